package lsp

import (
	"encoding/json"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/ext"
)

func (s *Server) didOpen(raw json.RawMessage) error {
	var p protocol.DidOpenTextDocumentParams
	if err := decode(raw, &p); err != nil {
		return err
	}
	snap := s.session.Open(p.TextDocument.URI, p.TextDocument.Version, []byte(p.TextDocument.Text))
	s.analyze(snap)
	return nil
}

func (s *Server) didChange(raw json.RawMessage) error {
	var p ext.DidChangeParams
	if err := decode(raw, &p); err != nil {
		return err
	}
	changes := make([]cache.Change, len(p.ContentChanges))
	for i, c := range p.ContentChanges {
		changes[i] = cache.Change{Range: c.Range, Text: c.Text}
	}
	snap, err := s.session.Change(p.TextDocument.URI, p.TextDocument.Version, changes)
	if err != nil {
		return err
	}
	s.analyze(snap)
	return nil
}

func (s *Server) didClose(raw json.RawMessage) error {
	var p protocol.DidCloseTextDocumentParams
	if err := decode(raw, &p); err != nil {
		return err
	}
	if s.session.Close(p.TextDocument.URI) {
		// Closing clears the file's diagnostics: the editor shows none for files it has not open.
		s.notifier.send(protocol.MethodTextDocumentPublishDiagnostics, &protocol.PublishDiagnosticsParams{
			URI: p.TextDocument.URI, Diagnostics: []protocol.Diagnostic{},
		})
	}
	return nil
}
