package solve

import (
	"strings"

	"hmb/thermo/units"
)

// formatter writes the solver's values in its messages through the units package's one
// formatter of quantities, in the model's display units or in the unit the user wrote.
type formatter struct {
	sys  units.System
	atm  float64
	pick units.Picks // the units the file chose per quantity
}

func (f formatter) disp() units.Display {
	return units.Display{System: f.sys, Atm: f.atm, Pick: f.pick}
}

// q writes an SI value of dimension d in the display unit: "540.00 C", "0.9500".
func (f formatter) q(d units.Dim, si float64) string { return f.disp().Show(d, si) }

// dq writes a difference of dimension d (a miss, a pressure drop): "2.0000 dK", "3.1000 psi".
func (f formatter) dq(d units.Dim, si float64) string { return f.disp().Delta(d, si) }

// frac writes a fraction (quality, efficiency).
func (f formatter) frac(v float64) string { return f.disp().Show(units.Dimensionless, v) }

// sgen writes an entropy rate.
func (f formatter) sgen(si float64) string { return f.q(units.EntropyRate, si) }

func pct(rel float64) string {
	s := units.Format(rel*100, 2)
	if !strings.Contains(s, "e") && rel*100 >= 1 {
		s = units.Format(rel*100, 3)
	}
	return s + " %"
}

// unitFor is the unit a value of dimension d is written in: the user's spelling when it is a
// unit of d, else the display unit.
func (f formatter) unitFor(d units.Dim, spelling string) units.Unit {
	if spelling != "" {
		if u, err := units.Lookup(spelling); err == nil && u.Measures(d) {
			return u
		}
	}
	return f.disp().Unit(d)
}

// written echoes a value the user wrote (a given, an expectation's target) in the unit written,
// without trailing zeros: "1 kW/K", "150 psig", "0.9".
func (f formatter) written(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return units.Trim(si)
	}
	u := f.unitFor(d, spelling)
	return join(units.Trim(u.FromSI(si, f.atm)), u.Symbol())
}

// writtenQ writes a solved value in the unit the user wrote, with the formatter's digits.
func (f formatter) writtenQ(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return f.frac(si)
	}
	return units.ShowIn(f.unitFor(d, spelling), si, f.atm)
}

// writtenDeltaQ writes a solved difference in the unit the user wrote, with the formatter's
// digits.
func (f formatter) writtenDeltaQ(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return f.frac(si)
	}
	return units.ShowDelta(f.deltaUnitFor(d, spelling), si)
}

// deltaUnitFor is the unit a difference of dimension d is written in: the user's spelling when
// it is a unit of d (or of a temperature difference, dK for a temperature), else the display
// unit of the difference.
func (f formatter) deltaUnitFor(d units.Dim, spelling string) units.Unit {
	if d == units.Temperature {
		if u, err := units.Lookup(spelling); spelling != "" && err == nil && (u.Dim() == d || u.Dim() == units.TemperatureDiff) {
			return u
		}
		return f.disp().Unit(units.TemperatureDiff)
	}
	return f.unitFor(d, spelling)
}

// writtenDelta echoes a tolerance the user wrote, as a difference in the unit written.
func (f formatter) writtenDelta(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return units.Trim(si)
	}
	u := f.unitFor(d, spelling)
	return join(units.Trim(u.DeltaFromSI(si)), units.DeltaSymbol(u))
}

// writtenDiff echoes a difference the user wrote as the value of a difference (a superheat of
// 40 dK, a drop of 2 bar): in the unit written, or the display unit of the difference.
func (f formatter) writtenDiff(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return units.Trim(si)
	}
	u := f.deltaUnitFor(d, spelling)
	return join(units.Trim(u.DeltaFromSI(si)), units.DeltaSymbol(u))
}

func join(num, sym string) string {
	if sym == "" || num == units.NotANumber {
		return num
	}
	return num + " " + sym
}

// absolute is the absolute unit of the scale of a gauge unit (psia for psig, kPa for kPa(g)).
func absolute(u units.Unit) units.Unit {
	if !u.Gauge() {
		return u
	}
	sym := strings.TrimSuffix(u.Symbol(), "(g)")
	if sym == "psig" {
		sym = "psia"
	}
	if a, err := units.Lookup(sym); err == nil {
		return a
	}
	return u
}
