package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

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

// lineIndex maps byte offsets of one file to positions.
type lineIndex struct {
	src   []byte
	start []int // byte offset of each line start
}

func newLineIndex(src []byte) *lineIndex {
	li := &lineIndex{src: src, start: []int{0}}
	for i, c := range src {
		if c == '\n' {
			li.start = append(li.start, i+1)
		}
	}
	return li
}

func (li *lineIndex) pos(off int) position {
	off = max(0, min(off, len(li.src)))
	line := sortSearch(li.start, off)
	col := utf8.RuneCount(li.src[li.start[line]:off]) + 1
	return position{Line: line + 1, Column: col}
}

// sortSearch returns the index of the last line start <= off.
func sortSearch(starts []int, off int) int {
	lo, hi := 0, len(starts)
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if starts[mid] <= off {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

func (li *lineIndex) lineText(line int) string {
	s := li.start[line-1]
	e := len(li.src)
	if line < len(li.start) {
		e = li.start[line] - 1
	}
	return strings.TrimRight(string(li.src[s:e]), "\r")
}

func (li *lineIndex) rng(sp model.Span) jsonRange {
	return jsonRange{Start: li.pos(sp.Start), End: li.pos(sp.End)}
}

// writeText prints file:line:col: severity code: message, the source line and a caret under the span.
func writeText(w io.Writer, f *fileResult) {
	li := newLineIndex(f.src)
	for _, d := range f.diags {
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
}

type jsonFile struct {
	Path        string       `json:"path"`
	Diagnostics []jsonDiag   `json:"diagnostics"`
	Streams     []jsonStream `json:"streams"`
	Units       []jsonUnit   `json:"units"`
}

func toJSONFile(f *fileResult) jsonFile {
	li := newLineIndex(f.src)
	jf := jsonFile{Path: f.path, Diagnostics: []jsonDiag{}, Streams: f.streams, Units: f.units}
	if jf.Streams == nil {
		jf.Streams = []jsonStream{}
	}
	if jf.Units == nil {
		jf.Units = []jsonUnit{}
	}
	for _, d := range f.diags {
		jd := jsonDiag{Severity: d.Severity.String(), Code: d.Code, Message: d.Message, Range: li.rng(d.Span)}
		for _, r := range d.Related {
			jd.Related = append(jd.Related, jsonRelated{Message: r.Message, Range: li.rng(r.Span)})
		}
		jf.Diagnostics = append(jf.Diagnostics, jd)
	}
	return jf
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
