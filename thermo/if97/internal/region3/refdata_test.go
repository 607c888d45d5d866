package region3

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// refPath is the repository's copy of the IAPWS R7-97(2012) verification values.
var refPath = filepath.Join("..", "..", "..", "..", "testdata", "reference", "if97-verification.csv")

// refRow is one row of testdata/reference/if97-verification.csv.
type refRow struct {
	source, names, prop string
	inputs              []float64
	value               float64
	text                string // value as printed
}

func loadVerification(t *testing.T) []refRow {
	t.Helper()
	path := refPath
	f, err := os.Open(path)
	if err != nil {
		t.Fatalf("reference data missing: %v", err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	var rows []refRow
	for k, r := range recs[1:] {
		if len(r) != 6 {
			t.Fatalf("%s:%d: want 6 fields, got %d", path, k+2, len(r))
		}
		row := refRow{source: r[0], names: r[1], prop: r[3], text: r[5]}
		for _, s := range strings.Split(r[2], ";") {
			x, err := strconv.ParseFloat(s, 64)
			if err != nil {
				t.Fatalf("%s:%d: input %q: %v", path, k+2, s, err)
			}
			row.inputs = append(row.inputs, x)
		}
		if row.value, err = strconv.ParseFloat(r[5], 64); err != nil {
			t.Fatalf("%s:%d: value %q: %v", path, k+2, r[5], err)
		}
		rows = append(rows, row)
	}
	return rows
}

// halfDigit is half a unit in the last of the printed significant digits.
func halfDigit(text string, v float64) float64 {
	mant := strings.ToLower(text)
	if i := strings.IndexByte(mant, 'e'); i >= 0 {
		mant = mant[:i]
	}
	digits := 0
	started := false
	for _, c := range mant {
		if c >= '1' && c <= '9' {
			started = true
		}
		if c >= '0' && c <= '9' && started {
			digits++
		}
	}
	e := math.Floor(math.Log10(math.Abs(v)))
	return 0.5 * math.Pow(10, e-float64(digits-1))
}

// TestTable33 checks the basic equation against the computer-program
// verification values of IAPWS R7-97(2012) Table 33.
func TestTable33(t *testing.T) {
	n := 0
	for _, r := range loadVerification(t) {
		if !strings.HasSuffix(r.source, "Table 33") {
			continue
		}
		if r.names != "T[K];rho[kg/m3]" {
			t.Fatalf("%s: unexpected inputs %q", r.source, r.names)
		}
		T, rho := r.inputs[0], r.inputs[1]
		pr := Eval(rho, T)
		got := map[string]float64{"p": pr.P, "h": pr.H, "u": pr.U, "s": pr.S, "cp": pr.Cp, "w": pr.W}
		g, known := got[r.prop]
		if !known {
			t.Errorf("%s: unknown property %q", r.source, r.prop)
			continue
		}
		n++
		if d := math.Abs(g - r.value); d > 1.0001*halfDigit(r.text, r.value) {
			t.Errorf("%s: %s(T=%g K, rho=%g kg/m3) = %.10g, want %s (off by %.2g)", r.source, r.prop, T, rho, g, r.text, d)
		}
	}
	if n != 18 {
		t.Errorf("found %d Table 33 rows, want 18", n)
	}
}
