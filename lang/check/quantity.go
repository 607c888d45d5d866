package check

import (
	"fmt"
	"math"
	"strings"

	"hmb/lang/ast"
	"hmb/thermo/units"
)

// spelling is the unit spelling of q as written, "" for a bare number.
func spelling(q *ast.Quantity) string {
	if q.Unit == nil {
		return ""
	}
	return q.Unit.Name
}

// unitOf looks up q's unit spelling and checks its dimension. what names the quantity in
// messages ("p", "efficiency of T1"). A temperature difference unit is accepted where allowDiff,
// which also says that q is a difference (a tolerance), for the units an unknown one lists.
func (c *checker) unitOf(q *ast.Quantity, want units.Dim, what string, allowDiff bool) (units.Unit, bool) {
	return c.unitIn(q, want, what, allowDiff, allowDiff)
}

// unitIn is unitOf for a value that is a difference (delta) or not.
func (c *checker) unitIn(q *ast.Quantity, want units.Dim, what string, allowDiff, delta bool) (units.Unit, bool) {
	if math.IsInf(q.Value, 0) {
		c.errorf(CodeRange, q, "%s is too large a number", q.Raw)
		return units.Unit{}, false
	}
	u, err := c.lookupUnit(spelling(q))
	if err != nil {
		d := c.errorf(CodeUnknownUnit, q.Unit, "unknown unit %s", q.Unit.Name)
		if s, ok := units.Nearest(q.Unit.Name, fitting(want, delta)); ok {
			d.Message += fmt.Sprintf("; did you mean %s?", s)
			d.Fix = s
		}
		if want != units.Dimensionless {
			d.Message += fmt.Sprintf(" (%s units: %s)", want, accepted(want, delta))
		}
		return u, false
	}
	got := u.Dim()
	if u.Measures(want) || allowDiff && want == units.Temperature && got == units.TemperatureDiff {
		return u, true
	}
	if q.Unit == nil {
		c.errorf(CodeNoUnit, q, "%s %s has no unit: a %s needs one, such as %s", what, q.Raw, want, examples(want))
		return u, false
	}
	if want == units.Dimensionless {
		c.errorf(CodeDimension, q.Unit, "%s is a plain number (a fraction or %%), not a %s in %s", what, got, q.Unit.Name)
	} else {
		c.errorf(CodeDimension, q.Unit, "%s is a %s, but %s is a unit of %s; use, for example, %s", what, want, q.Unit.Name, got, examples(want))
	}
	return u, false
}

// lookupUnit is units.Lookup, remembering the spellings found: a file writes the same few
// units thousands of times.
func (c *checker) lookupUnit(spelling string) (units.Unit, error) {
	slot := &c.unitMemo[(len(spelling)+int(firstByte(spelling)))%len(c.unitMemo)]
	if slot.ok && slot.spelling == spelling {
		return slot.unit, nil
	}
	u, err := units.Lookup(spelling)
	if err == nil {
		*slot = unitMemo{spelling, u, true}
	}
	return u, err
}

type unitMemo struct {
	spelling string
	unit     units.Unit
	ok       bool
}

func firstByte(s string) byte {
	if s == "" {
		return 0
	}
	return s[0]
}

// examples names a dimension's usual units in both systems.
func examples(d units.Dim) string {
	si, us := units.SI.Default(d).Symbol(), units.US.Default(d).Symbol()
	if d == units.Pressure {
		return "bar, kPa, psia or psig"
	}
	if si == us {
		return si
	}
	return si + " or " + us
}

// fitting lists the spellings that fit a value of dimension d, a difference (delta) or not, for a
// suggestion: a misspelt unit is taken to be one of the quantity expected.
func fitting(d units.Dim, delta bool) []string {
	var out []string
	for _, s := range units.Spellings(d) {
		if u, err := units.Lookup(s); err == nil && (delta && !u.Relative() || !delta && u.Level()) {
			out = append(out, s)
		}
	}
	return out
}

// accepted lists the canonical units of a dimension for a message: for a pressure difference
// (delta) those that do not read from the atmosphere, for a pressure those that say their reading.
func accepted(d units.Dim, delta bool) string {
	var syms []string
	for _, u := range units.Symbols(d) {
		if delta && u.Relative() || !delta && !u.Level() {
			continue
		}
		syms = append(syms, u.Symbol())
	}
	return strings.Join(syms, ", ")
}

// convert converts q to SI as a value of dimension want (delta: a difference, without offset or
// atmosphere). A pressure itself needs a unit that says its reading (psia, not psi); a pressure
// difference one that does not read from the atmosphere (psi, not psig). ok is false after a
// report.
func (c *checker) convert(q *ast.Quantity, want units.Dim, what string, delta bool) (si float64, u units.Unit, ok bool) {
	u, ok = c.unitIn(q, want, what, delta && want == units.Temperature, delta) // a temperature difference may be written in dK or dF
	if !ok {
		return 0, u, false
	}
	if delta {
		if u.Relative() {
			du := u.DeltaUnit()
			d := c.errorf(CodeRelativeDelta, q.Unit, "%s %s %s is a %s reading, but %s is a pressure difference: write %s %s (to state the outlet pressure, give p on the outlet stream)",
				what, q.Raw, q.Unit.Name, readingWord(u.Reading()), what, q.Raw, du.Symbol())
			d.Fix = du.Symbol()
			return 0, u, false
		}
		return u.DeltaToSI(q.Value), u, true
	}
	if !u.Level() {
		c.noReading(q, u, what)
		return 0, u, false
	}
	return u.ToSI(q.Value, c.m.Atm), u, true
}

// convertDelta converts q to SI as a difference of dimension want (a pressure drop, a
// superheat): a temperature difference may be written in K or dK, F or dF; a pressure
// difference in a unit that does not read from the atmosphere.
func (c *checker) convertDelta(q *ast.Quantity, want units.Dim, what string) (si float64, u units.Unit, ok bool) {
	if want == units.Temperature {
		if u, ok = c.unitOf(q, want, what, true); !ok {
			return 0, u, false
		}
		return u.DeltaToSI(q.Value), u, true
	}
	return c.convert(q, want, what, true)
}

// noReading reports a pressure written in a unit that states differences only.
func (c *checker) noReading(q *ast.Quantity, u units.Unit, what string) {
	var words, spell []string
	for _, r := range u.Readings() {
		w := readingWord(r.Reading())
		if r.Reading() == units.Vacuum {
			w = "a vacuum below the site atmosphere"
		}
		words = append(words, w)
		spell = append(spell, q.Raw+" "+r.Symbol())
	}
	c.errorf(CodeNoReading, q.Unit, "%s %s %s does not say whether it is %s: write %s",
		what, q.Raw, q.Unit.Name, strings.Join(words, " or "), joinOr(spell))
}

// readingWord names a reading in a sentence: "a gauge reading", "absolute".
func readingWord(r units.Reading) string {
	switch r {
	case units.Gauge:
		return "gauge"
	case units.Vacuum:
		return "vacuum"
	}
	return "absolute"
}

// tolerance converts a stated tolerance on a value of dimension want, given in u, to an absolute SI
// difference. A percentage is relative to the value as written, except on a plain number (a
// quality, an efficiency), where it is in points: "x 0.9 ± 2 %" is 0.88..0.92.
func (c *checker) tolerance(t *ast.Tol, val *ast.Quantity, u units.Unit, want units.Dim, what string) (float64, bool) {
	a := t.Amount
	if a.Value < 0 {
		c.errorf(CodeTolerance, a, "the tolerance of %s is below zero", what)
		return 0, false
	}
	if a.Unit != nil && a.Unit.Name == "%" && want == units.Temperature {
		abs := "K"
		if u.US() {
			abs = "F"
		}
		c.errorf(CodeRelativeTemp, a, "a tolerance of %s %% on a temperature has no fixed meaning (a percentage depends on where the scale puts zero): give it in degrees, such as ± %s %s",
			a.Raw, a.Raw, abs)
		return 0, false
	}
	if a.Unit != nil && a.Unit.Name == "%" && want != units.Dimensionless {
		return u.DeltaToSI(math.Abs(val.Value) * a.Value / 100), true
	}
	if a.Unit == nil && want != units.Dimensionless && !math.IsInf(a.Value, 0) {
		c.errorf(CodeNoUnit, a, "the tolerance %s of %s has no unit: give it in %% or in a unit of %s, such as %s",
			a.Raw, what, want, examples(want))
		return 0, false
	}
	tu, ok := c.unitOf(a, want, "the tolerance of "+what, true)
	if !ok {
		return 0, false
	}
	return tu.DeltaToSI(a.Value), true
}

// fraction checks a quality or efficiency in SI (a fraction).
func (c *checker) fraction(q *ast.Quantity, v float64, what string, zeroOK bool) bool {
	if v < 0 || v > 1 || v == 0 && !zeroOK {
		rng := "between 0 and 1 (0 % and 100 %)"
		if !zeroOK {
			rng = "above 0 and at most 1 (100 %)"
		}
		c.errorf(CodeFraction, q, "%s %s%s must be %s", what, q.Raw, unitSuffix(q), rng)
		return false
	}
	return true
}

func unitSuffix(q *ast.Quantity) string {
	if q.Unit == nil {
		return ""
	}
	if q.Unit.Name == "%" {
		return " %"
	}
	return " " + q.Unit.Name
}
