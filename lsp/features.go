package lsp

// The shims of the document requests: decode, convert positions, call package feature.

import (
	"context"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/ext"
	"hmb/lsp/feature"
)

func (s *Server) hover(ctx context.Context, snap *cache.Snapshot, p *protocol.HoverParams) (*protocol.Hover, error) {
	return feature.Hover(ctx, snap, snap.Mapper.Offset(p.Position))
}

func (s *Server) inlayHint(ctx context.Context, snap *cache.Snapshot, p *ext.InlayHintParams) ([]ext.InlayHint, error) {
	return feature.InlayHints(ctx, snap, snap.Mapper.Span(p.Range))
}

func (s *Server) completion(ctx context.Context, snap *cache.Snapshot, p *protocol.CompletionParams) (*protocol.CompletionList, error) {
	return feature.Completion(snap, snap.Mapper.Offset(p.Position)), nil
}

func (s *Server) definition(ctx context.Context, snap *cache.Snapshot, p *protocol.DefinitionParams) ([]protocol.Location, error) {
	return feature.Definition(snap, snap.Mapper.Offset(p.Position)), nil
}

func (s *Server) references(ctx context.Context, snap *cache.Snapshot, p *protocol.ReferenceParams) ([]protocol.Location, error) {
	return feature.References(snap, snap.Mapper.Offset(p.Position), p.Context.IncludeDeclaration), nil
}

func (s *Server) prepareRename(ctx context.Context, snap *cache.Snapshot, p *protocol.PrepareRenameParams) (*protocol.Range, error) {
	return feature.PrepareRename(snap, snap.Mapper.Offset(p.Position))
}

func (s *Server) rename(ctx context.Context, snap *cache.Snapshot, p *protocol.RenameParams) (*protocol.WorkspaceEdit, error) {
	return feature.Rename(snap, snap.Mapper.Offset(p.Position), p.NewName)
}

func (s *Server) documentSymbol(ctx context.Context, snap *cache.Snapshot, p *protocol.DocumentSymbolParams) ([]protocol.DocumentSymbol, error) {
	return feature.Symbols(snap), nil
}

func (s *Server) semanticTokens(ctx context.Context, snap *cache.Snapshot, p *protocol.SemanticTokensParams) (*protocol.SemanticTokens, error) {
	return feature.SemanticTokens(snap), nil
}

func (s *Server) formatting(ctx context.Context, snap *cache.Snapshot, p *protocol.DocumentFormattingParams) ([]protocol.TextEdit, error) {
	return feature.Format(snap)
}

func (s *Server) codeAction(ctx context.Context, snap *cache.Snapshot, p *protocol.CodeActionParams) ([]protocol.CodeAction, error) {
	return feature.CodeActions(snap, snap.Mapper.Span(p.Range)), nil
}
