package report

import (
	"bytes"
	"encoding/csv"
	"math"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// TestStreamTable checks the written cells against python3-iapws 1.5.2 (IAPWS97 class):
// IAPWS97(P=1, T=523.15) -> h 2943.2221652336634 kJ/kg, s 6.926622739684809 kJ/(kg K);
// IAPWS97(P=0.2, h=2943.2221652336634) -> T 509.19490955867684 K, s 7.655671765571876;
// the turbine outlet: IAPWS97(P=0.01, s=7.655671765571876) -> h 2426.570433219117 (isentropic),
// actual h = 2943.222 - 0.8 (2943.222 - 2426.570) = 2529.900779622026 kJ/kg,
// IAPWS97(P=0.01, h=2529.900779622026) -> T 318.9575482070235 K, s 7.9796349156572335, x 0.9774312403952671.
func TestStreamTable(t *testing.T) {
	in := testInput(t, units.SI)
	tab := StreamTable(in.Model, in.Result)
	want := [][]string{
		{"A", "header <steam>", "2.0000", "1000.0", "250.00", "2943.2", "6.9266", "", "superheated vapour"},
		{"B", "after valve", "2.0000", "200.00", sig(509.19490955867684-273.15, 5), "2943.2", "7.6557", "", "superheated vapour"},
		{"C", "exhaust", "2.0000", "10.000", sig(318.9575482070235-273.15, 5), "2529.9", "7.9796", "0.9774", "saturated mixture"},
	}
	if len(tab.Rows) != len(want) {
		t.Fatalf("%d rows, want %d", len(tab.Rows), len(want))
	}
	for i := range want {
		if strings.Join(tab.Rows[i], "|") != strings.Join(want[i], "|") {
			t.Errorf("row %d:\n got %q\nwant %q", i, tab.Rows[i], want[i])
		}
	}
	heads := []string{}
	for _, c := range tab.Cols {
		heads = append(heads, c.Heading())
	}
	if got := strings.Join(heads, "|"); got != "stream|label|flow (kg/s)|p (kPa)|T (C)|h (kJ/kg)|s (kJ/(kg K))|x|phase" {
		t.Errorf("headings %s", got)
	}
}

// TestUnitTable: the valve generates m (s_B - s_A) = 2 (7.655671765571876 - 6.926622739684809)
// = 1.458098 kW/K; the turbine delivers m (h_B - h_C) = 2 (2943.2221652336634 - 2529.900779622026)
// = 826.64 kW (python3-iapws values as above). In US units entropy generation is in Btu/(h R)
// (1 Btu_IT = 1055.05585262 J, NIST SP 811 (2008) Appendix B.8) and shaft power in hp
// (550 ft lbf/s = 745.69987158227022 W, the same appendix).
func TestUnitTable(t *testing.T) {
	for _, tt := range []struct {
		sys  units.System
		want [][]string
	}{
		// Pressure drops: the valve 1 MPa to 200 kPa, the turbine 200 kPa to 10 kPa; 1 psi =
		// 6894.757293168 Pa (NIST SP 811 (2008) Appendix B.8).
		{units.SI, [][]string{{"V1", "valve", "valve", "", "", "", "800.00", "1.4581"}, {"T1", "turbine", "turbine", "", "826.64", "0.8000", "190.00", "0.64793"}}},
		{units.US, [][]string{{"V1", "valve", "valve", "", "", "", sig(800e3/6894.757293168, 5), sig(1458.098052*3600/1055.05585262*5/9, 5)},
			{"T1", "turbine", "turbine", "", sig(826642.77/745.69987158227022, 5), "0.8000", sig(190e3/6894.757293168, 5), sig(2*(7979.6349156572335-7655.671765571876)*3600/1055.05585262*5/9, 5)}}},
	} {
		in := testInput(t, tt.sys)
		tab := UnitTable(in.Model, in.Result)
		for i := range tt.want {
			if strings.Join(tab.Rows[i], "|") != strings.Join(tt.want[i], "|") {
				t.Errorf("%s row %d:\n got %q\nwant %q", tt.sys, i, tab.Rows[i], tt.want[i])
			}
		}
	}
}

// TestConditionTable checks the derived stream values against python3-iapws 1.5.2 (IAPWS97
// class): IAPWS97(P=1, x=0).T = 453.0356323914666 K, IAPWS97(P=1, T=523.15).v =
// 0.23273893329992676 m3/kg; IAPWS97(P=0.2, x=0).T = 393.3615459364888 K, B's state as in
// TestStreamTable, IAPWS97(P=0.2, h=2943.2221652336634).v = 1.1660053036947147;
// IAPWS97(P=0.01, x=0).T = 318.9575482070235 K, IAPWS97(P=0.01, h=2529.900779622026).v =
// 14.339484984362544. The volume flows are 2 kg/s times v, per hour.
func TestConditionTable(t *testing.T) {
	in := testInput(t, units.SI)
	tab := ConditionTable(in.Model, in.Result)
	want := [][]string{
		{"A", sig(453.0356323914666-273.15, 5), sig(523.15-453.0356323914666, 5), "", sig(0.23273893329992676, 5), sig(1/0.23273893329992676, 5), sig(2*0.23273893329992676*3600, 5), "flow, p, T"},
		{"B", sig(393.3615459364888-273.15, 5), sig(509.19490955867684-393.3615459364888, 5), "", sig(1.1660053036947147, 5), sig(1/1.1660053036947147, 5), sig(2*1.1660053036947147*3600, 5), "p"},
		{"C", sig(318.9575482070235-273.15, 5), "", "", sig(14.339484984362544, 5), sig(1/14.339484984362544, 5), sig(2*14.339484984362544*3600, 5), "p"},
	}
	for i := range want {
		if strings.Join(tab.Rows[i], "|") != strings.Join(want[i], "|") {
			t.Errorf("row %d:\n got %q\nwant %q", i, tab.Rows[i], want[i])
		}
	}
	heads := []string{}
	for _, c := range tab.Cols {
		heads = append(heads, c.Heading())
	}
	if got := strings.Join(heads, "|"); got != "stream|Tsat (C)|superheat (dK)|subcooling (dK)|v (m3/kg)|rho (kg/m3)|volume flow (m3/h)|given" {
		t.Errorf("headings %s", got)
	}
	// The totals: the turbine's power out, nothing else.
	tot := TotalTable(in.Model, in.Result)
	if tot == nil || tot.Rows[0][0] != "power_out" || tot.Rows[0][1] != "826.64" || tot.Rows[2][1] != "826.64" || tot.Rows[5][1] != Unsolved {
		t.Errorf("totals %v", tot)
	}
	if ExchangerTable(in.Model, in.Result) != nil {
		t.Error("an exchanger table without exchangers")
	}
}

func TestUnsolvedCells(t *testing.T) {
	in := testInput(t, units.SI)
	in.Model.Streams = append(in.Model.Streams, &model.Stream{Name: "D", Fluid: "water"})
	in.Result.Streams = append(in.Result.Streams, in.Result.Streams[0])
	in.Result.Streams[3].HasState, in.Result.Streams[3].M = false, math.NaN()
	row := StreamTable(in.Model, in.Result).Rows[3]
	if strings.Join(row, "|") != "D||n/a|n/a|n/a|n/a|n/a|n/a|unsolved" {
		t.Errorf("unsolved row %q", row)
	}
	var b bytes.Buffer
	if err := WriteCSV(&b, in); err != nil {
		t.Fatal(err)
	}
	if strings.Contains(b.String(), Unsolved) {
		t.Errorf("CSV shows %q for a missing value:\n%s", Unsolved, b.String())
	}
	if got := (&Input{}); WriteMarkdown(&b, got) == nil || WriteCSV(&b, got) == nil || WriteHTML(&b, got) == nil {
		t.Error("no model: want an error")
	}
}

// TestCSVReadsBack parses the CSV as a spreadsheet would: three sections (streams, units and the
// basis: the ambient temperature), each with names, units and rows, every number parseable.
func TestCSVReadsBack(t *testing.T) {
	in := testInput(t, units.US)
	var b bytes.Buffer
	if err := WriteCSV(&b, in); err != nil {
		t.Fatal(err)
	}
	r := csv.NewReader(&b)
	r.FieldsPerRecord = -1
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	// The empty line between the sections is skipped by encoding/csv: streams, their
	// conditions, units, totals, the basis.
	if len(recs) != 2+3+2+3+2+2+2+7+2+1 {
		t.Fatalf("%d records:\n%q", len(recs), recs)
	}
	if recs[0][2] != "flow" || recs[1][2] != "lbm/h" || recs[1][3] != "psia" || recs[2][1] != "header <steam>" {
		t.Errorf("stream header %q %q", recs[0], recs[1])
	}
	if recs[10][0] != "unit" || recs[11][3] != "Btu/h" || recs[11][6] != "psi" || recs[11][7] != "Btu/(h R)" {
		t.Errorf("unit header %q %q", recs[10], recs[11])
	}
	numeric := func(recs [][]string, cols ...int) {
		for _, rec := range recs {
			for _, j := range cols {
				if j >= len(rec) || rec[j] == "" {
					continue
				}
				if _, err := parseNum(rec[j]); err != nil {
					t.Errorf("cell %q of %q is not a number", rec[j], rec)
				}
			}
		}
	}
	numeric(recs[2:5], 2, 3, 4, 5, 6, 7)
	numeric(recs[7:10], 1, 2, 3, 4, 5, 6)
	numeric(recs[12:14], 3, 4, 5, 6, 7)
	numeric(recs[16:23], 1)
	// The default ambient, 25 C = 77 F (t_F = 1.8 t_C + 32, NIST SP 811 (2008), 4.2.1.1).
	if recs[23][0] != "ambient" || recs[24][0] != "F" || recs[25][0] != "77.000" {
		t.Errorf("basis %q %q %q", recs[23], recs[24], recs[25])
	}
	// 2 kg/s = 2 / 0.45359237 * 3600 lbm/h (international pound, 1959), to 4 figures.
	if got, _ := parseNum(recs[2][2]); math.Abs(got/(2/0.45359237*3600)-1) > 5e-4 {
		t.Errorf("flow %g lbm/h", got)
	}
}

func TestHTMLTablesWellFormed(t *testing.T) {
	in := testInput(t, units.SI)
	var b bytes.Buffer
	if err := WriteHTML(&b, in); err != nil {
		t.Fatal(err)
	}
	root := parseXML(t, b.Bytes())
	var rows, cells int
	root.walk(func(n *node) {
		switch n.XMLName.Local {
		case "tr":
			rows++
		case "td":
			cells++
		}
	})
	// Two heading rows per table, then 3 streams of 9 cells, their 3 conditions of 8, 2 units
	// of 8 and 7 totals of 3.
	if rows != 4*2+3+3+2+7 || cells != 3*9+3*8+2*8+7*3 {
		t.Errorf("%d rows, %d cells", rows, cells)
	}
	if !strings.Contains(b.String(), "header &lt;steam&gt;") || !strings.Contains(b.String(), "Test line | valve") {
		t.Error("labels and title not escaped as text")
	}
}

func TestMarkdownEscapesPipes(t *testing.T) {
	in := testInput(t, units.SI)
	var b bytes.Buffer
	if err := WriteMarkdown(&b, in); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(b.String(), `# Test line \| valve and turbine`) {
		t.Errorf("title line %q", strings.SplitN(b.String(), "\n", 2)[0])
	}
	for _, line := range strings.Split(b.String(), "\n") {
		if strings.HasPrefix(line, "| A ") && strings.Count(line, "|") != 10 && strings.Count(line, "|") != 9 {
			t.Errorf("row has %d pipes: %s", strings.Count(line, "|"), line)
		}
	}
}
