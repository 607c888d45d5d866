package source

import "testing"

func TestPosition(t *testing.T) {
	// Byte layout of the text below: line 1 starts at 3; "°" (U+00B0) is bytes 9-10, 2 bytes and
	// 1 UTF-16 unit; "𝄞" (U+1D11E) is bytes 13-16, 4 bytes and 2 UTF-16 units (a surrogate pair);
	// "x" is 17, "\r\n" 18-19 and "last" starts at 20. Encoding lengths per the Unicode standard's
	// UTF-8 and UTF-16 encoding forms (chapter 3.9).
	f := New("t", []byte("ab\nT 540 °C 𝄞x\r\nlast"))
	tests := []struct {
		off                     int
		line, col, runes, utf16 int
	}{
		{0, 0, 0, 0, 0},
		{2, 0, 2, 2, 2},
		{3, 1, 0, 0, 0},
		{9, 1, 6, 6, 6},     // before "°"
		{11, 1, 8, 7, 7},    // just past "°"
		{13, 1, 10, 9, 9},   // before "𝄞"
		{17, 1, 14, 10, 11}, // after "𝄞", before "x"
		{18, 1, 15, 11, 12}, // before "\r\n"
		{20, 2, 0, 0, 0},
		{24, 2, 4, 4, 4}, // end of file
	}
	for _, tt := range tests {
		p := f.Position(tt.off)
		if p.Line != tt.line || p.Col != tt.col || p.Rune != tt.runes || p.UTF16 != tt.utf16 {
			t.Errorf("Position(%d) = %+v, want line %d col %d runes %d utf16 %d", tt.off, p, tt.line, tt.col, tt.runes, tt.utf16)
		}
		if got := f.OffsetUTF16(p.Line, p.UTF16); got != tt.off {
			t.Errorf("OffsetUTF16(%d, %d) = %d, want %d", p.Line, p.UTF16, got, tt.off)
		}
	}
	// An offset inside a multi-byte rune counts the rune as not yet reached.
	if p := f.Position(15); p.Col != 12 || p.Rune != 9 || p.UTF16 != 9 {
		t.Errorf("Position(15) inside \"𝄞\" = %+v, want col 12 runes 9 utf16 9", p)
	}
	if got := f.OffsetUTF16(1, 99); got != 18 {
		t.Errorf("a column past the line end clamps to the end before \\r\\n: got %d, want 18", got)
	}
	if got := f.OffsetUTF16(1, 10); got != 13 {
		t.Errorf("a column inside a surrogate pair stays before the rune: got %d, want 13", got)
	}
	if got := f.OffsetUTF16(9, 0); got != 24 {
		t.Errorf("a line past the end clamps to the file end: got %d, want 24", got)
	}
	if got := string(f.Line(1)); got != "T 540 °C 𝄞x" {
		t.Errorf("Line(1) = %q", got)
	}
	if got := f.Position(11).String(); got != "2:8" {
		t.Errorf("Position(11).String() = %q, want 2:8 (1-based, code points)", got)
	}
}

// Lines end at "\n", "\r\n" and a lone "\r", as the language server protocol counts them
// (LSP 3.17, "Text Documents"), for the command line as for the server.
func TestLineEnds(t *testing.T) {
	src := "a\nbb\r\nccc\rdddd\r\r\n"
	f := New("t", []byte(src))
	want := []string{"a", "bb", "ccc", "dddd", "", ""}
	if f.LineCount() != len(want) {
		t.Fatalf("%d lines, want %d", f.LineCount(), len(want))
	}
	for i, w := range want {
		if got := string(f.Line(i)); got != w {
			t.Errorf("Line(%d) = %q, want %q", i, got, w)
		}
	}
	for _, tt := range []struct{ off, line, col int }{{2, 1, 0}, {6, 2, 0}, {9, 2, 3}, {10, 3, 0}, {15, 4, 0}, {17, 5, 0}} {
		if p := f.Position(tt.off); p.Line != tt.line || p.Rune != tt.col {
			t.Errorf("Position(%d) = %d:%d, want %d:%d", tt.off, p.Line, p.Rune, tt.line, tt.col)
		}
	}
	if got := f.LineEnd(3); got != 14 {
		t.Errorf("LineEnd(3) = %d, want 14 (before the lone \\r)", got)
	}
}
