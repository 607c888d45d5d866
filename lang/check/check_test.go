package check_test

import (
	"math"
	"strings"
	"testing"

	"hmb/lang/check"
	"hmb/lang/parser"
	"hmb/thermo/model"
)

// want is one expected diagnostic. at locates its range: the first occurrence in the source of
// the text, or, written "before|text", of text just after the first occurrence of before. rel
// locates the first related range the same way ("" when the diagnostic has none).
type want struct {
	code, at, msg string
	fix           string
	rel           string
}

// locate finds the span an at/rel pattern names in src.
func locate(t *testing.T, src, at string) model.Span {
	t.Helper()
	before, text, ok := strings.Cut(at, "|")
	if !ok {
		before, text = "", at
	}
	i := strings.Index(src, before)
	if i < 0 {
		t.Fatalf("pattern %q: %q is not in the source", at, before)
	}
	i += len(before)
	j := strings.Index(src[i:], text)
	if j < 0 {
		t.Fatalf("pattern %q: %q is not in the source after %q", at, text, before)
	}
	return model.Span{Start: i + j, End: i + j + len(text)}
}

func run(src string) (*model.Model, []model.Diagnostic) {
	f, pd := parser.Parse("t.hmb", []byte(src))
	m, cd, _ := check.Check(f)
	return m, append(pd, cd...)
}

// TestDiagnostics checks that each diagnostic fires with its exact range, message, fix and related
// range, and that nothing else is reported (the "stream not connected" warning aside, which most
// of these small files draw and which has rows of its own).
func TestDiagnostics(t *testing.T) {
	tests := []struct {
		name, src string
		want      []want
		warnings  bool // compare warnings too
	}{
		// Names.
		{"undefined stream in a port", "stream A, B\nvalve V { in A; out C }",
			[]want{{code: "HMB201", at: "out |C", msg: "stream C is not declared (declare it with: stream C)"}}, false},
		{"undefined stream with a suggestion", "stream Feed, Drain\nvalve V { in Feed; out Drian }",
			[]want{{code: "HMB201", at: "Drian", msg: "stream Drian is not declared (declare it with: stream Drian); did you mean Drain?", fix: "Drain"}}, false},
		{"numbered tags are not misspellings", "stream S1, S2\nvalve V { in S1; out S3 }",
			[]want{{code: "HMB201", at: "S3", msg: "stream S3 is not declared (declare it with: stream S3)"}}, false},
		{"undefined expectation target", "stream A, B\nvalve V { in A; out B }\nexpect Q x > 0.5",
			[]want{{code: "HMB201", at: "Q", msg: "stream or unit Q is not declared"}}, false},
		{"duplicate stream", "stream A { p 1 bar }\nstream B, A\nvalve V { in A; out B }",
			[]want{{code: "HMB202", at: "B, |A", msg: "A is already declared as a stream", rel: "A"}}, false},
		{"duplicate unit", "stream A, B, C, D\nvalve V { in A; out B }\nheater V { in C; out D }",
			[]want{{code: "HMB202", at: "heater |V", msg: "V is already declared as a valve", rel: "valve |V"}}, false},
		{"unit named like a stream", "stream A, B\nvalve A { in A; out B }",
			[]want{{code: "HMB202", at: "valve |A", msg: "A is already declared as a stream", rel: "A"}}, false},

		// Wiring.
		{"stream fed by two units", "stream A, B, C\nvalve V { in A; out C }\nvalve W { in B; out C }",
			[]want{{code: "HMB203", at: "W { in B; out |C", msg: "stream C already leaves valve V", rel: "V { in A; out |C"}}, false},
		{"stream consumed twice", "stream A, B, C\nvalve V { in A; out B }\nvalve W { in A; out C }",
			[]want{{code: "HMB204", at: "W { in |A", msg: "stream A already enters valve V", rel: "V { in |A"}}, false},
		{"stream entering one mixer twice", "stream A, B\nmixer M { in A, A; out B }",
			[]want{{code: "HMB204", at: "in A, |A", msg: "stream A enters mixer M twice", rel: "in |A"}}, false},
		{"missing outlet", "stream A, B\nvalve V { in A }",
			[]want{
				{code: "HMB205", at: "valve |V", msg: "valve V has no out stream (outlet stream)"},
				{code: "HMB209", at: "B", msg: "stream B is not connected to any unit"},
			}, true},
		{"missing ports of an exchanger", "stream A, B\nexchanger E { hot_in A; hot_out B }",
			[]want{
				{code: "HMB205", at: "E", msg: "exchanger E has no cold_in stream (cold-side inlet)"},
				{code: "HMB205", at: "E", msg: "exchanger E has no cold_out stream (cold-side outlet)"},
			}, false},
		{"two outlets on a valve", "stream A, B, C\nvalve V { in A; out B, C }",
			[]want{{code: "HMB206", at: "out B, |C", msg: "valve V takes one out stream, not 2"}}, false},
		{"unknown kind with a suggestion", "stream A, B\nturbin T { in A; out B }",
			[]want{{code: "HMB207", at: "turbin", fix: "turbine",
				msg: "unknown unit kind turbin (kinds: boiler, cooler, deaerator, desuperheater, exchanger, flash, heater, mixer, pump, splitter, turbine, valve); did you mean turbine?"}}, false},
		// The misspelt port is not reported missing as well.
		{"role written out as a word", "stream A, B\npump P { inlet A; out B }",
			[]want{{code: "HMB208", at: "inlet", msg: "a pump has no role inlet (roles: in, out); did you mean in?", fix: "in"}}, false},
		{"unknown role with a suggestion", "stream A, B, C, D\nexchanger E { hot_in A; hot_out B; cold_in C; cold_ot D }",
			[]want{{code: "HMB208", at: "cold_ot", fix: "cold_out",
				msg: "an exchanger has no role cold_ot (roles: hot_in, hot_out, cold_in, cold_out); did you mean cold_out?"}}, false},
		{"unknown role", "stream A, B, C\nvalve V { in A; out B; bypass C }",
			[]want{{code: "HMB208", at: "bypass", msg: "a valve has no role bypass (roles: in, out)"}}, false},
		{"unconnected stream", "stream A { p 1 bar }",
			[]want{{code: "HMB209", at: "A", msg: "stream A is not connected to any unit"}}, true},
		{"stream in and out of one unit", "stream A\nheater H { in A; out A; duty 5 kW }",
			[]want{{code: "HMB210", at: "out |A", msg: "stream A both enters and leaves heater H", rel: "in |A"}}, false},
		{"unit where a stream is needed", "stream A, B\nvalve V { in A; out B }\nvalve W { in V; out A }",
			[]want{{code: "HMB211", at: "W { in |V", msg: "V is a valve, not a stream"}}, false},
		{"unknown stream property in an expectation", "stream A, B\nvalve V { in A; out B }\nexpect A pres > 1 bar",
			[]want{{code: "HMB212", at: "pres", msg: "a stream has no property pres (it has flow, p, T, h, s, x, v, rho, vol_flow, Tsat, superheat or subcooling); did you mean p?", fix: "p"}}, false},
		{"unknown unit result in an expectation", "stream A, B\nturbine T1 { in A; out B }\nexpect T1 powr > 1 kW",
			[]want{{code: "HMB212", at: "powr", msg: "turbine T1 has no result powr (it has power, efficiency, dp or sgen); did you mean power?", fix: "power"}}, false},

		// Values and units.
		{"wrong dimension", "stream A { p 40 lbm/h }",
			[]want{{code: "HMB302", at: "lbm/h", msg: "p is a pressure, but lbm/h is a unit of mass flow; use, for example, bar, kPa, psia or psig"}}, false},
		{"temperature difference for a temperature", "stream A { T 30 dC }",
			[]want{{code: "HMB302", at: "dC", msg: "T is a temperature, but dC is a unit of temperature difference; use, for example, C or F"}}, false},
		{"unit on an efficiency", "stream A, B\npump P { in A; out B; efficiency 80 kW }",
			[]want{{code: "HMB302", at: "kW", msg: "efficiency is a plain number (a fraction or %), not a power in kW"}}, false},
		{"unknown unit with a suggestion", "stream A { p 3 psgi }",
			[]want{{code: "HMB301", at: "psgi", msg: "unknown unit psgi; did you mean psig? (pressure units: " + levelPressures + ")", fix: "psig"}}, false},
		{"unknown unit near a metric one", "stream A { p 3 barr }",
			[]want{{code: "HMB301", at: "barr", msg: "unknown unit barr; did you mean bar? (pressure units: " + levelPressures + ")", fix: "bar"}}, false},
		{"unknown unit of a pressure drop lists differences", "stream A, B\nvalve V { in A; out B; dp 3 pascals }",
			[]want{{code: "HMB301", at: "pascals", msg: "unknown unit pascals (pressure units: Pa, hPa, kPa, MPa, bar, mbar, psia, atm, psi, inHg(abs), inHg, inH2O(abs), inH2O, mmHg(abs), mmHg, kgf/cm2(a), kgf/cm2)"}}, false},
		{"unknown unit of a flow", "stream A { flow 3 kg/sec }",
			[]want{{code: "HMB301", at: "kg/sec", msg: "unknown unit kg/sec; did you mean kg/s? (mass flow units: kg/s, kg/min, kg/h, t/h, lbm/s, lbm/min, lbm/h, klbm/h, Mlb/h, MMlb/h)", fix: "kg/s"}}, false},
		{"unknown unit of a plain number lists none", "stream A { x 0.5 parts }",
			[]want{{code: "HMB301", at: "parts", msg: "unknown unit parts"}}, false},
		// Readings: a pressure says absolute, gauge or vacuum; a difference does not.
		{"bare psi for a pressure", "stream A { p 5 psi }",
			[]want{{code: "HMB317", at: "psi", msg: "p 5 psi does not say whether it is absolute or gauge: write 5 psia or 5 psig"}}, false},
		{"psid for a pressure", "stream A { p 5 psid }",
			[]want{{code: "HMB317", at: "psid", msg: "p 5 psid does not say whether it is absolute or gauge: write 5 psia or 5 psig"}}, false},
		{"bare inHg for a pressure", "stream A { p 28 inHg }",
			[]want{{code: "HMB317", at: "inHg", msg: "p 28 inHg does not say whether it is absolute or a vacuum below the site atmosphere: write 28 inHg(abs) or 28 inHg(vac)"}}, false},
		{"bare mmHg in an expectation", "stream A, B\nvalve V { in A; out B }\nexpect B p < 50 mmHg",
			[]want{{code: "HMB317", at: "mmHg", msg: "p of B 50 mmHg does not say whether it is absolute or a vacuum below the site atmosphere: write 50 mmHg(abs) or 50 mmHg(vac)"}}, false},
		{"bare kgf/cm2 for a pressure", "stream A { p 10 kgf/cm2 }",
			[]want{{code: "HMB317", at: "kgf/cm2", msg: "p 10 kgf/cm2 does not say whether it is absolute or gauge: write 10 kgf/cm2(a) or 10 kgf/cm2(g)"}}, false},
		{"bare psi for the atmosphere", "atmosphere 14.2 psi",
			[]want{{code: "HMB317", at: "psi", fix: "psia", msg: "the atmosphere is an absolute pressure: write 14.2 psia"}}, false},
		{"bare inHg for the atmosphere", "atmosphere 29.92 inHg",
			[]want{{code: "HMB317", at: "inHg", fix: "inHg(abs)", msg: "the atmosphere is an absolute pressure: write 29.92 inHg(abs)"}}, false},
		{"vacuum reading for the atmosphere", "atmosphere 2 inHg(vac)",
			[]want{{code: "HMB310", at: "2 inHg(vac)", msg: "the atmosphere is an absolute pressure, not inHg(vac)"}}, false},
		{"gauge unit on a pressure drop", "stream A, B\nvalve V { in A; out B; dp 5 psig }",
			[]want{{code: "HMB318", at: "psig", fix: "psi", msg: "dp 5 psig is a gauge reading, but dp is a pressure difference: write 5 psi (to state the outlet pressure, give p on the outlet stream)"}}, false},
		{"gauge unit on a cold-side drop", "stream A, B, C, D\nexchanger E { hot_in A; hot_out B; cold_in C; cold_out D; dp_cold 2 bar(g) }",
			[]want{{code: "HMB318", at: "bar(g)", fix: "bar", msg: "dp_cold 2 bar(g) is a gauge reading, but dp_cold is a pressure difference: write 2 bar (to state the outlet pressure, give p on the outlet stream)"}}, false},
		{"vacuum unit on a pressure drop", "stream A, B\nheater H { in A; out B; dp 1 inHg(vac) }",
			[]want{{code: "HMB318", at: "inHg(vac)", fix: "inHg", msg: "dp 1 inHg(vac) is a vacuum reading, but dp is a pressure difference: write 1 inHg (to state the outlet pressure, give p on the outlet stream)"}}, false},
		{"vacuum beyond full vacuum", "stream A { p 31 inHg(vac) }",
			[]want{{code: "HMB304", at: "31 inHg(vac)", msg: "p 31 inHg(vac) is a vacuum at or beyond zero absolute: at this site's atmosphere a full vacuum is 29.92 inHg(vac)"}}, false},
		{"relative tolerance on a temperature", "stream A { T 250 C ± 2 % }",
			[]want{{code: "HMB319", at: "2 %", msg: "a tolerance of 2 % on a temperature has no fixed meaning (a percentage depends on where the scale puts zero): give it in degrees, such as ± 2 K"}}, false},
		{"relative tolerance on a temperature in F", "stream A { T 480 F +- 1 % }",
			[]want{{code: "HMB319", at: "1 %", msg: "a tolerance of 1 % on a temperature has no fixed meaning (a percentage depends on where the scale puts zero): give it in degrees, such as ± 1 F"}}, false},
		{"relative tolerance on an expected temperature", "stream A, B\nvalve V { in A; out B }\nexpect B T = 300 C within 1 %",
			[]want{{code: "HMB319", at: "1 %", msg: "a tolerance of 1 % on a temperature has no fixed meaning (a percentage depends on where the scale puts zero): give it in degrees, such as ± 1 K"}}, false},
		{"quality above one", "stream A { x 1.2 }",
			[]want{{code: "HMB303", at: "1.2", msg: "quality 1.2 must be between 0 and 1 (0 % and 100 %)"}}, false},
		{"quality below zero", "stream A { x -0.1 }",
			[]want{{code: "HMB303", at: "-0.1", msg: "quality -0.1 must be between 0 and 1 (0 % and 100 %)"}}, false},
		{"quality above 100 %", "stream A { x 120 % }",
			[]want{{code: "HMB303", at: "120 %", msg: "quality 120 % must be between 0 and 1 (0 % and 100 %)"}}, false},
		{"expected quality above one", "stream A, B\nvalve V { in A; out B }\nexpect B x = 1.5",
			[]want{{code: "HMB303", at: "1.5", msg: "quality 1.5 must be between 0 and 1 (0 % and 100 %)"}}, false},
		{"efficiency written as a percentage without %", "stream A, B\nturbine T { in A; out B; efficiency 80 }",
			[]want{{code: "HMB303", at: "80", msg: "efficiency 80 must be above 0 and at most 1 (100 %)"}}, false},
		{"efficiency of zero", "stream A, B\npump P { in A; out B; efficiency 0 % }",
			[]want{{code: "HMB303", at: "0 %", msg: "efficiency 0 % must be above 0 and at most 1 (100 %)"}}, false},
		{"pressure drop below zero", "stream A, B\nvalve V { in A; out B; dp -0.5 bar }",
			[]want{{code: "HMB316", at: "-0.5 bar", msg: "dp -0.5 bar is a pressure drop below zero: a valve does not raise the pressure"}}, false},
		{"hot-side pressure drop below zero, in psi", "stream A, B, C, D\nexchanger E { hot_in A; hot_out B; cold_in C; cold_out D; dp_hot -2 psi }",
			[]want{{code: "HMB316", at: "-2 psi", msg: "dp_hot -2 psi is a pressure drop below zero: an exchanger does not raise the pressure"}}, false},
		// -15 psig at the standard atmosphere (14.696 psia) is -0.30 psia.
		{"gauge pressure below a full vacuum", "stream A { p -15 psig }",
			[]want{{code: "HMB304", at: "-15 psig", msg: "p -15 psig is at or below zero absolute: at this site's atmosphere a full vacuum is -14.70 psig"}}, false},
		// At a site atmosphere of 12 psia, -12.5 psig is -0.5 psia.
		{"gauge pressure below vacuum at the site atmosphere", "atmosphere 12 psia\nstream A { p -12.5 psig }",
			[]want{{code: "HMB304", at: "-12.5 psig", msg: "p -12.5 psig is at or below zero absolute: at this site's atmosphere a full vacuum is -12.00 psig"}}, false},
		{"absolute pressure of zero", "stream A { p 0 bar }",
			[]want{{code: "HMB304", at: "0 bar", msg: "p 0 bar is not above zero absolute"}}, false},
		{"expected gauge pressure below a full vacuum", "stream A, B\nvalve V { in A; out B }\nexpect B p = -20 psig",
			[]want{{code: "HMB304", at: "-20 psig", msg: "p -20 psig is at or below zero absolute: at this site's atmosphere a full vacuum is -14.70 psig"}}, false},
		{"temperature below absolute zero", "stream A { T -500 F }",
			[]want{{code: "HMB304", at: "-500 F", msg: "T -500 F is at or below absolute zero"}}, false},
		{"property given twice", "stream A { p 1 bar\n p 2 bar }",
			[]want{{code: "HMB305", at: "p 2 bar", msg: "p of stream A is given twice", rel: "p 1 bar"}}, false},
		{"unknown stream property with a suggestion", "stream A { flw 3 kg/s }",
			[]want{{code: "HMB306", at: "flw", msg: "a stream has no property flw (it takes flow, p, T, h, s, x and fluid); did you mean flow?", fix: "flow"}}, false},
		{"property written out as a word", "stream A { Temperature 20 C }",
			[]want{{code: "HMB306", at: "Temperature", msg: "a stream has no property Temperature (it takes flow, p, T, h, s, x and fluid); did you mean T?", fix: "T"}}, false},
		{"unknown parameter with a suggestion", "stream A, B\nturbine T { in A; out B; efficency 0.8 }",
			[]want{{code: "HMB306", at: "efficency", msg: "a turbine has no parameter efficency (parameters: efficiency, power); did you mean efficiency?", fix: "efficiency"}}, false},
		{"unknown parameter with an underscore", "stream A, B\nmixer M { in A; out B; heatloss 3 kW }",
			[]want{{code: "HMB306", at: "heatloss", msg: "a mixer has no parameter heatloss (parameters: heat_loss, dp); did you mean heat_loss?", fix: "heat_loss"}}, false},
		{"unknown parameter without a near one", "stream A, B\nvalve V { in A; out B; bogus 3 }",
			[]want{{code: "HMB306", at: "bogus", msg: "a valve has no parameter bogus (parameters: dp)"}}, false},
		{"number without a unit", "stream A { h 1200 }",
			[]want{{code: "HMB307", at: "1200", msg: "h 1200 has no unit: a specific enthalpy needs one, such as kJ/kg or Btu/lbm"}}, false},
		{"tolerance without a unit", "stream A { p 3 bar ± 0.1 }",
			[]want{{code: "HMB307", at: "0.1", msg: "the tolerance 0.1 of p has no unit: give it in % or in a unit of pressure, such as bar, kPa, psia or psig"}}, false},
		{"unknown setting with a suggestion", "dispaly US",
			[]want{{code: "HMB308", at: "dispaly", fix: "display",
				msg: "unknown setting dispaly (settings: title, display, atmosphere, elevation, tolerance, ambient, project, document, revision, prepared_by, checked_by, date, display_QUANTITY); did you mean display?"}}, false},
		{"setting twice", "display US\ndisplay SI",
			[]want{{code: "HMB309", at: "US\n|display", msg: "display is set twice", rel: "display US"}}, false},
		{"atmosphere and elevation", "atmosphere 14.2 psia\nelevation 300 m",
			[]want{{code: "HMB309", at: "elevation", msg: "give the site atmosphere or the elevation, not both", rel: "atmosphere 14.2 psia"}}, false},
		{"setting value", "display metric",
			[]want{{code: "HMB310", at: "metric", msg: "unknown unit system metric: SI or US"}}, false},
		{"gauge atmosphere", "atmosphere 14.2 psig",
			[]want{{code: "HMB310", at: "14.2 psig", msg: "the atmosphere is an absolute pressure, not psig"}}, false},
		{"fluid other than water", "stream A { fluid ammonia }",
			[]want{{code: "HMB311", at: "ammonia", msg: "fluid ammonia is not supported: only water (steam) is"}}, false},
		{"negative tolerance", "stream A { T 300 F ± -2 F }",
			[]want{{code: "HMB312", at: "-2 F", msg: "the tolerance of T is below zero"}}, false},
		{"tolerance on a comparison", "stream A, B\nvalve V { in A; out B }\nexpect B x >= 0.9 within 0.01",
			[]want{{code: "HMB312", at: "within 0.01", msg: "a tolerance applies to = only, not to >="}}, false},
		{"tolerance of the wrong dimension", "stream A { x 0.5 ± 2 kg/s }",
			[]want{{code: "HMB302", at: "kg/s", msg: "the tolerance of x is a plain number (a fraction or %), not a mass flow in kg/s"}}, false},
		{"number too large", "stream A { p 1e999 bar }",
			[]want{{code: "HMB313", at: "1e999 bar", msg: "1e999 is too large a number"}}, false},
		{"names for a value", "stream A { fluid water, steam }",
			[]want{{code: "HMB314", at: "fluid water, steam", msg: "fluid takes one name: fluid water"}}, false},
		{"value for a role", "stream A, B\nvalve V { in A; out B; in 3 bar }",
			[]want{{code: "HMB314", at: "in 3 bar", msg: "in takes stream names, not a number"}}, false},
		{"label on a list of streams", "stream A, B \"two\"",
			[]want{{code: "HMB315", at: "B", msg: "a list of streams declares bare streams: give each its own stream statement for a label or givens"}}, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, diags := run(tt.src)
			checkDiags(t, tt.src, diags, tt.want, tt.warnings)
		})
	}
}

func checkDiags(t *testing.T, src string, diags []model.Diagnostic, wants []want, warnings bool) {
	t.Helper()
	var got []model.Diagnostic
	for _, d := range diags {
		if warnings || d.Severity == model.Error {
			got = append(got, d)
		}
	}
	for _, w := range wants {
		span := locate(t, src, w.at)
		k := -1
		for i, d := range got {
			if d.Code == w.code && d.Span == span && d.Message == w.msg {
				k = i
				break
			}
		}
		if k < 0 {
			t.Errorf("no %s at %q [%d,%d) with message %q; got:%s", w.code, w.at, span.Start, span.End, w.msg, list(src, got))
			continue
		}
		d := got[k]
		got = append(got[:k], got[k+1:]...)
		if d.Fix != w.fix {
			t.Errorf("%s %q: fix %q, want %q", w.code, w.msg, d.Fix, w.fix)
		}
		switch {
		case w.rel == "" && len(d.Related) > 0:
			t.Errorf("%s %q: unexpected related range %v", w.code, w.msg, d.Related)
		case w.rel != "" && len(d.Related) == 0:
			t.Errorf("%s %q: no related range, want %q", w.code, w.msg, w.rel)
		case w.rel != "" && d.Related[0].Span != locate(t, src, w.rel):
			r := d.Related[0].Span
			t.Errorf("%s %q: related range %q, want %q", w.code, w.msg, src[r.Start:r.End], w.rel)
		}
	}
	if len(got) > 0 {
		t.Errorf("unexpected diagnostics:%s", list(src, got))
	}
}

func list(src string, ds []model.Diagnostic) string {
	var b strings.Builder
	for _, d := range ds {
		b.WriteString("\n\t" + d.Code + " " + strings.TrimSpace(src[d.Span.Start:d.Span.End]) + ": " + d.Message)
	}
	return b.String()
}

// Conversion factors for the values below, from NIST Special Publication 811 (2008 edition),
// Appendix B.8: 1 psi = 6.894 757 E+03 Pa, 1 lb (avoirdupois) = 0.453 592 37 kg (exact),
// 1 bar = 1 E+05 Pa (exact), standard atmosphere = 1.013 25 E+05 Pa (exact); Appendix B.9 and
// section 4.2.1.1: T/K = (t/°F + 459.67)/1.8 and T/K = t/°C + 273.15, a degree Fahrenheit being
// 1/1.8 K as a difference.
const (
	psi = 6894.757
	lbm = 0.45359237
	atm = 101325.0
	// Appendix B.8: inch of mercury, conventional 3.386 389 E+03 Pa; inch of water, conventional
	// 2.490 889 E+02 Pa; millimeter of mercury, conventional 1.333 224 E+02 Pa; kilogram-force per
	// square centimeter 9.806 65 E+04 Pa (exact).
	// The mercury columns from their definition (13 595.1 kg/m3 under standard gravity), which
	// those values round: a vacuum reading subtracts, so seven figures would not carry.
	inHg   = 13595.1 * 9.80665 * 0.0254
	inH2O  = 249.0889
	mmHg   = 13595.1 * 9.80665 * 0.001
	kgfcm2 = 98066.5
)

// levelPressures are the pressure units an unknown spelling of a pressure lists.
const levelPressures = "Pa, hPa, kPa, MPa, bar, mbar, psia, atm, psig, bar(g), kPa(g), MPa(g), inHg(abs), inHg(vac), inH2O(abs), inH2O(vac), mmHg(abs), mmHg(vac), kgf/cm2(a), kgf/cm2(g)"

// TestValues checks givens, parameters and expectations in SI, with their tolerances: a
// tolerance is absolute in the unit written, or in % of the value as written, and on a quality or
// an efficiency a % is in points of percentage.
func TestValues(t *testing.T) {
	tests := []struct {
		name, src string
		get       func(m *model.Model) *model.Given
		value     float64
		tol       float64
	}{
		{"gauge pressure ± %", "stream A { p 150 psig ± 2 % }", streamGiven(model.P),
			150*psi + atm, 3 * psi},
		{"gauge pressure ± absolute", "stream A { p 150 psig ± 2 psi }", streamGiven(model.P),
			150*psi + atm, 2 * psi},
		{"gauge pressure at the site atmosphere", "atmosphere 12 psia\nstream A { p 10 psig +- 0.5 psig }", streamGiven(model.P),
			22 * psi, 0.5 * psi},
		{"absolute pressure, plus-minus spelt +/-", "stream A { p 40 bar +/- 0.2 bar }", streamGiven(model.P),
			40e5, 0.2e5},
		{"temperature ± degrees of the same scale", "stream A { T 300 F ± 2 F }", streamGiven(model.T),
			(300 + 459.67) / 1.8, 2 / 1.8},
		{"temperature ± a temperature difference", "stream A { T 400 °C ± 2 dF }", streamGiven(model.T),
			673.15, 2 / 1.8},
		{"flow ± %", "stream A { flow 9000 lbm/h ± 2 % }", streamGiven(model.Flow),
			9000 * lbm / 3600, 180 * lbm / 3600},
		{"flow ± another unit", "stream A { flow 3 kg/s ± 36 kg/h }", streamGiven(model.Flow),
			3, 0.01},
		{"quality as a fraction", "stream A { x 0.9 ± 0.01 }", streamGiven(model.X), 0.9, 0.01},
		{"quality in %", "stream A { x 90 % ± 1 % }", streamGiven(model.X), 0.9, 0.01},
		{"quality ± % is in points", "stream A { x 0.9 ± 1 % }", streamGiven(model.X), 0.9, 0.01},
		{"quality of saturated liquid", "stream A { x 0 }", streamGiven(model.X), 0, 0},
		{"efficiency as a fraction", "stream A, B\nturbine T { in A; out B; efficiency 0.82 ± 0.02 }", unitParam("efficiency"),
			0.82, 0.02},
		{"efficiency in %", "stream A, B\nturbine T { in A; out B; efficiency 82 % ± 2 % }", unitParam("efficiency"),
			0.82, 0.02},
		{"boiler efficiency in %", "stream A, B\nboiler B1 { in A; out B; efficiency 100 % }", unitParam("efficiency"),
			1, 0},
		{"pressure drop in psi", "stream A, B\nvalve V { in A; out B; dp 2 psi }", unitParam("dp"),
			2 * psi, 0},
		{"pressure drop in psid", "stream A, B\nvalve V { in A; out B; dp 2 psid ± 0.1 psid }", unitParam("dp"),
			2 * psi, 0.1 * psi},
		{"pressure drop in inches of water", "stream A, B\nvalve V { in A; out B; dp 10 inH2O }", unitParam("dp"),
			10 * inH2O, 0},
		{"pressure drop in kgf/cm2", "stream A, B\nvalve V { in A; out B; dp 0.5 kgf/cm2 }", unitParam("dp"),
			0.5 * kgfcm2, 0},
		{"condenser vacuum", "stream A { p 28 inHg(vac) ± 0.1 inHg }", streamGiven(model.P),
			atm - 28*inHg, 0.1 * inHg},
		{"condenser vacuum below a site atmosphere", "atmosphere 29.00 inHg(abs)\nstream A { p 27 inHg(vac) }", streamGiven(model.P),
			2 * inHg, 0},
		{"absolute mercury column", "stream A { p 2.5 inHg(abs) }", streamGiven(model.P), 2.5 * inHg, 0},
		{"vacuum in mmHg", "stream A { p 700 mmHg(vac) }", streamGiven(model.P), atm - 700*mmHg, 0},
		{"kgf/cm2 gauge", "stream A { p 10 kg/cm2g }", streamGiven(model.P), 10*kgfcm2 + atm, 0},
		{"hectopascal", "atmosphere 950 hPa\nstream A { p 1 barg }", streamGiven(model.P), 1e5 + 95000, 0},
		{"pressure drop", "stream A, B\nvalve V { in A; out B; dp 0.5 bar }", unitParam("dp"), 0.5e5, 0},
		{"no pressure drop", "stream A, B\nheater H { in A; out B; dp 0 bar }", unitParam("dp"), 0, 0},
		{"expected flow within %", "stream A, B\nvalve V { in A; out B }\nexpect B flow = 36 t/h within 1 %", expectation,
			10, 0.1},
		// Enthalpy below zero is a real state: Debian's python3-iapws 1.5.2,
		// IAPWS97(T=273.15, P=0.000611657).h = -0.0416 kJ/kg (IAPWS-IF97 region 1).
		{"expected enthalpy below zero", "stream A, B\nvalve V { in A; out B }\nexpect B h = -0.04 kJ/kg", expectation,
			-40, 0},
		{"expected quality in % within points", "stream A, B\nvalve V { in A; out B }\nexpect B x = 90 % ± 2 %", expectation,
			0.9, 0.02},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			m, diags := run(tt.src)
			for _, d := range diags {
				if d.Severity == model.Error {
					t.Fatalf("%s %s", d.Code, d.Message)
				}
			}
			g := tt.get(m)
			if g == nil {
				t.Fatal("value missing from the model")
			}
			if !near(g.Value, tt.value) || !near(g.Tol, tt.tol) {
				t.Errorf("got %.9g ± %.9g, want %.9g ± %.9g", g.Value, g.Tol, tt.value, tt.tol)
			}
		})
	}
}

// near compares to 1e-6 relative: the psi factor above is given to seven digits.
func near(a, b float64) bool { return math.Abs(a-b) <= 1e-6*math.Max(math.Abs(b), 1e-9) }

func streamGiven(p model.Prop) func(*model.Model) *model.Given {
	return func(m *model.Model) *model.Given {
		if len(m.Streams) == 0 {
			return nil
		}
		return m.Streams[0].Given[p]
	}
}

func unitParam(name string) func(*model.Model) *model.Given {
	return func(m *model.Model) *model.Given {
		if len(m.Units) == 0 {
			return nil
		}
		return m.Units[0].Params[name]
	}
}

func expectation(m *model.Model) *model.Given {
	if len(m.Expects) == 0 {
		return nil
	}
	return &model.Given{Value: m.Expects[0].Value, Tol: m.Expects[0].Tol}
}
