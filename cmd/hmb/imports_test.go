package main

import (
	"os/exec"
	"strings"
	"testing"
)

// TestImportRules keeps syntax apart from physics (see DEVELOPERS.md): the notation never depends
// on the property engine or the solver, nothing in thermo sees the notation or the editor, and
// only the command (cmd/hmb) and the language server join the two.
func TestImportRules(t *testing.T) {
	if _, err := exec.LookPath("go"); err != nil {
		t.Skip("go command not on PATH:", err)
	}
	out, err := exec.Command("go", "list", "-deps=false", "-f", `{{.ImportPath}}:{{join .Deps " "}}`, "hmb/...").CombinedOutput()
	if err != nil {
		t.Fatalf("go list: %v\n%s", err, out)
	}
	forbidden := func(pkg string) []string {
		switch {
		case strings.HasPrefix(pkg, "hmb/lang"):
			return []string{"hmb/thermo/if97", "hmb/thermo/solve", "hmb/thermo/reconcile", "hmb/thermo/report", "hmb/lsp", "hmb/cmd"}
		case strings.HasPrefix(pkg, "hmb/thermo/units"):
			return []string{"hmb/"}
		case strings.HasPrefix(pkg, "hmb/thermo/model"):
			return []string{"hmb/lang", "hmb/thermo/if97", "hmb/thermo/solve", "hmb/thermo/reconcile", "hmb/thermo/report"}
		case strings.HasPrefix(pkg, "hmb/thermo"):
			return []string{"hmb/lang", "hmb/lsp", "hmb/cmd"}
		}
		return nil
	}
	n := 0
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		pkg, deps, _ := strings.Cut(line, ":")
		n++
		for _, dep := range strings.Fields(deps) {
			for _, f := range forbidden(pkg) {
				if dep == f || strings.HasPrefix(dep, f+"/") || (strings.HasSuffix(f, "/") && strings.HasPrefix(dep, f)) {
					t.Errorf("%s depends on %s", pkg, dep)
				}
			}
		}
	}
	if n < 3 {
		t.Fatalf("go list found only %d packages", n)
	}
}
