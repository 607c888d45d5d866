package if97

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestLimits: the range of validity of IAPWS R7-97(2012) Sec. 4 (Fig. 1):
// 273.15-1073.15 K at 0 < p <= 100 MPa, 1073.15-2273.15 K at p <= 50 MPa.
func TestLimits(t *testing.T) {
	cases := []struct {
		name     string
		call     func() (State, error)
		quantity string
		text     string
	}{
		{"T above region 5 pressure limit", func() (State, error) { return PT(60e6, 1200) }, "temperature",
			"temperature 1200 K is above the IF97 limit 1073.15 K at pressures over 50 MPa"},
		{"T below 273.15 K", func() (State, error) { return PT(1e6, 270) }, "temperature", "below the IF97 limit 273.15 K"},
		{"T above 2273.15 K", func() (State, error) { return PT(1e6, 2300) }, "temperature", "above the IF97 limit 2273.15 K"},
		{"p above 100 MPa", func() (State, error) { return PT(101e6, 500) }, "pressure", "pressure 101 MPa is above the IF97 limit 100 MPa"},
		{"p zero", func() (State, error) { return PT(0, 500) }, "pressure", "below the IF97 limit 0 MPa"},
		{"p NaN", func() (State, error) { return PT(math.NaN(), 500) }, "pressure", "not a finite number"},
		{"h below 273.15 K liquid", func() (State, error) { return PH(1e6, -10e3) }, "enthalpy", "below the IF97 limit"},
		{"h above 2273.15 K", func() (State, error) { return PH(1e6, 8000e3) }, "enthalpy", "above the IF97 limit"},
		{"s above 1073.15 K at 80 MPa", func() (State, error) { return PS(80e6, 9e3) }, "entropy", "above the IF97 limit"},
		{"PX pressure above critical", func() (State, error) { return PX(23e6, 0.5) }, "pressure", "above the IF97 limit 22.064 MPa for saturation"},
		{"TX temperature above critical", func() (State, error) { return TX(650, 0.5) }, "temperature", "above the IF97 limit 647.096 K"},
		{"quality above 1", func() (State, error) { return PX(1e6, 1.2) }, "quality", "quality 1.2 is outside 0..1"},
		{"quality below 0", func() (State, error) { return TX(400, -0.1) }, "quality", "quality -0.1 is outside 0..1"},
		{"quality NaN", func() (State, error) { return TX(400, math.NaN()) }, "quality", "not a finite number"},
	}
	for _, c := range cases {
		st, err := c.call()
		var le *LimitError
		if !errors.As(err, &le) {
			t.Errorf("%s: got %v (%+v), want *LimitError", c.name, err, st)
			continue
		}
		if le.Quantity != c.quantity || !strings.Contains(err.Error(), c.text) {
			t.Errorf("%s: got %q (quantity %q), want quantity %q and %q", c.name, err, le.Quantity, c.quantity, c.text)
		}
	}
	if _, err := Psat(200); err == nil {
		t.Error("Psat(200 K): no error")
	}
	if _, err := Tsat(30e6); err == nil {
		t.Error("Tsat(30 MPa): no error")
	}
}

// TestOnSaturation: (p, Tsat(p)) fixes no state (Tsat from R7-97 Eq. 31).
func TestOnSaturation(t *testing.T) {
	for _, p := range []float64{1e3, 0.1e6, 1e6, 10e6, 16e6, 18e6, 21e6} {
		ts, err := Tsat(p)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := PT(p, ts); !errors.Is(err, ErrOnSaturation) {
			t.Errorf("PT(%g Pa, Tsat %g K): %v, want ErrOnSaturation", p, ts, err)
		}
		if !strings.Contains(ErrOnSaturation.Error(), "give quality") {
			t.Error(ErrOnSaturation)
		}
		for _, dt := range []float64{-1e-3, 1e-3} {
			st, err := PT(p, ts+dt)
			want := Liquid
			if dt > 0 {
				want = Vapor
			}
			if err != nil || st.Phase != want {
				t.Errorf("PT(%g Pa, Tsat%+g K): %v %v, want %v", p, dt, st.Phase, err, want)
			}
		}
	}
}

// TestNotUnique: cold compressed liquid reaches two-phase enthalpies along
// an isotherm (300 K: h' = 112.6 kJ/kg at 3.5 kPa, h = 184.1 kJ/kg at
// 80 MPa, R7-97 Table 5), so (300 K, 150 kJ/kg) fits two states.
func TestNotUnique(t *testing.T) {
	if _, err := TH(300, 150e3); !errors.Is(err, ErrNotUnique) {
		t.Errorf("TH(300 K, 150 kJ/kg): %v, want ErrNotUnique", err)
	}
	// R7-97 Table 15: (700 K, 30 MPa) has h = 2631.49474 kJ/kg,
	// s = 5.17540298 kJ/(kg K); along 700 K both are unique.
	for _, c := range []struct {
		name string
		f    func() (State, error)
	}{
		{"TH", func() (State, error) { return TH(700, 2631.49474e3) }},
		{"TS", func() (State, error) { return TS(700, 5.17540298e3) }},
	} {
		st, err := c.f()
		if err != nil || relErr(st.P, 30e6) > 1e-7 {
			t.Errorf("%s at 700 K (R7-97 Table 15): p = %g, %v; want 30 MPa", c.name, st.P, err)
		}
	}
	if _, err := TH(1500, 5000e3); !errors.Is(err, ErrNoSolution) {
		t.Errorf("TH(1500 K, 5000 kJ/kg): %v, want ErrNoSolution", err)
	}
}

// TestTwoPhaseFields: inside the dome Cp, Cv, W are NaN; X is 0 and 1 at
// the ends, which carry their phase's values.
func TestTwoPhaseFields(t *testing.T) {
	for _, x := range []float64{0, 0.3, 1} {
		st, err := PX(1e6, x)
		if err != nil {
			t.Fatal(err)
		}
		undefined := math.IsNaN(st.Cp) || math.IsNaN(st.Cv) || math.IsNaN(st.W)
		if (x > 0 && x < 1) != undefined || st.X != x || st.Region != 4 {
			t.Errorf("PX(1 MPa, %g): %+v", x, st)
		}
		for _, v := range []float64{st.P, st.T, st.H, st.S, st.V, st.Rho, st.U} {
			if math.IsNaN(v) {
				t.Errorf("PX(1 MPa, %g): NaN in %+v", x, st)
			}
		}
	}
	want := map[float64]Phase{0: SatLiquid, 0.3: Mixture, 1: SatVapor}
	for x, ph := range want {
		st, _ := TX(600, x)
		if st.Phase != ph {
			t.Errorf("TX(600 K, %g) phase %v want %v", x, st.Phase, ph)
		}
	}
	if Supercritical.String() != "supercritical fluid" || SatVapor.String() != "saturated vapour" {
		t.Error("phase names")
	}
}
