package solve

import (
	"math"
	"strings"
	"testing"

	"hmb/thermo/model"
)

// Tests of the solver's judgment: exchanger profiles, entropy boundaries, pressure drops that
// follow from both ends, and the errors of impossible plants. Reference values come from
// Debian's python3-iapws (from iapws import IAPWS97 as W; P in MPa, T in K, h in kJ/kg, s in
// kJ/(kg K)), each balance written out by hand as the row's src says.

// withOption sets a word-valued parameter ("arrangement parallel") on a unit of m.
func withOption(m *model.Model, unitName, param, value string) *model.Model {
	for _, u := range m.Units {
		if u.Name == unitName {
			if u.Options == nil {
				u.Options = map[string]*model.Option{}
			}
			u.Options[param] = &model.Option{Value: value}
		}
	}
	return m
}

func unitResult(t *testing.T, m *model.Model, r *Result, name string) UnitResult {
	t.Helper()
	for i, u := range m.Units {
		if u.Name == name {
			return r.Units[i]
		}
	}
	t.Fatalf("no unit %s", name)
	return UnitResult{}
}

func TestExchangerProfile(t *testing.T) {
	lm := func(a, b float64) float64 { return (a - b) / math.Log(a/b) }
	cases := []struct {
		name  string
		m     func(t *testing.T) *model.Model
		dtMin float64 // K
		at    string  // words of DTMinAt
		lmtd  float64 // K; NaN: none
		ua    float64 // W/K
		zones []string
		src   string
	}{
		{
			// Extraction steam 2 MPa, 573.15 K condensing to saturated liquid; feedwater 40 kg/s
			// 8 MPa 423.15 K to 7.9 MPa 478.15 K. python3-iapws: hi=W(P=2,T=573.15),
			// ho=W(P=2,x=0), g=W(P=2,x=1), ci=W(P=8,T=423.15), co=W(P=7.9,T=478.15);
			// Q = 40 (co.h-ci.h) = 9.6177 MW; the dew point at f = (hi.h-g.h)/(hi.h-ho.h) =
			// 0.106761, where the feedwater is at W(P=7.9+f 0.1, h=co.h-f(co.h-ci.h)).T =
			// 472.404573 K against Tsat 485.534535 K: dT 13.129962 K; zone LMTDs 41.369814 and
			// 31.605442 K, UA = 296636.3548 W/K, LMTD = Q/UA = 32.422440 K.
			name: "condensing feedwater heater: the pinch is where the steam starts condensing",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("EXT", pp, 2e6, tt, 573.15), strm("DRN", xx, 0), strm("FWI", flow, 40, pp, 8e6, tt, 423.15), strm("FWO", tt, 478.15)},
					unit("FWH", "exchanger", ports("hot_in EXT", "hot_out DRN", "cold_in FWI", "cold_out FWO"), "dp_cold", 1e5))
			},
			dtMin: 13.129961866364567, at: "where the hot side EXT starts condensing",
			lmtd: 32.42244021824467, ua: 296636.35480759456,
			zones: []string{"desuperheating/heating", "condensing/heating"},
			src:   "python3-iapws, see the comment",
		},
		{
			// Water 2 kg/s at 0.3 MPa, 363.15 -> 323.15 K, against 2 kg/s from 293.15 K.
			// python3-iapws: Q = 2 (W(P=0.3,T=363.15).h - W(P=0.3,T=323.15).h) = 335.1239 kW;
			// cold outlet W(P=0.3, h=c1.h + Q/2).T = 333.239042 K; ends 29.910958 K and 30 K,
			// LMTD 29.955457 K, UA = 11187.4088 W/K.
			name: "single-phase counterflow: the classical LMTD",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("H1", flow, 2, pp, 0.3e6, tt, 363.15), strm("H2", tt, 323.15), strm("C1", flow, 2, pp, 0.3e6, tt, 293.15), strm("C2")},
					unit("X", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2")))
			},
			dtMin: 29.910957947509644, at: "at the hot inlet end",
			lmtd: lm(363.15-333.23904205249033, 30), ua: 11187.408764558631,
			zones: []string{"cooling/heating"},
			src:   "python3-iapws, see the comment",
		},
		{
			// The same hot side against 4 kg/s in parallel flow: cold outlet
			// W(P=0.3, h=c1.h + Q/4).T = 313.193227 K; ends 70 K and 9.956773 K, LMTD
			// 30.787574 K, UA 10885.0388 W/K (python3-iapws).
			name: "single-phase parallel flow",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("H1", flow, 2, pp, 0.3e6, tt, 363.15), strm("H2", tt, 323.15), strm("C1", flow, 4, pp, 0.3e6, tt, 293.15), strm("C2")},
					unit("X", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2")))
				return withOption(m, "X", "arrangement", "parallel")
			},
			dtMin: 9.956773053401548, at: "at the hot outlet end",
			lmtd: 30.78757424527337, ua: 10885.038834000017,
			zones: []string{"cooling/heating"},
			src:   "python3-iapws, see the comment",
		},
		{
			// Steam 2 kg/s at 0.2 MPa, 523.15 K to liquid at 333.15 K; water at 1 MPa from
			// 313.15 to 428.15 K. The ends are 95 K and 20 K apart, but the dew point lies at
			// f = 0.097435 (python3-iapws: (hi.h-g.h)/(hi.h-ho.h) with g = W(P=0.2,x=1)), where
			// the water is at W(P=1, h=co.h - f (co.h-ci.h)).T = 417.162785 K against Tsat
			// 393.361546 K: a cross of 23.801239 K.
			name: "internal temperature cross at the dew point",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("HS1", flow, 2, pp, 0.2e6, tt, 523.15), strm("HS2", tt, 333.15), strm("CW1", pp, 1e6, tt, 313.15), strm("CW2", tt, 428.15)},
					unit("X1", "exchanger", ports("hot_in HS1", "hot_out HS2", "cold_in CW1", "cold_out CW2")))
			},
			dtMin: -23.801239210815822, at: "where the hot side HS1 starts condensing",
			lmtd: math.NaN(), ua: math.NaN(),
			zones: []string{"desuperheating/heating", "condensing/heating", "subcooling/heating"},
			src:   "python3-iapws, see the comment",
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := c.m(t)
			r := solveModel(t, m)
			ur := r.Units[0]
			if math.Abs(ur.DTMin-c.dtMin) > 1e-6 {
				t.Errorf("dT_min %.9g K, want %.9g (%s)", ur.DTMin, c.dtMin, c.src)
			}
			if ur.DTMinAt != c.at {
				t.Errorf("dT_min at %q, want %q", ur.DTMinAt, c.at)
			}
			for _, p := range []struct {
				what      string
				got, want float64
			}{{"LMTD", ur.LMTD, c.lmtd}, {"UA", ur.UA, c.ua}} {
				if math.IsNaN(p.want) != math.IsNaN(p.got) || !math.IsNaN(p.want) && math.Abs(p.got-p.want) > 1e-6*p.want {
					t.Errorf("%s %.9g, want %.9g (%s)", p.what, p.got, p.want, c.src)
				}
			}
			var zs []string
			for _, z := range ur.Zones {
				zs = append(zs, z.Hot+"/"+z.Cold)
			}
			if strings.Join(zs, ", ") != strings.Join(c.zones, ", ") {
				t.Errorf("zones %v, want %v", zs, c.zones)
			}
			cross := findDiag(r, CodeTempCross) != nil
			if cross != (c.dtMin < 0) {
				logDiags(t, r)
				t.Errorf("temperature cross reported: %v", cross)
			}
		})
	}
}

// TestEntropyBoundaries checks S_gen with a T_boundary, heat losses at the ambient temperature,
// and the fluid-only flag.
func TestEntropyBoundaries(t *testing.T) {
	cases := []struct {
		name      string
		m         func(t *testing.T) *model.Model
		unit      string
		sgen      float64 // W/K
		fluidOnly bool
		src       string
	}{
		{
			name: "heater with its source at T_boundary",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("W1", flow, 2, pp, 2e6, tt, 373.15), strm("W2", tt, 453.15)},
					unit("H", "heater", ports("in W1", "out W2"), "T_boundary", 523.15))
			},
			unit: "H", sgen: 353.3581214204587,
			src: "2 (W(P=2,T=453.15).s - W(P=2,T=373.15).s) - Q/523.15, Q = 2 (h2 - h1) = 686.3311 kW",
		},
		{
			name: "condenser rejecting to cooling water at T_boundary",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 101325, xx, 0.95), strm("S2", xx, 0)},
					unit("C", "cooler", ports("in S1", "out S2"), "T_boundary", 303.15))
			},
			unit: "C", sgen: 1326.1839397285012,
			src: "(W(P=0.101325,x=0).s - W(P=0.101325,x=0.95).s) + Q/303.15, Q = h1 - h2 = 2143.7137 kW",
		},
		{
			// Without T_boundary the same condenser generates nothing inside the fluid (no
			// pressure drop): the fluid-only reading.
			name: "condenser without T_boundary counts the fluid only",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 101325, xx, 0.95), strm("S2", xx, 0)},
					unit("C", "cooler", ports("in S1", "out S2")))
			},
			unit: "C", sgen: 0, fluidOnly: true,
			src: "m (s_out - s(p_in, h_out)) with p_out = p_in",
		},
		{
			name: "mixer heat loss leaves at the file's ambient temperature",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 2, pp, 1e6, tt, 523.15), strm("S2", flow, 3, pp, 1e6, tt, 313.15), strm("S3")},
					unit("M1", "mixer", ports("in S1", "in S2", "out S3"), "heat_loss", 50e3))
				m.Ambient = 293.15
				return m
			},
			unit: "M1", sgen: 874.1404885681521,
			src: "5 W(P=1,h=h3).s - 2 W(P=1,T=523.15).s - 3 W(P=1,T=313.15).s + 50 kW / 293.15 K, h3 = (2 h1 + 3 h2 - 50) / 5",
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := c.m(t)
			r := solveModel(t, m)
			if errs := errorsOf(r); len(errs) > 0 {
				logDiags(t, r)
				t.Fatalf("%d errors", len(errs))
			}
			ur := unitResult(t, m, r, c.unit)
			if math.Abs(ur.Sgen-c.sgen) > 1e-4 {
				t.Errorf("S_gen %.9g W/K, want %.9g (%s)", ur.Sgen, c.sgen, c.src)
			}
			if ur.SgenFluidOnly != c.fluidOnly {
				t.Errorf("fluid only %v, want %v", ur.SgenFluidOnly, c.fluidOnly)
			}
			if want := m.AmbientOr(); r.Ambient != want {
				t.Errorf("ambient %v, want %v", r.Ambient, want)
			}
		})
	}
}

// TestPressureDropsFollow checks that a drop follows from both pressures when both are given,
// and stays zero when nothing else fixes the outlet.
func TestPressureDropsFollow(t *testing.T) {
	cases := []struct {
		name string
		m    func(t *testing.T) *model.Model
		want []want
	}{
		{
			name: "heater with both pressures given",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("E1", flow, 1, pp, 1e6, tt, 373.15), strm("E2", pp, 0.95e6, tt, 423.15)},
					unit("H", "heater", ports("in E1", "out E2")))
			},
			want: []want{{what: "H Q", v: 212769.89134888386, tol: 1e-3, src: "W(P=0.95,T=423.15).h - W(P=1,T=373.15).h"}},
		},
		{
			name: "heater with the inlet pressure only keeps it",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("E1", flow, 1, pp, 1e6, tt, 373.15), strm("E2", tt, 423.15)},
					unit("H", "heater", ports("in E1", "out E2")))
			},
			want: []want{{what: "E2 p", v: 1e6, src: "dp taken as zero"}},
		},
		{
			name: "header with its pressure given: higher inlets throttle into it",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("G1", flow, 1, pp, 1.2e6, tt, 523.15), strm("G2", flow, 2, pp, 1e6, tt, 473.15), strm("G3", pp, 0.8e6)},
					unit("HD", "mixer", ports("in G1", "in G2", "out G3")))
			},
			want: []want{
				{what: "G3 h", v: 2864073.315386157, tol: 1e-3, src: "(W(P=1.2,T=523.15).h + 2 W(P=1,T=473.15).h) / 3"},
				{what: "G3 T", v: 483.8165051357036, tol: 1e-6, src: "W(P=0.8,h=2864.073315).T"},
				{what: "HD sgen", v: 382.84117767193317, tol: 1e-4, src: "3 s3 - s1 - 2 s2"},
			},
		},
		{
			name: "exchanger with all four pressures given",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("EXT", pp, 2e6, tt, 573.15), strm("DRN", pp, 1.95e6, xx, 0), strm("FWI", flow, 40, pp, 8e6, tt, 423.15), strm("FWO", pp, 7.9e6, tt, 478.15)},
					unit("FWH", "exchanger", ports("hot_in EXT", "hot_out DRN", "cold_in FWI", "cold_out FWO")))
			},
			want: []want{{what: "FWH Q", v: 9617674.480307247, tol: 1e-2, src: "40 (W(P=7.9,T=478.15).h - W(P=8,T=423.15).h)"}},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := c.m(t)
			r := solveModel(t, m)
			if len(r.Diags) > 0 {
				logDiags(t, r)
				t.Fatalf("%d diagnostics", len(r.Diags))
			}
			for _, w := range c.want {
				got := value(t, m, r, w.what)
				tol := w.tol
				if tol == 0 {
					tol = 1e-7 * math.Abs(w.v)
				}
				if math.Abs(got-w.v) > tol {
					t.Errorf("%s = %.10g, want %.10g (%s)", w.what, got, w.v, w.src)
				}
			}
		})
	}
}

// TestImpossiblePlants checks each error of an impossible plant: its code, place and words.
func TestImpossiblePlants(t *testing.T) {
	cases := []struct {
		name     string
		m        func(t *testing.T) *model.Model
		code     string
		sev      model.Severity
		at       func(*model.Model) model.Span
		contains []string
		absent   []string
	}{
		{
			name: "tee branch given more than the header",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("HD", flow, 3, pp, 0.7e6, tt, 473.15), strm("B1", flow, 4), strm("B2")},
					unit("TE", "splitter", ports("in HD", "out B1", "out B2")))
			},
			code: CodeNegativeFlow, sev: model.Error, at: streamAt("B2"),
			contains: []string{"B2: solved flow -1.0000 kg/s is negative", "the mass balance of splitter TE forces it", "given B1 flow 4", "given HD flow 3"},
		},
		{
			name: "the pipe after a reversed branch is named on the branch's error",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("HD", flow, 3, pp, 0.7e6, tt, 473.15), strm("B1", flow, 4), strm("B2"), strm("B3", pp, 0.5e6)},
					unit("TE", "splitter", ports("in HD", "out B1", "out B2")), unit("V", "valve", ports("in B2", "out B3")))
			},
			code: CodeNegativeFlow, sev: model.Error, at: streamAt("B2"),
			contains: []string{"B2: solved flow"},
		},
		{
			// python3-iapws: 5 (W(P=0.12,x=0).h - W(P=0.3,T=403.15).h) /
			// (W(P=0.12,T=423.15).h - W(P=0.12,x=0).h) = -0.229274 kg/s.
			name: "deaerator outlet saturated liquid below its condensate's temperature",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("DS", pp, 0.12e6, tt, 423.15), strm("DC", flow, 5, pp, 0.3e6, tt, 403.15), strm("DF", xx, 0)},
					unit("DA", "mixer", ports("in DS", "in DC", "out DF")))
			},
			code: CodeNegativeFlow, sev: model.Error, at: streamAt("DS"),
			contains: []string{"DS: solved flow -0.22927 kg/s", "the energy balance of mixer DA forces it", "given DF x 0"},
		},
		{
			// python3-iapws: (W(P=1,x=0).h - W(P=0.2,x=0).h) / (W(P=0.2,x=1).h - W(P=0.2,x=0).h)
			// = 0.117189: 11.72 % flashes, the meters say 20 %.
			name: "flash tank with all three flows metered",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("C", flow, 10, pp, 1e6, xx, 0), strm("V", flow, 2, pp, 0.2e6), strm("L", flow, 8)},
					unit("FT", "flash", ports("in C", "vapor V", "liquid L")))
			},
			code: CodeOutletState, sev: model.Error, at: unitAt("FT"),
			contains: []string{"leave its vapor outlet V as a wet mixture of quality 0.5859", "saturated vapour (quality 1)", "would flash 11.72 %", "given V flow 2 kg/s"},
		},
		{
			// A feed at 1 MPa and 700 K is superheated at 0.2 MPa even after throttling.
			name: "flash tank fed superheated steam",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("F", flow, 1, pp, 1e6, tt, 700), strm("V", pp, 0.2e6), strm("L")},
					unit("FT", "flash", ports("in F", "vapor V", "liquid L")))
			},
			code: CodeFlashFeed, sev: model.Error, at: unitAt("FT"),
			contains: []string{"is superheated at the tank pressure 200.00 kPa", "no liquid is left"},
			absent:   []string{CodeNegativeFlow},
		},
		{
			name: "flash feed below the tank pressure",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("F", flow, 1, pp, 0.2e6, xx, 0.5), strm("V", pp, 0.3e6), strm("L")},
					unit("FT", "flash", ports("in F", "vapor V", "liquid L")))
			},
			code: CodePressureRise, sev: model.Error, at: unitAt("FT"),
			contains: []string{"feed F at 200.00 kPa is below the tank pressure 300.00 kPa"},
			absent:   []string{CodeEntropy},
		},
		{
			name: "desuperheater spray water below the steam pressure",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S", flow, 10, pp, 4e6, tt, 723.15), strm("W", pp, 3e6, tt, 393.15), strm("O", tt, 623.15)},
					unit("DS", "desuperheater", ports("steam S", "water W", "out O")))
			},
			code: CodePressureRise, sev: model.Error, at: unitAt("DS"),
			contains: []string{"spray water W at 3000.0 kPa is below the steam S at 4000.0 kPa"},
		},
		{
			// python3-iapws: W(P=4, h=(10 W(P=4,T=673.15).h + 3 W(P=6,T=393.15).h)/13).x = 0.876799.
			name: "desuperheater over-sprayed into wet steam",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S", flow, 10, pp, 4e6, tt, 673.15), strm("W", flow, 3, pp, 6e6, tt, 393.15), strm("O")},
					unit("DS", "desuperheater", ports("steam S", "water W", "out O")))
			},
			code: CodeOverspray, sev: model.Warning, at: unitAt("DS"),
			contains: []string{"outlet O is wet (quality 0.8768"},
		},
		{
			name: "mixer inlet below the outlet pressure given",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("A", flow, 1, pp, 0.5e6, tt, 473.15), strm("B", flow, 1, pp, 0.3e6, tt, 423.15), strm("O", pp, 0.4e6)},
					unit("MX", "mixer", ports("in A", "in B", "out O")))
			},
			code: CodePressureRise, sev: model.Error, at: unitAt("MX"),
			contains: []string{"inlet B at 300.00 kPa is below the outlet O at 400.00 kPa"},
		},
		{
			name: "exchanger side gaining pressure",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("H1", flow, 1, pp, 0.5e6, tt, 473.15), strm("H2", tt, 373.15), strm("C1", flow, 2, pp, 0.3e6, tt, 303.15), strm("C2", pp, 0.4e6)},
					unit("X", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2")))
			},
			code: CodePressureRise, sev: model.Error, at: unitAt("X"),
			contains: []string{"cold side outlet C2 at 400.00 kPa is above inlet C1 at 300.00 kPa", "a gain of 100.00 kPa"},
		},
		{
			name: "pump discharge below its suction",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("P0", flow, 5, pp, 1e6, tt, 333.15), strm("P2", pp, 0.8e6)},
					unit("BP", "pump", ports("in P0", "out P2"), "efficiency", 0.75))
			},
			code: CodePressureRise, sev: model.Error, at: unitAt("BP"),
			contains: []string{"outlet P2 at 800.00 kPa is below inlet P0 at 1000.0 kPa: a pump raises the pressure"},
			absent:   []string{CodeEntropy, CodeEfficiency},
		},
		{
			name: "heater whose source is colder than the water it heats",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("W1", flow, 2, pp, 2e6, tt, 373.15), strm("W2", tt, 453.15)},
					unit("H", "heater", ports("in W1", "out W2"), "T_boundary", 423.15))
			},
			code: CodeTempCross, sev: model.Error, at: unitAt("H"),
			contains: []string{"its heat comes in at T_boundary", "W2 is at 180.00 C"},
			absent:   []string{CodeEntropy},
		},
		{
			name: "exchanger with its roles the wrong way round",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("H1", flow, 2, pp, 0.3e6, tt, 293.15), strm("H2", tt, 333.15), strm("C1", flow, 2, pp, 0.3e6, tt, 363.15), strm("C2")},
					unit("X", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2")))
			},
			code: CodeTempCross, sev: model.Error, at: unitAt("X"),
			contains: []string{"the duty is -334.", "heat passes from the cold side (C1 90.000 C", "swap the hot and cold roles"},
			absent:   []string{CodeEntropy},
		},
		{
			// Heat gained from 25 C surroundings cannot warm water at about 87 C: the mixed water
			// gains about 100 kW / 360 K of entropy, the surroundings lose 100 kW / 298.15 K.
			name: "heat gained from colder surroundings",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("A", flow, 2, pp, 0.3e6, tt, 348.15), strm("B", flow, 0.5, pp, 0.3e6, tt, 363.15), strm("O")},
					unit("TK", "mixer", ports("in A", "in B", "out O"), "heat_loss", -100e3))
			},
			code: CodeEntropy, sev: model.Error, at: unitAt("TK"),
			contains: []string{"destroys entropy", "with the heat loss leaving at the ambient 25.000 C"},
		},
		{
			name: "exchanger closer than its min_approach",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("H1", flow, 2, pp, 0.3e6, tt, 363.15), strm("H2", tt, 323.15), strm("C1", flow, 2, pp, 0.3e6, tt, 293.15), strm("C2")},
					unit("X", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2"), "min_approach", 35))
			},
			code: CodeApproach, sev: model.Warning, at: unitAt("X"),
			contains: []string{"the closest approach is 29.911 dK at the hot inlet end, below min_approach 35"},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := c.m(t)
			r := solveModel(t, m)
			var d *model.Diagnostic
			for i := range r.Diags {
				if r.Diags[i].Code == c.code && r.Diags[i].Span == c.at(m) {
					d = &r.Diags[i]
					break
				}
			}
			if d == nil {
				logDiags(t, r)
				t.Fatalf("no %s at %v", c.code, c.at(m))
			}
			if d.Severity != c.sev {
				t.Errorf("severity %v, want %v", d.Severity, c.sev)
			}
			for _, s := range c.contains {
				if !strings.Contains(d.Message, s) {
					t.Errorf("message %q lacks %q", d.Message, s)
				}
			}
			for _, code := range c.absent {
				if findDiag(r, code) != nil {
					t.Errorf("%s reported: %s", code, findDiag(r, code).Message)
				}
			}
		})
	}
}

// TestNegativeFlowFollowers checks that a stream whose flow follows from a reversed one gets no
// error of its own.
func TestNegativeFlowFollowers(t *testing.T) {
	m := mk(t, streams{strm("HD", flow, 3, pp, 0.7e6, tt, 473.15), strm("B1", flow, 4), strm("B2"), strm("B3", pp, 0.5e6)},
		unit("TE", "splitter", ports("in HD", "out B1", "out B2")), unit("V", "valve", ports("in B2", "out B3")))
	r := solveModel(t, m)
	n := 0
	for _, d := range r.Diags {
		if d.Code == CodeNegativeFlow {
			n++
			if len(d.Related) == 0 || !strings.Contains(d.Related[len(d.Related)-1].Message, "B3 follows from it") {
				t.Errorf("the follower B3 is not named: %+v", d.Related)
			}
		}
	}
	if n != 1 {
		logDiags(t, r)
		t.Errorf("%d negative-flow errors, want 1", n)
	}
}

// TestEntropyToleranceScale checks that a balance closing within the tolerance does not read as
// destroying entropy, and that the tolerance does not follow the enthalpy datum: a valve whose
// outlet enthalpy is 0.05 % below its inlet's at the same pressure closes (0.05 % of the inlet's
// enthalpy flow), and its entropy change, about -2.6 J/(kg K) against s = 6.77 kJ/(kg K), is
// within relTol of its entropy flow (python3-iapws: W(P=2,T=573.15).h = 3024.2519 kJ/kg,
// s = 6.7685 kJ/(kg K); ds = dh / T at constant p).
func TestEntropyToleranceScale(t *testing.T) {
	h1 := 3024.251875761745e3
	m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 2e6, hh, h1*(1-0.0005))}, unit("V1", "valve", ports("in S1", "out S2")))
	r := solveModel(t, m)
	if d := findDiag(r, CodeEntropy); d != nil {
		t.Errorf("within the closure tolerance, yet %s: %s", d.Code, d.Message)
	}
	if sg := r.Units[0].Sgen; !(sg < 0) {
		t.Errorf("S_gen %g: the test means a small negative value", sg)
	}
}
