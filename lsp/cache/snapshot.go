// Package cache holds the server's state: open documents, one immutable snapshot per version of
// each, and the notation's and the solver's results, computed lazily from a snapshot.
package cache

import (
	"context"
	"errors"
	"fmt"
	"io"
	"runtime/debug"
	"slices"
	"sync"

	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/lang/source"
	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
)

// ErrSuperseded is returned when a newer version replaced (or closing removed) a snapshot
// before its solution was found.
var ErrSuperseded = errors.New("document changed")

// SolveFunc solves a lowered model; it returns early, with a partial or empty result, when ctx
// is done.
type SolveFunc func(ctx context.Context, m *model.Model) *solve.Result

// Solve is the solver hmb check runs, with its default options: the balances, with the
// reconciliation of the measurements (reconcile.Of reads it from the result).
func Solve(ctx context.Context, m *model.Model) *solve.Result {
	res, _ := reconcile.Solve(ctx, m, solve.Options{})
	return res
}

// A Snapshot is one version of one document and everything derived from it. Its text never
// changes; its results are computed at most once, on demand, and may be shared by any number of
// requests.
type Snapshot struct {
	URI     protocol.DocumentURI
	Version int32
	Mapper  Mapper

	solver SolveFunc
	log    io.Writer

	// ctx is cancelled when the snapshot is superseded or its document closed: that cancels its
	// solve.
	ctx    context.Context
	cancel context.CancelFunc

	checkOnce sync.Once
	checked   *lang.Result
	tokens    []lang.Token

	solveOnce sync.Once
	solveDone chan struct{}
	solution  *solve.Result
	cases     []*cases.Result // the file's cases, solved with the solution
}

func newSnapshot(uri protocol.DocumentURI, version int32, src []byte, solver SolveFunc, log io.Writer) *Snapshot {
	ctx, cancel := context.WithCancel(context.Background())
	return &Snapshot{
		URI:       uri,
		Version:   version,
		Mapper:    NewMapper(string(uri), src),
		solver:    solver,
		log:       log,
		ctx:       ctx,
		cancel:    cancel,
		solveDone: make(chan struct{}),
	}
}

// Src is the text. Callers must not modify it.
func (s *Snapshot) Src() []byte { return s.Mapper.File.Src }

// Done is closed when a newer version supersedes the snapshot or the document is closed.
func (s *Snapshot) Done() <-chan struct{} { return s.ctx.Done() }

// Superseded reports whether Done is closed.
func (s *Snapshot) Superseded() bool { return s.ctx.Err() != nil }

// Check returns the notation's check of the text (lang.Check: syntax, names, wiring, units,
// lowering), computing it on first use. It is never nil; its Model is nil only when the check
// failed inside (an internal error, reported as a diagnostic).
func (s *Snapshot) Check() *lang.Result {
	s.checkOnce.Do(func() {
		defer func() {
			if r := recover(); r != nil {
				f := &ast.File{Src: source.New(string(s.URI), s.Src())}
				s.checked = &lang.Result{File: f, Info: &check.Info{}, Diags: []model.Diagnostic{s.internalError("check", r)}}
				s.tokens = nil
			}
		}()
		s.checked = lang.Check(string(s.URI), s.Src())
		s.tokens = s.checked.Tokens()
	})
	return s.checked
}

// Tokens are the classified tokens of the text, in source order.
func (s *Snapshot) Tokens() []lang.Token {
	s.Check()
	return s.tokens
}

// Solution returns the solver's result, starting the solve if nobody has. It waits until the
// solve ends or ctx is done. The solve runs on the snapshot's own context, so a caller giving up
// does not cancel it for the others; superseding the snapshot does.
func (s *Snapshot) Solution(ctx context.Context) (*solve.Result, error) {
	s.solveOnce.Do(func() { go s.solve() })
	select {
	case <-s.solveDone:
		if s.solution == nil {
			return nil, ErrSuperseded
		}
		return s.solution, nil
	case <-ctx.Done():
		return nil, ctx.Err()
	}
}

// Solved returns the solution if the solve has finished, without starting or waiting for one.
func (s *Snapshot) Solved() *solve.Result {
	select {
	case <-s.solveDone:
		return s.solution
	default:
		return nil
	}
}

func (s *Snapshot) solve() {
	defer close(s.solveDone)
	m := s.Check().Model
	if m == nil || s.solver == nil {
		s.solution = &solve.Result{}
		return
	}
	defer func() {
		if r := recover(); r != nil {
			s.solution = &solve.Result{Diags: []model.Diagnostic{s.internalError("solve", r)}}
		}
	}()
	sol := s.solver(s.ctx, m)
	if s.ctx.Err() != nil {
		return // superseded: a partial result must not be taken for the answer
	}
	if sol == nil {
		sol = &solve.Result{}
	}
	cs := cases.SolveWith(s.ctx, m, s.solver) // every case, as hmb check solves them
	if s.ctx.Err() != nil {
		return
	}
	s.solution, s.cases = sol, cs
}

// Cases returns the file's cases as solved with the solution, once Solution has returned one;
// nil before, and for a file without cases.
func (s *Snapshot) Cases() []*cases.Result {
	select {
	case <-s.solveDone:
		return s.cases
	default:
		return nil
	}
}

// internalError turns a panic in the check or the solve into a diagnostic at the top of the
// file, so that the user learns that the check is incomplete, and logs the stack for the bug
// report.
func (s *Snapshot) internalError(stage string, r any) model.Diagnostic {
	if s.log != nil {
		fmt.Fprintf(s.log, "hmb lsp: panic in %s of %s version %d: %v\n%s", stage, s.URI, s.Version, r, debug.Stack())
	}
	return model.Diagnostic{
		Span:     model.Span{Start: 0, End: 0},
		Severity: model.Error,
		Code:     "internal",
		Message:  fmt.Sprintf("internal error in the %s (please report it): %v", stage, r),
	}
}

// Diagnostics is the full set for the snapshot: the check's and, when sol is not nil, the
// solver's and, when sol is the snapshot's solution, those of its cases the base does not make
// (each naming its case), in hmb check's order (by start, the check's first among equals).
func (s *Snapshot) Diagnostics(sol *solve.Result) []model.Diagnostic {
	res := s.Check()
	out := make([]model.Diagnostic, 0, len(res.Diags))
	out = append(out, res.Diags...)
	if sol != nil {
		out = append(out, sol.Diags...)
		if sol == s.Solved() {
			for _, k := range s.cases {
				out = append(out, cases.Distinct(k.Diags, sol.Diags)...) // the base says what it shares
			}
		}
	}
	slices.SortStableFunc(out, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	return out
}
