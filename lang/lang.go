// Package lang is the notation's front door for the command line and the language server: one
// call parses and checks a calc file, so that the editor and CI can never disagree. The work is
// done in the sub-packages: token (scanner), parser, ast, check (names, wiring, units; lowering
// to the solver's model), format, and source (the one mapper between byte offsets and lines).
package lang

import (
	"slices"

	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/lang/parser"
	"hmb/thermo/model"
)

// Result is everything known about one version of a calc file without solving it.
type Result struct {
	File  *ast.File
	Model *model.Model // the valid parts, lowered; Model.Incomplete when anything was left out
	Info  *check.Info  // declarations and mentions of names
	Diags []model.Diagnostic
}

// Check parses and checks a calc file. It never fails: every problem is a diagnostic, sorted by
// position.
func Check(filename string, src []byte) *Result {
	f, pd := parser.Parse(filename, src)
	m, cd, info := check.Check(f)
	diags := append(pd, cd...)
	slices.SortStableFunc(diags, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	if len(pd) > 0 {
		m.Incomplete = true
	}
	return &Result{File: f, Model: m, Info: info, Diags: diags}
}

// Codes documents every diagnostic code of the notation, in code order.
var Codes = slices.Concat(parser.Codes, check.Codes)

// HasErrors reports whether any diagnostic is an error.
func (r *Result) HasErrors() bool {
	return slices.ContainsFunc(r.Diags, func(d model.Diagnostic) bool { return d.Severity == model.Error })
}
