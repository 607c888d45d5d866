package solve

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
	"time"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Options bound the work of Solve.
type Options struct {
	MaxIter int           // Newton iterations per block; 0 means 50
	Timeout time.Duration // wall-clock limit of the whole solve; 0 means 5 s
	// Adjust, when set, runs after the balances are solved and before results are read from
	// them (see Adjustment): the reconciliation of measurements hooks in here.
	Adjust Adjust
	// Start, when set, is the solution of a model of the same streams and units (a sweep's
	// previous point): a block of equations its first guesses do not satisfy starts from
	// Start's values instead when they satisfy it better.
	Start *Result
}

// ProvKind says where a solved value came from.
type ProvKind uint8

const (
	ProvNone     ProvKind = iota // not solved
	ProvGiven                    // stated in the file
	ProvEquation                 // fixed by an equation of a unit (or by a given of another property)
	ProvDerived                  // computed by IAPWS-IF97 from the stream's p and h
)

// Provenance tells, for hover, which given or which equation produced a value.
type Provenance struct {
	Kind  ProvKind
	Label string     // "given S3 T", "energy balance of mixer DA", "IAPWS-IF97 from p and h"
	Span  model.Span // the given, or the unit whose equation it is
	Unit  int        // index into Model.Units, or -1
}

// StreamResult is the solved state of one stream.
type StreamResult struct {
	Solved bool       // flow and state both found
	State  if97.State // valid when HasState
	// HasState is set when p and h were found, even if the flow was not.
	HasState bool
	M        float64 // mass flow, kg/s; NaN when not solved
	Source   [model.NumProps]Provenance
}

// UnitResult holds a unit's duties and balances. Fields that do not apply, or could not be
// computed, are NaN.
type UnitResult struct {
	Q float64 // duty in the kind's own sense: heat added (heater, boiler), removed (cooler), passed hot to cold (exchanger), W
	W float64 // shaft power: produced by a turbine, absorbed by a pump, W
	// Sgen is the entropy generation, W/K: sum (m s) out - sum (m s) in - sum Q/T over the heat
	// Q crossing into the fluid at temperature T (each unit's file states its boundary). Heat
	// losses leave at the ambient temperature (Result.Ambient); a duty crosses at the unit's
	// T_boundary when the file gives one (TBoundary). Without it, SgenFluidOnly is set.
	Sgen float64
	// SgenFluidOnly is set when a duty crosses the unit's boundary (heater, cooler, boiler) and
	// the file gives no T_boundary: Sgen then counts only what happens inside the fluid (its
	// pressure drop), the heat taken as crossing at the fluid's own temperature, so a cooler
	// condensing steam without a pressure drop shows zero. Tables, hover and reports say so.
	SgenFluidOnly bool
	// TBoundary is the temperature, K, at which the unit's duty crosses its boundary (the flue
	// gas of a boiler, the cooling water of a cooler), as given by T_boundary; NaN when none.
	TBoundary  float64
	Efficiency float64 // isentropic (turbine, pump) or boiler efficiency
	Fuel       float64 // boiler fuel heat input, W
	// Flows through the unit: mass in kg/s; energy in W (sum of m h plus heat and work crossing
	// the boundary on that side).
	MassIn, MassOut, EnergyIn, EnergyOut float64
	// Relative closure of a balance that was redundant (every term fixed without it); NaN when
	// the balance was used to solve. Mass: |in - out| / max(|in|, |out|). Energy: |in - out|
	// over the largest term that does not depend on the enthalpy datum (the duty or power, or
	// the largest enthalpy change across the unit; see energyBalance), so that it reads the same
	// whatever h = 0 is taken to be.
	MassClosure, EnergyClosure float64
	// Exchangers only (NaN, "" and nil for other kinds): the temperature profile along the
	// unit, split into zones where a side changes phase (see exchanger.go).
	//
	// DTMin is the least hot-minus-cold temperature difference anywhere along the profile, K
	// (below zero: a temperature cross); DTMinAt says in words where it lies ("at the hot inlet
	// end", "where the hot side HS1 starts condensing"). LMTD is the zone-weighted log-mean
	// temperature difference, K: the duty over UA. UA is the sum over the zones of the zone's
	// duty over its log-mean temperature difference, W/K (each zone's from its end
	// temperatures). LMTD and UA are NaN when the profile crosses or touches.
	DTMin   float64
	DTMinAt string
	LMTD    float64
	UA      float64
	Zones   []Zone
}

// Result is everything Solve found.
type Result struct {
	Streams []StreamResult // same order as Model.Streams
	Units   []UnitResult   // same order as Model.Units
	Diags   []model.Diagnostic
	// Ambient is the temperature of the surroundings the entropy generation was computed with,
	// K: the file's ambient setting or model.DefaultAmbient.
	Ambient float64
	// System and X expose the equations and the solution (NaN where unsolved) for later stages
	// such as uncertainty propagation.
	System *System
	X      []float64
	Work   Work
	// Adjusted is what Options.Adjust found (Adjustment.Product), nil without one.
	Adjusted any
	run      *solveRun // for Evaluator
	// Totals are the whole file's powers and duties (totals.go); nil until solved.
	Totals *Totals
	// Expects holds the verdict on each of Model.Expects, in the same order (expect.go).
	Expects []ExpectResult
}

// Solve finds every stream's state and every unit's duty, and reports what is missing,
// conflicting or impossible. It never panics on a well-typed model and returns within
// opt.Timeout (plus one property evaluation).
func Solve(ctx context.Context, m *model.Model, opt Options) *Result {
	if opt.MaxIter <= 0 {
		opt.MaxIter = 50
	}
	if opt.Timeout <= 0 {
		opt.Timeout = 5 * time.Second
	}
	ctx, cancel := context.WithTimeout(ctx, opt.Timeout)
	defer cancel()
	res := &Result{Ambient: m.AmbientOr()}
	if m == nil {
		return res
	}
	if d, ok := validate(m); !ok {
		res.Diags = d
		res.Streams = make([]StreamResult, len(m.Streams))
		res.Units = make([]UnitResult, len(m.Units))
		for i := range res.Streams {
			res.Streams[i].M = math.NaN()
		}
		for i := range res.Units {
			res.Units[i] = nanUnit()
		}
		return res
	}
	relTol := m.Tolerance
	if !(relTol > 0) {
		relTol = 0.001
	}
	s := &solveRun{m: m, res: res, ctx: ctx, opt: opt, relTol: relTol, f: formatter{sys: m.Display, atm: m.Atm, pick: m.Pick}, explained: map[int]bool{}}
	s.run()
	return res
}

// validate rejects what would make the solver index nil: the notation never builds such a model.
func validate(m *model.Model) ([]model.Diagnostic, bool) {
	var d []model.Diagnostic
	bad := func(msg string) {
		d = append(d, model.Diagnostic{Severity: model.Error, Code: CodeStructure, Message: msg})
	}
	for i, s := range m.Streams {
		if s == nil {
			bad(fmt.Sprintf("stream %d is missing", i))
		}
	}
	for i, u := range m.Units {
		if u == nil {
			bad(fmt.Sprintf("unit %d is missing", i))
		}
	}
	for i, e := range m.Expects {
		if e == nil {
			bad(fmt.Sprintf("expectation %d is missing", i))
		}
	}
	return d, len(d) == 0
}

func nanUnit() UnitResult {
	n := math.NaN()
	return UnitResult{Q: n, W: n, Sgen: n, TBoundary: n, Efficiency: n, Fuel: n, MassIn: n, MassOut: n, EnergyIn: n, EnergyOut: n, MassClosure: n, EnergyClosure: n,
		DTMin: n, LMTD: n, UA: n}
}

type solveRun struct {
	m      *model.Model
	res    *Result
	ctx    context.Context
	opt    Options
	relTol float64
	f      formatter
	b      *builder
	st     *structure
	x      []float64
	solved []bool
	nbr    [][]int // streams sharing a unit with each stream
	diags  []model.Diagnostic
	evals  int // equation evaluations, for Work
	// explained streams run backwards for a reason a unit has reported in its own terms (a
	// flash tank fed subcooled liquid): negativeFlows does not report them again.
	explained map[int]bool
	judged    []bool // redundant equations Options.Adjust gave the verdict on
}

func (s *solveRun) run() {
	s.b = build(s.m, s.f, s.relTol)
	sys := s.b.sys
	s.res.System = sys
	st, err := analyse(s.ctx, sys)
	s.st = st
	s.x = make([]float64, len(sys.Vars))
	for i := range s.x {
		s.x[i] = math.NaN()
	}
	s.solved = make([]bool, len(sys.Vars))
	if err != nil {
		// Cut short by the time limit: nothing is solved, and no unknown is reported as
		// under-specified on a matching that was not finished.
		s.timedOut()
	} else {
		s.neighbours()
		s.underSpecified()
		sys.memo = make([]memoState, len(s.m.Streams))
		s.solveBlocks()
		s.adjust()
	}
	s.res.X = s.x
	s.res.run = s
	s.streamResults()
	s.volumeFlows()
	sys.memo = nil
	s.res.Units = make([]UnitResult, len(s.m.Units))
	for i := range s.res.Units {
		s.res.Units[i] = nanUnit()
	}
	s.overSpecified()
	s.unitResults()
	s.totals()
	s.negativeFlows()
	s.provenance()
	s.expectations()
	diags := append(s.b.diags, s.diags...)
	sort.SliceStable(diags, func(i, j int) bool { return diags[i].Span.Start < diags[j].Span.Start })
	s.res.Diags = diags
	s.res.Work = Work{Structure: s.b.steps + s.st.steps, Evals: s.evals}
}

// diags collected after building go through solveRun.
func (s *solveRun) diag(sev model.Severity, code string, span model.Span, msg string, rel ...model.Related) {
	s.diags = append(s.diags, model.Diagnostic{Span: span, Severity: sev, Code: code, Message: msg, Related: rel})
}

func (s *solveRun) neighbours() {
	// Counted, then filled: sub-slices of one array, not a slice grown per stream.
	count := make([]int, len(s.m.Streams)+1)
	each := func(f func(p, q int)) {
		for u, un := range s.m.Units {
			if s.b.badUnit[u] {
				continue
			}
			for _, p := range un.Ports {
				for _, q := range un.Ports {
					if p.Stream != q.Stream {
						f(p.Stream, q.Stream)
					}
				}
			}
		}
	}
	each(func(p, _ int) { count[p+1]++ })
	for i := range len(s.m.Streams) {
		count[i+1] += count[i]
	}
	flat := make([]int, count[len(s.m.Streams)])
	s.nbr = make([][]int, len(s.m.Streams))
	for i := range s.nbr {
		s.nbr[i] = flat[count[i]:count[i]:count[i+1]]
	}
	each(func(p, q int) { s.nbr[p] = append(s.nbr[p], q) })
}

// guess is the first Newton iterate of an unknown: the same property of a solved neighbour
// stream when there is one, else a typical value.
func (s *solveRun) guess(v int) float64 {
	vr := &s.b.sys.Vars[v]
	if vr.Stream >= 0 {
		for _, n := range s.nbr[vr.Stream] {
			w := s.b.sys.StreamVar(n, vr.Prop)
			if s.solved[w] {
				return s.x[w]
			}
		}
		switch vr.Prop {
		case model.Flow:
			return 1
		case model.P:
			return 1e6
		}
		return 1e6 // J/kg: liquid at every pressure, a safe start for IF97
	}
	switch vr.Param {
	case "efficiency":
		return 0.8
	}
	return 0
}

func (s *solveRun) solveBlocks() {
	sys := s.b.sys
	nt := &newton{ctx: s.ctx, sys: sys, x: s.x, solved: s.solved, maxIter: s.opt.MaxIter, guess: s.guess}
	if w := s.opt.Start; w != nil && w.System != nil && len(w.X) == len(s.x) {
		nt.start = func(v int) (float64, bool) {
			return w.X[v], w.System.Vars[v].Name == sys.Vars[v].Name && finite(w.X[v])
		}
	}
	defer func() { s.evals += nt.evals }()
	var vars []int
	for _, blk := range s.st.blocks {
		if s.ctx.Err() != nil {
			s.timedOut()
			return
		}
		vars = vars[:0]
		for _, e := range blk {
			vars = append(vars, s.st.matchEq[e])
		}
		ready := true
		for _, e := range blk {
			for _, v := range s.st.vars(e) {
				if !s.solved[v] && !contains(vars, int(v)) {
					ready = false
				}
			}
		}
		if !ready {
			continue // an unknown it needs was not found; that cause is reported already
		}
		err := nt.solveBlock(blk, vars)
		if err == errTimeout {
			s.timedOut()
			return
		}
		if err != nil {
			for _, v := range vars {
				s.x[v] = math.NaN()
			}
			s.blockFailed(blk, vars, err)
			continue
		}
		for _, v := range vars {
			s.solved[v] = true
		}
	}
}

// timedOut reports that the time limit (or the caller) stopped the solve.
func (s *solveRun) timedOut() {
	if s.ctx.Err() == context.Canceled {
		s.diag(model.Error, CodeTimeout, model.Span{}, fmt.Sprintf("solving stopped after %s: %v; the values shown are incomplete", s.opt.Timeout, s.ctx.Err()))
		return
	}
	s.diag(model.Error, CodeTimeout, model.Span{}, fmt.Sprintf("solving stopped after %s; the values shown are incomplete", s.opt.Timeout))
}

func contains(s []int, v int) bool {
	for _, w := range s {
		if w == v {
			return true
		}
	}
	return false
}

func (s *solveRun) blockFailed(blk, vars []int, err error) {
	sys := s.b.sys
	eq := &sys.Eqs[blk[0]]
	be, ok := err.(*blockError)
	if !ok {
		be = &blockError{reason: err.Error()}
	}
	if len(blk) == 1 && eq.Kind == EqGiven && eq.Stream >= 0 && eq.Given != nil {
		// A given T at a pressure that a unit fixed (not given beside it, which the state checks
		// catch) can still land on the saturation line.
		if errors.Is(be.prop, if97.ErrOnSaturation) && eq.Prop == model.T {
			if pv := sys.StreamVar(eq.Stream, model.P); s.solved[pv] {
				s.diag(model.Error, CodeStateAmbiguous, eq.Span, fmt.Sprintf("%s: T %s is the saturation temperature at its solved pressure %s; give the quality x (or h) instead of T",
					s.m.Streams[eq.Stream].Name, s.f.written(units.Temperature, eq.Given.Value, eq.Given.Unit), s.f.q(units.Pressure, s.x[pv])))
				return
			}
		}
		if s.stateFailed(eq, vars[0], be) {
			return
		}
	}
	if s.givensFailed(blk, be) {
		return
	}
	var names, labels []string
	for _, v := range vars {
		names = append(names, sys.Vars[v].Name)
	}
	var rel []model.Related
	for k, e := range blk {
		labels = append(labels, sys.Eqs[e].Label)
		if k > 0 {
			rel = append(rel, related(sys.Eqs[e].Span, sys.Eqs[e].Label))
		}
	}
	code := CodeNoConvergence
	if be.prop != nil && len(blk) == 1 && eq.Kind == EqGiven {
		code = CodeOutsideIF97
	}
	why := be.reason
	if be.prop != nil {
		why += ": " + s.f.propErr(be.prop)
	}
	if be.miss > 0 && finite(be.miss) {
		why += fmt.Sprintf(" (the closest values found still miss by %s)", pct(be.miss))
	}
	if be.singular {
		// Structurally square but numerically degenerate (a mixer inlet pressure that the lowest-
		// pressure rule leaves free, two givens that say the same thing): one more given among
		// the group's unknowns is what usually fixes it.
		var cands []string
		seen := map[string]bool{}
		for _, v := range vars {
			if n, _ := s.candName(v); n != "" && !seen[n] {
				seen[n] = true
				cands = append(cands, n)
			}
		}
		if len(cands) > 0 {
			why += "; the group may be under-specified: giving one of " + strings.Join(cands, ", ") + " may fix it"
		}
	}
	s.diag(model.Error, code, eq.Span, fmt.Sprintf("cannot solve %s from %s: %s", andList(names), andList(labels), why), rel...)
}

// stateFailed words the failure of a one-stream block: a given T, s or x that no value of the
// stream's unknown pressure (or enthalpy) meets at the enthalpy (or pressure) fixed before it.
// That is the plant-side reading of the failure ("no pressure gives ST2 T 100 C at the enthalpy
// the valve keeps"), which names the value that could not be met and where the other came from.
func (s *solveRun) stateFailed(eq *Equation, v int, be *blockError) bool {
	sys := s.b.sys
	vr := sys.Vars[v]
	if vr.Stream != eq.Stream || (vr.Prop != model.P && vr.Prop != model.H) {
		return false
	}
	unknown, other, otherWord := "pressure", sys.StreamVar(eq.Stream, model.H), "enthalpy"
	if vr.Prop == model.H {
		unknown, other, otherWord = "enthalpy", sys.StreamVar(eq.Stream, model.P), "pressure"
	}
	if !contains(eq.Vars, other) || !s.solved[other] {
		return false
	}
	ov := sys.Vars[other]
	code := CodeNoConvergence
	name := s.m.Streams[eq.Stream].Name
	msg := fmt.Sprintf("%s: no %s gives %s %s at the %s %s (%s)", name, unknown, eq.Prop,
		s.f.written(eq.Prop.Dim(), eq.Given.Value, eq.Given.Unit), otherWord, s.f.q(ov.Dim, s.x[other]), s.source(other))
	var le *if97.LimitError
	if be.prop != nil {
		code = CodeOutsideIF97
		if errors.As(be.prop, &le) {
			msg += ": " + s.f.limit(le)
		}
	}
	var rel []model.Related
	if e := s.st.matchVar[other]; e >= 0 && sys.Eqs[e].Span != eq.Span {
		rel = append(rel, related(sys.Eqs[e].Span, sys.Eqs[e].Label+" fixes "+ov.Name))
	}
	s.diag(model.Error, code, eq.Span, msg, rel...)
	return true
}

// givensFailed words the failure of a block made only of one stream's givens (T and s, say):
// no state of water has them together.
func (s *solveRun) givensFailed(blk []int, be *blockError) bool {
	sys := s.b.sys
	st := sys.Eqs[blk[0]].Stream
	if len(blk) < 2 || st < 0 {
		return false
	}
	var parts []string
	var rel []model.Related
	for k, e := range blk {
		eq := &sys.Eqs[e]
		if eq.Kind != EqGiven || eq.Stream != st || eq.Given == nil {
			return false
		}
		parts = append(parts, eq.Prop.String()+" "+s.f.written(eq.Prop.Dim(), eq.Given.Value, eq.Given.Unit))
		if k > 0 {
			rel = append(rel, related(eq.Span, eq.Prop.String()+" given here"))
		}
	}
	msg := fmt.Sprintf("%s: no state of water has %s", s.m.Streams[st].Name, andList(parts))
	if be.prop != nil {
		msg += ": " + s.f.propErr(be.prop)
	}
	s.diag(model.Error, CodeNoConvergence, sys.Eqs[blk[0]].Span, msg, rel...)
	return true
}

// source says which given or equation fixed a solved unknown, for a message: "given S1 p",
// "from the energy balance of valve V1".
func (s *solveRun) source(v int) string {
	e := s.st.matchVar[v]
	if e < 0 {
		return "not fixed"
	}
	eq := &s.b.sys.Eqs[e]
	if eq.Kind == EqGiven {
		return eq.Label
	}
	return "from the " + eq.Label
}

// streamResults evaluates each stream's state from its solved p and h.
func (s *solveRun) streamResults() {
	sys := s.b.sys
	s.res.Streams = make([]StreamResult, len(s.m.Streams))
	book := sys.book(s.x)
	var outside []outsideState
	for i := range s.m.Streams {
		r := &s.res.Streams[i]
		r.M = math.NaN()
		if v := sys.StreamVar(i, model.Flow); s.solved[v] {
			r.M = s.x[v]
		}
		pv, hv := sys.StreamVar(i, model.P), sys.StreamVar(i, model.H)
		if !s.solved[pv] || !s.solved[hv] {
			continue
		}
		if s.b.blocked[i] {
			// A given of this stream was rejected: what the rest fixes is not the state the file
			// describes (a rejected pressure would show the one a unit carries back), so the
			// stream shows no state; its error is reported where the given is written.
			continue
		}
		state, err := book.state(s.x[pv], s.x[hv])
		if err != nil {
			outside = append(outside, outsideState{stream: i, err: err})
			continue
		}
		r.State, r.HasState = state, true
		r.Solved = !math.IsNaN(r.M)
	}
	s.reportOutside(outside)
}

// outsideState is a stream whose solved p and h IAPWS-IF97 cannot evaluate.
type outsideState struct {
	stream int
	err    error
	origin int // index into s.diags of the error that reports it, or of its origin's
}

// reportOutside reports states outside IAPWS-IF97 once, at their origin. A stream whose p or h
// was fixed by an equation that reads another such stream (the outlet of a valve after an
// impossible inlet) only repeats that error; it is named on the origin's error instead. Streams
// are taken in solving order, so an origin is always met before what follows from it.
func (s *solveRun) reportOutside(out []outsideState) {
	if len(out) == 0 {
		return
	}
	sys := s.b.sys
	blockOf := make(map[int]int)
	for bi, blk := range s.st.blocks {
		for _, e := range blk {
			blockOf[s.st.matchEq[e]] = bi
		}
	}
	order := func(o outsideState) int {
		return max(blockOf[sys.StreamVar(o.stream, model.P)], blockOf[sys.StreamVar(o.stream, model.H)])
	}
	sort.SliceStable(out, func(i, j int) bool { return order(out[i]) < order(out[j]) })
	seen := map[int]int{} // stream -> index into out
	for k := range out {
		o := &out[k]
		i := o.stream
		from := -1
		for _, prop := range []model.Prop{model.P, model.H} {
			e := s.st.matchVar[sys.StreamVar(i, prop)]
			if e < 0 {
				continue
			}
			for _, v := range sys.Eqs[e].Vars {
				if st := sys.Vars[v].Stream; st >= 0 && st != i {
					if j, ok := seen[st]; ok && from < 0 {
						from = j
					}
				}
			}
		}
		seen[i] = k
		if from >= 0 {
			o.origin = out[from].origin
			d := &s.diags[o.origin]
			d.Related = append(d.Related, related(s.m.Streams[i].Span, s.m.Streams[i].Name+" follows from this state and is not solved either"))
			continue
		}
		o.origin = len(s.diags)
		s.outsideAt(i, o.err)
	}
}

// outsideAt reports stream i's state outside IAPWS-IF97: at the given that is out of range when
// it is one of the stream's own, else at the stream, naming the equation that produced the value.
func (s *solveRun) outsideAt(i int, err error) {
	sys := s.b.sys
	st := s.m.Streams[i]
	pv, hv := sys.StreamVar(i, model.P), sys.StreamVar(i, model.H)
	var le *if97.LimitError
	if !errors.As(err, &le) || (le.Quantity != "pressure" && le.Quantity != "enthalpy") || !finite(le.Value) {
		s.diag(model.Error, CodeOutsideIF97, st.Span, fmt.Sprintf("%s: p %s (%s) and h %s (%s) are outside IAPWS-IF97: %s",
			st.Name, s.f.q(units.Pressure, s.x[pv]), s.source(pv), s.f.q(units.SpecificEnergy, s.x[hv]), s.source(hv), s.f.propErr(err)))
		return
	}
	prop, v := model.H, hv
	if le.Quantity == "pressure" {
		prop, v = model.P, pv
	}
	dim := prop.Dim()
	side, bound := "above", le.Max
	if le.Value <= le.Min {
		side, bound = "below", le.Min
	}
	span, what := st.Span, s.f.q(dim, s.x[v])+" ("+s.source(v)+")"
	var rel []model.Related
	g := st.Given[prop]
	if e := s.st.matchVar[v]; e >= 0 {
		eq := &sys.Eqs[e]
		if eq.Kind == EqGiven && eq.Stream == i && eq.Prop == prop && g != nil {
			span, what = g.Span, s.f.written(dim, g.Value, g.Unit)
		} else {
			rel = append(rel, related(eq.Span, eq.Label+" fixes "+sys.Vars[v].Name))
		}
	}
	lim := s.f.q(dim, bound)
	if g != nil && span == g.Span {
		lim = s.f.written(dim, bound, g.Unit)
	}
	at := ""
	if prop == model.H {
		at = " at p " + s.f.q(units.Pressure, s.x[pv])
		if gp := st.Given[model.P]; gp != nil && s.st.matchVar[pv] >= 0 && sys.Eqs[s.st.matchVar[pv]].Given == gp {
			at = " at p " + s.f.written(units.Pressure, gp.Value, gp.Unit)
		}
	}
	s.diag(model.Error, CodeOutsideIF97, span, fmt.Sprintf("%s: %s %s is %s the IAPWS-IF97 limit %s%s", st.Name, prop, what, side, lim, at), rel...)
}

// underSpecified reports unknowns no equation fixes, grouped by the set of givens that would fix
// them. A model the notation could not read fully is not reported: it would only echo its errors.
func (s *solveRun) underSpecified() {
	if s.m.Incomplete {
		return
	}
	sys := s.b.sys
	quiet := make([]bool, len(s.m.Streams))
	copy(quiet, s.b.blocked)
	for u, un := range s.m.Units {
		if s.b.badUnit[u] {
			for _, p := range un.Ports {
				if p.Stream >= 0 && p.Stream < len(quiet) {
					quiet[p.Stream] = true
				}
			}
		}
	}
	// An unknown whose given was rejected (a stream's bad T, a duty that is not a finite number)
	// is quiet: the rejection is the error, and "specify one of: QC1 duty" beside it would ask
	// for what the file already tries to say.
	quietVar := func(v int) bool {
		if st := sys.Vars[v].Stream; st >= 0 && quiet[st] {
			return true
		}
		return s.b.rejected[v]
	}
	mark := make([]int, len(sys.Vars))
	group := make([]int, len(sys.Vars)) // unknown -> group number + 1 of the search that reached it
	stamp := 0
	type grp struct {
		missing []int
		cands   []int
		quiet   bool // the group reaches an unknown whose given was rejected: a follow-on
		cut     bool // cands are the nearest of more than maxReach
	}
	var groups []*grp
	for v := range sys.Vars {
		if s.st.matchVar[v] >= 0 {
			continue
		}
		if quietVar(v) {
			continue
		}
		if g := group[v]; g > 0 {
			groups[g-1].missing = append(groups[g-1].missing, v)
			continue
		}
		stamp++
		reach, whole := s.st.underdetermined(sys, v, mark, stamp)
		g := &grp{missing: []int{v}, cands: reach, cut: !whole}
		groups = append(groups, g)
		for _, w := range reach {
			if group[w] == 0 {
				group[w] = len(groups)
			}
			// Fixing the rejected given would very likely fix this unknown too: the group is
			// a consequence of that error, not a separate one.
			g.quiet = g.quiet || quietVar(w)
		}
	}
	for _, g := range groups {
		if g.quiet {
			continue
		}
		first := sys.Vars[g.missing[0]]
		span := model.Span{}
		if first.Stream >= 0 {
			span = s.m.Streams[first.Stream].Span
		} else {
			span = s.m.Units[first.Unit].Span
		}
		var names []string
		var specs []model.Spec
		seen := map[string]bool{}
		for _, c := range g.cands {
			n, spec := s.candName(c)
			if n == "" || seen[n] {
				continue
			}
			seen[n] = true
			names = append(names, n)
			specs = append(specs, spec)
		}
		more := ""
		if len(names) > 10 {
			more = fmt.Sprintf(" (and %d more)", len(names)-10)
			if g.cut {
				more = fmt.Sprintf(" (and at least %d more)", len(names)-10)
			}
			names = names[:10]
		}
		var rel []model.Related
		var missing []string
		for k, v := range g.missing {
			missing = append(missing, sys.Vars[v].Name)
			if k > 0 {
				vr := sys.Vars[v]
				sp := model.Span{}
				if vr.Stream >= 0 {
					sp = s.m.Streams[vr.Stream].Span
				} else {
					sp = s.m.Units[vr.Unit].Span
				}
				rel = append(rel, related(sp, vr.Name+" is not fixed either"))
			}
		}
		var msg string
		if len(g.missing) == 1 {
			msg = fmt.Sprintf("under-specified: nothing fixes %s; specify one of: %s%s", missing[0], strings.Join(names, ", "), more)
		} else {
			msg = fmt.Sprintf("under-specified by %d values: nothing fixes %s; specify %d of: %s%s", len(missing), andList(missing), len(missing), strings.Join(names, ", "), more)
		}
		s.diag(model.Error, CodeUnderSpecified, span, msg, rel...)
		s.diags[len(s.diags)-1].Specify = specs
	}
}

// candName names an unknown as something a file can give: a stream's h may be fixed by T, h, s
// or x, so it is offered as "T or h".
// The Spec offers T for a stream's h: the temperature is what a file usually states.
func (s *solveRun) candName(v int) (string, model.Spec) {
	vr := s.b.sys.Vars[v]
	if vr.Stream >= 0 {
		name := s.m.Streams[vr.Stream].Name
		if s.b.blocked[vr.Stream] {
			return "", model.Spec{}
		}
		if vr.Prop == model.H {
			return name + " T or h", model.Spec{Name: name, Prop: "T"}
		}
		return vr.Name, model.Spec{Name: name, Prop: vr.Prop.String()}
	}
	return vr.Name, model.Spec{Name: s.m.Units[vr.Unit].Name, Prop: vr.Param}
}
