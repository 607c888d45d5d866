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
