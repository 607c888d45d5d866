package main

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"golang.org/x/image/font"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// The diagrams' labels are measured here with the font they name first, DejaVu Sans, read from
// Debian's font files (package fonts-dejavu-core), so that the check does not share the drawing
// code's own width table: a label's box is the ink of its glyphs, from the fonts' glyph bounds.

const dejaVuDir = "/usr/share/fonts/truetype/dejavu"

type dejaVu struct {
	book, bold *sfnt.Font
	buf        sfnt.Buffer
}

// loadDejaVu skips the test when the fonts are missing, unless HMB_REQUIRE_BROWSER=1 (set by
// .ci/run, which installs them with chromium) demands them.
func loadDejaVu(t *testing.T) *dejaVu {
	t.Helper()
	var fs [2]*sfnt.Font
	for i, name := range []string{"DejaVuSans.ttf", "DejaVuSans-Bold.ttf"} {
		b, err := os.ReadFile(filepath.Join(dejaVuDir, name))
		if err == nil {
			fs[i], err = sfnt.Parse(b)
		}
		if err != nil {
			if os.Getenv("HMB_REQUIRE_BROWSER") == "1" {
				t.Fatalf("DejaVu Sans not readable and HMB_REQUIRE_BROWSER=1: %v", err)
			}
			t.Skipf("DejaVu Sans not readable (%v): apt-get install fonts-dejavu-core", err)
		}
	}
	return &dejaVu{book: fs[0], bold: fs[1]}
}

// ink is the box of the glyphs' ink of s set at size pixels with its baseline origin at (0, 0),
// y downwards; the horizontal extent is the advance width, which holds the ink and the side
// bearings.
func (d *dejaVu) ink(t *testing.T, s string, size float64, bold bool) (x1, y0, y1 float64) {
	t.Helper()
	f := d.book
	if bold {
		f = d.bold
	}
	upem := fixed.I(int(f.UnitsPerEm()))
	scale := size / float64(f.UnitsPerEm())
	for _, r := range s {
		gi, err := f.GlyphIndex(&d.buf, r)
		if err != nil {
			t.Fatal(err)
		}
		adv, err := f.GlyphAdvance(&d.buf, gi, upem, font.HintingNone)
		if err != nil {
			t.Fatal(err)
		}
		if r != ' ' {
			b, _, err := f.GlyphBounds(&d.buf, gi, upem, font.HintingNone)
			if err != nil {
				t.Fatal(err)
			}
			y0 = math.Min(y0, float64(b.Min.Y)/64*scale)
			y1 = math.Max(y1, float64(b.Max.Y)/64*scale)
		}
		x1 += float64(adv) / 64 * scale
	}
	return x1, y0, y1
}

// svgText is one text element of a drawing, placed.
type svgText struct {
	text, class string
	box         [4]float64 // x0, y0, x1, y1
}

type xnode struct {
	XMLName xml.Name
	Attrs   []xml.Attr `xml:",any,attr"`
	Text    string     `xml:",chardata"`
	Nodes   []xnode    `xml:",any"`
}

func (n *xnode) attr(name string) string {
	for _, a := range n.Attrs {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

var (
	styleRule = regexp.MustCompile(`\.([\w-]+)\{font-size:([\d.]+)px(;font-weight:bold)?`)
	translate = regexp.MustCompile(`^translate\(([-\d.]+),([-\d.]+)\)$`)
)

// svgTexts reads every horizontal text element of an SVG with its ink box, and the centres of the
// stream markers. Font sizes come from the drawing's style sheet, by class.
func svgTexts(t *testing.T, f *dejaVu, svg []byte) (texts []svgText, marks [][2]float64, width, height float64) {
	t.Helper()
	var root xnode
	if err := xml.NewDecoder(bytes.NewReader(svg)).Decode(&root); err != nil {
		t.Fatal(err)
	}
	width, _ = strconv.ParseFloat(root.attr("width"), 64)
	height, _ = strconv.ParseFloat(root.attr("height"), 64)
	type style struct {
		size float64
		bold bool
	}
	styles := map[string]style{}
	var walk func(n *xnode, dx, dy float64)
	walk = func(n *xnode, dx, dy float64) {
		if tr := n.attr("transform"); tr != "" {
			m := translate.FindStringSubmatch(tr)
			if m == nil {
				return // rotated: the axis title along the side, kept clear by the layout
			}
			a, _ := strconv.ParseFloat(m[1], 64)
			b, _ := strconv.ParseFloat(m[2], 64)
			dx, dy = dx+a, dy+b
		}
		switch n.XMLName.Local {
		case "style":
			for _, m := range styleRule.FindAllStringSubmatch(n.Text, -1) {
				v, _ := strconv.ParseFloat(m[2], 64)
				styles[m[1]] = style{v, m[3] != ""}
			}
		case "circle":
			if n.attr("class") == "stream" {
				x, _ := strconv.ParseFloat(n.attr("cx"), 64)
				y, _ := strconv.ParseFloat(n.attr("cy"), 64)
				marks = append(marks, [2]float64{x + dx, y + dy})
			}
		case "text":
			st, ok := styles[n.attr("class")]
			if !ok {
				t.Fatalf("text %q of class %q: no font size in the style sheet", n.Text, n.attr("class"))
			}
			x, _ := strconv.ParseFloat(n.attr("x"), 64)
			y, _ := strconv.ParseFloat(n.attr("y"), 64)
			w, a, b := f.ink(t, n.Text, st.size, st.bold)
			x += dx
			switch n.attr("text-anchor") {
			case "middle":
				x -= w / 2
			case "end":
				x -= w
			}
			texts = append(texts, svgText{text: n.Text, class: n.attr("class"), box: [4]float64{x, y + dy + a, x + w, y + dy + b}})
		}
		for i := range n.Nodes {
			walk(&n.Nodes[i], dx, dy)
		}
	}
	walk(&root, 0, 0)
	return texts, marks, width, height
}

// overlapCheck reports every pair of texts whose ink boxes overlap, every text that leaves the
// drawing and every stream marker a label covers.
func overlapCheck(texts []svgText, marks [][2]float64, width, height float64) []string {
	var bad []string
	const eps = 0.25 // pixels: rounding of the coordinates written
	for i, a := range texts {
		b := a.box
		if b[0] < -eps || b[1] < -eps || b[2] > width+eps || b[3] > height+eps {
			bad = append(bad, fmt.Sprintf("%q leaves the drawing (%.1f,%.1f)-(%.1f,%.1f)", a.text, b[0], b[1], b[2], b[3]))
		}
		for _, o := range texts[i+1:] {
			c := o.box
			if math.Min(b[2], c[2])-math.Max(b[0], c[0]) > eps && math.Min(b[3], c[3])-math.Max(b[1], c[1]) > eps {
				bad = append(bad, fmt.Sprintf("%q overlaps %q", a.text, o.text))
			}
		}
		if a.class == "d-tl" || a.class == "d-sm" {
			for _, m := range marks {
				if m[0] > b[0]-3 && m[0] < b[2]+3 && m[1] > b[1]-3 && m[1] < b[3]+3 {
					bad = append(bad, fmt.Sprintf("%q covers a stream marker at %.0f,%.0f", a.text, m[0], m[1]))
				}
			}
		}
	}
	return bad
}

// TestDiagramLabelsDoNotOverlap draws every example in every kind, fitted and over the full
// dome, and reads the labels back: no two overlap, none covers a stream marker, none leaves the
// drawing, and every solved stream's name is printed.
func TestDiagramLabelsDoNotOverlap(t *testing.T) {
	f := loadDejaVu(t)
	for _, file := range append(exampleFiles(t), crowdedFile(t)) {
		for _, kind := range []string{"Ts", "hs", "ph"} {
			for _, full := range []bool{false, true} {
				args := []string{"plot", "--kind", kind, file}
				if full {
					args = append([]string{"plot", "--full-dome"}, args[1:]...)
				}
				code, out, stderr := runReportCmd(args...)
				if code == 2 {
					t.Fatalf("%v: %s", args, stderr)
				}
				texts, marks, w, h := svgTexts(t, f, out)
				for _, b := range overlapCheck(texts, marks, w, h) {
					t.Errorf("%s %s (full dome %v): %s", filepath.Base(file), kind, full, b)
				}
				printed := map[string]bool{}
				for _, tx := range texts {
					if tx.class == "d-tl" {
						for _, n := range strings.Split(tx.text, ", ") {
							printed[n] = true
						}
					}
				}
				for _, n := range solvedStreams(t, file) {
					if !printed[n] {
						t.Errorf("%s %s (full dome %v): stream %s has no label", filepath.Base(file), kind, full, n)
					}
				}
			}
		}
	}
}

// crowdedFile writes an invented calc file that crowds a diagram: a header tee feeding six
// reducing valves to pressures a few per cent apart, so that isobars, isotherms and stream
// markers bunch together, with stream names that once printed over each other.
func crowdedFile(t *testing.T) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("title \"crowded labels\"\ndisplay SI\nstream FW1 { flow 12 kg/s; p 2500 kPa; T 300 C }\n")
	b.WriteString("splitter TEE { in FW1; out C1, C2, C3, C4, C5, C6 }\n")
	for i, p := range []int{2350, 2200, 2050, 1900, 1750, 1600} {
		fmt.Fprintf(&b, "stream C%d { flow 2 kg/s }\nstream D%d { p %d kPa }\nvalve V%d { in C%d; out D%d }\n", i+1, i+1, p, i+1, i+1, i+1)
	}
	b.WriteString("stream W1 { flow 3 kg/s; p 2500 kPa; T 30 C }\nstream W2 { T 41 C }\nheater H1 { in W1; out W2 }\n")
	b.WriteString("expect TEE sgen >= 0 kW/K\n")
	path := filepath.Join(t.TempDir(), "crowded.hmb")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, stderr := runReportCmd("check", path); code != 0 {
		t.Fatalf("crowded.hmb does not check clean: %s", stderr)
	}
	return path
}

// solvedStreams lists the streams the table shows with a state.
func solvedStreams(t *testing.T, file string) []string {
	t.Helper()
	_, table, _ := runReportCmd("table", "--format", "csv", file)
	recs := strings.Split(strings.Split(string(table), "\n\n")[0], "\n")
	var out []string
	for _, rec := range recs[2:] {
		name, _, _ := strings.Cut(rec, ",")
		if rec != "" && !strings.HasSuffix(rec, ",unsolved") {
			out = append(out, name)
		}
	}
	return out
}

// TestOverlapCheckFails makes sure the check above can fail: two labels printed on one spot, and
// a label over a marker.
func TestOverlapCheckFails(t *testing.T) {
	f := loadDejaVu(t)
	svg := `<svg xmlns="http://www.w3.org/2000/svg" width="200" height="100"><style>.d-tl{font-size:15px;font-weight:bold}.d-sm{font-size:13px}</style>` +
		`<text x="10" y="30" text-anchor="start" class="d-tl">C2</text><text x="26" y="32" text-anchor="start" class="d-tl">FW1</text>` +
		`<circle class="stream" cx="120" cy="60" r="5"/><text x="110" y="65" text-anchor="start" class="d-sm">x=0.2</text></svg>`
	texts, marks, w, h := svgTexts(t, f, []byte(svg))
	bad := overlapCheck(texts, marks, w, h)
	if len(bad) != 2 || !strings.Contains(bad[0], `"C2" overlaps "FW1"`) || !strings.Contains(bad[1], "covers a stream marker") {
		t.Errorf("overlap check found %q", bad)
	}
}

// TestDiagramFitsLowPressureSystem: the pool-heating blend (45 to 150 C liquid) fills the plot by
// default and shrinks into a corner only when the full dome is asked for.
func TestDiagramFitsLowPressureSystem(t *testing.T) {
	f := loadDejaVu(t)
	file := filepath.Join(reportExamples, "district_heat_blend.hmb")
	span := func(args ...string) (fx, fy float64) {
		_, out, _ := runReportCmd(append([]string{"plot", "--kind", "Ts"}, append(args, file)...)...)
		_, marks, _, _ := svgTexts(t, f, out)
		if len(marks) != 3 {
			t.Fatalf("%d stream markers", len(marks))
		}
		x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
		for _, m := range marks {
			x0, y0, x1, y1 = math.Min(x0, m[0]), math.Min(y0, m[1]), math.Max(x1, m[0]), math.Max(y1, m[1])
		}
		// The plot frame of the diagrams: 86..712 by 58..598 pixels.
		return (x1 - x0) / (712 - 86), (y1 - y0) / (598 - 58)
	}
	if fx, fy := span(); fx < 0.5 || fy < 0.5 {
		t.Errorf("fitted: the streams span %.0f %% by %.0f %% of the plot, want at least half each way", 100*fx, 100*fy)
	}
	if fx, fy := span("--full-dome"); fx > 0.25 || fy > 0.35 {
		t.Errorf("full dome: the streams span %.0f %% by %.0f %% of the plot", 100*fx, 100*fy)
	}
}
