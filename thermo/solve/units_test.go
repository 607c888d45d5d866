package solve

import (
	"math"
	"testing"

	"hmb/thermo/model"
)

// Reference values in this file were computed with Debian's python3-iapws 1.5.2 (IAPWS97 class,
// IAPWS-IF97 forward equations with Newton refinement for (P,h) and (P,s)), the balance of each
// unit written out by hand in Python:
//
//	from iapws import IAPWS97 as W   # P in MPa, T in K, h in kJ/kg, s in kJ/(kg K)
//
// Each row's src names the call that produced the number.

const (
	flow = model.Flow
	pp   = model.P
	tt   = model.T
	hh   = model.H
	ss   = model.S
	xx   = model.X
)

// want is one solved value and the reference it is checked against.
type want struct {
	what string  // "S3 T", "M1 sgen" (see value)
	v    float64 // SI
	tol  float64 // absolute; 0 means 1e-7 relative
	src  string
}

func TestUnitKinds(t *testing.T) {
	cases := []struct {
		name    string
		streams []*model.Stream
		units   []unitDef
		want    []want
	}{
		{
			name: "mixer: steam and water to a wet mixture",
			streams: []*model.Stream{
				strm("S1", flow, 2, pp, 1e6, tt, 523.15),
				strm("S2", flow, 3, pp, 1e6, tt, 313.15),
				strm("S3"),
			},
			units: []unitDef{unit("M1", "mixer", ports("in S1", "in S2", "out S3"))},
			want: []want{
				{what: "S3 flow", v: 5, src: "mass balance 2 + 3"},
				{what: "S3 p", v: 1e6, src: "lowest inlet pressure"},
				{what: "S3 h", v: 1278341.258177, src: "(2 W(P=1,T=523.15).h + 3 W(P=1,T=313.15).h) / 5"},
				{what: "S3 T", v: 453.035632, src: "W(P=1,h=1278.341258).T"},
				{what: "S3 x", v: 0.2559814441150933, tol: 1e-9, src: "W(P=1,h=1278.341258).x"},
				{what: "S3 s", v: 3276.665039, src: "W(P=1,h=1278.341258).s"},
				{what: "M1 sgen", v: 813.9463660950748, tol: 1e-4, src: "5 s3 - 2 s1 - 3 s2"},
			},
		},
		{
			name: "mixer with heat loss and pressure drop",
			streams: []*model.Stream{
				strm("S1", flow, 2, pp, 1e6, tt, 523.15),
				strm("S2", flow, 3, pp, 1e6, tt, 313.15),
				strm("S3"),
			},
			units: []unitDef{unit("M1", "mixer", ports("in S1", "in S2", "out S3"), "heat_loss", 50e3, "dp", 0.05e6)},
			want: []want{
				{what: "S3 p", v: 0.95e6, src: "1 MPa less 0.05 MPa"},
				{what: "S3 h", v: 1268341.258177, src: "(2 h1 + 3 h2 - 50 kW) / 5"},
				{what: "S3 T", v: 450.818737, src: "W(P=0.95,h=1268.341258).T"},
				{what: "S3 x", v: 0.2548843841203908, tol: 1e-9, src: "W(P=0.95,h=1268.341258).x"},
				{what: "M1 sgen", v: 899.611966942015, tol: 1e-4, src: "5 s3 - 2 s1 - 3 s2 + 50 kW / 298.15 K"},
			},
		},
		{
			name: "splitter: outlets at the inlet state",
			streams: []*model.Stream{
				strm("S1", flow, 4, pp, 2e6, tt, 573.15),
				strm("S2", flow, 1.5),
				strm("S3"),
			},
			units: []unitDef{unit("T1", "splitter", ports("in S1", "out S2", "out S3"))},
			want: []want{
				{what: "S3 flow", v: 2.5, src: "mass balance 4 - 1.5"},
				{what: "S2 h", v: 3024251.875762, src: "W(P=2,T=573.15).h"},
				{what: "S3 T", v: 573.15, tol: 1e-6, src: "inlet T"},
				{what: "S3 s", v: 6768.515328, src: "W(P=2,T=573.15).s"},
				{what: "T1 sgen", v: 0, tol: 1e-6, src: "no change of state"},
			},
		},
		{
			name: "valve: throttling 2 MPa 300 C steam to 0.5 MPa",
			streams: []*model.Stream{
				strm("S1", flow, 2, pp, 2e6, tt, 573.15),
				strm("S2", pp, 0.5e6),
			},
			units: []unitDef{unit("V1", "valve", ports("in S1", "out S2"))},
			want: []want{
				{what: "S2 h", v: 3024251.875762, src: "W(P=2,T=573.15).h"},
				{what: "S2 T", v: 553.622376, src: "W(P=0.5,h=3024.251876).T"},
				{what: "S2 s", v: 7389.830027, src: "W(P=0.5,h=3024.251876).s"},
				{what: "V1 sgen", v: 1242.6293975005826, tol: 1e-4, src: "2 (s2 - s1)"},
			},
		},
		{
			name: "heater: duty and pressure drop into the dome",
			streams: []*model.Stream{
				strm("S1", flow, 3, pp, 0.5e6, tt, 293.15),
				strm("S2"),
			},
			units: []unitDef{unit("H1", "heater", ports("in S1", "out S2"), "duty", 2e6, "dp", 20e3)},
			want: []want{
				{what: "S2 p", v: 0.48e6, src: "0.5 MPa less 20 kPa"},
				{what: "S2 h", v: 751054.856244, src: "W(P=0.5,T=293.15).h + 2 MW / 3 kg/s"},
				{what: "S2 T", v: 423.454515, src: "W(P=0.48,h=751.054856).T"},
				{what: "S2 x", v: 0.05560999935547584, tol: 1e-9, src: "W(P=0.48,h=751.054856).x"},
				{what: "H1 Q", v: 2e6, src: "given"},
				{what: "H1 sgen", v: 3.0698338263639435, tol: 1e-4, src: "3 (s(0.48 MPa, h2) - s(0.5 MPa, h2))"},
			},
		},
		{
			name: "cooler: duty from the outlet temperature",
			streams: []*model.Stream{
				strm("S1", flow, 1, pp, 0.2e6, tt, 473.15),
				strm("S2", tt, 323.15),
			},
			units: []unitDef{unit("C1", "cooler", ports("in S1", "out S2"))},
			want: []want{
				{what: "C1 Q", v: 2661281.237078441, tol: 1e-3, src: "W(P=0.2,T=473.15).h - W(P=0.2,T=323.15).h"},
				{what: "S2 h", v: 209498.046711, src: "W(P=0.2,T=323.15).h"},
				{what: "C1 sgen", v: 0, tol: 1e-6, src: "no pressure drop: no entropy generated inside the boundary"},
			},
		},
		{
			name: "boiler: duty and fuel from the efficiency",
			streams: []*model.Stream{
				strm("S1", flow, 10, pp, 12e6, tt, 473.15),
				strm("S2", tt, 753.15),
			},
			units: []unitDef{unit("B1", "boiler", ports("in S1", "out S2"), "dp", 0.5e6, "efficiency", 0.88)},
			want: []want{
				{what: "S2 p", v: 11.5e6, src: "12 MPa less 0.5 MPa"},
				{what: "S2 h", v: 3302258.992625, src: "W(P=11.5,T=753.15).h"},
				{what: "B1 Q", v: 24454708.3218073, tol: 1e-2, src: "10 (W(P=11.5,T=753.15).h - W(P=12,T=473.15).h)"},
				{what: "B1 fuel", v: 27789441.274781022, tol: 1e-2, src: "duty / 0.88"},
			},
		},
		{
			name: "turbine: 6 MPa 450 C to 0.2 MPa at 85 %",
			streams: []*model.Stream{
				strm("S1", flow, 8, pp, 6e6, tt, 723.15),
				strm("S2", pp, 0.2e6),
			},
			units: []unitDef{unit("TB", "turbine", ports("in S1", "out S2"), "efficiency", 0.85)},
			want: []want{
				{what: "S2 h", v: 2660230.035427, src: "h1 - 0.85 (h1 - W(P=0.2,s=s1).h), s1 from W(P=6,T=723.15)"},
				{what: "S2 T", v: 393.361546, src: "W(P=0.2,h=2660.230035).T"},
				{what: "S2 x", v: 0.9791005658339903, tol: 1e-9, src: "W(P=0.2,h=2660.230035).x"},
				{what: "TB W", v: 5140268.022573583, tol: 1e-2, src: "8 (h1 - h2)"},
				{what: "TB sgen", v: 2306.0281756640393, tol: 1e-4, src: "8 (s2 - s1)"},
			},
		},
		{
			name: "pump: condensate 10 kPa to 8 MPa at 75 %",
			streams: []*model.Stream{
				strm("S1", flow, 5, pp, 10e3, xx, 0),
				strm("S2", pp, 8e6),
			},
			units: []unitDef{unit("P1", "pump", ports("in S1", "out S2"), "efficiency", 0.75)},
			want: []want{
				{what: "S1 h", v: 191812.295194, src: "W(P=0.01,x=0).h"},
				{what: "S2 h", v: 202556.769248, tol: 1e-3, src: "h1 + (W(P=8,s=s1).h - h1) / 0.75"},
				{what: "S2 T", v: 319.867744, src: "W(P=8,h=202.556769).T"},
				{what: "P1 W", v: 53722.37027294192, tol: 1e-2, src: "5 (h2 - h1)"},
				{what: "P1 sgen", v: 42.0303843268377, tol: 1e-4, src: "5 (s2 - s1)"},
			},
		},
		{
			name: "exchanger: condensing steam sizes the cooling water flow",
			streams: []*model.Stream{
				strm("H1", flow, 2, pp, 0.3e6, xx, 1),
				strm("H2", xx, 0),
				strm("C1", pp, 1e6, tt, 303.15),
				strm("C2", tt, 363.15),
			},
			units: []unitDef{unit("X1", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2"), "dp_cold", 50e3)},
			want: []want{
				{what: "X1 Q", v: 4326872.512599086, tol: 1e-2, src: "2 (W(P=0.3,x=1).h - W(P=0.3,x=0).h)"},
				{what: "C1 flow", v: 17.23880592485374, src: "duty / (W(P=0.95,T=363.15).h - W(P=1,T=303.15).h)"},
				{what: "C2 p", v: 0.95e6, src: "1 MPa less 50 kPa"},
				{what: "H2 T", v: 406.67535794654543, tol: 1e-6, src: "W(P=0.3,x=0).T"},
				{what: "X1 sgen", v: 2384.8821901872434, tol: 1e-3, src: "2 (s_H2 - s_H1) + m_c (s_C2 - s_C1)"},
			},
		},
		{
			name: "flash: saturated liquid 1 MPa into a 0.2 MPa tank",
			streams: []*model.Stream{
				strm("F", flow, 2, pp, 1e6, xx, 0),
				strm("V", pp, 0.2e6),
				strm("L"),
			},
			units: []unitDef{unit("FT", "flash", ports("in F", "vapor V", "liquid L"))},
			want: []want{
				{what: "V flow", v: 0.23437861540574978, src: "2 (W(P=1,x=0).h - W(P=0.2,x=0).h) / (W(P=0.2,x=1).h - W(P=0.2,x=0).h)"},
				{what: "L flow", v: 1.76562138459425, src: "2 - vapour flow"},
				{what: "V x", v: 1, tol: 1e-15, src: "saturated vapour, exactly"},
				{what: "L x", v: 0, tol: 1e-15, src: "saturated liquid, exactly"},
				{what: "L T", v: 393.3615459364888, tol: 1e-6, src: "W(P=0.2,x=0).T"},
				{what: "FT sgen", v: 95.09413583437353, tol: 1e-4, src: "m_v s_v + m_l s_l - 2 s_F"},
			},
		},
		{
			name: "desuperheater: spray flow to reach 300 C",
			streams: []*model.Stream{
				strm("ST", flow, 10, pp, 4e6, tt, 693.15),
				strm("WA", pp, 5e6, tt, 393.15),
				strm("OUT", tt, 573.15),
			},
			units: []unitDef{unit("DS", "desuperheater", ports("steam ST", "water WA", "out OUT"))},
			want: []want{
				{what: "WA flow", v: 1.2210589113471675, src: "10 (W(P=4,T=693.15).h - W(P=4,T=573.15).h) / (h_out - W(P=5,T=393.15).h)"},
				{what: "OUT flow", v: 11.221058911347168, src: "10 + spray"},
				{what: "OUT p", v: 4e6, src: "steam pressure"},
				{what: "DS sgen", v: 1148.8492880785968, tol: 1e-3, src: "m_out s_out - 10 s_steam - m_w s_w"},
			},
		},
		{
			name: "exchanger with heat loss and a hot-side pressure drop",
			streams: []*model.Stream{
				strm("H1", flow, 2, pp, 0.3e6, xx, 1),
				strm("H2", xx, 0),
				strm("C1", pp, 1e6, tt, 303.15),
				strm("C2", tt, 363.15),
			},
			units: []unitDef{unit("X1", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2"),
				"dp_cold", 50e3, "dp_hot", 20e3, "heat_loss", 50e3)},
			want: []want{
				{what: "X1 Q", v: 4296860.086476519, tol: 1e-2, src: "2 (W(P=0.3,x=1).h - W(P=0.28,x=0).h) - 50 kW"},
				{what: "C1 flow", v: 17.119232633116017, src: "duty / (W(P=0.95,T=363.15).h - W(P=1,T=303.15).h)"},
				{what: "H2 T", v: 404.3378062957247, tol: 1e-6, src: "W(P=0.28,x=0).T"},
				{what: "X1 sgen", v: 2413.0567135528445, tol: 1e-3, src: "2 (s_H2 - s_H1) + m_c (s_C2 - s_C1) + 50 kW / 298.15 K"},
			},
		},
		{
			name: "heater: duty from the outlet temperature",
			streams: []*model.Stream{
				strm("S1", flow, 3, pp, 0.5e6, tt, 293.15),
				strm("S2", tt, 393.15),
			},
			units: []unitDef{unit("H1", "heater", ports("in S1", "out S2"), "dp", 20e3)},
			want:  []want{{what: "H1 Q", v: 1258782.2585675244, tol: 1e-3, src: "3 (W(P=0.48,T=393.15).h - W(P=0.5,T=293.15).h)"}},
		},
		{
			name: "mixer: an inlet at unknown pressure enters at the outlet pressure plus the drop",
			streams: []*model.Stream{
				strm("S1", flow, 2, pp, 1e6, tt, 523.15),
				strm("S2", flow, 3, hh, 168420.653473),
				strm("S3", pp, 1e6),
			},
			units: []unitDef{unit("M1", "mixer", ports("in S1", "in S2", "out S3"))},
			want: []want{
				{what: "S2 p", v: 1e6, tol: 1e-3, src: "mixer pressure rule (doc comment of mixer.go)"},
				{what: "S3 h", v: 1278341.258177, src: "as the first mixer row: W(P=1,T=313.15).h given as h"},
			},
		},
		{
			// Values from testdata/examples/expected.py (waste_to_energy_cycle), python3-iapws.
			name:    "closed loop: regenerative cycle with an open feedwater heater",
			streams: regenStreams(true),
			units:   regenUnits(),
			want: []want{
				{what: "BLD flow", v: 4.042540199567469, src: "m (h_X - h_FW1) / (h_X - h_CN2), bleed = 28 - that"},
				{what: "FW1 T", v: 413.00299129047136, tol: 1e-6, src: "W(P=0.36,x=0).T"},
				{what: "FW2 h", v: 594444.3321520806, tol: 1e-3, src: "feed pump 0.36 to 4.5 MPa at 76 %"},
				{what: "SG Q", v: 73592703.25866278, tol: 1e-1, src: "28 (h_MS - h_FW2)"},
				{what: "ACC Q", v: 51668736.40095939, tol: 1e-1, src: "m_LP (h_EXH - h_CN)"},
			},
		},
		// Inverse problems: the same units, with the answer of a row above given and one of its
		// givens left for the solver to find (Newton through IF97 instead of a direct formula).
		{
			name: "inverse turbine: outlet pressure from power and efficiency",
			streams: []*model.Stream{
				strm("S1", flow, 8, pp, 6e6, tt, 723.15),
				strm("S2"),
			},
			units: []unitDef{unit("TB", "turbine", ports("in S1", "out S2"), "efficiency", 0.85, "power", 5140268.022573583)},
			want:  []want{{what: "S2 p", v: 0.2e6, tol: 0.2, src: "the forward turbine row: 0.2 MPa gives this power"}},
		},
		{
			name: "inverse turbine: efficiency from power",
			streams: []*model.Stream{
				strm("S1", flow, 8, pp, 6e6, tt, 723.15),
				strm("S2", pp, 0.2e6),
			},
			units: []unitDef{unit("TB", "turbine", ports("in S1", "out S2"), "power", 5140268.022573583)},
			want:  []want{{what: "TB eff", v: 0.85, tol: 1e-9, src: "the forward turbine row"}},
		},
		{
			name: "inverse pump: discharge pressure from power and efficiency",
			streams: []*model.Stream{
				strm("S1", flow, 5, pp, 10e3, xx, 0),
				strm("S2"),
			},
			units: []unitDef{unit("P1", "pump", ports("in S1", "out S2"), "efficiency", 0.75, "power", 53722.37027294192)},
			want:  []want{{what: "S2 p", v: 8e6, tol: 8, src: "the forward pump row: 8 MPa takes this power"}},
		},
		{
			name: "inverse heater: flow from duty and outlet temperature",
			streams: []*model.Stream{
				strm("S1", pp, 0.5e6, tt, 293.15),
				strm("S2", tt, 400),
			},
			units: []unitDef{unit("H1", "heater", ports("in S1", "out S2"), "duty", 2e6, "dp", 20e3)},
			want: []want{{what: "S1 flow", v: 4.457134346630119,
				src: "2 MW / (W(P=0.48,T=400).h - W(P=0.5,T=293.15).h)"}},
		},
		{
			name: "inverse valve: inlet pressure from inlet and outlet temperatures",
			streams: []*model.Stream{
				strm("S1", flow, 2, tt, 573.15),
				strm("S2", pp, 0.5e6, tt, 553.622376),
			},
			units: []unitDef{unit("V1", "valve", ports("in S1", "out S2"))},
			want:  []want{{what: "S1 p", v: 2e6, tol: 1, src: "the forward valve row (T2 to 6 decimals)"}},
		},
		{
			name: "inverse flash: feed flow from the flash steam",
			streams: []*model.Stream{
				strm("F", pp, 1e6, xx, 0),
				strm("V", flow, 0.23437861540574978, pp, 0.2e6),
				strm("L"),
			},
			units: []unitDef{unit("FT", "flash", ports("in F", "vapor V", "liquid L"))},
			want:  []want{{what: "F flow", v: 2, src: "the forward flash row"}},
		},
		{
			name: "inverse desuperheater: steam flow from the outlet flow",
			streams: []*model.Stream{
				strm("ST", pp, 4e6, tt, 693.15),
				strm("WA", pp, 5e6, tt, 393.15),
				strm("OUT", flow, 11.221058911347168, tt, 573.15),
			},
			units: []unitDef{unit("DS", "desuperheater", ports("steam ST", "water WA", "out OUT"))},
			want: []want{
				{what: "ST flow", v: 10, src: "the forward desuperheater row"},
				{what: "WA flow", v: 1.2210589113471675, src: "the forward desuperheater row"},
			},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := mk(t, c.streams, c.units...)
			r := solveModel(t, m)
			if errs := errorsOf(r); len(errs) > 0 {
				logDiags(t, r)
				t.Fatalf("%d errors", len(errs))
			}
			for _, w := range c.want {
				got := value(t, m, r, w.what)
				tol := w.tol
				if tol == 0 {
					tol = 1e-7 * math.Abs(w.v)
				}
				if !(math.Abs(got-w.v) <= tol) {
					t.Errorf("%s = %.10g, want %.10g ± %.3g (%s)", w.what, got, w.v, tol, w.src)
				}
			}
		})
	}
}

// regenStreams and regenUnits are a closed regenerative cycle: HP turbine, bleed tee, LP
// turbine, condenser, condensate pump, open feedwater heater, feed pump, steam generator. With
// cn2P false the condensate pump's discharge pressure is left out, which leaves the deaerator
// pressure free.
func regenStreams(cn2P bool) []*model.Stream {
	cn2 := strm("CN2")
	if cn2P {
		cn2 = strm("CN2", pp, 0.36e6)
	}
	return []*model.Stream{
		strm("MS", flow, 28, pp, 4.2e6, tt, 678.15),
		strm("X", pp, 0.36e6),
		strm("BLD"), strm("LPI"),
		strm("EXH", pp, 14e3),
		strm("CN", xx, 0),
		cn2,
		strm("FW1", xx, 0),
		strm("FW2"),
	}
}

func regenUnits() []unitDef {
	return []unitDef{
		unit("HPS", "turbine", ports("in MS", "out X"), "efficiency", 0.81),
		unit("TEE", "splitter", ports("in X", "out BLD", "out LPI")),
		unit("LPS", "turbine", ports("in LPI", "out EXH"), "efficiency", 0.78),
		unit("ACC", "cooler", ports("in EXH", "out CN")),
		unit("CEP", "pump", ports("in CN", "out CN2"), "efficiency", 0.7),
		unit("DA", "mixer", ports("in BLD", "in CN2", "out FW1")),
		unit("BFP", "pump", ports("in FW1", "out FW2"), "efficiency", 0.76),
		unit("SG", "boiler", ports("in FW2", "out MS"), "dp", 0.3e6),
	}
}
