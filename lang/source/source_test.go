package source

import "testing"

func TestPosition(t *testing.T) {
	// "°" is 2 bytes and 1 UTF-16 unit; "𝄞" (U+1D11E) is 4 bytes and 2 UTF-16 units (a surrogate
	// pair), per the Unicode standard's UTF-8 and UTF-16 encoding forms.
	f := New("t", []byte("ab\nT 540 °C 𝄞x\r\nlast"))
	tests := []struct {
		off                         int
		line, col, runes, utf16, to int
	}{
		{0, 0, 0, 0, 0, 0},
		{2, 0, 2, 2, 2, 0},
		{3, 1, 0, 0, 0, 0},
		{12, 1, 9, 8, 8, 0},   // after "°C"? no: offset 12 is just past "°"
		{15, 1, 12, 10, 10, 0}, // before "𝄞"
		{19, 1, 16, 11, 12, 0}, // after "𝄞"
		{22, 2, 0, 0, 0, 0},
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
	if got := f.OffsetUTF16(1, 99); got != 20 {
		t.Errorf("a column past the line end clamps to the end before \\r\\n: got %d, want 20", got)
	}
	if got := f.OffsetUTF16(1, 11); got != 15 {
		t.Errorf("a column inside a surrogate pair stays before the rune: got %d, want 15", got)
	}
	if got := string(f.Line(1)); got != "T 540 °C 𝄞x" {
		t.Errorf("Line(1) = %q", got)
	}
}
