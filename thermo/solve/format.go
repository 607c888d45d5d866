package solve

import (
	"strings"

	"hmb/thermo/units"
)

// sig is the number of significant figures of values in messages: enough to tell a 0.1 %
// closure error from rounding.
const sig = 5

// formatter writes SI values in the unit system the file asked for.
type formatter struct {
	sys units.System
	atm float64
}

// q writes an absolute quantity: "25310 lbm/h", "180.00 C". NaN prints as "n/a".
func (f formatter) q(d units.Dim, si float64) string {
	if d == units.Dimensionless {
		return f.frac(si)
	}
	u := f.sys.Default(d)
	return join(units.Format(u.FromSI(si, f.atm), sig), u.Symbol())
}

// dq writes a difference: no temperature offset, no atmosphere.
func (f formatter) dq(d units.Dim, si float64) string {
	switch d {
	case units.Dimensionless:
		return f.frac(si)
	case units.Temperature:
		d = units.TemperatureDiff
	}
	u := f.sys.Default(d)
	sym := u.Symbol()
	if sym == "psia" {
		sym = "psi" // a difference is neither absolute nor gauge
	}
	return join(units.Format(u.DeltaFromSI(si), sig), sym)
}

func (f formatter) frac(v float64) string { return units.Format(v, 4) }

// Entropy rates have no unit of their own in the units package: W/K is kW/K in SI and Btu/(h R)
// in US units (1 Btu_IT = 1055.05585262 J, 1 R = 5/9 K; NIST SP 811 (2008), Appendix B).
func (f formatter) sgen(si float64) string {
	if f.sys == units.US {
		return join(units.Format(si*3600/1055.05585262*5/9, sig), "Btu/(h R)")
	}
	return join(units.Format(si/1e3, sig), "kW/K")
}

func join(num, sym string) string {
	if sym == "" || num == "n/a" {
		return num
	}
	return num + " " + sym
}

// pct writes a relative error as a percent with two decimals at least ("0.83 %").
func pct(rel float64) string {
	s := units.Format(rel*100, 2)
	if !strings.Contains(s, "e") && rel*100 >= 1 {
		s = units.Format(rel*100, 3)
	}
	return s + " %"
}

// unitFor is the unit a value the user wrote is shown in: their own spelling when it measures d,
// else the display system's unit.
func (f formatter) unitFor(d units.Dim, spelling string) units.Unit {
	if spelling != "" {
		if u, err := units.Lookup(spelling); err == nil && u.Dim() == d {
			return u
		}
	}
	return f.sys.Default(d)
}

// written writes an absolute value in the unit the user wrote it in, with no trailing zeros, so
// that "150 MPa" in the file reads "150 MPa" in the message.
func (f formatter) written(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return short(si)
	}
	u := f.unitFor(d, spelling)
	return join(short(u.FromSI(si, f.atm)), u.Symbol())
}

// writtenQ writes a solved value in the unit the user wrote beside it, at the usual precision.
func (f formatter) writtenQ(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return f.frac(si)
	}
	u := f.unitFor(d, spelling)
	return join(units.Format(u.FromSI(si, f.atm), sig), u.Symbol())
}

// writtenDelta writes a difference or tolerance in the unit the user wrote the value in: a
// tolerance on "150 C" reads "2 C" (a degree Celsius is a kelvin in size), on "50 psig" "1 psi".
func (f formatter) writtenDelta(d units.Dim, si float64, spelling string) string {
	if d == units.Dimensionless && spelling != "%" {
		return short(si)
	}
	u := f.unitFor(d, spelling)
	return join(short(u.DeltaFromSI(si)), deltaSymbol(u))
}

// deltaSymbol names a unit as a difference: a pressure difference is neither absolute nor gauge.
func deltaSymbol(u units.Unit) string {
	switch s := u.Symbol(); s {
	case "psia", "psig":
		return "psi"
	default:
		return strings.TrimSuffix(s, "(g)")
	}
}

// absolute returns the absolute counterpart of a gauge pressure unit (psig -> psia): a range of
// IAPWS-IF97 starts at zero absolute pressure, which no gauge reading shows well.
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

// short writes v with at most sig significant figures and without trailing zeros.
func short(v float64) string {
	s := units.Format(v, sig)
	mant, exp, hasExp := strings.Cut(s, "e")
	if strings.Contains(mant, ".") {
		mant = strings.TrimSuffix(strings.TrimRight(mant, "0"), ".")
	}
	if hasExp {
		return mant + "e" + exp
	}
	return mant
}

// sgenIn writes an entropy rate in the power-per-degree unit the user wrote ("kW/K", "Btu/h/R"),
// else as sgen does.
func (f formatter) sgenIn(si float64, spelling string, delta bool) string {
	k := strings.LastIndexByte(spelling, '/')
	per := 0.0
	if k > 0 {
		switch spelling[k+1:] {
		case "K":
			per = 1
		case "R":
			per = 5.0 / 9.0 // one rankine is 5/9 kelvin
		}
	}
	u, err := units.Lookup(spelling[:max(k, 0)])
	if per == 0 || err != nil || u.Dim() != units.Power {
		return f.sgen(si)
	}
	v := si * per / u.DeltaToSI(1)
	if delta {
		return short(v) + " " + spelling
	}
	return units.Format(v, sig) + " " + spelling
}
