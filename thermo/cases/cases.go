// Package cases solves a model's cases and sweeps. A case is the model with the case's overrides
// applied (model.WithCase), solved as any model is; a sweep point is the model with the swept
// value set, solved from the previous point's solution (solve.Options.Start). The solver sees
// only models: it never learns that a case or a sweep was there.
package cases

import (
	"context"
	"fmt"
	"runtime"
	"strings"
	"sync"

	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
)

// Result is one case, solved.
type Result struct {
	Case  *model.Case
	Model *model.Model      // the base with the case applied
	Res   *solve.Result     // nil when the case is Broken (not solved)
	Rec   *reconcile.Result // nil when not solved
	// Diags are the solver's findings in this case, each marked with the case (Diagnostic.Case)
	// and its message prefixed with it (Prefix).
	Diags []model.Diagnostic
}

// Prefix is what a case's diagnostics start with: "case low: ".
func Prefix(name string) string { return "case " + name + ": " }

// Solve solves every case of m that the notation found sound, in parallel, with the
// reconciliation of measurements as hmb check runs it, and returns them in the model's order.
func Solve(ctx context.Context, m *model.Model, opt solve.Options) []*Result {
	return SolveWith(ctx, m, func(ctx context.Context, mm *model.Model) *solve.Result {
		res, _ := reconcile.Solve(ctx, mm, opt)
		return res
	})
}

// SolveWith is Solve with the solver given (the language server's, which it may replace).
func SolveWith(ctx context.Context, m *model.Model, solver func(context.Context, *model.Model) *solve.Result) []*Result {
	out := make([]*Result, len(m.Cases))
	var wg sync.WaitGroup
	sem := make(chan struct{}, runtime.GOMAXPROCS(0))
	for i, c := range m.Cases {
		out[i] = &Result{Case: c, Model: m.WithCase(c)}
		if c.Broken {
			continue
		}
		wg.Add(1)
		sem <- struct{}{}
		go func(r *Result) {
			defer wg.Done()
			defer func() { <-sem }()
			defer func() {
				if p := recover(); p != nil { // a bug must cost the case, not the process
					r.Res, r.Rec = &solve.Result{}, nil
					r.Diags = Mark([]model.Diagnostic{internal(r.Case.Span, p)}, r.Case.Name)
				}
			}()
			r.Res = solver(ctx, r.Model)
			if r.Res == nil {
				r.Res = &solve.Result{}
			}
			r.Rec = reconcile.Of(r.Res)
			r.Diags = Mark(r.Res.Diags, r.Case.Name)
		}(out[i])
	}
	wg.Wait()
	return out
}

// Mark returns copies of diags marked as the case's.
func Mark(diags []model.Diagnostic, name string) []model.Diagnostic {
	out := make([]model.Diagnostic, len(diags))
	for i, d := range diags {
		d.Case = name
		d.Message = Prefix(name) + d.Message
		out[i] = d
	}
	return out
}

// Distinct leaves out of a case's diagnostics those the base reports as well, word for word at
// the same place: a warning the base and every case share is said once, by the base.
func Distinct(caseDiags, base []model.Diagnostic) []model.Diagnostic {
	type key struct {
		code string
		span model.Span
		msg  string
	}
	seen := make(map[key]bool, len(base))
	for _, d := range base {
		seen[key{d.Code, d.Span, d.Message}] = true
	}
	var out []model.Diagnostic
	for _, d := range caseDiags {
		if !seen[key{d.Code, d.Span, strings.TrimPrefix(d.Message, Prefix(d.Case))}] {
			out = append(out, d)
		}
	}
	return out
}

// Within returns the diagnostics whose span lies inside sp: a case's or a sweep's notation
// errors, found by position.
func Within(diags []model.Diagnostic, sp model.Span) []model.Diagnostic {
	var out []model.Diagnostic
	for _, d := range diags {
		if d.Span.Start >= sp.Start && d.Span.End <= sp.End && sp.End > sp.Start {
			out = append(out, d)
		}
	}
	return out
}

// Find returns the case of m named name, or nil.
func Find(m *model.Model, name string) *model.Case {
	for _, c := range m.Cases {
		if c.Name == name {
			return c
		}
	}
	return nil
}

// Names lists the cases of m, for a message.
func Names(m *model.Model) string {
	var ns []string
	for _, c := range m.Cases {
		ns = append(ns, c.Name)
	}
	if len(ns) == 0 {
		return "the file declares none"
	}
	return "cases: " + strings.Join(ns, ", ")
}

// internal reports a panic while solving as an error at sp.
func internal(sp model.Span, p any) model.Diagnostic {
	return errorf("internal", sp, "internal error in the solve (please report it): %v", p)
}

// errorf makes an error diagnostic.
func errorf(code string, sp model.Span, format string, args ...any) model.Diagnostic {
	return model.Diagnostic{Span: sp, Severity: model.Error, Code: code, Message: fmt.Sprintf(format, args...)}
}
