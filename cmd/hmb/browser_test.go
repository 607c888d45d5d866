package main

import (
	"bytes"
	"context"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// The report is checked in a real browser: Debian's chromium, headless, driven through the
// DevTools protocol (github.com/chromedp/chromedp). Every example's page is laid out as print
// lays it out on A4 and on US Letter, measured, printed to PDF and photographed. .ci/run installs
// chromium and sets HMB_REQUIRE_BROWSER=1; elsewhere the test skips with a note when chromium is
// missing.

// paper is a sheet the report must print on: its size and the page margins of the report's
// @page rule (14 mm top and bottom, 12 mm left and right), in millimetres.
type paper struct {
	name          string
	width, height float64
}

var papers = []paper{{"A4", 210, 297}, {"Letter", 215.9, 279.4}}

const marginTB, marginLR = 14.0, 12.0

func mmToIn(mm float64) float64 { return mm / 25.4 }

// cssPx is a length in CSS pixels (96 to the inch).
func cssPx(mm float64) int64 { return int64(mm / 25.4 * 96) }

// findChromium returns the browser's path, or skips the test.
func findChromium(t *testing.T) string {
	t.Helper()
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("HMB_REQUIRE_BROWSER") == "1" {
		t.Fatal("chromium not found and HMB_REQUIRE_BROWSER=1 (apt-get install chromium)")
	}
	t.Skip("chromium not found: the report's browser checks need it (apt-get install chromium)")
	return ""
}

// layoutCheck is what the page script below measures.
type layoutCheck struct {
	Width       float64  `json:"width"`
	ScrollWidth float64  `json:"scrollWidth"`
	Overflow    []string `json:"overflow"`
	Figures     int      `json:"figures"`
	EmptyFigs   []string `json:"emptyFigures"`
	Images      int      `json:"images"`
	Broken      int      `json:"broken"`
	Overlaps    []string `json:"overlaps"`
	Caution     bool     `json:"caution"`
}

// measure runs in the page: whether any element reaches past the page's width, whether every
// figure and image has drawn, and whether any two labels of a drawing overlap as the browser set
// them (its own text boxes, trimmed to the ink of the DejaVu glyphs: 0.15 em off the top of the
// line box, 0.1 em off the bottom). Tick labels in translated groups and the rotated axis title
// are placed on fixed grids and left out.
const measure = `(() => {
  const W = document.documentElement.clientWidth;
  const out = {width: W, scrollWidth: document.documentElement.scrollWidth, overflow: [], figures: 0,
    emptyFigures: [], images: document.images.length, broken: 0, overlaps: [],
    caution: !!document.querySelector('.caution')};
  for (const img of document.images) if (!img.complete || img.naturalWidth === 0) out.broken++;
  for (const el of document.body.querySelectorAll('*')) {
    // Inside a drawing, lines run on past the plot under its clip path; the drawing itself is
    // measured, and its labels are checked below and in labels_test.go.
    if (el.ownerSVGElement) continue;
    const r = el.getBoundingClientRect();
    if (r.width > 0 && (r.right > W + 0.5 || r.left < -0.5)) {
      out.overflow.push(el.tagName + '.' + (el.getAttribute('class') || '') + ' ' + (el.textContent || '').slice(0, 30) +
        ' [' + Math.round(r.left) + ', ' + Math.round(r.right) + '] of ' + W);
    }
  }
  for (const svg of document.querySelectorAll('figure svg')) {
    out.figures++;
    const r = svg.getBoundingClientRect();
    if (!(r.width > 100 && r.height > 50) || svg.querySelectorAll('*').length < 10) out.emptyFigures.push(svg.id);
    const texts = [...svg.querySelectorAll('text')].filter(t => !t.getAttribute('transform') && !t.closest('g[transform]') && t.textContent.trim() !== '');
    const boxes = texts.map(t => { const b = t.getBBox(); return {x0: b.x, x1: b.x + b.width, y0: b.y + 0.15 * b.height / 1.164, y1: b.y + b.height - 0.1 * b.height / 1.164}; });
    for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i], b = boxes[j];
      if (Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0) > 0.5 && Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0) > 0.5) {
        out.overlaps.push(svg.id + ': "' + texts[i].textContent + '" and "' + texts[j].textContent + '"');
      }
    }
  }
  return out;
})()`

var pdfPage = regexp.MustCompile(`/Type\s*/Page[^s]`)

// TestReportInBrowser writes every example's report, opens it in headless chromium and, for A4
// and US Letter, lays it out as print does (print media, the page's printable width): nothing
// reaches past the page width, every figure has drawn, images load, no two labels overlap; then
// prints it to PDF (a sane page count) and takes a screenshot. With -update it keeps the first
// printed page of one example as testdata/report/report-page.png.
func TestReportInBrowser(t *testing.T) {
	exe := findChromium(t)
	if testing.Short() {
		t.Skip("short mode: the browser checks take half a minute")
	}
	dir := t.TempDir()
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(exe),
		chromedp.Headless,
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.NoFirstRun,
		chromedp.UserDataDir(filepath.Join(dir, "profile")),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
	}
	actx, cancelAlloc := chromedp.NewExecAllocator(context.Background(), opts...)
	defer cancelAlloc()
	ctx, cancel := chromedp.NewContext(actx)
	defer cancel()
	// The first run starts the browser; it must not carry a timeout (see chromedp.Run).
	if err := chromedp.Do(ctx); err != nil {
		t.Fatalf("starting chromium: %v", err)
	}

	// The examples run in parallel, each in its own tab of the one browser; the group returns
	// when they all have, before the browser is stopped.
	t.Run("examples", func(t *testing.T) {
		for _, file := range exampleFiles(t) {
			base := strings.TrimSuffix(filepath.Base(file), ".hmb")
			t.Run(base, func(t *testing.T) {
				t.Parallel()
				checkInBrowser(t, ctx, dir, file, base)
			})
		}
	})
}

// checkInBrowser lays out, measures, prints and photographs one example's report in a new tab.
func checkInBrowser(t *testing.T, browser context.Context, dir, file, base string) {
	html := filepath.Join(dir, base+".html")
	if code, _, stderr := runReportCmd("report", "-o", html, file); code == 2 {
		t.Fatalf("%s: %s", base, stderr)
	}
	tab, closeTab := chromedp.NewContext(browser)
	defer closeTab()
	if err := chromedp.Do(tab); err != nil { // opens the tab; no timeout on this first run
		t.Fatalf("%s: opening a tab: %v", base, err)
	}
	step, stop := context.WithTimeout(tab, 120*time.Second)
	defer stop()
	if err := chromedp.Do(step, chromedp.Navigate("file://"+html)); err != nil {
		t.Fatalf("%s: %v", base, err)
	}
	for _, p := range papers {
		where := base + " on " + p.name
		width := cssPx(p.width - 2*marginLR)
		height := cssPx(p.height - 2*marginTB)
		var got layoutCheck
		err := chromedp.Do(step,
			chromedp.Func(func(ctx context.Context, tg *chromedp.Target) error {
				if _, err := cdp.Call(ctx, tg, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"}); err != nil {
					return err
				}
				_, err := cdp.Call(ctx, tg, emulation.SetDeviceMetricsOverride, emulation.SetDeviceMetricsOverrideParams{
					Width: width, Height: height, DeviceScaleFactor: 1})
				return err
			}),
		)
		if err == nil {
			got, err = chromedp.Run(step, chromedp.Evaluate[layoutCheck](measure))
		}
		if err != nil {
			t.Fatalf("%s: %v", where, err)
		}
		if got.Width != float64(width) {
			t.Errorf("%s: laid out %g px wide, want the printable width %d px", where, got.Width, width)
		}
		if got.ScrollWidth > got.Width {
			t.Errorf("%s: the page scrolls to %g px, wider than the printable %g px", where, got.ScrollWidth, got.Width)
		}
		for _, o := range got.Overflow {
			t.Errorf("%s: past the page width: %s", where, o)
		}
		if got.Figures != 4+sweepsIn(t, file) || len(got.EmptyFigs) > 0 {
			t.Errorf("%s: %d figures, %v not drawn", where, got.Figures, got.EmptyFigs)
		}
		if got.Broken > 0 {
			t.Errorf("%s: %d of %d images did not load", where, got.Broken, got.Images)
		}
		for _, o := range got.Overlaps {
			t.Errorf("%s: labels overlap: %s", where, o)
		}
		if !got.Caution {
			t.Errorf("%s: no caution", where)
		}

		pdf, err := chromedp.Run(step, func(ctx context.Context, tg *chromedp.Target) ([]byte, error) {
			tb, lr := mmToIn(marginTB), mmToIn(marginLR)
			res, err := cdp.Call(ctx, tg, page.PrintToPDF, page.PrintToPDFParams{
				PaperWidth: mmToIn(p.width), PaperHeight: mmToIn(p.height),
				MarginTop: &tb, MarginBottom: &tb, MarginLeft: &lr, MarginRight: &lr,
				PrintBackground: ptr(true),
			})
			if err != nil {
				return nil, err
			}
			return res.Data, nil
		})
		if err != nil {
			t.Fatalf("%s: printing: %v", where, err)
		}

		pages := len(pdfPage.FindAll(pdf, -1))
		// Title block, caution, summary and the flowsheet; the tables; three property
		// diagrams of about half a page each; expectations, findings and the listing.
		if !bytes.HasPrefix(pdf, []byte("%PDF-")) || pages < 3 || pages > 14 {
			t.Errorf("%s: a PDF of %d bytes and %d pages; want 3 to 14 pages", where, len(pdf), pages)
		}

		if p.name != "A4" {
			continue // one screenshot an example
		}
		shot, err := chromedp.Run(step, func(ctx context.Context, tg *chromedp.Target) ([]byte, error) {
			res, err := cdp.Call(ctx, tg, page.CaptureScreenshot, page.CaptureScreenshotParams{
				Clip: &page.Viewport{X: 0, Y: 0, Width: float64(width), Height: float64(height), Scale: 1}})
			if err != nil {
				return nil, err
			}
			return res.Data, nil
		})
		if err != nil {
			t.Fatalf("%s: screenshot: %v", where, err)
		}
		img, err := png.Decode(bytes.NewReader(shot))
		if err != nil {
			t.Errorf("%s: screenshot: %v", where, err)
		} else if b := img.Bounds(); int64(b.Dx()) != width || int64(b.Dy()) != height {
			t.Errorf("%s: screenshot %v, want %dx%d", where, b, width, height)
		}
		// The kept picture: the first page of one example, as it prints on A4.
		if update() && base == "waste_to_energy_cycle" && p.name == "A4" {
			if err := writeFileAtomic(filepath.Join(reportExamples, "..", "report", "report-page.png"), shot); err != nil {
				t.Fatal(err)
			}
		}
	}
}

func ptr[T any](v T) *T { return &v }

// sweepsIn counts the sweeps of a calc file: the page draws a plot of each.
func sweepsIn(t *testing.T, file string) int {
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	return len(checkModel(context.Background(), file, src, nil).model.Sweeps)
}
