// Package ext defines the few protocol messages the server needs that go.lsp.dev/protocol
// v0.12.0 lacks or gets wrong: LSP 3.17 inlay hints, a content change that can tell a whole-text
// replacement from an edit at the top of the file, and the initialize result with the
// capabilities the old types cannot express.
package ext

import "go.lsp.dev/protocol"

// MethodInlayHint is textDocument/inlayHint (LSP 3.17).
const MethodInlayHint = "textDocument/inlayHint"

// InlayHintParams are the parameters of textDocument/inlayHint.
type InlayHintParams struct {
	TextDocument protocol.TextDocumentIdentifier `json:"textDocument"`
	Range        protocol.Range                  `json:"range"`
}

// InlayHintKind is 1 for a type, 2 for a parameter.
type InlayHintKind int

const (
	InlayHintType      InlayHintKind = 1
	InlayHintParameter InlayHintKind = 2
)

// InlayHint is one hint shown in the text (LSP 3.17). The label is a plain string here: the
// server needs no label parts.
type InlayHint struct {
	Position     protocol.Position `json:"position"`
	Label        string            `json:"label"`
	Kind         InlayHintKind     `json:"kind,omitempty"`
	Tooltip      string            `json:"tooltip,omitempty"`
	PaddingLeft  bool              `json:"paddingLeft,omitempty"`
	PaddingRight bool              `json:"paddingRight,omitempty"`
}

// ContentChange is one entry of didChange's contentChanges. protocol's type has a Range that is
// not a pointer, which cannot tell a whole-text change (no range) from an edit at 0:0-0:0.
type ContentChange struct {
	Range       *protocol.Range `json:"range,omitempty"`
	RangeLength uint32          `json:"rangeLength,omitempty"`
	Text        string          `json:"text"`
}

// DidChangeParams are didChange's parameters with ContentChange entries.
type DidChangeParams struct {
	TextDocument   protocol.VersionedTextDocumentIdentifier `json:"textDocument"`
	ContentChanges []ContentChange                          `json:"contentChanges"`
}

// SemanticTokensOptions declares full-document semantic tokens with their legend (protocol's
// type has neither field).
type SemanticTokensOptions struct {
	Legend protocol.SemanticTokensLegend `json:"legend"`
	Full   bool                          `json:"full"`
}

// ServerCapabilities is the subset of capabilities the server announces, 3.17 ones included.
type ServerCapabilities struct {
	PositionEncoding           string                           `json:"positionEncoding,omitempty"`
	TextDocumentSync           protocol.TextDocumentSyncOptions `json:"textDocumentSync"`
	HoverProvider              bool                             `json:"hoverProvider"`
	CompletionProvider         *protocol.CompletionOptions      `json:"completionProvider,omitempty"`
	DefinitionProvider         bool                             `json:"definitionProvider"`
	ReferencesProvider         bool                             `json:"referencesProvider"`
	DocumentSymbolProvider     bool                             `json:"documentSymbolProvider"`
	CodeActionProvider         *protocol.CodeActionOptions      `json:"codeActionProvider,omitempty"`
	DocumentFormattingProvider bool                             `json:"documentFormattingProvider"`
	RenameProvider             *protocol.RenameOptions          `json:"renameProvider,omitempty"`
	SemanticTokensProvider     *SemanticTokensOptions           `json:"semanticTokensProvider,omitempty"`
	InlayHintProvider          bool                             `json:"inlayHintProvider"`
	ExecuteCommandProvider     *protocol.ExecuteCommandOptions  `json:"executeCommandProvider,omitempty"`
}

// InitializeResult is initialize's result.
type InitializeResult struct {
	Capabilities ServerCapabilities   `json:"capabilities"`
	ServerInfo   *protocol.ServerInfo `json:"serverInfo,omitempty"`
}
