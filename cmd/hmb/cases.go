package main

import (
	"context"
	"flag"
	"fmt"
	"slices"
	"strings"

	"hmb/thermo/cases"
	"hmb/thermo/model"
	"hmb/thermo/report"
	"hmb/thermo/solve"
)

// resultList is a repeatable option naming results: --result "MS T" --result "T1 power".
type resultList []string

func (r *resultList) String() string { return strings.Join(*r, ", ") }

func (r *resultList) Set(s string) error {
	*r = append(*r, s)
	return nil
}

// caseFlags are the --case and --sweep options of the commands that show results.
type caseFlags struct {
	kase, sweep *string
	results     *resultList
}

func addCaseFlags(fset *flag.FlagSet, plot bool) caseFlags {
	f := caseFlags{
		kase:    fset.String("case", "", "show this case of the file instead of its base"),
		sweep:   fset.String("sweep", "", "show this sweep of the file: its results against the swept value"),
		results: &resultList{},
	}
	what := "a result of the sweep to tabulate, as NAME RESULT (\"MS T\"); repeat for more (default: the sweep's show list)"
	if plot {
		what = "a result of the sweep to draw, as NAME RESULT (\"MS T\"); repeat for more (default: the sweep's show list)"
	}
	fset.Var(f.results, "result", what)
	return f
}

// check refuses options that do not go together.
func (f caseFlags) check() error {
	if *f.kase != "" && *f.sweep != "" {
		return usageErr("--case and --sweep exclude each other (a sweep names its case in the file)")
	}
	if len(*f.results) > 0 && *f.sweep == "" {
		return usageErr("--result picks results of a sweep: give --sweep NAME")
	}
	return nil
}

// caseInput is the report input of one case of a checked file: the case's model, solution and
// findings, titled with the case.
func caseInput(in *report.Input, name string) (*report.Input, error) {
	for _, c := range in.Cases {
		if c.Case.Name != name {
			continue
		}
		m := *c.Model
		m.Title = report.Title(in.Model, in.Path) + ": case " + name
		if c.Case.Label != "" {
			m.Title += " (" + c.Case.Label + ")"
		}
		diags := cases.Within(in.Diags, c.Case.Decl)
		diags = append(diags, c.Diags...)
		if c.Case.Broken {
			return nil, &exitError{code: 1, msg: fmt.Sprintf("case %s has errors and was not solved (hmb check lists them)", name)}
		}
		return &report.Input{Path: in.Path, Src: in.Src, Model: &m, Result: c.Res, Diags: diags, Where: in.Where}, nil
	}
	return nil, usageErr("no case %s in %s (%s)", name, in.Path, cases.Names(in.Model))
}

// sweepOf solves the sweep name of a checked file, recording the results named (none: the
// sweep's show list, or every result).
func sweepOf(in *report.Input, name string, results []string) (*cases.SweepResult, error) {
	sw := cases.FindSweep(in.Model, name)
	if sw == nil {
		var names []string
		for _, s := range in.Model.Sweeps {
			names = append(names, s.Name)
		}
		list := "the file declares none without errors"
		if len(names) > 0 {
			list = "sweeps: " + strings.Join(names, ", ")
		}
		return nil, usageErr("no sweep %s in %s (%s)", name, in.Path, list)
	}
	var refs []model.Ref
	for _, r := range results {
		ref, err := cases.ParseRef(in.Model, r)
		if err != nil {
			return nil, usageErr("--result %v", err)
		}
		refs = append(refs, ref)
	}
	return cases.Sweep(context.Background(), in.Model, sw, refs, solve.Options{}), nil
}

// sweepsOf solves every sweep of a checked file, for hmb check and the report.
func sweepsOf(ctx context.Context, m *model.Model) []*cases.SweepResult {
	var out []*cases.SweepResult
	for _, sw := range m.Sweeps {
		out = append(out, cases.Sweep(ctx, m, sw, nil, solve.Options{}))
	}
	return out
}

// jsonCase is one case of a file, with the same fields as the base (SI base units).
type jsonCase struct {
	Name         string       `json:"name"`
	Label        string       `json:"label"`
	Streams      []jsonStream `json:"streams"`
	Units        []jsonUnit   `json:"units"`
	Totals       *jsonTotals  `json:"totals"`
	Expectations []jsonExpect `json:"expectations"`
	// Diagnostics are the case's own: the notation's findings in its block, then the solver's,
	// each with "case" set and its message starting "case NAME: ".
	Diagnostics []jsonDiag `json:"diagnostics"`
	diags       []model.Diagnostic
}

// jsonSweep is one sweep of a file: the recorded results at every point, SI base units.
type jsonSweep struct {
	Name  string `json:"name"`
	Label string `json:"label"`
	Case  string `json:"case,omitempty"` // the case it varies; "" for the base
	// Vary names the value swept ("FW flow"); Results the values recorded at each point.
	Vary    string      `json:"vary"`
	Results []string    `json:"results"`
	Points  []jsonPoint `json:"points"`
}

type jsonPoint struct {
	Value  jsonNum   `json:"value"`
	Values []jsonNum `json:"values"` // in the order of Results; null where not solved
	Failed bool      `json:"failed"`
	Code   string    `json:"code,omitempty"`   // the first error of a point that failed
	Reason string    `json:"reason,omitempty"` // its message
}

// checkCases adds a file's cases and sweeps to what hmb check reports: each case's streams,
// units, totals, expectations and findings, every sweep point, and the sweeps' findings.
func checkCases(fr *fileResult, c *checked) {
	m := c.model
	for _, k := range c.cases {
		jc := jsonCase{Name: k.Case.Name, Label: k.Case.Label, Streams: []jsonStream{}, Units: []jsonUnit{}, Expectations: []jsonExpect{}}
		jc.diags = cases.Mark(cases.Within(c.lang.Diags, k.Case.Decl), k.Case.Name)
		if k.Res != nil {
			p := solvedJSON(k.Model, k.Res, k.Rec)
			jc.Streams, jc.Units, jc.Totals, jc.Expectations = p.streams, p.units, p.totals, p.expects
			jc.diags = append(jc.diags, k.Diags...)
		}
		fr.cases = append(fr.cases, jc)
	}
	for _, r := range sweepsOf(context.Background(), m) {
		fr.diags = append(fr.diags, r.Diags...)
		js := jsonSweep{Name: r.Sweep.Name, Label: r.Sweep.Label, Results: []string{}, Points: []jsonPoint{}}
		js.Vary, _ = r.Axis()
		if r.Sweep.Case >= 0 {
			js.Case = m.Cases[r.Sweep.Case].Name
		}
		for _, ref := range r.Refs {
			js.Results = append(js.Results, cases.RefName(r.Model, ref))
		}
		for _, p := range r.Points {
			jp := jsonPoint{Value: jsonNum(p.Value), Values: make([]jsonNum, len(p.Values)), Failed: p.Failed, Code: p.Code, Reason: p.Reason}
			for i, v := range p.Values {
				jp.Values[i] = jsonNum(v)
			}
			js.Points = append(js.Points, jp)
		}
		fr.sweeps = append(fr.sweeps, js)
	}
	slices.SortStableFunc(fr.diags, func(a, b model.Diagnostic) int { return a.Span.Start - b.Span.Start })
	if t := report.CaseTable(m, c.res, c.cases); len(c.cases) > 0 {
		fr.table += "\n  cases side by side (the quantities that differ)\n" + alignRows(tableRows(t))
	}
}
