package units

import (
	"math"
	"testing"
)

func TestAtmosphereAt(t *testing.T) {
	// U.S. Standard Atmosphere 1976, Table I (geometric altitude), from memory; the table prints
	// five significant figures, so the tolerance is 1e-4 relative.
	const src = "U.S. Standard Atmosphere 1976, Table I, from memory"
	tests := []struct {
		z, wantPa float64
		source    string
	}{
		{-500, 107478, src},
		{0, 101325, src + " (sea level, exact)"},
		{500, 95461, src},
		{1000, 89876, src},
		{1500, 84560, src},
		{2000, 79501, src},
		{3000, 70121, src},
		{5000, 54048, src},
		{11000, 22700, src},
	}
	for _, tt := range tests {
		got, err := AtmosphereAt(tt.z)
		if err != nil {
			t.Errorf("AtmosphereAt(%g): %v", tt.z, err)
			continue
		}
		if !near(got, tt.wantPa, 1e-4) {
			t.Errorf("AtmosphereAt(%g) = %.1f Pa, want %g (%s)", tt.z, got, tt.wantPa, tt.source)
		}
	}
	for _, z := range []float64{-501, 11001, math.NaN(), math.Inf(1), math.Inf(-1)} {
		if p, err := AtmosphereAt(z); err == nil {
			t.Errorf("AtmosphereAt(%g) = %g, want error", z, p)
		}
	}
}
