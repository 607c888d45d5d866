package units

import (
	"math"
	"testing"
)

// Expected strings follow the rules of significant figures (round half to even on the binary
// value, as strconv does); no outside table exists for a formatting choice.
func TestFormat(t *testing.T) {
	tests := []struct {
		v    float64
		sig  int
		want string
	}{
		{373.15, 4, "373.1"}, // 373.15 is stored just below .15
		{373.151, 4, "373.2"},
		{101325, 4, "101300"},
		{101325, 6, "101325"},
		{1.5, 3, "1.50"},
		{-40, 3, "-40.0"},
		{0.0012345, 3, "0.00123"},
		{0.00012345, 2, "0.00012"},
		{0.000012345, 3, "1.23e-5"},
		{9.9996, 4, "10.00"},
		{999999999, 3, "1.00e9"},
		{123456789, 4, "123500000"},
		{6.02214076e23, 4, "6.022e23"},
		{2326, 1, "2000"},
		{0, 3, "0"},
		{math.Copysign(0, -1), 3, "0"},
		{1.1111111, 0, "1"},                  // sig clamped up to 1
		{1.0 / 3, 40, "0.33333333333333331"}, // clamped down to 17
		{math.NaN(), 4, "n/a"},
		{math.Inf(1), 4, "n/a"},
		{math.Inf(-1), 4, "n/a"},
	}
	for _, tt := range tests {
		if got := Format(tt.v, tt.sig); got != tt.want {
			t.Errorf("Format(%g, %d) = %q, want %q", tt.v, tt.sig, got, tt.want)
		}
	}
}

// A difference shows no digit its operands do not resolve. Expected strings by the rule in
// FormatDiff's comment; no outside table exists for a formatting choice. The psi figures:
// 101325 Pa = 14.695949 psia (1 psi = 6894.757293168 Pa, NIST SP 811 (2008) App. B.8).
func TestFormatDiff(t *testing.T) {
	tests := []struct {
		v, ref float64
		sig    int
		want   string
	}{
		{14.696 - 14.695949, 14.696, 6, "0"},             // 5.1e-5 psig: within a unit of 1e-4
		{14.6962 - 14.695949, 14.6962, 6, "0.0003"},      // beyond it: one significant figure
		{164.696 - 14.695949, 164.696, 6, "150.000"},     // the digits of 164.696
		{0.943633 - 14.695949, 14.695949, 6, "-13.7523"}, // a vacuum: the atmosphere is the larger operand
		{-3.6e-15, 1e3, 5, "0"},
		{0.1, 1e3, 5, "0"}, // 1000.0 resolves 0.1 only to a unit
		{0.25, 1e3, 5, "0.3"},
		{2.5e6, 1e6, 5, "2500000"},
		{0, 0, 5, "0"},
		{math.NaN(), 1, 5, "n/a"},
	}
	for _, tt := range tests {
		if got := FormatDiff(tt.v, tt.ref, tt.sig); got != tt.want {
			t.Errorf("FormatDiff(%g, %g, %d) = %q, want %q", tt.v, tt.ref, tt.sig, got, tt.want)
		}
	}
}

func TestResolved(t *testing.T) {
	tests := []struct{ v, scale, want float64 }{
		{-3.6e-12, 5e4, 0},     // -3.6e-15 kW/K against 50 kW/K of entropy flows
		{3.0013e-12, 20527, 0}, // a heater at zero duty, two-phase
		{0.021, 330e3, 0.021},  // a real generation 6e-8 of the flows: kept
		{1e-6, 0, 1e-6},        // nothing to compare with: kept
		{-42, 1e3, -42},
	}
	for _, tt := range tests {
		if got := Resolved(tt.v, tt.scale); got != tt.want {
			t.Errorf("Resolved(%g, %g) = %g, want %g", tt.v, tt.scale, got, tt.want)
		}
	}
}
