// Package source maps byte offsets in a calc file to lines and columns and back. It is the one
// place positions are converted: the CLI prints 1-based line:column (columns in bytes), the
// language server speaks 0-based lines with UTF-16 columns. Inside hmb every position is a byte
// offset.
package source

import (
	"bytes"
	"sort"
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
	lines := make([]int, 1, bytes.Count(src, nl)+1)
	for i := 0; ; {
		k := bytes.IndexByte(src[i:], '\n')
		if k < 0 {
			break
		}
		i += k + 1
		lines = append(lines, i)
	}
	return &File{Name: name, Src: src, lines: lines}
}

var nl = []byte{'\n'}

// NewLines is New for a caller that has found the line starts already (the parser, whose
// scanner makes a token of every "\n"): lines[0] is 0, then the offset just after each "\n" of
// src, in order. The File keeps both.
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

// String is the 1-based "line:col" with the column in bytes, the form of compiler messages.
func (p Pos) String() string { return itoa(p.Line+1) + ":" + itoa(p.Col+1) }

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

// lineEnd is the offset of the line's terminating newline (or of a "\r\n"), or the file end.
func (f *File) lineEnd(line int) int {
	end := len(f.Src)
	if line+1 < len(f.lines) {
		end = f.lines[line+1] - 1
	}
	if end > f.lines[line] && f.Src[end-1] == '\r' {
		end--
	}
	return end
}

// Line returns the text of the 0-based line without its line terminator.
func (f *File) Line(line int) []byte {
	if line < 0 || line >= len(f.lines) {
		return nil
	}
	return f.Src[f.lines[line]:f.lineEnd(line)]
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var b [20]byte
	i := len(b)
	neg := n < 0
	if neg {
		n = -n
	}
	for n > 0 {
		i--
		b[i] = byte('0' + n%10)
		n /= 10
	}
	if neg {
		i--
		b[i] = '-'
	}
	return string(b[i:])
}
