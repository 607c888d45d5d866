package main

import (
	"context"
	"os"
	"strings"
	"testing"

	"hmb/thermo/report"
)

// TestReportExamples writes the page of every example and checks that it is well-formed, carries
// the caution, inlines its diagrams and lists every finding the checker makes.
func TestReportExamples(t *testing.T) {
	for _, f := range exampleFiles(t) {
		code, out, stderr := runReportCmd("report", f)
		if code == 2 || len(out) == 0 {
			t.Fatalf("%s: exit %d: %s", f, code, stderr)
		}
		if err := xmlWellFormed(out); err != nil {
			t.Errorf("%s: %v", f, err)
		}
		page := string(out)
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		c := checkModel(context.Background(), f, src, nil)
		// The flowsheet, three property diagrams, and a plot per sweep.
		if !strings.Contains(page, report.Caution) || strings.Count(page, "<svg ") != 4+len(c.model.Sweeps) {
			t.Errorf("%s: caution or diagrams missing", f)
		}
		errs := 0
		for _, d := range c.diags {
			if !strings.Contains(page, esc(d.Message)) {
				t.Errorf("%s: finding %s %q not on the page", f, d.Code, d.Message)
			}
			if d.Severity == 1 {
				errs++
			}
		}
		if (errs > 0) != (code == 1) {
			t.Errorf("%s: exit %d with %d error(s)", f, code, errs)
		}
		if n := len(c.model.Expects); n > 0 && !strings.Contains(page, "expectation(s) hold.") {
			t.Errorf("%s: no expectation summary", f)
		}
	}
}

// esc mirrors the page's HTML escaping of text.
func esc(s string) string {
	return strings.NewReplacer("&", "&amp;", "<", "&lt;", ">", "&gt;", `"`, "&#34;", "'", "&#39;").Replace(s)
}

// TestReportBrokenFile: a file the notation cannot read is an error with its diagnostics, and no
// page.
func TestReportBrokenFile(t *testing.T) {
	dir := t.TempDir()
	bad := dir + "/bad.hmb"
	if err := os.WriteFile(bad, []byte("stream {{{ nonsense\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, stderr := runReportCmd("report", "-o", dir+"/bad.html", bad)
	if code == 0 {
		t.Errorf("exit 0 for a broken file; stdout %q", out)
	}
	if !strings.Contains(stderr, "bad.hmb") {
		t.Errorf("stderr does not name the file: %q", stderr)
	}
}
