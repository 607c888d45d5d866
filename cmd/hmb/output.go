package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"hmb/lang/source"
	"hmb/thermo/model"
)

// position is a 1-based line and a 1-based column counted in Unicode code points: what a person
// counts in an editor, and SARIF's "unicodeCodePoints" column kind.
type position struct {
	Line   int `json:"line"`
	Column int `json:"column"`
}

type jsonRange struct {
	Start position `json:"start"`
	End   position `json:"end"`
}

// lineIndex resolves byte offsets of one file to positions, through the notation's own mapper.
type lineIndex struct{ f *source.File }

func newLineIndex(src []byte) *lineIndex { return &lineIndex{source.New("", src)} }

func (li *lineIndex) pos(off int) position {
	p := li.f.Position(off)
	return position{Line: p.Line + 1, Column: p.Rune + 1}
}

// lineText is the 1-based line without its terminator.
func (li *lineIndex) lineText(line int) string { return string(li.f.Line(line - 1)) }

func (li *lineIndex) rng(sp model.Span) jsonRange {
	return jsonRange{Start: li.pos(sp.Start), End: li.pos(sp.End)}
}

// textOptions choose what text output shows beside errors and warnings.
type textOptions struct {
	quiet  bool // no notes (info diagnostics)
	passes bool // the expectations that hold, one line each
}

// passed is an expectation that holds: where it is written and what it compared.
type passed struct {
	span model.Span
	text string
}

// writeText prints file:line:col: severity code: message, the source line and a caret under the
// span; with opt.passes, file:line:col: pass: and what each expectation that holds compared.
func writeText(w io.Writer, f *fileResult, opt textOptions) {
	li := newLineIndex(f.src)
	for _, d := range f.diags {
		if opt.quiet && d.Severity == model.Info {
			continue
		}
		p := li.pos(d.Span.Start)
		fmt.Fprintf(w, "%s:%d:%d: %s %s: %s\n", f.path, p.Line, p.Column, d.Severity, d.Code, d.Message)
		text := li.lineText(p.Line)
		fmt.Fprintf(w, "    %s\n", strings.ReplaceAll(text, "\t", " "))
		end := li.pos(d.Span.End)
		width := 1
		if end.Line == p.Line && end.Column > p.Column {
			width = end.Column - p.Column
		}
		fmt.Fprintf(w, "    %s%s\n", strings.Repeat(" ", p.Column-1), strings.Repeat("^", width))
		for _, r := range d.Related {
			rp := li.pos(r.Span.Start)
			fmt.Fprintf(w, "    %s:%d:%d: %s\n", f.path, rp.Line, rp.Column, r.Message)
		}
	}
	if opt.passes {
		for _, ps := range f.passes {
			p := li.pos(ps.span.Start)
			fmt.Fprintf(w, "%s:%d:%d: pass: %s\n", f.path, p.Line, p.Column, ps.text)
		}
	}
}

type jsonRelated struct {
	Message string    `json:"message"`
	Range   jsonRange `json:"range"`
}

type jsonDiag struct {
	Severity string        `json:"severity"`
	Code     string        `json:"code"`
	Message  string        `json:"message"`
	Range    jsonRange     `json:"range"`
	Related  []jsonRelated `json:"related,omitempty"`
	Case     string        `json:"case,omitempty"` // the case it belongs to (see jsonCase)
}

type jsonFile struct {
	Path string `json:"path"`
	// Ambient is the temperature of the surroundings, K, at which heat losses leave (the file's
	// ambient setting, 298.15 K by default); null when the file could not be read into a model.
	Ambient     jsonNum      `json:"ambient"`
	Diagnostics []jsonDiag   `json:"diagnostics"`
	Streams     []jsonStream `json:"streams"`
	Units       []jsonUnit   `json:"units"`
	// Reconciliation is the reconciliation of the file's measurements; null when the file
	// could not be solved.
	Reconciliation *jsonRecon `json:"reconciliation"`
	// Totals are null when the file could not be read into a model.
	Totals       *jsonTotals  `json:"totals"`
	Expectations []jsonExpect `json:"expectations"`
	Cases        []jsonCase   `json:"cases"`
	Sweeps       []jsonSweep  `json:"sweeps"`
}

func toJSONFile(f *fileResult) jsonFile {
	li := newLineIndex(f.src)
	jf := jsonFile{Path: f.path, Ambient: nan, Diagnostics: []jsonDiag{}, Streams: f.streams, Units: f.units, Totals: f.totals, Expectations: f.expects, Reconciliation: f.recon}
	if jf.Expectations == nil {
		jf.Expectations = []jsonExpect{}
	}
	if f.ambient > 0 {
		jf.Ambient = jsonNum(f.ambient)
	}
	if jf.Streams == nil {
		jf.Streams = []jsonStream{}
	}
	if jf.Units == nil {
		jf.Units = []jsonUnit{}
	}
	for _, d := range f.diags {
		if d.Case == "" { // a case's findings are listed with the case
			jf.Diagnostics = append(jf.Diagnostics, li.diag(d))
		}
	}
	jf.Cases, jf.Sweeps = []jsonCase{}, f.sweeps
	if jf.Sweeps == nil {
		jf.Sweeps = []jsonSweep{}
	}
	for _, c := range f.cases {
		c.Diagnostics = []jsonDiag{}
		for _, d := range c.diags {
			c.Diagnostics = append(c.Diagnostics, li.diag(d))
		}
		jf.Cases = append(jf.Cases, c)
	}
	return jf
}

func (li *lineIndex) diag(d model.Diagnostic) jsonDiag {
	jd := jsonDiag{Severity: d.Severity.String(), Code: d.Code, Message: d.Message, Range: li.rng(d.Span), Case: d.Case}
	for _, r := range d.Related {
		jd.Related = append(jd.Related, jsonRelated{Message: r.Message, Range: li.rng(r.Span)})
	}
	return jd
}

func writeJSON(w io.Writer, files []*fileResult) error {
	out := struct {
		Files []jsonFile `json:"files"`
	}{Files: []jsonFile{}}
	for _, f := range files {
		out.Files = append(out.Files, toJSONFile(f))
	}
	return encodeIndent(w, out)
}

func encodeIndent(w io.Writer, v any) error {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return err
	}
	_, err := w.Write(buf.Bytes())
	return err
}
