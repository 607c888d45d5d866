package solve

import (
	"math"
	"slices"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

type streams = []*model.Stream

// givenAt is the span of a stream's given; unitAt the span of a unit's name.
func givenAt(name string, p model.Prop) func(*model.Model) model.Span {
	return func(m *model.Model) model.Span {
		for _, s := range m.Streams {
			if s.Name == name && s.Given[p] != nil {
				return s.Given[p].Span
			}
		}
		return model.Span{Start: -1}
	}
}

func unitAt(name string) func(*model.Model) model.Span {
	return func(m *model.Model) model.Span {
		for _, u := range m.Units {
			if u.Name == name {
				return u.Span
			}
		}
		return model.Span{Start: -1}
	}
}

func streamAt(name string) func(*model.Model) model.Span {
	return func(m *model.Model) model.Span {
		for _, s := range m.Streams {
			if s.Name == name {
				return s.Span
			}
		}
		return model.Span{Start: -1}
	}
}

func paramAt(unit, param string) func(*model.Model) model.Span {
	return func(m *model.Model) model.Span {
		for _, u := range m.Units {
			if u.Name == unit && u.Params[param] != nil {
				return u.Params[param].Span
			}
		}
		return model.Span{Start: -1}
	}
}

// TestDiagnostics checks each finding of the solver: its code, severity, place, the words that
// tell the engineer what to do, and the related places. Physical facts behind each case:
// Tsat(1 MPa) = 453.0356 K (python3-iapws: W(P=1,x=0).T); throttling to a higher pressure at
// constant h lowers the entropy of steam (any h-s chart); a 6 MPa 350 C expansion to 10 kPa at
// 80 % leaves the exhaust at about 15 % moisture (python3-iapws: x = 0.8450 from W(P=6,T=623.15),
// W(P=0.01,s=s1), h2 = h1 - 0.8 (h1 - hs)).
func TestDiagnostics(t *testing.T) {
	cases := []struct {
		name     string
		m        func(t *testing.T) *model.Model
		code     string
		sev      model.Severity
		at       func(*model.Model) model.Span
		contains []string
		related  []func(*model.Model) model.Span
		absent   []string // codes that must not be reported
	}{
		{
			name: "under-specified valve names the outlet pressure or the drop",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2")}, unit("V1", "valve", ports("in S1", "out S2")))
			},
			code: CodeUnderSpecified, sev: model.Error, at: unitAt("V1"),
			contains: []string{"under-specified", "specify one of:", "V1 dp", "S2 p"},
		},
		{
			name: "under-specified flow names every stream whose flow would fix it",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", pp, 2e6, tt, 573.15), strm("S2"), strm("S3", pp, 1e6, tt, 473.15)},
					unit("V1", "valve", ports("in S1", "out S2")), unit("H", "heater", ports("in S2", "out S3")))
			},
			code: CodeUnderSpecified, sev: model.Error, at: streamAt("S1"),
			contains: []string{"nothing fixes S1 flow", "specify one of: S1 flow, S2 flow, S3 flow"},
		},
		{
			// Around a closed loop one mass balance is redundant; without it the split between
			// bleed and condensate needs the deaerator pressure, which nothing states here.
			name: "closed loop without the deaerator pressure is under-specified, not singular",
			m: func(t *testing.T) *model.Model {
				return mk(t, regenStreams(false), regenUnits()...)
			},
			code: CodeUnderSpecified, sev: model.Error, at: unitAt("BFP"),
			contains: []string{"under-specified", "FW1 p", "CN2 p"},
			absent:   []string{CodeNoConvergence},
		},
		{
			name: "over-specified flow names both givens",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", flow, 2.5, pp, 1e6)}, unit("V1", "valve", ports("in S1", "out S2")))
			},
			code: CodeNotClosed, sev: model.Error, at: unitAt("V1"),
			contains: []string{"mass balance of valve V1 does not close", "in 2.0000 kg/s", "out 2.5000 kg/s", "20.0 %", "given S1 flow", "given S2 flow"},
			related:  []func(*model.Model) model.Span{givenAt("S1", flow), givenAt("S2", flow)},
		},
		{
			name: "over-specified outlet state: a given T against the valve's energy balance",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 0.5e6, tt, 523.15)}, unit("V1", "valve", ports("in S1", "out S2")))
			},
			code: CodeNotClosed, sev: model.Error, at: unitAt("V1"),
			contains: []string{"energy balance of valve V1 does not close", "of the largest enthalpy change across the unit", "given S1 T", "given S2 T"},
			related:  []func(*model.Model) model.Span{givenAt("S1", tt), givenAt("S2", tt)},
		},
		{
			name: "three properties of a single-phase state",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 1e6, tt, 573.15, hh, 3e6)})
			},
			code: CodeStateOverSpecified, sev: model.Error, at: givenAt("S1", hh),
			contains: []string{"S1 is over-specified", "p, T and h given"},
			related:  []func(*model.Model) model.Span{givenAt("S1", hh)},
		},
		{
			name: "T, p and x inconsistent",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 1e6, tt, 400, xx, 0.5)})
			},
			code: CodeStateInconsistent, sev: model.Error, at: givenAt("S1", tt),
			contains: []string{"inconsistent", "saturation temperature at 1000 kPa is 179.89 C"},
			related:  []func(*model.Model) model.Span{givenAt("S1", pp), givenAt("S1", xx)},
		},
		{
			name: "(p, T) on the saturation line",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 1e6, tt, 453.0356)})
			},
			code: CodeStateAmbiguous, sev: model.Error, at: givenAt("S1", tt),
			contains: []string{"is the saturation temperature at 1000 kPa", "give the quality x"},
			related:  []func(*model.Model) model.Span{givenAt("S1", pp)},
		},
		{
			name: "T on the saturation line at a pressure a unit fixes",
			m: func(t *testing.T) *model.Model {
				// Tsat(0.48 MPa) = 423.454515 K (python3-iapws: W(P=0.48,x=0).T).
				return mk(t, streams{strm("S1", pp, 0.5e6, tt, 293.15), strm("S2", tt, 423.454515)},
					unit("H1", "heater", ports("in S1", "out S2"), "duty", 2e6, "dp", 20e3))
			},
			code: CodeStateAmbiguous, sev: model.Error, at: givenAt("S2", tt),
			contains: []string{"S2: T 150.3 C is the saturation temperature at its solved pressure 480.00 kPa", "give the quality x"},
		},
		{
			name: "throttling up in pressure",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 1e6, tt, 573.15), strm("S2", pp, 2e6)}, unit("V1", "valve", ports("in S1", "out S2")))
			},
			code: CodePressureRise, sev: model.Error, at: unitAt("V1"),
			contains: []string{"valve V1: outlet S2 at 2000.0 kPa is above inlet S1 at 1000.0 kPa", "a valve cannot raise the pressure"},
			absent:   []string{CodeEntropy},
		},
		{
			name: "given efficiency above 1",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 6e6, tt, 723.15), strm("S2", pp, 0.2e6)}, unit("T", "turbine", ports("in S1", "out S2"), "efficiency", 1.2))
			},
			code: CodeEfficiency, sev: model.Error, at: paramAt("T", "efficiency"),
			contains: []string{"efficiency 1.2000 is outside 0..1"},
		},
		{
			name: "solved efficiency above 1: the exhaust is drier than an ideal turbine allows",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 6e6, tt, 723.15), strm("S2", pp, 0.2e6, xx, 0.8)}, unit("T", "turbine", ports("in S1", "out S2")))
			},
			code: CodeEfficiency, sev: model.Error, at: unitAt("T"),
			contains: []string{"solved isentropic efficiency", "outside 0..1"},
		},
		{
			// 10 (W(P=11.5,T=753.15).h - W(P=12,T=473.15).h) = 24.45 MW from 20 MW of fuel:
			// efficiency 1.2227 (python3-iapws).
			name: "solved boiler efficiency above 1",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 10, pp, 12e6, tt, 473.15), strm("S2", tt, 753.15)},
					unit("B1", "boiler", ports("in S1", "out S2"), "dp", 0.5e6, "fuel", 20e6))
			},
			code: CodeEfficiency, sev: model.Error, at: unitAt("B1"),
			contains: []string{"solved boiler efficiency 1.2227 is outside 0..1"},
		},
		{
			name: "exchanger temperature cross",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("H1", flow, 2, pp, 0.3e6, xx, 1), strm("H2", xx, 0), strm("C1", flow, 1, pp, 1e6, tt, 303.15), strm("C2")},
					unit("X1", "exchanger", ports("hot_in H1", "hot_out H2", "cold_in C1", "cold_out C2")))
			},
			code: CodeTempCross, sev: model.Error, at: unitAt("X1"),
			contains: []string{"temperature cross", "hot inlet H1 is 133.53 C", "colder than cold outlet C2"},
		},
		{
			name: "pump inlet a wet mixture",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 0.1e6, xx, 0.5), strm("S2", pp, 1e6)}, unit("P", "pump", ports("in S1", "out S2"), "efficiency", 0.7))
			},
			code: CodePumpInlet, sev: model.Warning, at: unitAt("P"),
			contains: []string{"inlet S1 is a saturated mixture, not liquid"},
		},
		{
			name: "turbine exhaust wetter than 10 %",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 6e6, tt, 623.15), strm("S2", pp, 10e3)}, unit("T", "turbine", ports("in S1", "out S2"), "efficiency", 0.8))
			},
			code: CodeWetExhaust, sev: model.Warning, at: unitAt("T"),
			// 1 - 0.8450 = 15.5 % moisture.
			contains: []string{"exhaust S2 has 15.5 % moisture, above the usual 10 % limit (common practice, no source)"},
		},
		{
			// 330 K at 1 MPa lies below Tsat(0.2 MPa) = 393.36 K (python3-iapws: W(P=0.2,x=0).T):
			// nothing can flash, and the tank says so instead of reporting negative flows.
			name: "flash tank fed with subcooled liquid: the tank says why",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("F", flow, 1, pp, 1e6, tt, 330), strm("V", pp, 0.2e6), strm("L")},
					unit("FT", "flash", ports("in F", "vapor V", "liquid L")))
			},
			code: CodeFlashFeed, sev: model.Error, at: unitAt("FT"),
			contains: []string{"flash FT: the feed F is subcooled at the tank pressure 200.00 kPa", "against the saturation temperature 120.21 C", "so nothing can flash", "through the vapour outlet V"},
			absent:   []string{CodeNegativeFlow},
		},
		{
			name: "quality given above the critical pressure",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 25e6, xx, 0.5)})
			},
			code: CodeNoDome, sev: model.Error, at: givenAt("S1", xx),
			contains: []string{"no two-phase region"},
			related:  []func(*model.Model) model.Span{givenAt("S1", pp)},
		},
		{
			name: "temperature outside IF97",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 1e6, tt, 2500)})
			},
			code: CodeOutsideIF97, sev: model.Error, at: givenAt("S1", tt),
			contains: []string{"outside IAPWS-IF97"},
		},
		{
			name: "failed expectation states the solved and the expected value",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 0.5e6)}, unit("V1", "valve", ports("in S1", "out S2")))
				// Solved T2 = 553.622376 K (python3-iapws: W(P=0.5,h=W(P=2,T=573.15).h).T).
				m.Expects = append(m.Expects, &model.Expect{Stream: 1, Unit: -1, Prop: "T", Op: model.Eq, Value: 560, Tol: 1, Span: model.Span{Start: 7000, End: 7010}})
				return m
			},
			code: CodeExpectFailed, sev: model.Error, at: func(*model.Model) model.Span { return model.Span{Start: 7000, End: 7010} },
			contains: []string{"S2 T is 280.47 C, expected 286.85 C ± 1 C"},
		},
		{
			// Tsat(0.48 MPa) = 423.454515 K (python3-iapws: W(P=0.48,x=0).T); 423.45 K is 0.0045 K
			// from it, inside the 0.01 K window that a T given beside a given p also gets.
			name: "T within 0.01 K of saturation at a pressure a unit fixes",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", pp, 0.5e6, tt, 293.15), strm("S2", tt, 423.45)},
					unit("H1", "heater", ports("in S1", "out S2"), "duty", 2e6, "dp", 20e3))
			},
			code: CodeStateAmbiguous, sev: model.Error, at: givenAt("S2", tt),
			contains: []string{"is the saturation temperature at its solved pressure 480.00 kPa"},
		},
		{
			// Tsat(1 MPa) = 453.0356 K (python3-iapws): 453.0 K is 0.036 K off, inside its own ± 0.1 K.
			name: "T within its stated tolerance of saturation",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 2, pp, 1e6, tt, 453.0)})
				m.Streams[0].Given[tt].Tol = 0.1
				return m
			},
			code: CodeStateAmbiguous, sev: model.Error, at: givenAt("S1", tt),
			contains: []string{"is the saturation temperature at 1000 kPa"},
		},
		{
			// 150 MPa is above the 100 MPa limit of IAPWS R7-97(2012), Sec. 4.
			name: "pressure outside IF97 reads in the unit written",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 1, pp, 150e6, tt, 573.15)})
				m.Streams[0].Given[pp].Unit = "MPa"
				return m
			},
			code: CodeOutsideIF97, sev: model.Error, at: givenAt("S1", pp),
			contains: []string{"S1: pressure 150 MPa is outside IAPWS-IF97 (above 0 MPa, up to 100 MPa)"},
		},
		{
			// 273.15 K and 2273.15 K (IAPWS R7-97(2012), Sec. 4) are 32 F and 3632 F.
			name: "temperature range in F",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 1, pp, 1e6, tt, 2500)})
				m.Display = units.US
				m.Streams[0].Given[tt].Unit = "F"
				return m
			},
			code: CodeOutsideIF97, sev: model.Error, at: givenAt("S1", tt),
			contains: []string{"temperature 4040.3 F is outside IAPWS-IF97 (32 F to 3632 F)"},
		},
		{
			// Tc = 647.096 K = 373.946 C (IAPWS R7-97(2012), Eq. 1).
			name: "quality given above the critical temperature names it",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 1, tt, 653.15, xx, 0.5)})
				m.Streams[0].Given[tt].Unit = "C"
				return m
			},
			code: CodeNoDome, sev: model.Error, at: givenAt("S1", xx),
			contains: []string{"quality given at 380 C, at or above the critical temperature 373.95 C"},
			related:  []func(*model.Model) model.Span{givenAt("S1", tt)},
		},
		{
			// At 14.7 psia (0.1013529 MPa) the highest IF97 enthalpy, at 2273.15 K, is 7376.955 kJ/kg
			// = 3171.52 Btu/lbm (python3-iapws: W(P=0.1013529,T=2273.15).h / 2.326).
			name: "given enthalpy beyond IF97: at the given, in the file's units, once",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 0.126, pp, 14.7*6894.757293168, hh, 5000*2326.0), strm("S2")},
					unit("V1", "valve", ports("in S1", "out S2"), "dp", 6894.757293168))
				m.Display = units.US
				m.Streams[0].Given[pp].Unit = "psia"
				m.Streams[0].Given[hh].Unit = "Btu/lbm"
				return m
			},
			code: CodeOutsideIF97, sev: model.Error, at: givenAt("S1", hh),
			contains: []string{"S1: h 5000 Btu/lbm is above the IAPWS-IF97 limit 3171.5 Btu/lbm at p 14.7 psia"},
			related:  []func(*model.Model) model.Span{streamAt("S2")},
		},
		{
			// 1 kg/s of 1 MPa 300 C steam (h = 3051.7 kJ/kg) given 5 MW more: 8051.7 kJ/kg, above
			// the 7376.7 kJ/kg IF97 reaches at 1 MPa and 2273.15 K (python3-iapws:
			// W(P=1,T=573.15).h, W(P=1,T=2273.15).h).
			name: "solved enthalpy beyond IF97 names the equation that made it",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 1e6, tt, 573.15), strm("S2")},
					unit("H1", "heater", ports("in S1", "out S2"), "duty", 5e6))
			},
			code: CodeOutsideIF97, sev: model.Error, at: streamAt("S2"),
			contains: []string{"S2: h 8051.7 kJ/kg (from the energy balance of heater H1) is above the IAPWS-IF97 limit 7376.7 kJ/kg at p 1000.0 kPa"},
			related:  []func(*model.Model) model.Span{unitAt("H1")},
		},
		{
			// h(1 MPa, 200 C) = 2828.27 kJ/kg (python3-iapws: W(P=1,T=473.15).h); steam at that
			// enthalpy is above 100 C at every pressure.
			name: "no pressure meets an outlet T at the enthalpy a valve keeps",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 0.5, pp, 1e6, tt, 473.15), strm("S2", tt, 373.15)},
					unit("V1", "valve", ports("in S1", "out S2")))
				m.Streams[1].Given[tt].Unit = "C"
				return m
			},
			code: CodeNoConvergence, sev: model.Error, at: givenAt("S2", tt),
			contains: []string{"S2: no pressure gives T 100 C at the enthalpy 2828.3 kJ/kg (from the energy balance of valve V1)"},
			related:  []func(*model.Model) model.Span{unitAt("V1")},
		},
		{
			// At 100 C the entropy of water is above 1.2373 kJ/(kg K) at every pressure up to the
			// 100 MPa of IF97 (python3-iapws: W(P=100,T=373.15).s), so s 1 kJ/(kg K) is out of reach.
			name: "two givens of one stream that no state has together",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 1, tt, 373.15, ss, 1000)})
				m.Streams[0].Given[tt].Unit = "C"
				m.Streams[0].Given[ss].Unit = "kJ/(kg K)"
				return m
			},
			code: CodeNoConvergence, sev: model.Error, at: givenAt("S1", ss),
			related:  []func(*model.Model) model.Span{givenAt("S1", tt)},
			contains: []string{"S1: no state of water has", "T 100 C", "s 1 kJ/(kg K)"},
		},
		{
			// 3 kg/s of water at 4 bar from 60 C to 85 C takes 314.22 kW (python3-iapws:
			// 3 (W(P=0.4,T=358.15).h - W(P=0.4,T=333.15).h)); 25.78 kW off 340 kW is 7.58 %.
			name: "energy closure sets the given duty against the implied one",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 3, pp, 0.4e6, tt, 333.15), strm("S2", pp, 0.4e6, tt, 358.15)},
					unit("H1", "heater", ports("in S1", "out S2"), "duty", 340e3))
				m.Units[0].Params["duty"].Unit = "kW"
				return m
			},
			code: CodeNotClosed, sev: model.Error, at: unitAt("H1"),
			contains: []string{"energy balance of heater H1 does not close: duty 340 kW given, the stream states imply 314.22 kW (7.58 %)"},
		},
		{
			name: "a duty rejected as not finite is not asked for again",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 0.4e6, tt, 333.15), strm("S2")},
					unit("H1", "heater", ports("in S1", "out S2"), "duty", math.Inf(1)))
			},
			code: CodeStructure, sev: model.Error, at: paramAt("H1", "duty"),
			contains: []string{"heater H1 duty is not a finite number"},
			absent:   []string{CodeUnderSpecified},
		},
		{
			name: "a rejected stream given brings no under-specification after it",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 1, pp, 150e6, tt, 573.15), strm("S2", pp, 1e5, tt, 2800)},
					unit("C1", "cooler", ports("in S1", "out S2")))
			},
			code: CodeOutsideIF97, sev: model.Error, at: givenAt("S1", pp),
			absent: []string{CodeUnderSpecified},
		},
		{
			// 2 kg/s is 7.2 t/h; 0.5 t/h is 0.13889 kg/s.
			name: "expectation in the unit written",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 0.5e6)}, unit("V1", "valve", ports("in S1", "out S2")))
				m.Expects = append(m.Expects, &model.Expect{Stream: 0, Unit: -1, Prop: "flow", Op: model.Lt, Value: 0.5 / 3.6, Spelling: "t/h", Span: model.Span{Start: 7000, End: 7010}})
				return m
			},
			code: CodeExpectFailed, sev: model.Error, at: func(*model.Model) model.Span { return model.Span{Start: 7000, End: 7010} },
			contains: []string{"S1 flow is 7.2000 t/h, expected < 0.5 t/h"},
		},
		{
			// Solved T2 = 553.622376 K = 536.85 F (python3-iapws, as above); 2 K is 3.6 F.
			name: "expectation tolerance in the unit written",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 0.5e6)}, unit("V1", "valve", ports("in S1", "out S2")))
				m.Display = units.US
				m.Expects = append(m.Expects, &model.Expect{Stream: 1, Unit: -1, Prop: "T", Op: model.Eq, Value: 573.15, Tol: 2, Spelling: "F", Span: model.Span{Start: 7000, End: 7010}})
				return m
			},
			code: CodeExpectFailed, sev: model.Error, at: func(*model.Model) model.Span { return model.Span{Start: 7000, End: 7010} },
			contains: []string{"S2 T is 536.85 F, expected 572 F ± 3.6 F"},
		},
		{
			name: "expectation on an unsolved value",
			m: func(t *testing.T) *model.Model {
				m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2")}, unit("V1", "valve", ports("in S1", "out S2")))
				m.Expects = append(m.Expects, &model.Expect{Stream: 1, Unit: -1, Prop: "T", Op: model.Gt, Value: 300, Span: model.Span{Start: 7000, End: 7010}})
				return m
			},
			code: CodeExpectUnsolved, sev: model.Error, at: func(*model.Model) model.Span { return model.Span{Start: 7000, End: 7010} },
			contains: []string{"cannot check S2 T: it was not solved"},
		},
		{
			name: "redundant balance that closes is reported as a closure",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", flow, 2.001, pp, 1e6)}, unit("V1", "valve", ports("in S1", "out S2")))
			},
			code: CodeClosure, sev: model.Info, at: unitAt("V1"),
			contains: []string{"mass balance of valve V1 closes", "0.050 %"},
		},
		{
			// Both ends of a valve given, the outlet enthalpy 0.03 % above the inlet's
			// (python3-iapws: IAPWS97(P=2, T=573.15).h = 3024.251875761745 kJ/kg): a valve has no
			// duty to judge the mismatch against, so it is measured against the inlet's enthalpy
			// flow and closes within the default 0.1 %.
			name: "valve with both states given closes against its enthalpy flow",
			m: func(t *testing.T) *model.Model {
				return mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 1e6, hh, 3024.251875761745e3*1.0003)}, unit("V1", "valve", ports("in S1", "out S2")))
			},
			code: CodeClosure, sev: model.Info, at: unitAt("V1"),
			contains: []string{"energy balance of valve V1 closes", "0.030 %"},
			absent:   []string{CodeNotClosed},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := c.m(t)
			r := solveModel(t, m)
			// The diagnostic of that code at the expected place, else the first of that code.
			d := findDiag(r, c.code)
			for i := range r.Diags {
				if r.Diags[i].Code == c.code && r.Diags[i].Span == c.at(m) {
					d = &r.Diags[i]
					break
				}
			}
			if d == nil {
				logDiags(t, r)
				t.Fatalf("no %s", c.code)
			}
			if d.Severity != c.sev {
				t.Errorf("severity %v, want %v", d.Severity, c.sev)
			}
			if want := c.at(m); d.Span != want {
				t.Errorf("span %v, want %v", d.Span, want)
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
			var got []model.Span
			for _, rl := range d.Related {
				got = append(got, rl.Span)
			}
			for _, f := range c.related {
				if w := f(m); !slices.Contains(got, w) {
					t.Errorf("related %v lacks %v", got, w)
				}
			}
			for _, dd := range r.Diags {
				if strings.Contains(dd.Message, "NaN") || strings.Contains(dd.Message, "Inf") {
					t.Errorf("message shows a non-number: %q", dd.Message)
				}
			}
		})
	}
}

// TestExpectationHolds: an expectation that the solved values meet reports nothing, and each
// operator compares the way it reads. Solved T2 = 553.622376 K (python3-iapws, as above).
func TestExpectationHolds(t *testing.T) {
	for _, c := range []struct {
		op   model.Op
		v    float64
		tol  float64
		pass bool
	}{
		{model.Eq, 553.6, 0.1, true},
		{model.Eq, 553.6, 0.01, false},
		{model.Lt, 554, 0, true},
		{model.Lt, 553.6, 0, false},
		{model.Le, 553.7, 0, true},
		{model.Gt, 553.6, 0, true},
		{model.Gt, 554, 0, false},
		{model.Ge, 553.7, 0, false},
	} {
		m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 0.5e6)}, unit("V1", "valve", ports("in S1", "out S2")))
		m.Expects = append(m.Expects, &model.Expect{Stream: 1, Unit: -1, Prop: "T", Op: c.op, Value: c.v, Tol: c.tol})
		r := solveModel(t, m)
		if got := findDiag(r, CodeExpectFailed) == nil; got != c.pass {
			logDiags(t, r)
			t.Errorf("T %s %g (tol %g): pass %v, want %v", c.op, c.v, c.tol, got, c.pass)
		}
	}
}

// TestProvenance: each solved value names the given or the equation that produced it.
func TestProvenance(t *testing.T) {
	m := mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2", pp, 0.5e6)}, unit("V1", "valve", ports("in S1", "out S2")))
	r := solveModel(t, m)
	for _, c := range []struct {
		stream int
		prop   model.Prop
		kind   ProvKind
		label  string
	}{
		{0, model.Flow, ProvGiven, "given S1 flow"},
		{0, model.T, ProvGiven, "given S1 T"},
		{0, model.H, ProvEquation, "given S1 T"}, // h from the given T at the given p
		{1, model.Flow, ProvEquation, "mass balance of valve V1"},
		{1, model.H, ProvEquation, "energy balance of valve V1"},
		{1, model.P, ProvGiven, "given S2 p"},
		{1, model.T, ProvDerived, "IAPWS-IF97 from p (given S2 p) and h (energy balance of valve V1)"},
	} {
		got := r.Streams[c.stream].Source[c.prop]
		if got.Kind != c.kind || got.Label != c.label {
			t.Errorf("%s %s: %v %q, want %v %q", m.Streams[c.stream].Name, c.prop, got.Kind, got.Label, c.kind, c.label)
		}
	}
	if u := r.Streams[1].Source[model.H].Unit; u != 0 {
		t.Errorf("S2 h comes from unit %d, want 0", u)
	}
}

// TestSystemAtSolution: the explicit system a later reconciliation stage will use holds at the
// solution: every equation's residual vanishes (relative to its scale) and the Jacobian is finite
// and has an entry for every unknown each equation touches.
func TestSystemAtSolution(t *testing.T) {
	m := networkModel(t, 51)
	r := solveModel(t, m)
	if errs := errorsOf(r); len(errs) > 0 {
		logDiags(t, r)
		t.Fatal("errors")
	}
	sys := r.System
	res := make([]float64, len(sys.Eqs))
	sys.Residuals(r.X, res)
	for e := range sys.Eqs {
		_, scale, err := sys.Residual(e, r.X)
		if err != nil || !(math.Abs(res[e]) <= 1e-8*scale) {
			t.Errorf("%s: residual %g (scale %g, %v)", sys.Eqs[e].Label, res[e], scale, err)
		}
	}
	n := 0
	for _, en := range sys.Jacobian(r.X) {
		n++
		if !finite(en.Val) {
			t.Errorf("Jacobian (%s, %s) = %v", sys.Eqs[en.Row].Label, sys.Vars[en.Col].Name, en.Val)
		}
	}
	want := 0
	for _, eq := range sys.Eqs {
		want += len(eq.Vars)
	}
	if n != want {
		t.Errorf("%d Jacobian entries, want %d", n, want)
	}
}

// TestRejectedGivenShowsNoState: a stream whose given was rejected shows no state, even when the
// rest fixes its p and h (here the cooler carries the outlet's 1 bar back to the inlet whose
// 150 MPa, above the 100 MPa of IAPWS R7-97(2012) Sec. 4, was rejected); a stream after a state
// error is still solved from what was kept.
func TestRejectedGivenShowsNoState(t *testing.T) {
	m := mk(t, streams{strm("HIGH", flow, 1, pp, 150e6, tt, 573.15), strm("LOW", pp, 1e5, tt, 373.15)},
		unit("C1", "cooler", ports("in HIGH", "out LOW")))
	r := solveModel(t, m)
	if r.Streams[0].HasState || r.Streams[0].Solved {
		t.Errorf("HIGH: HasState %v, Solved %v; want no state after its pressure was rejected (p shown %g Pa)",
			r.Streams[0].HasState, r.Streams[0].Solved, r.Streams[0].State.P)
	}
	if r.Streams[0].M != 1 {
		t.Errorf("HIGH flow %g, want the given 1 kg/s", r.Streams[0].M)
	}
	// Tsat(0.1 MPa) = 372.756 K (python3-iapws: W(P=0.1,x=0).T): 373.15 K at 1 bar is vapour.
	if !r.Streams[1].HasState || math.Abs(r.Streams[1].State.T-373.15) > 1e-6 {
		t.Errorf("LOW: HasState %v, T %g; want its own givens solved", r.Streams[1].HasState, r.Streams[1].State.T)
	}
}

// TestEnergyClosureAgainstDuty: the closure of an energy balance is taken against the duty, not
// the total enthalpy flow, which depends on the enthalpy datum. 3 kg/s of water at 4 bar from
// 60 C to 85 C takes 314.2231 kW (python3-iapws: 3 (W(P=0.4,T=358.15).h - W(P=0.4,T=333.15).h));
// against a given 320 kW the closure is (320 - 314.2231) / 320 = 1.805 %. Against the total
// inflow (3 W(P=0.4,T=333.15).h + 320 kW = 1074.4 kW) it would read 0.54 %.
func TestEnergyClosureAgainstDuty(t *testing.T) {
	m := mk(t, streams{strm("S1", flow, 3, pp, 0.4e6, tt, 333.15), strm("S2", pp, 0.4e6, tt, 358.15)},
		unit("H1", "heater", ports("in S1", "out S2"), "duty", 320e3))
	m.Tolerance = 0.05
	r := solveModel(t, m)
	want := (320 - 314.2231) / 320
	if got := r.Units[0].EnergyClosure; math.Abs(got-want) > 1e-5 {
		t.Errorf("energy closure %.6f, want %.6f", got, want)
	}
	d := findDiag(r, CodeClosure)
	if d == nil || !strings.Contains(d.Message, "duty 320 kW given, the stream states imply 314.22 kW (1.81 %)") {
		logDiags(t, r)
		t.Errorf("no HMB504 setting the given duty against the implied one")
	}
}

// TestSpecifyList: an under-specified system lists, besides its message, the values that would
// fix it in a form an editor can insert (a stream's h is offered as T).
func TestSpecifyList(t *testing.T) {
	m := mk(t, streams{strm("S1", pp, 2e6, tt, 573.15), strm("S2"), strm("S3", pp, 1e6, tt, 473.15)},
		unit("V1", "valve", ports("in S1", "out S2")), unit("H", "heater", ports("in S2", "out S3")))
	d := findDiag(solveModel(t, m), CodeUnderSpecified)
	if d == nil {
		t.Fatal("no HMB501")
	}
	want := []model.Spec{{Name: "S1", Prop: "flow"}, {Name: "S2", Prop: "flow"}, {Name: "S3", Prop: "flow"}}
	if len(d.Specify) < len(want) || !slices.Equal(d.Specify[:len(want)], want) {
		t.Errorf("Specify = %v, want it to start with %v (message %q)", d.Specify, want, d.Message)
	}
	m = mk(t, streams{strm("S1", flow, 2, pp, 2e6, tt, 573.15), strm("S2")}, unit("V1", "valve", ports("in S1", "out S2")))
	d = findDiag(solveModel(t, m), CodeUnderSpecified)
	if d == nil || !slices.Contains(d.Specify, model.Spec{Name: "V1", Prop: "dp"}) || !slices.Contains(d.Specify, model.Spec{Name: "S2", Prop: "p"}) {
		t.Errorf("valve: %+v", d)
	}
}
