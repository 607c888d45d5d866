package solve

import (
	"math"
	"strings"
	"testing"

	"hmb/thermo/model"
)

// References from python3-iapws 1.5.2 (W = IAPWS97; P in MPa, T in K, h in kJ/kg), the
// balances written out by hand in Python:
//
//	hc = W(P=0.3, T=353.15).h = 335.149713184984    condensate return
//	hm = W(P=0.3, T=288.15).h = 63.269221107942     make-up water
//	hs = W(P=0.3, T=473.15).h = 2865.9520394954516  heating steam
//	hf = W(P=0.13, x=0).h = 449.1316161056175       tank water, Tsat 380.2594527326265 K
//	hg = W(P=0.13, x=1).h = 2686.649521051863       vent steam
const (
	daHC, daHM, daHS = 335.149713184984e3, 63.269221107942e3, 2865.9520394954516e3
	daHF, daHG       = 449.1316161056175e3, 2686.649521051863e3
)

func deaeratorPlant(t *testing.T, vent *model.Stream, params ...any) *model.Model {
	return mk(t, streams{
		strm("CR", flow, 8, pp, 0.3e6, tt, 353.15), strm("MU", flow, 2, pp, 0.3e6, tt, 288.15), strm("LS", pp, 0.3e6, tt, 473.15),
		vent, strm("FW", pp, 0.13e6)},
		unit("DA", "deaerator", ports("in CR", "in MU", "in LS", "vent "+vent.Name, "out FW"), params...))
}

func TestDeaerator(t *testing.T) {
	t.Run("vent flow given: the balances size the heating steam", func(t *testing.T) {
		m := deaeratorPlant(t, strm("VT", flow, 0.02))
		r := solveModel(t, m)
		if errs := errorsOf(r); len(errs) > 0 {
			logDiags(t, r)
			t.Fatal("errors")
		}
		// ms = (0.02 hg + 9.98 hf - 8 hc - 2 hm) / (hs - hf)
		ms := (0.02*daHG + 9.98*daHF - 8*daHC - 2*daHM) / (daHS - daHF)
		for _, w := range []want{
			{what: "LS flow", v: ms, src: "energy balance: 0.7151256894110432 kg/s"},
			{what: "FW flow", v: 10 + ms - 0.02, src: "mass balance: 10.695125689411043 kg/s"},
			{what: "FW T", v: 380.2594527326265, src: "W(P=0.13, x=0).T"},
			{what: "FW h", v: daHF, src: "W(P=0.13, x=0).h"},
			{what: "VT h", v: daHG, src: "W(P=0.13, x=1).h"},
			{what: "VT p", v: 0.13e6, src: "vent at the tank pressure"},
			{what: "DA sgen", v: 695.434800986714, tol: 1e-3, src: "0.02 s_g + m_out s_f - sum m_k s_k, W(...).s"},
		} {
			if got := value(t, m, r, w.what); !close(got, w) {
				t.Errorf("%s = %.12g, want %.12g (%s)", w.what, got, w.v, w.src)
			}
		}
		sub := model.Subject{Kind: model.UnitSubject, Index: 0}
		if v, _, _ := r.Value(m, sub, "dp"); math.Abs(v-0.17e6) > 1e-3 {
			t.Errorf("dp %g, want 0.3 - 0.13 MPa", v)
		}
		if v, _, _ := r.Value(m, sub, "vent_rate"); math.Abs(v-0.02/(10+ms-0.02)) > 1e-12 {
			t.Errorf("vent_rate %g", v)
		}
	})
	t.Run("vent_rate and a heat loss", func(t *testing.T) {
		// mout from 8 hc + 2 hm + (1.005 mout - 10) hs = mout (0.005 hg + hf) + 20 kW.
		m := deaeratorPlant(t, strm("VT"), "vent_rate", 0.005, "heat_loss", 20e3)
		r := solveModel(t, m)
		if errs := errorsOf(r); len(errs) > 0 {
			logDiags(t, r)
			t.Fatal("errors")
		}
		mout := (8*daHC + 2*daHM - 10*daHS - 20e3) / (0.005*daHG + daHF - 1.005*daHS)
		for _, w := range []want{
			{what: "FW flow", v: mout, src: "10.700915339681778 kg/s"},
			{what: "LS flow", v: 1.005*mout - 10, src: "0.7544199163801864 kg/s"},
			{what: "VT flow", v: 0.005 * mout, src: "0.05350457669840889 kg/s"},
		} {
			if got := value(t, m, r, w.what); !close(got, w) {
				t.Errorf("%s = %.12g, want %.12g (%s)", w.what, got, w.v, w.src)
			}
		}
	})
	t.Run("too little heating steam", func(t *testing.T) {
		// 0.3 kg/s of steam cannot heat 10 kg/s to saturation: the balances send steam in
		// through the vent.
		m := deaeratorPlant(t, strm("VT"))
		m.Streams[2].Given[model.Flow] = &model.Given{Value: 0.3, Span: model.Span{Start: 9000, End: 9005}}
		r := solveModel(t, m)
		if v := value(t, m, r, "VT flow"); !(v < 0) {
			t.Errorf("vent flow %g, want below zero", v)
		}
		d := findDiag(r, CodeDeaeratorFeed)
		if d == nil || !strings.Contains(d.Message, "subcooled") || !strings.Contains(d.Message, "vent VT") {
			logDiags(t, r)
			t.Fatalf("no subcooled-feed error: %+v", d)
		}
		if findDiag(r, CodeNegativeFlow) != nil {
			t.Error("the reversed vent is reported again as a negative flow")
		}
	})
	t.Run("an inlet below the tank pressure", func(t *testing.T) {
		m := deaeratorPlant(t, strm("VT", flow, 0.02))
		m.Streams[4].Given[model.P].Value = 0.4e6
		r := solveModel(t, m)
		if findDiag(r, CodePressureRise) == nil {
			logDiags(t, r)
			t.Error("no flow-against-pressure error")
		}
	})
}

// A boiler purging 3 % of its 10 kg/s of feedwater (W(P=4.5, T=378.15).h =
// 443.45462814515747 kJ/kg) as saturated water at the 4 MPa drum (W(P=4, x=0).h =
// 1087.4260238647876, T 523.5075191240655 K), raising 9.7 kg/s of steam at W(P=4,
// T=673.15).h = 3214.3735088712324: duty = 9.7 h_st + 0.3 h_bd - 10 h_fw = 27071.104561758817 kW.
func TestBoilerBlowdown(t *testing.T) {
	const duty = 27071.104561758817e3
	for _, tc := range []struct {
		name string
		bd   *model.Stream
		rate float64
	}{
		{"blowdown_rate", strm("BD"), 0.03},
		{"blowdown flow given", strm("BD", flow, 0.3), 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var params []any
			if tc.rate > 0 {
				params = []any{"blowdown_rate", tc.rate}
			}
			m := mk(t, streams{strm("FW", flow, 10, pp, 4.5e6, tt, 378.15), strm("ST", pp, 4e6, tt, 673.15), tc.bd},
				unit("B1", "boiler", ports("in FW", "out ST", "blowdown BD"), params...))
			r := solveModel(t, m)
			if errs := errorsOf(r); len(errs) > 0 {
				logDiags(t, r)
				t.Fatal("errors")
			}
			for _, w := range []want{
				{what: "BD flow", v: 0.3, src: "3 % of 10 kg/s"},
				{what: "ST flow", v: 9.7, src: "mass balance"},
				{what: "BD p", v: 4e6, src: "drum at the steam pressure"},
				{what: "BD T", v: 523.5075191240655, src: "W(P=4, x=0).T"},
				{what: "BD x", v: 0, tol: 1e-9, src: "saturated liquid"},
				{what: "B1 Q", v: duty, src: "9.7 h_st + 0.3 h_bd - 10 h_fw"},
			} {
				if got := value(t, m, r, w.what); !close(got, w) {
					t.Errorf("%s = %.12g, want %.12g (%s)", w.what, got, w.v, w.src)
				}
			}
			if v, _, _ := r.Value(m, model.Subject{Kind: model.UnitSubject, Index: 0}, "blowdown_rate"); math.Abs(v-0.03) > 1e-9 {
				t.Errorf("blowdown_rate %g", v)
			}
			if r.Units[0].MassOut != 10 && math.Abs(r.Units[0].MassOut-10) > 1e-9 {
				t.Errorf("mass out %g: the blowdown is an outlet", r.Units[0].MassOut)
			}
		})
	}
	// Without a blowdown stream the boiler is what it was, and has no blowdown_rate.
	m := mk(t, streams{strm("FW", flow, 10, pp, 4.5e6, tt, 378.15), strm("ST", pp, 4e6, tt, 673.15)},
		unit("B1", "boiler", ports("in FW", "out ST")))
	r := solveModel(t, m)
	if v, _, ok := r.Value(m, model.Subject{Kind: model.UnitSubject, Index: 0}, "blowdown_rate"); !ok || !math.IsNaN(v) {
		t.Errorf("blowdown_rate without blowdown %g, %v", v, ok)
	}
}

// A volume flow of water, 100 m3/h at 0.5 MPa and 333.15 K: W(P=0.5, T=333.15).rho =
// 983.3843437995022 kg/m3, so 27.316231772208393 kg/s. The same on steam is an error at the
// given.
func TestVolumeFlow(t *testing.T) {
	vol := func(s *model.Stream, v float64) *model.Stream {
		s.VolFlow = &model.Given{Value: v, Unit: "m3/h", Span: model.Span{Start: 8000, End: 8010}}
		return s
	}
	m := mk(t, streams{vol(strm("W1", pp, 0.5e6, tt, 333.15), 100.0/3600), strm("W2", pp, 0.4e6)},
		unit("V", "valve", ports("in W1", "out W2")))
	r := solveModel(t, m)
	if errs := errorsOf(r); len(errs) > 0 {
		logDiags(t, r)
		t.Fatal("errors")
	}
	if got := value(t, m, r, "W2 flow"); math.Abs(got-27.316231772208393) > 1e-7 {
		t.Errorf("mass flow %.12g, want 27.316231772208393 (100/3600 W(P=0.5,T=333.15).rho)", got)
	}
	if v, _, _ := r.Value(m, model.Subject{Kind: model.StreamSubject, Index: 0}, "vol_flow"); math.Abs(v-100.0/3600) > 1e-12 {
		t.Errorf("vol_flow %g", v)
	}
	m = mk(t, streams{vol(strm("S1", pp, 0.5e6, tt, 473.15), 100.0/3600), strm("S2", pp, 0.4e6)},
		unit("V", "valve", ports("in S1", "out S2")))
	r = solveModel(t, m)
	d := findDiag(r, CodeVolumeNotLiquid)
	if d == nil || d.Span.Start != 8000 || !strings.Contains(d.Message, "superheated vapour") {
		logDiags(t, r)
		t.Errorf("no volume-flow error at the given: %+v", d)
	}
}

func close(got float64, w want) bool {
	tol := w.tol
	if tol == 0 {
		tol = 1e-7 * math.Abs(w.v)
	}
	return math.Abs(got-w.v) <= tol
}
