// Package analysis is the language server's view of hmb's notation and solver: it runs the
// check the command line runs (lang.Check, then the solver) and indexes the result for the editor
// features: declarations, mentions, token roles, what may be written where, and quick fixes.
package analysis

import (
	"context"
	"slices"

	"hmb/lang"
	"hmb/lang/format"
	"hmb/lang/token"
	"hmb/lsp/cache"
	"hmb/thermo/model"
)

// SolveFunc solves a lowered model; it returns early when ctx is done.
type SolveFunc func(ctx context.Context, m *model.Model) *cache.Solution

// Analyzer implements cache.Analyzer with lang and a solver.
type Analyzer struct {
	// solve is the solver; nil solves nothing (the checks still run).
	solve SolveFunc
}

// New returns the analyzer over lang and solve (nil: no solver).
func New(solve SolveFunc) *Analyzer { return &Analyzer{solve: solve} }

// data is what Site and QuickFixes need beyond cache.Syntax.
type data struct {
	res *lang.Result
}

// Check implements cache.Analyzer.
func (a *Analyzer) Check(name string, src []byte) *cache.Syntax {
	res := lang.Check(name, src)
	syn := &cache.Syntax{
		Diagnostics: res.Diags,
		Model:       res.Model,
		Data:        &data{res: res},
	}
	if res.Model != nil {
		syn.Display = res.Model.Display
		syn.Atm = res.Model.Atm
	}
	index(syn, res)
	return syn
}

// Solve implements cache.Analyzer.
func (a *Analyzer) Solve(ctx context.Context, syn *cache.Syntax) *cache.Solution {
	if a.solve == nil || syn.Model == nil {
		return &cache.Solution{}
	}
	return a.solve(ctx, syn.Model)
}

// Format implements cache.Analyzer: exactly hmb fmt.
func (a *Analyzer) Format(name string, src []byte) ([]byte, error) { return format.Source(name, src) }

// ValidName implements cache.Analyzer: a name is one identifier token that is not a keyword.
func (a *Analyzer) ValidName(name string) bool {
	toks, errs := token.Scan([]byte(name))
	if len(errs) > 0 || len(toks) != 2 || toks[0].Kind != token.Ident || int(toks[0].End) != len(name) {
		return false
	}
	return !isKeyword(name) && model.Kinds[name] == nil
}

// keywords are the notation's keywords with their help, in completion order.
var keywords = []cache.Keyword{
	{Name: "stream", Doc: "declares a stream (a state point): stream NAME \"label\" { givens }, or stream A, B, C for bare streams"},
	{Name: "expect", Doc: "checks a solved value: expect NAME PROP OP VALUE [within TOLERANCE]"},
	{Name: "title", Doc: "setting: the title of the calc"},
	{Name: "display", Doc: "setting: the unit system results are shown in, SI or US"},
	{Name: "atmosphere", Doc: "setting: the site atmosphere gauge pressures are measured against"},
	{Name: "elevation", Doc: "setting: the site elevation, giving the atmosphere from the standard atmosphere"},
	{Name: "tolerance", Doc: "setting: the relative closure tolerance of the balances"},
	{Name: "within", Doc: "the tolerance of an expectation: expect S1 T = 300 C within 2 C"},
	{Name: "fluid", Doc: "the stream's fluid (water, liquid or steam: IAPWS-IF97)"},
}

func isKeyword(w string) bool {
	return slices.ContainsFunc(keywords, func(k cache.Keyword) bool { return k.Name == w })
}

// Keywords implements cache.Analyzer.
func (a *Analyzer) Keywords() []cache.Keyword { return keywords }

var _ cache.Analyzer = (*Analyzer)(nil)
