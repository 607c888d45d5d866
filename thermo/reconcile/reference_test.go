package reconcile

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

const python3 = "/usr/bin/python3" // Debian's interpreter, where python3-numpy installs

// TestReferencesCurrent re-runs the scripts of testdata/reconcile and checks that the JSON
// beside each holds its answers: skipped with a note when Debian's python3-numpy (and, for the
// non-linear cases, python3-scipy and python3-iapws) are missing, failed then when
// HMB_REQUIRE_NUMPY=1.
func TestReferencesCurrent(t *testing.T) {
	for _, ref := range []struct {
		script, json, imports string
		tol                   float64 // relative; another library release may differ in the last digits
	}{
		{"linear.py", "linear.json", "import numpy", 1e-9},
		{"nonlinear.py", "nonlinear.json", "import numpy, scipy, iapws", 1e-7},
	} {
		t.Run(ref.script, func(t *testing.T) { referenceCurrent(t, ref.script, ref.json, ref.imports, ref.tol) })
	}
}

func referenceCurrent(t *testing.T, script, committedJSON, imports string, relTol float64) {
	if err := exec.Command(python3, "-c", imports).Run(); err != nil {
		if os.Getenv("HMB_REQUIRE_NUMPY") == "1" {
			t.Fatalf("%s fails and HMB_REQUIRE_NUMPY=1: %v", imports, err)
		}
		t.Skipf("%s fails (%v); apt-get install python3-numpy python3-scipy python3-iapws to re-run %s", imports, err, script)
	}
	out := filepath.Join(t.TempDir(), committedJSON)
	if b, err := exec.Command(python3, "../../testdata/reconcile/"+script, out).CombinedOutput(); err != nil {
		t.Fatalf("%s: %v\n%s", script, err, b)
	}
	read := func(p string) any {
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		var v any
		if err := json.Unmarshal(b, &v); err != nil {
			t.Fatal(err)
		}
		return v
	}
	fresh, committed := read(out), read("../../testdata/reconcile/"+committedJSON)
	// Numbers, not bytes: another numpy may differ in the last digits, and the Monte Carlo
	// probabilities in their third.
	var diff func(path string, a, b any)
	diff = func(path string, a, b any) {
		switch a := a.(type) {
		case map[string]any:
			bm, ok := b.(map[string]any)
			if !ok || len(a) != len(bm) {
				t.Errorf("%s: %s and %s differ in shape", path, script, committedJSON)
				return
			}
			for k, v := range a {
				diff(path+"."+k, v, bm[k])
			}
		case []any:
			bs, ok := b.([]any)
			if !ok || len(a) != len(bs) {
				t.Errorf("%s: %s and %s differ in shape", path, script, committedJSON)
				return
			}
			for i := range a {
				diff(fmt.Sprintf("%s[%d]", path, i), a[i], bs[i])
			}
		case float64:
			bf, ok := b.(float64)
			tol := relTol * max(math.Abs(a), math.Abs(bf))
			if strings.HasPrefix(path, ".simulation.p_found_first.") {
				tol = 0.03
			}
			if !ok || math.Abs(a-bf) > tol {
				t.Errorf("%s: %s gives %v, %s holds %v: re-run it", path, script, a, committedJSON, b)
			}
		case string:
			if path != ".generator" && a != b {
				t.Errorf("%s: %s gives %q, %s holds %q", path, script, a, committedJSON, b)
			}
		default:
			if a != b {
				t.Errorf("%s: %s gives %v, %s holds %v", path, script, a, committedJSON, b)
			}
		}
	}
	diff("", fresh, committed)
}
