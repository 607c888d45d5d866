package analysis

import (
	"slices"
	"strings"

	"hmb/lsp/cache"
	"hmb/thermo/report"
	"hmb/thermo/solve"
)

// Tables implements cache.Analyzer with hmb table's own Markdown writer, so that the editor shows
// the very table the command line prints. A solution from another solver (one without the
// solver's own result) tabulates as unsolved.
func (a *Analyzer) Tables(name string, src []byte, syn *cache.Syntax, sol *cache.Solution) (string, error) {
	in := &report.Input{Path: name, Src: src, Model: syn.Model, Diags: slices.Clone(syn.Diagnostics)}
	if sol != nil {
		in.Result, _ = sol.Data.(*solve.Result)
		in.Diags = append(in.Diags, sol.Diagnostics...)
	}
	var b strings.Builder
	if err := report.WriteMarkdown(&b, in); err != nil {
		return "", err
	}
	return b.String(), nil
}
