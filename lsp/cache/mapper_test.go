package cache

import (
	"strings"
	"testing"
	"unicode/utf16"
	"unicode/utf8"

	"go.lsp.dev/protocol"
)

// The protocol's rules (LSP 3.17 specification, "Text Documents" and "Position"): a line ends at
// "\n", "\r\n" or "\r"; a column counts UTF-16 code units; a column past the end of its line
// means the line's end.

// refPositions is a second, plain implementation of those rules: the protocol position of every
// byte offset of src that starts a character or a line break, or is the end.
func refPositions(src string) map[int]protocol.Position {
	out := map[int]protocol.Position{}
	var line, col uint32
	for i := 0; i <= len(src); {
		out[i] = protocol.Position{Line: line, Character: col}
		if i == len(src) {
			break
		}
		switch {
		case strings.HasPrefix(src[i:], "\r\n"):
			out[i+1] = protocol.Position{Line: line, Character: col + 1}
			line, col, i = line+1, 0, i+2
		case src[i] == '\r' || src[i] == '\n':
			line, col, i = line+1, 0, i+1
		default:
			r, size := utf8.DecodeRuneInString(src[i:])
			col += uint32(len(utf16.Encode([]rune{r})))
			i += size
		}
	}
	return out
}

var mapperTexts = []string{
	"",
	"stream S1\n",
	"stream S1\r\nstream S2\r\n",
	"a\rb\r\nc\nd",                // every kind of line break
	"T 400 °C\r  p 1 bar\r\r🔥x\r", // lone "\r" only, as old Mac files; non-ASCII before names
	"\r\r\n\n\r",
	"x ² 🔥 y\n°\r\n🔥\rz",
}

func TestMapperPositions(t *testing.T) {
	for _, src := range mapperTexts {
		m := NewMapper("t.hmb", []byte(src))
		ref := refPositions(src)
		for off, want := range ref {
			if got := m.Position(off); got != want {
				t.Errorf("%q: Position(%d) = %v, want %v", src, off, got, want)
			}
			// Back again, except from between "\r" and "\n", which is no place in the editor.
			if off > 0 && off < len(src) && src[off-1] == '\r' && src[off] == '\n' {
				continue
			}
			if got := m.Offset(want); got != off {
				t.Errorf("%q: Offset(%v) = %d, want %d", src, want, got, off)
			}
		}
	}
}

func TestMapperClamps(t *testing.T) {
	src := "a\rbc\r\n°🔥\nlast"
	m := NewMapper("t.hmb", []byte(src))
	tests := []struct {
		pos  protocol.Position
		want int
	}{
		{protocol.Position{Line: 0, Character: 9}, 1},   // past the end of "a": before its "\r"
		{protocol.Position{Line: 1, Character: 9}, 4},   // before "\r\n"
		{protocol.Position{Line: 2, Character: 2}, 8},   // inside the emoji's surrogate pair: before it
		{protocol.Position{Line: 2, Character: 3}, 12},  // after the emoji
		{protocol.Position{Line: 3, Character: 99}, 17}, // the file's end
		{protocol.Position{Line: 9, Character: 0}, 17},  // a line past the end
	}
	for _, tt := range tests {
		if got := m.Offset(tt.pos); got != tt.want {
			t.Errorf("Offset(%v) = %d, want %d", tt.pos, got, tt.want)
		}
	}
	for line, want := range []int{1, 4, 12, 17, 17} {
		if got := m.LineEnd(line); got != want {
			t.Errorf("LineEnd(%d) = %d, want %d", line, got, want)
		}
	}
	// The same without a lone "\r" goes through lang/source's index.
	m = NewMapper("t.hmb", []byte("ab\r\n°\n"))
	for line, want := range []int{2, 6, 7, 7} {
		if got := m.LineEnd(line); got != want {
			t.Errorf("no lone CR: LineEnd(%d) = %d, want %d", line, got, want)
		}
	}
}

func TestApplyChangesLoneCR(t *testing.T) {
	// Lines: "a", "°b", "c". Replace "b" (line 1, columns 1-2) and then insert at the start of the
	// last line of the text as it is after the first change.
	m := NewMapper("t.hmb", []byte("a\r°b\rc"))
	r1 := protocol.Range{Start: protocol.Position{Line: 1, Character: 1}, End: protocol.Position{Line: 1, Character: 2}}
	r2 := protocol.Range{Start: protocol.Position{Line: 3}, End: protocol.Position{Line: 3}}
	got, err := ApplyChanges(m, []Change{{Range: &r1, Text: "B\rX"}, {Range: &r2, Text: ">"}})
	if err != nil || string(got) != "a\r°B\rX\r>c" {
		t.Errorf("ApplyChanges = %q, %v", got, err)
	}
}
