package cache

import (
	"go.lsp.dev/protocol"

	"hmb/lang/source"
	"hmb/thermo/model"
)

// A Mapper converts between the byte offsets hmb uses inside and the protocol's positions: 0-based
// lines and UTF-16 columns. It is the only place the server does so, over the notation's one line
// index (lang/source), whose lines end where the protocol's do: at "\n", "\r\n" and a lone "\r".
type Mapper struct {
	File *source.File
}

// NewMapper indexes src.
func NewMapper(name string, src []byte) Mapper { return Mapper{File: source.New(name, src)} }

// Position converts a byte offset (clamped to the text). An offset inside a multi-byte character
// is taken to be before it.
func (m Mapper) Position(off int) protocol.Position {
	p := m.File.Position(off)
	return protocol.Position{Line: uint32(p.Line), Character: uint32(p.UTF16)}
}

// Range converts a byte span.
func (m Mapper) Range(sp model.Span) protocol.Range {
	start, end := sp.Start, sp.End
	if end < start {
		end = start
	}
	return protocol.Range{Start: m.Position(start), End: m.Position(end)}
}

// Offset converts a protocol position to a byte offset. Positions past the end of a line or of
// the file are clamped, as the protocol asks; a column inside a surrogate pair stays before it.
func (m Mapper) Offset(p protocol.Position) int {
	return m.File.OffsetUTF16(clampInt(p.Line), clampInt(p.Character))
}

// Span converts a protocol range to a byte span, start before end.
func (m Mapper) Span(r protocol.Range) model.Span {
	a, b := m.Offset(r.Start), m.Offset(r.End)
	if b < a {
		a, b = b, a
	}
	return model.Span{Start: a, End: b}
}

// LineEnd is the offset where the protocol's 0-based line ends, before its line break (the file's
// end for the last line or a line past it).
func (m Mapper) LineEnd(line int) int { return m.File.LineEnd(line) }

func clampInt(u uint32) int {
	if u > 1<<31-1 {
		return 1<<31 - 1
	}
	return int(u)
}
