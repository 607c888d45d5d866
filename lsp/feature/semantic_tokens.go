package feature

// This file implements semantic highlighting of the whole document.

import (
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// TokenTypes is the legend's token types, indexed by cache.TokenKind.
var TokenTypes = []protocol.SemanticTokenTypes{
	cache.KeywordToken:  protocol.SemanticTokenKeyword,
	cache.StreamToken:   protocol.SemanticTokenVariable,
	cache.UnitToken:     protocol.SemanticTokenClass,
	cache.KindToken:     protocol.SemanticTokenType,
	cache.RoleToken:     protocol.SemanticTokenProperty,
	cache.ParamToken:    protocol.SemanticTokenProperty,
	cache.PropToken:     protocol.SemanticTokenProperty,
	cache.NumberToken:   protocol.SemanticTokenNumber,
	cache.SpellingToken: protocol.SemanticTokenEnumMember,
	cache.StringToken:   protocol.SemanticTokenString,
	cache.CommentToken:  protocol.SemanticTokenComment,
	cache.OperatorToken: protocol.SemanticTokenOperator,
}

// TokenModifiers is the legend's modifiers: bit 0 marks a declaration.
var TokenModifiers = []protocol.SemanticTokenModifiers{protocol.SemanticTokenModifierDeclaration}

// SemanticTokens encodes every token of the document as the protocol's relative quintuples. A
// token running past the end of its line (none should) is cut there, since the server does not
// assume multi-line token support.
func SemanticTokens(snap *cache.Snapshot) *protocol.SemanticTokens {
	syn := snap.Syntax()
	m := snap.Mapper
	data := make([]uint32, 0, 5*len(syn.Tokens))
	var prevLine, prevCol uint32
	for _, t := range syn.Tokens {
		if int(t.Kind) >= len(TokenTypes) || t.Span.End <= t.Span.Start {
			continue
		}
		start := m.Position(t.Span.Start)
		end := m.Position(t.Span.End)
		if end.Line != start.Line {
			end = m.Position(m.LineEnd(int(start.Line)))
		}
		if end.Character <= start.Character {
			continue
		}
		length := end.Character - start.Character
		line, col := start.Line, start.Character
		dl, dc := line-prevLine, col
		if dl == 0 {
			dc = col - prevCol
		}
		var mods uint32
		if t.Decl {
			mods = 1
		}
		data = append(data, dl, dc, length, uint32(t.Kind), mods)
		prevLine, prevCol = line, col
	}
	return &protocol.SemanticTokens{Data: data}
}
