package solve

import (
	"math"
	"testing"

	"hmb/thermo/model"
)

// TestDerivedResults reads every derived result of an invented plant through Value, the one
// lookup outputs use, and checks it against python3-iapws 1.5.2 (W = IAPWS97; P in MPa):
//
// A Rankine cycle of 5 kg/s: the pump takes saturated liquid C1 = W(P=0.008, x=0) to 6 MPa at
// 80 % (h = c1.h + (W(P=6, s=c1.s).h - c1.h)/0.8 = 181.39558646 kJ/kg); the boiler heats it to
// S1 = W(P=5.7, T=753.15) (dp 0.3 MPa); the turbine expands it to 8 kPa at 85 % (h = s1.h -
// 0.85 (s1.h - W(P=0.008, s=s1.s).h) = 2327.51736129 kJ/kg); a surface condenser returns C1,
// cooled by 200 kg/s of water from W(P=0.2, T=293.15) leaving at 0.15 MPa (dp_cold 0.05 MPa).
// A separate valve throttles water at 25 MPa, 723.15 K to 23 MPa (above the critical pressure:
// no Tsat).
func TestDerivedResults(t *testing.T) {
	m := mk(t, streams{
		strm("C1", flow, 5, pp, 8e3, xx, 0), strm("F1", pp, 6e6), strm("S1", tt, 753.15), strm("X1", pp, 8e3),
		strm("W1", flow, 200, pp, 0.2e6, tt, 293.15), strm("W2"),
		strm("SC", flow, 1, pp, 25e6, tt, 723.15), strm("SC2", pp, 23e6)},
		unit("P1", "pump", ports("in C1", "out F1"), "efficiency", 0.8),
		unit("B1", "boiler", ports("in F1", "out S1"), "dp", 0.3e6),
		unit("T1", "turbine", ports("in S1", "out X1"), "efficiency", 0.85),
		unit("CD", "exchanger", ports("hot_in X1", "hot_out C1", "cold_in W1", "cold_out W2"), "dp_cold", 0.05e6),
		unit("V1", "valve", ports("in SC", "out SC2")),
	)
	r := solveModel(t, m)
	if errs := errorsOf(r); len(errs) > 0 {
		logDiags(t, r)
		t.Fatal("errors")
	}
	const (
		tsat008 = 314.66005269838354 // W(P=0.008, x=0).T
		wp      = 37.71908944449436e3
		wt      = 5257.326395097327e3
		qb      = 15987.93526925843e3
		qc      = 10768.327963605598e3
		tw2     = 306.0377621900303 // W(P=0.15, h=W(P=0.2,T=293.15).h + qc/200).T
	)
	nan := math.NaN()
	stream := func(name string) model.Subject { return subjectOf(t, m, name) }
	tests := []struct {
		sub  model.Subject
		name string
		want float64
		rel  float64
		src  string
	}{
		{stream("S1"), "Tsat", 545.4097841445318, 1e-9, "W(P=5.7, x=0).T"},
		{stream("S1"), "superheat", 753.15 - 545.4097841445318, 1e-9, "753.15 - W(P=5.7, x=0).T"},
		{stream("S1"), "subcooling", nan, 0, "a vapour has none"},
		{stream("F1"), "subcooling", 548.7364107560508 - 315.2034714845201, 1e-7, "W(P=6, x=0).T - W(P=6, h=181.39558646).T"},
		{stream("F1"), "superheat", nan, 0, "a liquid has none"},
		{stream("F1"), "rho", 993.9850136856295, 1e-7, "W(P=6, h=181.39558646).rho"},
		{stream("F1"), "vol_flow", 0.005030256926571093, 1e-7, "5 W(P=6, h=181.39558646).v"},
		{stream("C1"), "subcooling", 0, 1e-9, "saturated liquid: zero"},
		{stream("X1"), "Tsat", tsat008, 1e-9, "W(P=0.008, x=0).T"},
		{stream("X1"), "superheat", nan, 0, "wet steam (W(P=0.008, h=2327.517).x = 0.8965) has none"},
		{stream("X1"), "subcooling", nan, 0, "wet steam has none"},
		{stream("SC"), "Tsat", nan, 0, "25 MPa is above the critical pressure 22.064 MPa"},
		{stream("SC"), "superheat", nan, 0, "supercritical"},
		{unitSub(t, m, "P1"), "dp", 8e3 - 6e6, 1e-12, "8 kPa in, 6 MPa out: a rise"},
		{unitSub(t, m, "B1"), "dp", 0.3e6, 1e-9, "given"},
		{unitSub(t, m, "T1"), "dp", 5.7e6 - 8e3, 1e-12, "5.7 MPa in, 8 kPa out"},
		{unitSub(t, m, "T1"), "efficiency", 0.85, 1e-12, "given"},
		{unitSub(t, m, "CD"), "dp_hot", 0, 1e-9, "both ends at 8 kPa"},
		{unitSub(t, m, "CD"), "dp_cold", 0.05e6, 1e-9, "given"},
		{unitSub(t, m, "CD"), "dT_min", tsat008 - tw2, 1e-6, "Tsat(8 kPa) - cooling water out, at the hot inlet end"},
		{unitSub(t, m, "CD"), "lmtd", 14.09777994919332, 1e-6, "(dT2 - dT1) / ln(dT2/dT1), the hot side condensing at 314.66 K"},
		{unitSub(t, m, "CD"), "UA", 763831.4686719, 1e-6, "qc / lmtd"},
		{model.Subject{Kind: model.TotalSubject}, "power_out", wt, 1e-7, "5 (s1.h - x1.h)"},
		{model.Subject{Kind: model.TotalSubject}, "power_in", wp, 1e-6, "5 (f1.h - c1.h)"},
		{model.Subject{Kind: model.TotalSubject}, "net_power", wt - wp, 1e-7, "power_out - power_in"},
		{model.Subject{Kind: model.TotalSubject}, "heat_in", qb, 1e-7, "5 (s1.h - f1.h): the boiler"},
		{model.Subject{Kind: model.TotalSubject}, "heat_out", qc, 1e-7, "5 (x1.h - c1.h): the condenser, cooled from outside the file"},
		{model.Subject{Kind: model.TotalSubject}, "efficiency", 0.3264716311235687, 1e-7, "net / heat_in"},
		{model.Subject{Kind: model.TotalSubject}, "heat_rate", 11026.991802045457 / 3600, 1e-7, "heat_in / net (11027 kJ/kWh)"},
	}
	for _, tt := range tests {
		v, spec, ok := r.Value(m, tt.sub, tt.name)
		if !ok || spec == nil {
			t.Errorf("%v %s: no such result", tt.sub, tt.name)
			continue
		}
		switch {
		case math.IsNaN(tt.want):
			if !math.IsNaN(v) {
				t.Errorf("%v %s = %g, want none (%s)", tt.sub, tt.name, v, tt.src)
			}
		case math.Abs(v-tt.want) > tt.rel*max(math.Abs(tt.want), 1):
			t.Errorf("%v %s = %.12g, want %.12g (%s)", tt.sub, tt.name, v, tt.want, tt.src)
		}
	}
	// A value the state does not have is told apart from one not solved.
	if !r.Lacks(m, stream("X1"), "superheat") || r.Lacks(m, stream("X1"), "Tsat") || r.Lacks(m, stream("S1"), "superheat") {
		t.Error("Lacks")
	}
	// The energy of the cycle closes: heat in - heat out = net power.
	if d := r.Totals.HeatIn - r.Totals.HeatOut - (r.Totals.PowerOut - r.Totals.PowerIn); math.Abs(d) > 1e-6*qb {
		t.Errorf("cycle does not close: %g W", d)
	}
}

// An exchanger between two streams of the file (a feedwater heater) moves heat inside it;
// one heated from outside the file (a hot-water coil) adds heat. A file with nothing counted
// has zero totals and no efficiency.
func TestTotalsExchangers(t *testing.T) {
	m := mk(t, streams{
		strm("H1", flow, 2, pp, 0.3e6, tt, 363.15), strm("H2", tt, 333.15),
		strm("C1", flow, 3, pp, 0.5e6, tt, 293.15), strm("C2"), strm("C3", pp, 0.4e6)},
		unit("X", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2")),
		unit("V", "valve", ports("in C2", "out C3")),
	)
	r := solveModel(t, m)
	q := r.Units[0].Q
	if !(q > 0) || r.Totals.HeatIn != q || r.Totals.HeatOut != 0 {
		t.Errorf("hot side from outside: heat in %g, out %g, duty %g", r.Totals.HeatIn, r.Totals.HeatOut, q)
	}
	if v, _, _ := r.Value(m, model.Subject{Kind: model.TotalSubject}, "efficiency"); !math.IsNaN(v) {
		t.Errorf("efficiency with no power %g, want none", v)
	}
	if v, _, _ := r.Value(m, model.Subject{Kind: model.TotalSubject}, "heat_rate"); !math.IsNaN(v) {
		t.Errorf("heat rate with no power %g, want none", v)
	}
}

func subjectOf(t *testing.T, m *model.Model, name string) model.Subject {
	t.Helper()
	for i, s := range m.Streams {
		if s.Name == name {
			return model.Subject{Kind: model.StreamSubject, Index: i}
		}
	}
	t.Fatalf("no stream %s", name)
	return model.Subject{}
}

func unitSub(t *testing.T, m *model.Model, name string) model.Subject {
	t.Helper()
	for i, u := range m.Units {
		if u.Name == name {
			return model.Subject{Kind: model.UnitSubject, Index: i}
		}
	}
	t.Fatalf("no unit %s", name)
	return model.Subject{}
}
