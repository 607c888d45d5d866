package units

import (
	"errors"
	"testing"
)

// Inputs are typical engineer-typed givens (invented values).
func TestParseQuantity(t *testing.T) {
	tests := []struct {
		in   string
		v    float64
		unit string
	}{
		{"150psig", 150, "psig"},
		{"600 F", 600, "F"},
		{"2800kJ/kg", 2800, "kJ/kg"},
		{"85%", 85, "%"},
		{"0.9", 0.9, ""},
		{"  -5 C ", -5, "C"},
		{"−12.5°F", -12.5, "°F"},
		{"+3.5e2 kPa(g)", 350, "kPa(g)"},
		{"1E-3 m3/kg", 0.001, "m3/kg"},
		{".5 frac", 0.5, "frac"},
		{"7.", 7, ""},
		{"6.5 kJ/(kg K)", 6.5, "kJ/(kg K)"},
		{"2 ft", 2, "ft"},
		{"3e", 3, "e"}, // no exponent digits: the unit starts there (and Lookup will refuse it)
		{"12 Btu/lbm", 12, "Btu/lbm"},
	}
	for _, tt := range tests {
		v, unit, err := ParseQuantity(tt.in)
		if err != nil || v != tt.v || unit != tt.unit {
			t.Errorf("ParseQuantity(%q) = %g, %q, %v; want %g, %q", tt.in, v, unit, err, tt.v, tt.unit)
		}
	}
}

func TestParseQuantityErrors(t *testing.T) {
	tests := []struct {
		in     string
		offset int
		msg    string
	}{
		{"", 0, `missing number in ""`},
		{"   ", 3, `missing number in "   "`},
		{"psig", 0, `missing number in "psig"`},
		{"NaN", 0, `missing number in "NaN"`},
		{"Inf psia", 0, `missing number in "Inf psia"`},
		{"-", 0, `missing number in "-"`},
		{" 1e999 Pa", 1, `number out of range in " 1e999 Pa"`},
		{"1.2.3 kPa", 3, `malformed number in "1.2.3 kPa"`},
		{"12 34 psig", 3, `malformed number in "12 34 psig"`},
	}
	for _, tt := range tests {
		_, _, err := ParseQuantity(tt.in)
		var qe *QuantityError
		if !errors.As(err, &qe) {
			t.Errorf("ParseQuantity(%q) error %v, want *QuantityError", tt.in, err)
			continue
		}
		if qe.Offset != tt.offset || err.Error() != tt.msg {
			t.Errorf("ParseQuantity(%q) = offset %d %q, want offset %d %q", tt.in, qe.Offset, err, tt.offset, tt.msg)
		}
	}
}
