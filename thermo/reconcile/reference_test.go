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

// TestLinearCurrent re-runs linear.py and checks that linear.json holds its answers: skipped with
// a note without numpy, failed when HMB_REQUIRE_NUMPY=1.
func TestLinearCurrent(t *testing.T) {
	if err := exec.Command(python3, "-c", "import numpy").Run(); err != nil {
		if os.Getenv("HMB_REQUIRE_NUMPY") == "1" {
			t.Fatalf("numpy not importable and HMB_REQUIRE_NUMPY=1: %v", err)
		}
		t.Skipf("numpy not importable (%v); apt-get install python3-numpy to re-run linear.py", err)
	}
	out := filepath.Join(t.TempDir(), "linear.json")
	if b, err := exec.Command(python3, "../../testdata/reconcile/linear.py", out).CombinedOutput(); err != nil {
		t.Fatalf("linear.py: %v\n%s", err, b)
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
	fresh, committed := read(out), read("../../testdata/reconcile/linear.json")
	// Numbers, not bytes: another numpy may differ in the last digits, and the Monte Carlo
	// probabilities in their third.
	var diff func(path string, a, b any)
	diff = func(path string, a, b any) {
		switch a := a.(type) {
		case map[string]any:
			bm, ok := b.(map[string]any)
			if !ok || len(a) != len(bm) {
				t.Errorf("%s: linear.py and linear.json differ in shape", path)
				return
			}
			for k, v := range a {
				diff(path+"."+k, v, bm[k])
			}
		case []any:
			bs, ok := b.([]any)
			if !ok || len(a) != len(bs) {
				t.Errorf("%s: linear.py and linear.json differ in shape", path)
				return
			}
			for i := range a {
				diff(fmt.Sprintf("%s[%d]", path, i), a[i], bs[i])
			}
		case float64:
			bf, ok := b.(float64)
			tol := 1e-9 * max(math.Abs(a), math.Abs(bf))
			if strings.HasPrefix(path, ".simulation.p_found_first.") {
				tol = 0.03
			}
			if !ok || math.Abs(a-bf) > tol {
				t.Errorf("%s: linear.py gives %v, linear.json holds %v: re-run it", path, a, b)
			}
		case string:
			if path != ".generator" && a != b {
				t.Errorf("%s: linear.py gives %q, linear.json holds %q", path, a, b)
			}
		default:
			if a != b {
				t.Errorf("%s: linear.py gives %v, linear.json holds %v", path, a, b)
			}
		}
	}
	diff("", fresh, committed)
}
