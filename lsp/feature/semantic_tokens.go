package feature

// This file implements semantic highlighting of the whole document.

import (
	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lsp/cache"
)

// TokenTypes is the legend's token types, indexed by lang.TokenKind.
var TokenTypes = [lang.NumTokenKinds]protocol.SemanticTokenTypes{
	lang.KeywordToken:  protocol.SemanticTokenKeyword,
	lang.StreamToken:   protocol.SemanticTokenVariable,
	lang.UnitToken:     protocol.SemanticTokenClass,
	lang.KindToken:     protocol.SemanticTokenType,
	lang.RoleToken:     protocol.SemanticTokenProperty,
	lang.ParamToken:    protocol.SemanticTokenProperty,
	lang.PropToken:     protocol.SemanticTokenProperty,
	lang.NumberToken:   protocol.SemanticTokenNumber,
	lang.SpellingToken: protocol.SemanticTokenEnumMember,
	lang.StringToken:   protocol.SemanticTokenString,
	lang.CommentToken:  protocol.SemanticTokenComment,
	lang.OperatorToken: protocol.SemanticTokenOperator,
	lang.CaseToken:     protocol.SemanticTokenNamespace,
}

// TokenModifiers is the legend's modifiers: bit 0 marks a declaration.
var TokenModifiers = []protocol.SemanticTokenModifiers{protocol.SemanticTokenModifierDeclaration}

// SemanticTokens encodes every token of the document as the protocol's relative quintuples. A
// token running past the end of its line (none should) is cut there, since the server does not
// assume multi-line token support.
func SemanticTokens(snap *cache.Snapshot) *protocol.SemanticTokens {
	toks := snap.Tokens()
	m := snap.Mapper
	data := make([]uint32, 0, 5*len(toks))
	var prevLine, prevCol uint32
	for _, t := range toks {
		if int(t.Kind) >= len(TokenTypes) || t.End <= t.Pos {
			continue
		}
		start := m.Position(t.Pos)
		end := m.Position(t.End)
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
