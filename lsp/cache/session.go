package cache

import (
	"fmt"
	"io"
	"sync"

	"go.lsp.dev/protocol"
)

// A Session is the set of open documents.
type Session struct {
	solver SolveFunc
	log    io.Writer

	mu   sync.Mutex
	docs map[protocol.DocumentURI]*Snapshot // the latest snapshot of each open document
}

// NewSession makes an empty session solving documents with solver (nil: the check runs, nothing
// is solved). log receives panics of the check and the solve.
func NewSession(solver SolveFunc, log io.Writer) *Session {
	return &Session{solver: solver, log: log, docs: make(map[protocol.DocumentURI]*Snapshot)}
}

// Open records a newly opened document (or replaces it, if the client opens it twice).
func (s *Session) Open(uri protocol.DocumentURI, version int32, text []byte) *Snapshot {
	snap := newSnapshot(uri, version, text, s.solver, s.log)
	s.mu.Lock()
	old := s.docs[uri]
	s.docs[uri] = snap
	s.mu.Unlock()
	if old != nil {
		old.cancel()
	}
	return snap
}

// Change is one content change: a replacement of Range, or of the whole text when Range is nil.
type Change struct {
	Range *protocol.Range
	Text  string
}

// Change applies edits to an open document and returns its new snapshot.
func (s *Session) Change(uri protocol.DocumentURI, version int32, changes []Change) (*Snapshot, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	old := s.docs[uri]
	if old == nil {
		return nil, fmt.Errorf("change to %s, which is not open", uri)
	}
	if version <= old.Version {
		return nil, fmt.Errorf("change to %s refused: version %d is not newer than the document's %d", uri, version, old.Version)
	}
	src, err := ApplyChanges(old.Mapper, changes)
	if err != nil {
		return nil, err
	}
	snap := newSnapshot(uri, version, src, s.solver, s.log)
	s.docs[uri] = snap
	old.cancel()
	return snap, nil
}

// Close forgets a document and cancels its work. It reports whether the document was open.
func (s *Session) Close(uri protocol.DocumentURI) bool {
	s.mu.Lock()
	old := s.docs[uri]
	delete(s.docs, uri)
	s.mu.Unlock()
	if old != nil {
		old.cancel()
	}
	return old != nil
}

// Snapshot returns the latest snapshot of an open document, or nil.
func (s *Session) Snapshot(uri protocol.DocumentURI) *Snapshot {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.docs[uri]
}

// Shutdown cancels the work of every document.
func (s *Session) Shutdown() {
	s.mu.Lock()
	docs := s.docs
	s.docs = make(map[protocol.DocumentURI]*Snapshot)
	s.mu.Unlock()
	for _, d := range docs {
		d.cancel()
	}
}

// ApplyChanges applies content changes in order to the text m indexes. Ranges past the end are
// clamped (the protocol's rule for positions). A range whose start comes after its end is an
// error: the whole change is refused, rather than guessing which text the client meant.
func ApplyChanges(m Mapper, changes []Change) ([]byte, error) {
	src := m.File.Src
	for i, c := range changes {
		if r := c.Range; r != nil && (r.Start.Line > r.End.Line || r.Start.Line == r.End.Line && r.Start.Character > r.End.Character) {
			return nil, fmt.Errorf("content change %d has its start (%d:%d) after its end (%d:%d)", i, r.Start.Line, r.Start.Character, r.End.Line, r.End.Character)
		}
		if c.Range == nil {
			src = []byte(c.Text)
		} else {
			if i > 0 {
				m = NewMapper(m.File.Name, src)
			}
			sp := m.Span(*c.Range)
			out := make([]byte, 0, len(src)-(sp.End-sp.Start)+len(c.Text))
			out = append(out, src[:sp.Start]...)
			out = append(out, c.Text...)
			out = append(out, src[sp.End:]...)
			src = out
		}
	}
	return src, nil
}
