// Package cache holds the server's state: open documents, one immutable snapshot per version of
// each, and the analyses computed lazily from a snapshot.
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

	"hmb/thermo/model"
)

// ErrSuperseded is returned when a newer version replaced (or closing removed) a snapshot
// before its solution was found.
var ErrSuperseded = errors.New("document changed")

// A Snapshot is one version of one document and everything derived from it. Its text never
// changes; its analyses are computed at most once, on demand, and may be shared by any number of
// requests.
type Snapshot struct {
	URI     protocol.DocumentURI
	Version int32
	Mapper  Mapper

	analyzer Analyzer
	log      io.Writer

	// ctx is cancelled when the snapshot is superseded or its document closed: that cancels its
	// solve.
	ctx    context.Context
	cancel context.CancelFunc

	syntaxOnce sync.Once
	syntax     *Syntax

	solveOnce sync.Once
	solveDone chan struct{}
	solution  *Solution
}

func newSnapshot(uri protocol.DocumentURI, version int32, src []byte, a Analyzer, log io.Writer) *Snapshot {
	ctx, cancel := context.WithCancel(context.Background())
	return &Snapshot{
		URI:       uri,
		Version:   version,
		Mapper:    NewMapper(string(uri), src),
		analyzer:  a,
		log:       log,
		ctx:       ctx,
		cancel:    cancel,
		solveDone: make(chan struct{}),
	}
}

// Src is the text. Callers must not modify it.
func (s *Snapshot) Src() []byte { return s.Mapper.File.Src }

// Analyzer is the language the snapshot is analysed with.
func (s *Snapshot) Analyzer() Analyzer { return s.analyzer }

// Done is closed when a newer version supersedes the snapshot or the document is closed.
func (s *Snapshot) Done() <-chan struct{} { return s.ctx.Done() }

// Superseded reports whether Done is closed.
func (s *Snapshot) Superseded() bool { return s.ctx.Err() != nil }

// Syntax returns the fast analysis, computing it on first use.
func (s *Snapshot) Syntax() *Syntax {
	s.syntaxOnce.Do(func() {
		defer func() {
			if r := recover(); r != nil {
				s.syntax = &Syntax{Diagnostics: []model.Diagnostic{s.internalError("check", r)}}
			}
		}()
		s.syntax = s.analyzer.Check(string(s.URI), s.Src())
		if s.syntax == nil {
			s.syntax = &Syntax{}
		}
	})
	return s.syntax
}

// Solution returns the solver's result, starting the solve if nobody has. It waits until the
// solve ends or ctx is done. The solve runs on the snapshot's own context, so a caller giving up
// does not cancel it for the others; superseding the snapshot does.
func (s *Snapshot) Solution(ctx context.Context) (*Solution, error) {
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
func (s *Snapshot) Solved() *Solution {
	select {
	case <-s.solveDone:
		return s.solution
	default:
		return nil
	}
}

func (s *Snapshot) solve() {
	defer close(s.solveDone)
	syn := s.Syntax()
	if syn.Model == nil {
		s.solution = &Solution{}
		return
	}
	defer func() {
		if r := recover(); r != nil {
			s.solution = &Solution{Diagnostics: []model.Diagnostic{s.internalError("solve", r)}}
		}
	}()
	sol := s.analyzer.Solve(s.ctx, syn)
	if s.ctx.Err() != nil {
		return // superseded: a partial result must not be taken for the answer
	}
	if sol == nil {
		sol = &Solution{}
	}
	s.solution = sol
}

// internalError turns a panic in the analyzer into a diagnostic at the top of the file, so that
// the user learns that the check is incomplete, and logs the stack for the bug report.
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
// solver's, in hmb check's order (by start, the check's first among equals).
func (s *Snapshot) Diagnostics(sol *Solution) []model.Diagnostic {
	syn := s.Syntax()
	out := make([]model.Diagnostic, 0, len(syn.Diagnostics))
	out = append(out, syn.Diagnostics...)
	if sol != nil {
		out = append(out, sol.Diagnostics...)
	}
	slices.SortStableFunc(out, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	return out
}
