package units

import (
	"math"
	"strconv"
	"strings"
)

// This file is the one formatter of quantities: every value hmb prints (tables, hover, inlay
// hints, messages, reports) is written here, with its digits and its unit label, so that what
// hmb prints reads back through Lookup as the same quantity.

// Display is how results are shown: the unit system, the units a file chose for some
// quantities, and the site atmosphere gauge readings are taken against.
type Display struct {
	System System
	Atm    float64 // Pa; zero or below means the standard atmosphere
	// Pick holds the unit chosen for a dimension (a file's display_flow t/h), shown instead of
	// the system's default; the zero Unit where none was chosen.
	Pick Picks
}

// Picks are units chosen per dimension, indexed by Dim; the zero Unit where none was chosen.
type Picks [numDims]Unit

// Set chooses u for the dimension it measures; false when u is the bare number, which cannot
// be chosen.
func (p *Picks) Set(d Dim, u Unit) bool {
	if int(d) >= numDims || u == (Unit{}) {
		return false
	}
	p[d] = u
	return true
}

// Keep drops the picks that are not units of sys (the command line asked for US units, the
// file chose t/h).
func (p Picks) Keep(sys System) Picks {
	for d, u := range p {
		if u != (Unit{}) && !sys.Has(u) {
			p[d] = Unit{}
		}
	}
	return p
}

func (d Display) atm() float64 {
	if d.Atm > 0 {
		return d.Atm
	}
	return StandardAtmosphere
}

// Unit is the unit a dimension is shown in: the file's pick, else the system's default. A
// temperature difference follows a picked temperature scale (dF for F, dK for C or K).
func (d Display) Unit(dim Dim) Unit {
	if int(dim) < numDims && d.Pick[dim] != (Unit{}) {
		return d.Pick[dim]
	}
	if dim == TemperatureDiff {
		if t := d.Pick[Temperature]; t != (Unit{}) {
			if t.US() {
				return bySymbol["dF"]
			}
			return bySymbol["dK"]
		}
	}
	return d.System.Default(dim)
}

// Value converts an SI value of dimension dim to the number shown, in Unit(dim).
func (d Display) Value(dim Dim, si float64) float64 { return d.Unit(dim).FromSI(si, d.atm()) }

// Number writes an SI value of dimension dim as the number shown in Unit(dim), without the unit
// (for a table cell whose heading names the unit).
func (d Display) Number(dim Dim, si float64) string { return Number(d.Unit(dim), d.Value(dim, si)) }

// Show writes an SI value of dimension dim with its unit: "540.00 C", "0.9500" for a fraction,
// "n/a" when it is not a number.
func (d Display) Show(dim Dim, si float64) string { return ShowIn(d.Unit(dim), si, d.atm()) }

// Delta writes a difference of dimension dim (a tolerance, a pressure drop, a miss): scale only,
// a temperature difference in dK or dR, a pressure difference without absolute or gauge mark.
func (d Display) Delta(dim Dim, si float64) string {
	if dim == Temperature {
		dim = TemperatureDiff
	}
	return ShowDelta(d.Unit(dim), si)
}

// ShowIn writes an SI value in the unit u (a unit the user wrote, say) with u's label.
func ShowIn(u Unit, si, atm float64) string { return label(Number(u, u.FromSI(si, atm)), u.Symbol()) }

// ShowDelta writes an SI difference in the unit u, labelled as a difference (DeltaSymbol).
func ShowDelta(u Unit, si float64) string { return label(Number(u, u.DeltaFromSI(si)), DeltaSymbol(u)) }

// DeltaSymbol is the label of a difference measured in u: a pressure difference is neither
// absolute nor gauge nor vacuum (psi, kPa, inHg); every other unit keeps its symbol.
func DeltaSymbol(u Unit) string { return u.DeltaUnit().Symbol() }

func label(num, sym string) string {
	if sym == "" || num == NotANumber {
		return num
	}
	return num + " " + sym
}

// NotANumber is what a value that is not a number (not solved, not defined) prints as.
const NotANumber = "n/a"

// Digits is how the numbers of a unit are written: N decimal places when Fixed, else N
// significant figures.
type Digits struct {
	Fixed bool
	N     int
}

// DigitsOf is the one rule for the numbers of u: a fraction (quality, efficiency) to four
// decimals, so that 0 and 1 read with the digits of 0.95; a percentage to two decimals;
// everything else to five significant figures.
func DigitsOf(u Unit) Digits {
	switch {
	case u.Dim() == Dimensionless && u.Symbol() == "%":
		return Digits{Fixed: true, N: 2}
	case u.Dim() == Dimensionless:
		return Digits{Fixed: true, N: 4}
	}
	return Digits{N: 5}
}

// Number writes v, a value already in the unit u, by DigitsOf(u). A value that rounds to zero
// prints as 0 without a sign; NaN and infinities print as NotANumber.
func Number(u Unit, v float64) string {
	dg := DigitsOf(u)
	if !dg.Fixed {
		return Format(v, dg.N)
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return NotANumber
	}
	s := strconv.FormatFloat(v, 'f', dg.N, 64)
	if strings.HasPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		s = s[1:]
	}
	return s
}

// Trim writes v, a number the user wrote in some unit, back with five significant figures and no
// trailing zeros: "1", "2.5", "1.5e-7". It is how an expectation's own target is echoed.
func Trim(v float64) string {
	s := Format(v, 5)
	mant, exp, hasExp := strings.Cut(s, "e")
	if strings.Contains(mant, ".") {
		mant = strings.TrimSuffix(strings.TrimRight(mant, "0"), ".")
	}
	if hasExp {
		return mant + "e" + exp
	}
	return mant
}

// Base is the SI base unit of a dimension (Pa, K, J/kg, W/K...; dK for a temperature difference;
// the bare number for a fraction): the unit hmb computes in.
func Base(d Dim) Unit {
	for i, df := range defs {
		if df.dim == d.Measure() && df.scale == 1 && df.offset == 0 && df.reading == Absolute {
			return Unit{uint8(i)}
		}
	}
	return Unit{}
}
