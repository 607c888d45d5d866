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
