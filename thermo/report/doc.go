// Package report turns a solved calc file into what a reviewer reads: stream and unit tables
// (Markdown, CSV, HTML), property diagrams drawn as SVG from the IAPWS-IF97 engine, the heat and
// material balance diagram (flowsheet.go), and one self-contained HTML page holding them all
// with every finding, for a checker to sign.
//
// It sees only the neutral model, the solver's result and the diagnostics, never the notation:
// the command line and the language server can hand it the same check.
package report

import (
	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// Input is one checked calc file.
type Input struct {
	Path   string // shown on the page; may be empty
	Src    []byte // the file's text, for line:column and the text of expectations; may be nil
	Model  *model.Model
	Result *solve.Result // nil when the file could not be solved
	Diags  []model.Diagnostic
	Cases  []*cases.Result      // the file's cases, solved; tables and the page put them side by side
	Sweeps []*cases.SweepResult // the file's sweeps, solved; the page shows each as a table and a plot
	// Where writes the place of a byte offset of Src as the report prints it: the caller's line
	// index, "12:5" (1-based line, column in code points) from the notation's. nil prints the
	// byte offset.
	Where func(offset int) string
}

// solved reports whether there is anything to tabulate or draw.
func (in *Input) solved() bool {
	return in != nil && in.Model != nil && in.Result != nil &&
		len(in.Result.Streams) == len(in.Model.Streams) && len(in.Result.Units) == len(in.Model.Units)
}
