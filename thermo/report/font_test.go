package report

import (
	"os"
	"testing"

	"golang.org/x/image/font"
	"golang.org/x/image/font/sfnt"
	fx "golang.org/x/image/math/fixed"
)

// TestGlyphWidths reads the advance widths of font.go back from Debian's DejaVu Sans files
// (fonts-dejavu-core); skipped with a note when they are not installed, unless
// HMB_REQUIRE_BROWSER=1 (set by .ci/run) demands them.
func TestGlyphWidths(t *testing.T) {
	for _, tt := range []struct {
		file string
		tab  *[95]uint16
	}{
		{"/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf", &dejaVuBook},
		{"/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf", &dejaVuBold},
	} {
		b, err := os.ReadFile(tt.file)
		if err != nil {
			if os.Getenv("HMB_REQUIRE_BROWSER") == "1" {
				t.Fatalf("%v and HMB_REQUIRE_BROWSER=1", err)
			}
			t.Skipf("%v: apt-get install fonts-dejavu-core", err)
		}
		f, err := sfnt.Parse(b)
		if err != nil {
			t.Fatal(err)
		}
		var buf sfnt.Buffer
		upem := fx.I(int(f.UnitsPerEm()))
		if f.UnitsPerEm() != 2048 {
			t.Fatalf("%s: %d units per em, the table assumes 2048", tt.file, f.UnitsPerEm())
		}
		for r := rune(' '); r <= '~'; r++ {
			gi, err := f.GlyphIndex(&buf, r)
			if err != nil {
				t.Fatal(err)
			}
			adv, err := f.GlyphAdvance(&buf, gi, upem, font.HintingNone)
			if err != nil {
				t.Fatal(err)
			}
			if got := uint16(adv.Round()); got != tt.tab[r-' '] {
				t.Errorf("%s %q: advance %d, table %d", tt.file, r, got, tt.tab[r-' '])
			}
		}
		for _, r := range []rune{'°', '…'} {
			gi, _ := f.GlyphIndex(&buf, r)
			adv, _ := f.GlyphAdvance(&buf, gi, upem, font.HintingNone)
			if w := textWidth(string(r), 2048, tt.tab == &dejaVuBold); float64(adv.Round()) > w {
				t.Errorf("%q: advance %d, textWidth %g", r, adv.Round(), w)
			}
		}
	}
}
