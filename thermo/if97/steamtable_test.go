package if97

import "testing"

// US-customary conversions: 1 Btu/lbm = 2.326 kJ/kg (exact, IT Btu),
// 1 psi = 6894.757293168 Pa, F = K*9/5 - 459.67.
const (
	btuPerLbm = 2326.0 // J/kg
	psi       = 6894.757293168
)

func toF(k float64) float64   { return k*9/5 - 459.67 }
func fromF(f float64) float64 { return (f + 459.67) * 5 / 9 }

// TestSteamTableFacts checks round numbers every steam table shows.
// Source: common practice, no source.
func TestSteamTableFacts(t *testing.T) {
	liq, vap, err := SatPair(14.696 * psi)
	if err != nil {
		t.Fatal(err)
	}
	check := func(what string, got, want, tol float64) {
		t.Helper()
		if abs(got-want) > tol {
			t.Errorf("%s = %.4g, want %g ± %g (common practice, no source)", what, got, want, tol)
		}
	}
	check("boiling point at 14.696 psia, F", toF(liq.T), 212, 0.1)
	check("hf at 14.696 psia, Btu/lbm", liq.H/btuPerLbm, 180, 1)
	check("hg at 14.696 psia, Btu/lbm", vap.H/btuPerLbm, 1150, 1)
	check("hfg at 14.696 psia, Btu/lbm", (vap.H-liq.H)/btuPerLbm, 970, 1)

	st, err := PT(14.7*psi, fromF(600))
	if err != nil {
		t.Fatal(err)
	}
	check("h of steam at 14.7 psia, 600 F, Btu/lbm", st.H/btuPerLbm, 1335, 1.5)

	// Liquid at 60 F: h = cp (T - 32 F) with cp = 1 Btu/(lbm F) gives 28.
	st, err = PT(14.696*psi, fromF(60))
	if err != nil {
		t.Fatal(err)
	}
	check("h of water at 60 F, Btu/lbm", st.H/btuPerLbm, 1*(60-32), 0.5)
}
