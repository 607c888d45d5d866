package lsp

import (
	"context"
	"encoding/json"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/ext"
	"hmb/lsp/feature"
)

// version is the server's version, reported in initialize's serverInfo.
const version = "0.1.0-dev"

func (s *Server) initialize(ctx context.Context, _ *cache.Snapshot, raw json.RawMessage) (any, error) {
	var p protocol.InitializeParams
	if len(raw) > 0 {
		if err := decode(raw, &p); err != nil {
			return nil, err
		}
	}
	return &ext.InitializeResult{
		Capabilities: ext.ServerCapabilities{
			// Only UTF-16 columns, the protocol's default, are offered.
			PositionEncoding: "utf-16",
			TextDocumentSync: protocol.TextDocumentSyncOptions{
				OpenClose: true,
				Change:    protocol.TextDocumentSyncKindIncremental,
				Save:      &protocol.SaveOptions{},
			},
			HoverProvider:              true,
			CompletionProvider:         &protocol.CompletionOptions{TriggerCharacters: []string{"=", " "}},
			DefinitionProvider:         true,
			ReferencesProvider:         true,
			DocumentSymbolProvider:     true,
			CodeActionProvider:         &protocol.CodeActionOptions{CodeActionKinds: []protocol.CodeActionKind{protocol.QuickFix}},
			DocumentFormattingProvider: true,
			RenameProvider:             &protocol.RenameOptions{PrepareProvider: true},
			SemanticTokensProvider: &ext.SemanticTokensOptions{
				Legend: protocol.SemanticTokensLegend{TokenTypes: feature.TokenTypes[:], TokenModifiers: feature.TokenModifiers},
				Full:   true,
			},
			InlayHintProvider:      true,
			ExecuteCommandProvider: &protocol.ExecuteCommandOptions{Commands: commands},
		},
		ServerInfo: &protocol.ServerInfo{Name: "hmb", Version: version},
	}, nil
}

// shutdown only changes the state (dispatchCall refuses later requests): requests sent before it
// still get their answers, and the documents go when the client exits.
func (s *Server) shutdown(ctx context.Context, _ *cache.Snapshot, _ json.RawMessage) (any, error) {
	return nil, nil
}
