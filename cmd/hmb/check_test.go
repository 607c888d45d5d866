package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	goldenfile "hmb/lang/golden"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// golden compares got with the file at path, or rewrites it under -update: lang/golden, the one
// golden helper of hmb's tests.
func golden(t *testing.T, path string, got []byte) {
	t.Helper()
	goldenfile.Check(t, path, got)
}

// update reports whether this run rewrites golden files and generated sections.
func update() bool { return goldenfile.Update() }

// TestCheckGolden runs hmb check over the command-line fixtures in every output format. The
// fixtures are invented demo calcs; the goldens are reviewed output, not references (the
// solved values themselves are checked against python3-iapws in examples_test.go and in the
// solver's tests).
func TestCheckGolden(t *testing.T) {
	t.Chdir(filepath.Join("..", ".."))
	tests := []struct {
		name   string
		args   []string
		code   int
		golden string
	}{
		{"text", []string{"check", "testdata/cli"}, 1, "check.txt"},
		{"quiet", []string{"check", "--quiet", "testdata/cli/faulty.hmb"}, 1, "check-quiet.txt"},
		{"clean-si", []string{"check", "--si", "testdata/cli/clean.hmb"}, 0, "check-si.txt"},
		// Every expectation that holds, one line each; the file's own display units.
		{"verbose", []string{"check", "-v", "testdata/cli/plant.hmb"}, 0, "check-verbose.txt"},
		// --quiet drops the notes (HMB504: the redundant flow of PS agrees) as well as the tables and
		// the expectations that hold: nothing to say.
		{"quiet-notes", []string{"check", "--quiet", "-v", "testdata/cli/plant.hmb"}, 0, "check-quiet-notes.txt"},
		// --us keeps only the US units a file chose (none here): psia, lbm/h.
		{"plant-us", []string{"check", "--us", "testdata/cli/plant.hmb"}, 0, "check-plant-us.txt"},
		{"json", []string{"check", "--format", "json", "testdata/cli"}, 1, "check.json"},
		{"sarif", []string{"check", "--format", "sarif", "testdata/cli"}, 1, "check.sarif"},
		// The bundled examples are clean (warnings only): exit 0 in every format.
		{"examples-text", []string{"check", "testdata/examples"}, 0, "examples.txt"},
		{"examples-json", []string{"check", "--format", "json", "testdata/examples"}, 0, "examples.json"},
		{"examples-sarif", []string{"check", "--format", "sarif", "testdata/examples"}, 0, "examples.sarif"},
		{"examples-us", []string{"check", "--us", "testdata/examples"}, 0, "examples-us.txt"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var out, errb bytes.Buffer
			if code := run(tt.args, nil, &out, &errb); code != tt.code {
				t.Fatalf("exit %d, want %d; stderr %s", code, tt.code, errb.String())
			}
			golden(t, filepath.Join("testdata", "cli", tt.golden), out.Bytes())
		})
	}
}

// TestCheckJSONShape checks the JSON contract: SI base units, null for what is unknown or
// single-phase quality, 1-based positions.
func TestCheckJSONShape(t *testing.T) {
	t.Chdir(filepath.Join("..", ".."))
	var out, errb bytes.Buffer
	run([]string{"check", "--format", "json", "testdata/cli/clean.hmb", "testdata/cli/faulty.hmb"}, nil, &out, &errb)
	var doc struct {
		Files []struct {
			Path        string
			Diagnostics []struct {
				Severity, Code, Message string
				Range                   struct{ Start, End struct{ Line, Column int } }
			}
			Streams []map[string]any
			Units   []map[string]any
		}
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Files) != 2 {
		t.Fatalf("%d files", len(doc.Files))
	}
	clean, faulty := doc.Files[0], doc.Files[1]
	if len(clean.Diagnostics) != 0 || len(clean.Streams) != 2 || len(clean.Units) != 1 {
		t.Fatalf("clean: %+v", clean)
	}
	hp := clean.Streams[0]
	// 4000 lbm/h = 4000 x 0.45359237 / 3600 kg/s (exact pound); 125 psig + 14.696 psia default
	// atmosphere (101325 Pa) = 125 x 6894.757293168 + 101325 Pa; 450 F = 505.372 K.
	for k, want := range map[string]float64{"m": 4000 * 0.45359237 / 3600, "p": 125*6894.757293168361 + 101325, "T": (450-32)/1.8 + 273.15} {
		if g, _ := hp[k].(float64); g == 0 || (g-want)/want > 1e-9 || (want-g)/want > 1e-9 {
			t.Errorf("HP %s = %v, want %.10g", k, hp[k], want)
		}
	}
	if hp["x"] != nil || hp["phase"] != "superheated vapour" {
		t.Errorf("HP x %v phase %v", hp["x"], hp["phase"])
	}
	// A valve conserves enthalpy.
	if clean.Streams[0]["h"] != clean.Streams[1]["h"] {
		t.Errorf("valve: h %v -> %v", clean.Streams[0]["h"], clean.Streams[1]["h"])
	}
	codes := map[string]bool{}
	for _, d := range faulty.Diagnostics {
		codes[d.Code] = true
		if d.Range.Start.Line < 1 || d.Range.Start.Column < 1 || d.Severity == "" || d.Message == "" {
			t.Errorf("bad diagnostic %+v", d)
		}
	}
	for _, c := range []string{"HMB301", "HMB303", "HMB201"} {
		if !codes[c] {
			t.Errorf("faulty.hmb: no %s diagnostic in %v", c, codes)
		}
	}
	for _, s := range faulty.Streams {
		if s["name"] == "B" && s["T"] != nil {
			t.Errorf("unsolved stream B has T %v, want null", s["T"])
		}
	}
}

// TestSARIF checks the parts of SARIF 2.1.0 that code-scanning services read.
func TestSARIF(t *testing.T) {
	t.Chdir(filepath.Join("..", ".."))
	var out, errb bytes.Buffer
	run([]string{"check", "--format", "sarif", "testdata/cli"}, nil, &out, &errb)
	var doc struct {
		Version string `json:"version"`
		Schema  string `json:"$schema"`
		Runs    []struct {
			Tool struct {
				Driver struct {
					Name  string
					Rules []struct{ ID string }
				}
			}
			Results []struct {
				RuleID    string `json:"ruleId"`
				Level     string
				Message   struct{ Text string }
				Locations []struct {
					PhysicalLocation struct {
						ArtifactLocation struct{ URI string }
						Region           struct{ StartLine, StartColumn int }
					}
				}
			}
		}
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Version != "2.1.0" || !strings.Contains(doc.Schema, "sarif") || len(doc.Runs) != 1 {
		t.Fatalf("version %q schema %q runs %d", doc.Version, doc.Schema, len(doc.Runs))
	}
	r := doc.Runs[0]
	rules := map[string]bool{}
	for _, rule := range r.Tool.Driver.Rules {
		rules[rule.ID] = true
	}
	known := map[string]bool{}
	for _, c := range allCodes() {
		known[c.Code] = true
	}
	for id := range rules {
		if !known[id] {
			t.Errorf("rule %s is not a documented code", id)
		}
	}
	if len(r.Results) == 0 {
		t.Fatal("no results")
	}
	for _, res := range r.Results {
		loc := res.Locations[0].PhysicalLocation
		// faulty.hmb's errors, and the note that plant.hmb's redundant flow agrees.
		if !rules[res.RuleID] || res.Level == "" || res.Message.Text == "" || loc.Region.StartLine < 1 ||
			loc.ArtifactLocation.URI != "testdata/cli/faulty.hmb" && (loc.ArtifactLocation.URI != "testdata/cli/plant.hmb" || res.Level != "note") {
			t.Errorf("bad result %+v", res)
		}
	}
}

// TestFmt: fmt --check lists files that differ, -w rewrites them (atomically, keeping the mode)
// and a file that does not parse is never touched.
func TestFmt(t *testing.T) {
	dir := t.TempDir()
	messy := filepath.Join(dir, "messy.hmb")
	broken := filepath.Join(dir, "broken.hmb")
	src := "stream   A   {p 10 bar;T 200 C}\n\n\n\nstream B\n"
	os.WriteFile(messy, []byte(src), 0o640)
	os.WriteFile(broken, []byte("stream A { p 10 bar\n"), 0o644)

	var out, errb bytes.Buffer
	if code := run([]string{"fmt", "--check", messy}, nil, &out, &errb); code != 1 || strings.TrimSpace(out.String()) != messy {
		t.Errorf("fmt --check: exit %d, out %q", code, out.String())
	}
	out.Reset()
	if code := run([]string{"fmt", "-w", messy}, nil, &out, &errb); code != 0 {
		t.Fatalf("fmt -w: exit %d: %s", code, errb.String())
	}
	got, _ := os.ReadFile(messy)
	if string(got) == src || !strings.Contains(string(got), "stream A") {
		t.Errorf("fmt -w left %q", got)
	}
	if fi, _ := os.Stat(messy); fi.Mode().Perm() != 0o640 {
		t.Errorf("mode %v, want 0640", fi.Mode().Perm())
	}
	if code := run([]string{"fmt", "--check", messy}, nil, &out, &errb); code != 0 {
		t.Errorf("formatted file still differs")
	}
	before, _ := os.ReadFile(broken)
	if code := run([]string{"fmt", "-w", broken}, nil, &out, &errb); code != 1 {
		t.Errorf("fmt -w on a broken file: exit %d, want 1", code)
	}
	if after, _ := os.ReadFile(broken); !bytes.Equal(before, after) {
		t.Errorf("broken file rewritten: %q", after)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 2 {
		t.Errorf("temporary files left behind: %v", entries)
	}
}

// TestUsage: wrong invocations exit 2 with a message.
func TestUsage(t *testing.T) {
	for _, args := range [][]string{{}, {"frobnicate"}, {"check"}, {"check", "--format", "xml", "x"}, {"check", "--si", "--us", "x"}, {"check", "no/such/dir"}, {"fmt"}} {
		var out, errb bytes.Buffer
		if code := run(args, nil, &out, &errb); code != 2 || errb.Len() == 0 {
			t.Errorf("%v: exit %d, stderr %q", args, code, errb.String())
		}
	}
}

// TestCodesTable keeps the table of diagnostic codes in README.md equal to the codes hmb
// reports (-update rewrites the part between the markers).
func TestCodesTable(t *testing.T) {
	var b strings.Builder
	b.WriteString("| code | severity | meaning |\n|---|---|---|\n")
	for _, c := range allCodes() {
		fmt.Fprintf(&b, "| %s | %s | %s |\n", c.Code, c.Severity, strings.ReplaceAll(c.Summary, "|", "\\|"))
	}
	readmeSection(t, "codes", b.String())
}

// TestKindsTable keeps README.md's table of unit kinds equal to the catalogue the notation
// checks files against.
func TestKindsTable(t *testing.T) {
	names := slices.Sorted(maps.Keys(model.Kinds))
	var b strings.Builder
	b.WriteString("| kind | what it is | roles | parameters | results |\n|---|---|---|---|---|\n")
	for _, n := range names {
		k := model.Kinds[n]
		var roles, params, results []string
		for _, p := range k.Ports {
			r := "`" + p.Role + "`"
			if p.Many {
				r += " (one or more)"
			}
			if p.Optional {
				r += " (optional)"
			}
			roles = append(roles, r)
		}
		for _, p := range k.Params {
			params = append(params, "`"+p.Name+"` ("+p.Doc+")")
		}
		for _, r := range k.Results {
			results = append(results, "`"+r.Name+"`")
		}
		fmt.Fprintf(&b, "| `%s` | %s | %s | %s | %s |\n", n, k.Doc, strings.Join(roles, ", "), strings.Join(params, ", "), strings.Join(results, ", "))
	}
	readmeSection(t, "kinds", b.String())
}

// TestResultsTable keeps README.md's table of results (what outputs show and expectations
// check) equal to the catalogue.
func TestResultsTable(t *testing.T) {
	var b strings.Builder
	b.WriteString("| result | of | quantity | what it is |\n|---|---|---|---|\n")
	row := func(r model.ResultSpec, of, doc string) {
		quantity := r.Dim.String()
		si, us := units.Display{System: units.SI}.Unit(r.Dim), units.Display{System: units.US}.Unit(r.Dim)
		if r.Delta {
			quantity += " difference"
			si, us = deltaOf(si, r.Dim), deltaOf(us, r.Dim)
		}
		fmt.Fprintf(&b, "| `%s` | %s | %s (%s, %s) | %s |\n", r.Name, of, quantity,
			orDash(si.Symbol()), orDash(us.Symbol()), doc)
	}
	for _, r := range model.StreamResults {
		row(r, "every stream", r.Doc)
	}
	kinds := slices.Sorted(maps.Keys(model.Kinds))
	seen := map[string]bool{}
	for _, n := range kinds {
		for _, r := range model.Kinds[n].Results {
			if seen[r.Name] {
				continue
			}
			seen[r.Name] = true
			var of, docs []string
			same := true
			for _, m := range kinds {
				if mr := model.Kinds[m].Result(r.Name); mr != nil {
					of = append(of, m)
					docs = append(docs, m+": "+mr.Doc)
					same = same && mr.Doc == r.Doc
				}
			}
			doc := r.Doc
			if !same {
				doc = strings.Join(docs, "; ")
			}
			if len(of) == len(kinds) {
				of = []string{"every unit"}
			}
			row(r, strings.Join(of, ", "), doc)
		}
	}
	for _, r := range model.TotalResults {
		row(r, "`"+model.TotalName+"`", r.Doc)
	}
	readmeSection(t, "results", b.String())
}

// deltaOf is the unit a difference shows in: dK or dR for a temperature, psi for psia.
func deltaOf(u units.Unit, d units.Dim) units.Unit {
	if d == units.Temperature {
		if u.US() {
			return units.US.Default(units.TemperatureDiff)
		}
		return units.SI.Default(units.TemperatureDiff)
	}
	return u.DeltaUnit()
}

func orDash(s string) string {
	if s == "" {
		return "fraction"
	}
	return s
}

// TestUnitsTable keeps README.md's table of unit spellings equal to the table the notation and
// hmb props read units with.
func TestUnitsTable(t *testing.T) {
	var b strings.Builder
	b.WriteString("| quantity | units | also written |\n|---|---|---|\n")
	row := func(what string, us []units.Unit) {
		var syms, alts []string
		for _, u := range us {
			syms = append(syms, "`"+u.Symbol()+"`")
			for _, a := range u.Alternatives() {
				alts = append(alts, "`"+a+"`")
			}
		}
		if len(alts) > 12 { // the separators between kg and K, mostly: the table has them all
			alts = append(alts[:10], "... ([all](thermo/units/table.go))")
		}
		fmt.Fprintf(&b, "| %s | %s | %s |\n", what, strings.Join(syms, " "), strings.Join(alts, " "))
	}
	for _, d := range units.Dims() {
		if d.Measure() != d {
			continue // shaft power: the units of power
		}
		all := units.Symbols(d)
		if d != units.Pressure {
			row(d.String(), all)
			continue
		}
		for _, r := range []units.Reading{units.Absolute, units.Gauge, units.Vacuum, units.Difference} {
			what := "pressure, " + r.String()
			if r == units.Difference {
				what = "pressure difference only (no reading)"
			}
			var us []units.Unit
			for _, u := range all {
				if u.Reading() == r {
					us = append(us, u)
				}
			}
			row(what, us)
		}
	}
	readmeSection(t, "units", b.String())
}

// readmeSection compares the part of README.md between the markers of name with want, or
// rewrites it under -update.
func readmeSection(t *testing.T, name, want string) {
	t.Helper()
	t.Chdir(filepath.Join("..", ".."))
	begin, end := "<!-- "+name+":begin -->\n", "<!-- "+name+":end -->\n"
	readme, err := os.ReadFile("README.md")
	if err != nil {
		t.Fatal(err)
	}
	s := string(readme)
	i, j := strings.Index(s, begin), strings.Index(s, end)
	if i < 0 || j < i {
		t.Fatalf("README.md lacks the %q and %q markers", begin, end)
	}
	whole := s[:i+len(begin)] + want + s[j:]
	if update() {
		if err := writeFileAtomic("README.md", []byte(whole)); err != nil {
			t.Fatal(err)
		}
		return
	}
	if whole != s {
		t.Errorf("README.md's %s table is out of date: go test ./cmd/hmb -run %s -update", name, t.Name())
	}
}

// TestLoneCR: a lone "\r" ends a line for hmb check as it does for editors and the language
// server, so a comment does not swallow the statement after it, and positions count that line.
func TestLoneCR(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "cr.hmb")
	if err := os.WriteFile(path, []byte("# note\rstream B { p 5 barr }\r"), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb bytes.Buffer
	if code := run([]string{"check", "--format", "json", path}, nil, &out, &errb); code != 1 {
		t.Fatalf("exit %d, want 1 (the misspelt unit); stderr %s", code, errb.String())
	}
	var doc struct {
		Files []struct {
			Diagnostics []struct {
				Code  string
				Range struct{ Start struct{ Line, Column int } }
			}
		}
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	found := false
	for _, d := range doc.Files[0].Diagnostics {
		if d.Code == "HMB301" {
			found = true
			if d.Range.Start.Line != 2 || d.Range.Start.Column != 16 {
				t.Errorf("HMB301 at %d:%d, want 2:16", d.Range.Start.Line, d.Range.Start.Column)
			}
		}
	}
	if !found {
		t.Errorf("no HMB301 for the unit after the lone CR:\n%s", out.String())
	}
}
