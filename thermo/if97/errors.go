package if97

import (
	"errors"
	"fmt"
	"math"
	"strconv"
)

// LimitError reports an input outside the range where IF97 is defined.
// Value, Min and Max are in the SI units of the public API; Cond says when
// the limit applies ("at pressures over 50 MPa"), or is empty.
type LimitError struct {
	Quantity string // "pressure", "temperature", "enthalpy", "entropy", "quality"
	Value    float64
	Min, Max float64
	Cond     string
}

func (e *LimitError) Error() string {
	if math.IsNaN(e.Value) || math.IsInf(e.Value, 0) {
		return fmt.Sprintf("%s %v is not a finite number", e.Quantity, e.Value)
	}
	side, bound := "above", e.Max
	if e.Value <= e.Min { // the lower pressure limit 0 is exclusive
		side, bound = "below", e.Min
	}
	msg := fmt.Sprintf("%s %s is %s the IF97 limit %s", e.Quantity, show(e.Quantity, e.Value), side, show(e.Quantity, bound))
	if e.Quantity == "quality" {
		msg = fmt.Sprintf("quality %s is outside 0..1", show(e.Quantity, e.Value))
	}
	if e.Cond != "" {
		msg += " " + e.Cond
	}
	return msg
}

// show writes an SI value in the unit a steam-table reader expects.
func show(quantity string, v float64) string {
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', 9, 64) }
	switch quantity {
	case "pressure":
		return g(v*1e-6) + " MPa"
	case "temperature":
		return g(v) + " K"
	case "enthalpy":
		return g(v*1e-3) + " kJ/kg"
	case "entropy":
		return g(v*1e-3) + " kJ/(kg K)"
	}
	return g(v)
}

var (
	// ErrOnSaturation: a (p,T) pair on the saturation line fixes no single
	// state; the quality is needed as well.
	ErrOnSaturation = errors.New("state is on the saturation line; give quality")
	// ErrNotUnique: more than one state has the given pair of properties.
	ErrNotUnique = errors.New("state is not unique")
	// ErrNoSolution: no state inside the range of IF97 has the given pair.
	ErrNoSolution = errors.New("no IF97 state has these properties")
)

// finite reports whether x is a number other than ±Inf.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func notFinite(quantity string, v float64) error {
	return &LimitError{Quantity: quantity, Value: v, Min: math.Inf(-1), Max: math.Inf(1)}
}
