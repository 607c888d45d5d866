// Package source maps byte offsets in a calc file to lines and columns and back. It is the one
// line index of hmb: the parser builds it, and the command line, the report and the language
// server convert through it. A line ends at "\n", "\r\n" or a lone "\r", as editors and the
// language server protocol count lines. Inside hmb every position is a byte offset; columns are
// counted only at the edges, each output in its own convention (README, "Positions"): code points
// for what people read (the command line, JSON, SARIF, reports, goldens), UTF-16 code units for
// the language server.
package source

import (
	"sort"
	"strconv"
	"unicode/utf16"
	"unicode/utf8"
)

// File is a calc file's text with its line starts, built once per version of the text.
type File struct {
	Name  string
	Src   []byte
	lines []int // byte offset of the start of each line; lines[0] == 0
}

// New indexes src. The File keeps src; the caller must not modify it afterwards.
func New(name string, src []byte) *File {
	return &File{Name: name, Src: src, lines: LineStarts(src)}
}

// LineStarts returns the offset of each line's start: 0, then the offset just after each "\n",
// "\r\n" and lone "\r".
func LineStarts(src []byte) []int {
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

// NewLines is New for a caller that has found the line starts already (the parser, whose
// scanner makes a token of every line break): lines as LineStarts returns them. The File keeps
// both.
func NewLines(name string, src []byte, lines []int) *File {
	return &File{Name: name, Src: src, lines: lines}
}

// LineCount is the number of lines; a file ending in a newline has an empty last line.
func (f *File) LineCount() int { return len(f.lines) }

// LineStart is the byte offset where the 0-based line begins (clamped to the file).
func (f *File) LineStart(line int) int {
	if line < 0 {
		return 0
	}
	if line >= len(f.lines) {
		return len(f.Src)
	}
	return f.lines[line]
}

// Pos is a position resolved against the text. Line is 0-based; the columns are 0-based counts,
// from the start of the line, of bytes, of runes and of UTF-16 code units.
type Pos struct {
	Offset int
	Line   int
	Col    int // bytes
	Rune   int // runes (invalid UTF-8 counts one rune per byte)
	UTF16  int // UTF-16 code units, as the language server protocol counts by default
}

// String is the 1-based "line:col" with the column in code points, as the command line prints
// positions.
func (p Pos) String() string { return strconv.Itoa(p.Line+1) + ":" + strconv.Itoa(p.Rune+1) }

// Position resolves a byte offset, clamped to [0, len(Src)].
func (f *File) Position(off int) Pos {
	off = max(0, min(off, len(f.Src)))
	line := sort.Search(len(f.lines), func(i int) bool { return f.lines[i] > off }) - 1
	start := f.lines[line]
	p := Pos{Offset: off, Line: line, Col: off - start}
	for i := start; i < off; {
		r, size := utf8.DecodeRune(f.Src[i:])
		if i+size > off { // offset inside a multi-byte rune: count it as not yet reached
			break
		}
		p.Rune++
		if r >= 0x10000 && r != utf8.RuneError {
			p.UTF16 += 2
		} else {
			p.UTF16++
		}
		i += size
	}
	return p
}

// OffsetUTF16 converts a 0-based line and UTF-16 column (the protocol's Position) to a byte
// offset. A column past the end of the line is clamped to the line end, a line past the end of
// the file to the file's end, as the protocol asks.
func (f *File) OffsetUTF16(line, col int) int {
	if line < 0 {
		return 0
	}
	if line >= len(f.lines) {
		return len(f.Src)
	}
	i, end := f.lines[line], f.lineEnd(line)
	for n := 0; i < end && n < col; {
		r, size := utf8.DecodeRune(f.Src[i:])
		n += max(1, utf16.RuneLen(r))
		if n > col { // the column splits a surrogate pair: stay before the rune
			break
		}
		i += size
	}
	return i
}

// lineEnd is the offset of the line's terminator ("\n", "\r\n" or "\r"), or the file end.
func (f *File) lineEnd(line int) int {
	if line+1 >= len(f.lines) {
		return len(f.Src)
	}
	end := f.lines[line+1] - 1 // the "\n" or lone "\r"
	if end > f.lines[line] && f.Src[end] == '\n' && f.Src[end-1] == '\r' {
		end--
	}
	return end
}

// LineEnd is the offset where the 0-based line ends, before its terminator (the file's end for
// the last line, or a line past it).
func (f *File) LineEnd(line int) int {
	if line < 0 {
		line = 0
	}
	if line >= len(f.lines) {
		return len(f.Src)
	}
	return f.lineEnd(line)
}

// Line returns the text of the 0-based line without its line terminator.
func (f *File) Line(line int) []byte {
	if line < 0 || line >= len(f.lines) {
		return nil
	}
	return f.Src[f.lines[line]:f.lineEnd(line)]
}
