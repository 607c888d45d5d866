package reconcile

import (
	"context"
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"

	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Result is the reconciliation of a model's measurements and the uncertainty of every solved
// value. Every uncertainty is a 95 % half-width (1.96 standard deviations), in SI base units.
type Result struct {
	// Redundancy is the number of measurements beyond those needed to fix every measured or
	// solved value: the degrees of freedom of the global test.
	Redundancy int
	Chi2       float64 // sum of the squared normalised corrections, (reconciled - measured)/σ
	Chi2Limit  float64 // 95 % quantile of chi-square with Redundancy degrees of freedom; NaN when 0
	Passed     bool    // Chi2 <= Chi2Limit (true when nothing can be tested)
	// Reconciled is false when the measurements could not be reconciled (an error says why);
	// the values are then the solver's and the uncertainties unknown.
	Reconciled   bool
	Measurements []Measurement // in the order of the file
	// The 95 % half-widths of every result (see U): by stream in the order of
	// model.StreamResults, by unit in the order of its kind's Results.
	streamU, unitU [][]float64
	m              *model.Model
}

// Measurement is one given written with a ±.
type Measurement struct {
	Name     string // the stream or unit, as written in the file
	Property string // as written in the file: "flow", "p", "T", "duty", "power", ...
	Stream   int    // index into Model.Streams, or -1
	Unit     int    // index into Model.Units, or -1
	Given    *model.Given
	Dim      units.Dim
	// Measured and Reconciled are the value as read and as reconciled; UMeasured and
	// UReconciled their 95 % half-widths, SI.
	Measured, Reconciled   float64
	UMeasured, UReconciled float64
	// Test is the normalised correction |reconciled - measured| / sqrt(Var(correction)), to be
	// compared with 1.96; NaN when no balance checks the measurement.
	Test float64
	// Share is the measurement's own redundancy, Var(correction)/σ², 0..1: 0 when no balance
	// checks it, 1 when the balances alone fix its value. The shares add up to Redundancy.
	Share   float64
	Suspect bool // Test above 1.96
	Checked bool // some balance checks it (Share above zero)
}

// Coverage is the factor from a standard deviation to a 95 % half-width.
const Coverage = model.Coverage95

// Solve solves m as solve.Solve does, reconciling its measurements on the way: the solver's
// balances, stream states, duties, closures and expectations are all read from the reconciled
// values. The Result adds the measurements' statistics and every value's uncertainty.
func Solve(ctx context.Context, m *model.Model, opt solve.Options) (*solve.Result, *Result) {
	r := &run{m: m, out: &Result{Chi2Limit: math.NaN(), Passed: true, Reconciled: true}}
	opt.Adjust = r.adjust
	res := solve.Solve(ctx, m, opt)
	r.propagate(res)
	return res, r.out
}

// Of returns the reconciliation a solve through Solve carried out, or nil (a result of
// solve.Solve without it, or nil).
func Of(res *solve.Result) *Result {
	if res == nil {
		return nil
	}
	r, _ := res.Adjusted.(*Result)
	return r
}

// Find returns the measurement of a stream property or unit parameter by the names written in
// the file ("B2", "flow"), or nil.
func (r *Result) Find(name, property string) *Measurement {
	if r == nil {
		return nil
	}
	for i := range r.Measurements {
		if ms := &r.Measurements[i]; ms.Name == name && ms.Property == property {
			return ms
		}
	}
	return nil
}

// At returns the measurement whose given spans byte offset off, or nil.
func (r *Result) At(off int) *Measurement {
	if r == nil {
		return nil
	}
	for i := range r.Measurements {
		if sp := r.Measurements[i].Given.Span; sp.Start <= off && off < sp.End {
			return &r.Measurements[i]
		}
	}
	return nil
}

// run is one reconciliation: the hook the solver calls, then the propagation to every value.
type run struct {
	m    *model.Model
	out  *Result
	sys  *solve.System
	disp units.Display
	// cols maps an unknown to its row of lx, -1 when not solved; lx is the covariance factor of
	// the solved unknowns (Cov(x) = lx lxᵀ, SI), nil when no measurement moves them.
	cols []int
	lx   *mat.Dense
	x    []float64 // the solver's values, reconciled in place
	done bool      // the hook ran
}

// Limits of the iteration. A reconciliation converges when the change of every normalised
// correction is below stepTol (a ten-millionth of a standard deviation) and every equation holds
// to resTol relative to its scale (the solver's own convergence test).
const (
	maxIter = 50
	stepTol = 1e-7
	resTol  = 1e-9
	// condMax is the condition number of the scaled matched Jacobian above which the solved
	// values are taken as not fixed by the equations (singular).
	condMax = 1e13
)

// measEq is a measurement equation during the iteration.
type measEq struct {
	eq    int
	g     *model.Given
	sigma float64
	row   int // row in the matched Jacobian, or -1 when left over
	corr  float64
}

// adjust is solve.Options.Adjust: it reconciles the measurements among the solved equations.
func (r *run) adjust(ctx context.Context, a *solve.Adjustment) {
	r.done = true
	a.Product = r.out
	r.sys = a.System
	r.x = a.X
	r.disp = units.Display{System: a.Model.Display, Atm: a.Model.Atm}
	valid := r.validate(a)
	sys := a.System
	n := len(sys.Vars)
	ready := func(e int) bool {
		for _, v := range sys.Eqs[e].Vars {
			if !a.Solved[v] || math.IsNaN(a.X[v]) || math.IsInf(a.X[v], 0) {
				return false
			}
		}
		return true
	}
	r.cols = make([]int, n)
	for v := range r.cols {
		r.cols[v] = -1
	}
	var matched, left []int
	for e := range sys.Eqs {
		if !ready(e) {
			continue
		}
		if v := a.Matched[e]; v >= 0 {
			r.cols[v] = len(matched)
			matched = append(matched, e)
		} else {
			left = append(left, e)
		}
	}
	var ms []*measEq
	var cons []int // leftover equations that are not measurements
	for i, e := range matched {
		if g := sys.Eqs[e].Given; sys.Eqs[e].Kind == solve.EqGiven && valid[g] {
			ms = append(ms, &measEq{eq: e, g: g, sigma: g.Sigma(), row: i})
		}
	}
	d := len(ms)
	for _, e := range left {
		if g := sys.Eqs[e].Given; sys.Eqs[e].Kind == solve.EqGiven && valid[g] {
			ms = append(ms, &measEq{eq: e, g: g, sigma: g.Sigma(), row: -1})
		} else {
			cons = append(cons, e)
		}
	}
	if len(ms) == 0 || len(matched) == 0 {
		return
	}
	pos := make(map[int]bool, len(matched))
	for _, e := range matched {
		pos[e] = true
	}
	var blocks [][]int
	for _, blk := range a.Blocks {
		all := true
		for _, e := range blk {
			all = all && pos[e]
		}
		if all {
			blocks = append(blocks, blk)
		}
	}
	it := &iteration{r: r, a: a, matched: matched, blocks: blocks, ms: ms, d: d, cons: cons}
	if !it.run(ctx) {
		r.out.Reconciled, r.out.Passed = false, false
		r.lx = nil
		copy(a.X, it.x0)
		r.measurements(it, false)
		return
	}
	for _, k := range it.judged {
		a.Judged[k] = true
	}
	for _, m := range ms[d:] {
		a.Judged[m.eq] = true
	}
	r.measurements(it, true)
	r.verdict(it, a)
	// Cov(x) = xs Cov(v_M) xsᵀ with xs the change of x per unit of each matched measurement's
	// normalised value and Cov(v_M) = q2_M q2_Mᵀ, the matched rows of q2.
	if q2 := it.st.q2; q2 != nil && it.d > 0 {
		n := len(matched)
		_, q := q2.Dims()
		xs := mat.NewDense(n, 1+it.d, it.y).Slice(0, n, 1, 1+it.d)
		r.lx = mat.NewDense(n, q, nil)
		r.lx.Mul(xs, q2.Slice(0, it.d, 0, q))
	}
}

// validate reports measurements no meter can take and ± that are not above zero; it returns the
// givens that are measurements the reconciliation uses.
func (r *run) validate(a *solve.Adjustment) map[*model.Given]bool {
	valid := map[*model.Given]bool{}
	check := func(g *model.Given, name, prop string, ok bool) {
		if g == nil || !g.Measured {
			return
		}
		switch {
		case !ok:
			r.diag(a, model.Error, CodeNotMeasurable, g.Span, notMeasurable(name, prop))
		case !(g.Tol > 0) || math.IsInf(g.Tol, 0):
			r.diag(a, model.Error, CodeZeroUncertainty, g.Span, name+" "+prop+": a ± of zero is no measurement uncertainty; state the meter's 95 % uncertainty, or leave the ± out for an exact value")
		default:
			valid[g] = true
		}
	}
	for _, s := range a.Model.Streams {
		for p, g := range s.Given {
			check(g, s.Name, model.Prop(p).String(), streamMeasurable(model.Prop(p)))
		}
	}
	for _, u := range a.Model.Units {
		names := make([]string, 0, len(u.Params))
		for name := range u.Params {
			names = append(names, name)
		}
		slices.Sort(names)
		for _, name := range names {
			check(u.Params[name], u.Name, name, paramMeasurable(name))
		}
	}
	return valid
}

// streamMeasurable says which stream properties a meter reads: flow, pressure and temperature.
// Enthalpy, entropy and quality are computed from readings, never read.
func streamMeasurable(p model.Prop) bool { return p == model.Flow || p == model.P || p == model.T }

// paramMeasurable says which unit parameters a meter reads: a heat meter's duty, a wattmeter's
// power, a fuel meter's heat input, a differential-pressure transmitter's drop. An efficiency is
// a ratio of measured values and a heat loss an allowance; neither has a meter.
func paramMeasurable(name string) bool {
	switch name {
	case "duty", "power", "fuel", "dp", "dp_hot", "dp_cold":
		return true
	}
	return false
}

func notMeasurable(name, prop string) string {
	why := "no meter reads it"
	switch prop {
	case "h", "s":
		why = "no meter reads it: it is computed from measured pressure and temperature"
	case "x":
		why = "no meter reads a steam quality: it follows from the balances"
	case "efficiency":
		why = "an efficiency is a ratio of measured values, not a reading: hmb works out its uncertainty from the measurements"
	case "heat_loss":
		why = "a heat loss is an allowance, not a reading"
	}
	return name + " " + prop + " has a ±, which marks a measurement, but " + why + "; state it without ±"
}

func (r *run) diag(a *solve.Adjustment, sev model.Severity, code string, span model.Span, msg string, rel ...model.Related) {
	a.Diags = append(a.Diags, model.Diagnostic{Span: span, Severity: sev, Code: code, Message: msg, Related: rel})
}
