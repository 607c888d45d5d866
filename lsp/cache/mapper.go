package cache

import (
	"bytes"
	"sort"
	"unicode/utf16"
	"unicode/utf8"

	"go.lsp.dev/protocol"

	"hmb/lang/source"
	"hmb/thermo/model"
)

// A Mapper converts between the byte offsets hmb uses inside and the protocol's positions: 0-based
// lines and UTF-16 columns. It is the only place the server does so.
//
// The protocol ends a line at "\n", "\r\n" and a lone "\r"; lang/source, shared with the command
// line, ends one only at "\n" (the notation takes a lone "\r" for a blank). For the usual text,
// with no lone "\r", the mapper uses lang/source's line index as it is. For text with a lone "\r"
// it keeps a line index of its own, so that what the editor shows on line n is what the server
// calls line n; the notation still reads such a line break as a blank, so the statements on
// either side run together, and the diagnostics say so where the editor shows them.
type Mapper struct {
	File *source.File
	// lines are the protocol's line starts when the text has a lone "\r", else nil (File's
	// lines are the protocol's).
	lines []int
}

// NewMapper indexes src.
func NewMapper(name string, src []byte) Mapper {
	m := Mapper{File: source.New(name, src)}
	if hasLoneCR(src) {
		m.lines = lineStarts(src)
	}
	return m
}

// hasLoneCR reports whether a "\r" in src is not followed by "\n".
func hasLoneCR(src []byte) bool {
	for i := 0; ; {
		k := bytes.IndexByte(src[i:], '\r')
		if k < 0 {
			return false
		}
		i += k + 1
		if i == len(src) || src[i] != '\n' {
			return true
		}
	}
}

// lineStarts is the offset of each line's start, lines ending at "\n", "\r\n" or "\r".
func lineStarts(src []byte) []int {
	lines := []int{0}
	for i := 0; i < len(src); i++ {
		switch src[i] {
		case '\r':
			if i+1 < len(src) && src[i+1] == '\n' {
				i++
			}
			lines = append(lines, i+1)
		case '\n':
			lines = append(lines, i+1)
		}
	}
	return lines
}

// Position converts a byte offset (clamped to the text). An offset inside a multi-byte character
// is taken to be before it.
func (m Mapper) Position(off int) protocol.Position {
	if m.lines == nil {
		p := m.File.Position(off)
		return protocol.Position{Line: uint32(p.Line), Character: uint32(p.UTF16)}
	}
	src := m.File.Src
	off = max(0, min(off, len(src)))
	line := sort.Search(len(m.lines), func(i int) bool { return m.lines[i] > off }) - 1
	col := 0
	for i := m.lines[line]; i < off; {
		r, size := utf8.DecodeRune(src[i:])
		if i+size > off {
			break
		}
		col += max(1, utf16.RuneLen(r))
		i += size
	}
	return protocol.Position{Line: uint32(line), Character: uint32(col)}
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
	line, col := clampInt(p.Line), clampInt(p.Character)
	if m.lines == nil {
		return m.File.OffsetUTF16(line, col)
	}
	src := m.File.Src
	if line >= len(m.lines) {
		return len(src)
	}
	i, end := m.lines[line], m.LineEnd(line)
	for n := 0; i < end && n < col; {
		r, size := utf8.DecodeRune(src[i:])
		n += max(1, utf16.RuneLen(r))
		if n > col {
			break
		}
		i += size
	}
	return i
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
func (m Mapper) LineEnd(line int) int {
	src := m.File.Src
	if m.lines == nil {
		if line < 0 {
			line = 0
		}
		return m.File.LineStart(line) + len(m.File.Line(line))
	}
	if line < 0 {
		line = 0
	}
	if line+1 >= len(m.lines) {
		return len(src)
	}
	end := m.lines[line+1] - 1
	if src[end] == '\n' && end > m.lines[line] && src[end-1] == '\r' {
		end--
	}
	return end
}

func clampInt(u uint32) int {
	if u > 1<<31-1 {
		return 1<<31 - 1
	}
	return int(u)
}
