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

var codeRE = regexp.MustCompile(`^[A-Z][0-9]{3}$`)

// TestCodesDocumented reads the source of every package under lang and checks that each string
// constant shaped like a diagnostic code ("V302") has one row in Codes, with a severity and a
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
		// Code order is by number: the letter names the stage (P1xx parser, N2xx names, V3xx values).
		if c.Code[1:] <= prev[min(1, len(prev)):] {
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
