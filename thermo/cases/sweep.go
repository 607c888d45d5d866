package cases

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"strings"
	"sync"

	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Point is one point of a sweep.
type Point struct {
	Value  float64   // the swept value, SI
	Values []float64 // the results recorded at this point, SI (NaN where not solved), in the order of SweepResult.Refs
	Failed bool      // the point has errors: its values, where shown, are not to be trusted
	Code   string    // the first error's code
	Reason string    // the first error's message
	Errors int       // how many errors the point has
}

// SweepResult is a sweep, solved point by point.
type SweepResult struct {
	Sweep  *model.Sweep
	Model  *model.Model // the model the sweep varies: the base, or the base with the sweep's case applied
	Refs   []model.Ref  // the results recorded at every point
	Points []Point
	// Diags are the sweep's own findings: the points that failed (HMB801), or why the sweep
	// was not run (HMB802).
	Diags []model.Diagnostic
	Work  solve.Work // summed over the points
	mu    sync.Mutex
}

// MaxValues bounds the results a sweep keeps (points times results): a sweep of every result of
// a large plant over thousands of points would hold gigabytes.
const MaxValues = 16 << 20

// Sweep solves m at every point of sw, each from the previous point's solution. refs are the
// results to record; nil: the sweep's show list, or, when it has none, every result of every
// stream and unit. A point that fails is recorded with its reason and the sweep goes on, from
// the last point that solved. Expectations are not checked at the points.
func Sweep(ctx context.Context, m *model.Model, sw *model.Sweep, refs []model.Ref, opt solve.Options) *SweepResult {
	base := m
	if sw.Case >= 0 && sw.Case < len(m.Cases) {
		c := m.Cases[sw.Case]
		if c.Broken {
			return &SweepResult{Sweep: sw, Model: m, Diags: []model.Diagnostic{warnf(CodeSweepNotRun, sw.Span,
				"sweep %s was not run: its case %s has errors", sw.Name, c.Name)}}
		}
		base = m.WithCase(c)
	}
	base = base.With()
	base.Expects = nil
	if refs == nil {
		refs = sw.Show
	}
	if len(refs) == 0 {
		refs = AllRefs(base)
	}
	out := &SweepResult{Sweep: sw, Model: base, Refs: refs}
	if sw.N*len(refs) > MaxValues {
		out.Diags = append(out.Diags, warnf(CodeSweepNotRun, sw.Span,
			"sweep %s was not run: %d points of %d results each are more than it keeps; name the results it shows (show NAME RESULT, ...)",
			sw.Name, sw.N, len(refs)))
		return out
	}
	out.Points = make([]Point, sw.N)
	vals := make([]float64, sw.N*len(refs))
	for i := range out.Points {
		out.Points[i].Value = sw.Value(i)
		out.Points[i].Values = vals[i*len(refs) : (i+1)*len(refs) : (i+1)*len(refs)]
	}
	// The points are cut into runs, one per processor, each run solved in order from its own
	// previous point: a run's first point starts from the neighbours' values alone.
	runs := min(runtime.GOMAXPROCS(0), (sw.N+minRun-1)/minRun)
	work := make([]solve.Work, runs)
	measured := hasMeasurements(base)
	var wg sync.WaitGroup
	for k := range runs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer func() {
				if p := recover(); p != nil { // a bug must cost the sweep, not the process
					out.mu.Lock()
					out.Diags = append(out.Diags, internal(sw.Span, p))
					out.mu.Unlock()
				}
			}()
			work[k] = out.solveRun(ctx, base, opt, measured, k*sw.N/runs, (k+1)*sw.N/runs)
		}()
	}
	wg.Wait()
	for _, w := range work {
		out.Work.Structure += w.Structure
		out.Work.Evals += w.Evals
	}
	if d, ok := out.failures(); ok {
		out.Diags = append(out.Diags, d)
	}
	return out
}

// minRun is the fewest points a run of a sweep takes: below it, warm starts gain more than a
// second processor does.
const minRun = 16

// solveRun solves the points [lo, hi) in order, each from the last that solved.
func (r *SweepResult) solveRun(ctx context.Context, base *model.Model, opt solve.Options, measured bool, lo, hi int) solve.Work {
	var w solve.Work
	var prev *solve.Result
	for i := lo; i < hi; i++ {
		p := &r.Points[i]
		if ctx.Err() != nil {
			p.Failed, p.Code, p.Reason = true, solve.CodeTimeout, "not solved: the sweep was stopped"
			for k := range p.Values {
				p.Values[k] = math.NaN()
			}
			continue
		}
		pm := base.With(r.Sweep.Point(p.Value))
		o := opt
		o.Start = prev
		var res *solve.Result
		if measured {
			res, _ = reconcile.Solve(ctx, pm, o)
		} else {
			res = solve.Solve(ctx, pm, o) // the same answer, without propagating zero uncertainties
		}
		w.Structure += res.Work.Structure
		w.Evals += res.Work.Evals
		for k, ref := range r.Refs {
			p.Values[k], _, _ = res.Value(pm, ref.Subject, ref.Name)
		}
		for _, d := range res.Diags {
			if d.Severity != model.Error {
				continue
			}
			if p.Errors == 0 {
				p.Code, p.Reason = d.Code, d.Message
			}
			p.Errors++
		}
		p.Failed = p.Errors > 0
		if !p.Failed {
			prev = res
		}
	}
	return w
}

// failures words the points that failed as one warning at the sweep: how many, the first with
// its reason, and the values of the others.
func (r *SweepResult) failures() (model.Diagnostic, bool) {
	var failed []int
	for i, p := range r.Points {
		if p.Failed {
			failed = append(failed, i)
		}
	}
	if len(failed) == 0 {
		return model.Diagnostic{}, false
	}
	sw := r.Sweep
	first := r.Points[failed[0]]
	msg := fmt.Sprintf("sweep %s: %d of %d points did not solve; at %s: %s (%s)", sw.Name, len(failed), len(r.Points),
		r.Show(first.Value), first.Reason, first.Code)
	if len(failed) > 1 {
		var more []string
		for _, i := range failed[1:min(len(failed), 6)] {
			more = append(more, r.Number(r.Points[i].Value))
		}
		if len(failed) > 6 {
			more[len(more)-1] += fmt.Sprintf(" and %d more points", len(failed)-6)
		}
		_, u := r.Axis()
		msg += "; also at " + strings.Join(more, ", ") + " " + u.Symbol()
	}
	return warnf(CodePointFailed, sw.Span, "%s", msg), true
}

// Axis is the swept value's name ("FW flow") and the unit it is shown in: the unit the file
// wrote its range in, or the display unit of its dimension.
func (r *SweepResult) Axis() (name string, u units.Unit) {
	sw := r.Sweep
	name = sw.Vary.Param
	switch {
	case sw.Vary.Stream >= 0 && sw.Vary.Stream < len(r.Model.Streams):
		name = r.Model.Streams[sw.Vary.Stream].Name + " " + sw.Vary.Prop.String()
	case sw.Vary.Unit >= 0 && sw.Vary.Unit < len(r.Model.Units):
		name = r.Model.Units[sw.Vary.Unit].Name + " " + sw.Vary.Param
	}
	if g := sw.Vary.Given; g != nil {
		if wu, err := units.Lookup(g.Unit); err == nil && wu.Measures(sw.Dim) && wu.Level() {
			return name, wu
		}
	}
	return name, r.Model.Display.Default(sw.Dim)
}

// Show writes a swept value with its unit, Number without.
func (r *SweepResult) Show(v float64) string {
	_, u := r.Axis()
	return units.ShowIn(u, v, r.atm())
}

func (r *SweepResult) Number(v float64) string {
	_, u := r.Axis()
	return units.Number(u, u.FromSI(v, r.atm()))
}

func (r *SweepResult) atm() float64 {
	if r.Model.Atm > 0 {
		return r.Model.Atm
	}
	return units.StandardAtmosphere
}

// AllRefs lists every result of every stream and unit of m.
func AllRefs(m *model.Model) []model.Ref {
	var out []model.Ref
	for i, s := range m.Streams {
		if s == nil {
			continue
		}
		for _, r := range model.StreamResults {
			out = append(out, model.Ref{Subject: model.Subject{Kind: model.StreamSubject, Index: i}, Name: r.Name})
		}
	}
	for i, u := range m.Units {
		if u == nil || u.Kind == nil {
			continue
		}
		for _, r := range u.Kind.Results {
			out = append(out, model.Ref{Subject: model.Subject{Kind: model.UnitSubject, Index: i}, Name: r.Name})
		}
	}
	return out
}

// RefName names a result as a file writes it: "MS T", "T1 power".
func RefName(m *model.Model, r model.Ref) string {
	switch r.Subject.Kind {
	case model.StreamSubject:
		if r.Subject.Index < len(m.Streams) {
			return m.Streams[r.Subject.Index].Name + " " + r.Name
		}
	case model.UnitSubject:
		if r.Subject.Index < len(m.Units) {
			return m.Units[r.Subject.Index].Name + " " + r.Name
		}
	}
	return r.Name
}

// ParseRef reads "NAME RESULT" (or "NAME.RESULT") as a result of m, for the command line.
func ParseRef(m *model.Model, s string) (model.Ref, error) {
	f := strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == '.' || r == '\t' })
	if len(f) != 2 {
		return model.Ref{}, fmt.Errorf("%q: name a result as NAME RESULT, such as \"MS T\"", s)
	}
	for i, st := range m.Streams {
		if st != nil && st.Name == f[0] {
			sub := model.Subject{Kind: model.StreamSubject, Index: i}
			if m.Result(sub, f[1]) == nil {
				return model.Ref{}, fmt.Errorf("%q: a stream has no result %s", s, f[1])
			}
			return model.Ref{Subject: sub, Name: f[1]}, nil
		}
	}
	for i, u := range m.Units {
		if u != nil && u.Name == f[0] {
			sub := model.Subject{Kind: model.UnitSubject, Index: i}
			if m.Result(sub, f[1]) == nil {
				return model.Ref{}, fmt.Errorf("%q: %s has no result %s", s, u.Name, f[1])
			}
			return model.Ref{Subject: sub, Name: f[1]}, nil
		}
	}
	return model.Ref{}, fmt.Errorf("%q: no stream or unit is named %s", s, f[0])
}

// FindSweep returns the sweep of m named name, or nil.
func FindSweep(m *model.Model, name string) *model.Sweep {
	for _, s := range m.Sweeps {
		if s.Name == name {
			return s
		}
	}
	return nil
}

func warnf(code string, sp model.Span, format string, args ...any) model.Diagnostic {
	d := errorf(code, sp, format, args...)
	d.Severity = model.Warning
	return d
}

// hasMeasurements reports whether any given of m is a measurement (written with a ±).
func hasMeasurements(m *model.Model) bool {
	for _, s := range m.Streams {
		if s == nil {
			continue
		}
		for _, g := range s.Given {
			if g != nil && g.Measured {
				return true
			}
		}
	}
	for _, u := range m.Units {
		if u == nil {
			continue
		}
		for _, g := range u.Params {
			if g != nil && g.Measured {
				return true
			}
		}
	}
	return false
}
