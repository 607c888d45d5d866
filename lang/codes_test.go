package lang

import (
	"go/ast"
	"go/parser"
	"go/token"
	"io/fs"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

var codeRE = regexp.MustCompile(`^HMB[0-9]{3}$`)

// TestCodesDocumented reads the source of every package under lang and checks that each string
// constant shaped like a diagnostic code ("HMB302") has one row in Codes, with a severity and a
// one-line summary; and that Codes holds no row for a code nothing declares, nor one code twice.
// The command line prints and publishes this table (--help, SARIF rules).
func TestCodesDocumented(t *testing.T) {
	declared := map[string]string{} // code -> where
	fset := token.NewFileSet()
	err := filepath.WalkDir(".", func(path string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
			return err
		}
		f, err := parser.ParseFile(fset, path, nil, 0)
		if err != nil {
			return err
		}
		ast.Inspect(f, func(n ast.Node) bool {
			lit, ok := n.(*ast.BasicLit)
			if !ok || lit.Kind != token.STRING {
				return true
			}
			if s, err := strconv.Unquote(lit.Value); err == nil && codeRE.MatchString(s) {
				declared[s] = fset.Position(lit.Pos()).String()
			}
			return true
		})
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(declared) < 20 {
		t.Fatalf("found only %d codes in the source: the scan is broken", len(declared))
	}
	rows := map[string]bool{}
	prev := ""
	for _, c := range Codes {
		switch {
		case rows[c.Code]:
			t.Errorf("%s has two rows in Codes", c.Code)
		case declared[c.Code] == "":
			t.Errorf("%s is in Codes but declared nowhere in lang", c.Code)
		case c.Summary == "" || strings.ContainsAny(c.Summary, "\n\r"):
			t.Errorf("%s: summary %q is not one line", c.Code, c.Summary)
		case c.Severity.String() == "?":
			t.Errorf("%s has no severity", c.Code)
		}
		// Code order is by number: the hundreds name the stage (1 parser, 2 names, 3 values).
		if c.Code <= prev {
			t.Errorf("Codes is not in code order: %s after %s", c.Code, prev)
		}
		rows[c.Code], prev = true, c.Code
	}
	for code, where := range declared {
		if !rows[code] {
			t.Errorf("%s (declared at %s) has no row in Codes", code, where)
		}
	}
}

// TestCodeNames checks that every code has a unique readable name and help text: SARIF publishes
// them as the rule's name and help.
func TestCodeNames(t *testing.T) {
	nameRE := regexp.MustCompile(`^[a-z0-9]+(-[a-z0-9]+)*$`)
	seen := map[string]string{}
	for _, c := range Codes {
		if !nameRE.MatchString(c.Name) {
			t.Errorf("%s: name %q is not kebab-case", c.Code, c.Name)
		}
		if prev, ok := seen[c.Name]; ok {
			t.Errorf("%s and %s share the name %q", prev, c.Code, c.Name)
		}
		seen[c.Name] = c.Code
		if c.Help == "" || strings.ContainsAny(c.Help, "\n\r") {
			t.Errorf("%s: help %q is empty or not one line", c.Code, c.Help)
		}
	}
}
