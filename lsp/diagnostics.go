package lsp

import (
	"time"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/feature"
	"hmb/thermo/model"
)

// analyze publishes a new snapshot's diagnostics, off the request path. The check (parse, names,
// wiring, units) runs at once and, when it finds errors, is published at once; the solve waits
// for the debounce, so that typing a word solves once, and the full set (check and solve) is
// published after it. A newer version cancels all of this: the wait ends, the solve's context is
// cancelled, and anything still queued for the old version is dropped by the notifier.
func (s *Server) analyze(snap *cache.Snapshot) {
	go func() {
		if snap.Superseded() {
			return
		}
		syn := snap.Syntax()
		if snap.Superseded() {
			return
		}
		if syn.Model == nil || hasErrors(syn.Diagnostics) {
			s.publish(snap, snap.Diagnostics(nil))
			if syn.Model == nil {
				return
			}
		}
		if s.opts.debounce > 0 {
			t := time.NewTimer(s.opts.debounce)
			select {
			case <-t.C:
			case <-snap.Done():
				t.Stop()
				return
			}
		}
		sol, err := snap.Solution(noCancel{snap})
		if err != nil {
			return
		}
		s.publish(snap, snap.Diagnostics(sol))
	}()
}

// noCancel waits as long as the snapshot lives.
type noCancel struct{ snap *cache.Snapshot }

func (c noCancel) Deadline() (time.Time, bool) { return time.Time{}, false }
func (c noCancel) Done() <-chan struct{}       { return c.snap.Done() }
func (c noCancel) Err() error {
	if c.snap.Superseded() {
		return cache.ErrSuperseded
	}
	return nil
}
func (c noCancel) Value(any) any { return nil }

func (s *Server) publish(snap *cache.Snapshot, diags []model.Diagnostic) {
	s.notifier.enqueue(note{
		method: protocol.MethodTextDocumentPublishDiagnostics,
		params: &protocol.PublishDiagnosticsParams{
			URI:         snap.URI,
			Version:     uint32(snap.Version),
			Diagnostics: feature.Diagnostics(snap.URI, snap.Mapper, diags),
		},
		snap: snap,
	})
}

func hasErrors(diags []model.Diagnostic) bool {
	for _, d := range diags {
		if d.Severity == model.Error {
			return true
		}
	}
	return false
}
