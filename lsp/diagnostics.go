package lsp

import (
	"time"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/feature"
	"hmb/thermo/model"
)

// analyze publishes a new snapshot's diagnostics, off the request path. The check (parse, names,
// wiring, units) runs at once and, when it finds errors, is published at once; then the solve
// runs and the full set (check and solve) is published. A version that overtakes an analysis
// still running (the user is typing faster than the file solves) first waits for the debounce,
// so that a burst of keystrokes solves once, at its end; a version arriving when the server is
// idle is solved at once, so that a single edit shows its result without delay. A newer version
// cancels all of this: the wait ends, the solve's context is cancelled, and anything still
// queued for the old version is dropped by the notifier.
func (s *Server) analyze(snap *cache.Snapshot) {
	s.mu.Lock()
	burst := s.busy[snap.URI] != nil
	s.busy[snap.URI] = snap
	s.mu.Unlock()
	go func() {
		defer func() {
			s.mu.Lock()
			if s.busy[snap.URI] == snap {
				delete(s.busy, snap.URI)
			}
			s.mu.Unlock()
		}()
		if snap.Superseded() {
			return
		}
		res := snap.Check()
		if snap.Superseded() {
			return
		}
		if res.Model == nil || hasErrors(res.Diags) {
			s.publish(snap, snap.Diagnostics(nil), res.Model == nil)
			if res.Model == nil {
				return
			}
		}
		if burst && s.opts.debounce > 0 {
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
		s.publish(snap, snap.Diagnostics(sol), true)
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

// publish queues the diagnostics of snap; final marks the complete set (tests wait for it).
func (s *Server) publish(snap *cache.Snapshot, diags []model.Diagnostic, final bool) {
	if s.opts.onPublish != nil {
		s.opts.onPublish(snap.URI, snap.Version, final)
	}
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
