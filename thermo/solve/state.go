package solve

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"hmb/thermo/if97"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Range of IAPWS-IF97, IAPWS R7-97(2012), Sec. 4: 273.15 K <= T <= 2273.15 K, p <= 100 MPa
// (50 MPa above 1073.15 K; left to the property library).
const (
	tMinIF97 = 273.15
	tMaxIF97 = 2273.15
	pMaxIF97 = 100e6
)

// satTolMin is the least temperature difference from saturation that tells a (p, T) pair off the
// line: a few hundredths of a kelvin is the resolution of the tables people copy T and p from.
const satTolMin = 0.01

// satWindow is how far a stated T may lie from Tsat(p) and still be read as the saturation
// temperature: the ± the user stated, at least satTolMin. The same window serves a T given beside
// a given p and a T at a pressure a unit fixes, so both are judged alike.
func satWindow(g *model.Given) float64 { return max(g.Tol, satTolMin) }

// streamGivens checks the givens of stream i as a state, then adds one equation per given kept.
// A state needs two intensive properties; the flow is the third unknown.
func (b *builder) streamGivens(i int) {
	s := b.m.Streams[i]
	name := s.Name
	b.volumeGiven(i)
	if g := s.Given[model.Flow]; g != nil {
		if !finite(g.Value) {
			b.diag(model.Error, CodeStructure, g.Span, fmt.Sprintf("%s flow is not a finite number", name))
		} else {
			b.addEq(b.linearGiven(i, model.Flow, g))
		}
	}
	var keep []model.Prop
	for _, p := range []model.Prop{model.P, model.T, model.H, model.S, model.X} {
		g := s.Given[p]
		if g == nil {
			continue
		}
		if b.givenInRange(i, p, g) {
			keep = append(keep, p)
		} else {
			b.blocked[i] = true
		}
	}
	has := func(p model.Prop) bool { return propIn(keep, p) }
	if has(model.X) && has(model.P) && s.Given[model.P].Value >= pCrit {
		g := s.Given[model.X]
		gp := s.Given[model.P]
		b.diag(model.Error, CodeNoDome, g.Span, fmt.Sprintf("%s: quality given at %s, at or above the critical pressure %s, where water has no two-phase region",
			name, b.fmt.written(units.Pressure, gp.Value, gp.Unit), b.fmt.written(units.Pressure, pCrit, gp.Unit)), related(gp.Span, "pressure given here"))
		keep = dropProp(keep, model.X)
		b.blocked[i] = true
	}
	if has(model.X) && has(model.T) && s.Given[model.T].Value >= tCrit {
		g, gt := s.Given[model.X], s.Given[model.T]
		b.diag(model.Error, CodeNoDome, g.Span, fmt.Sprintf("%s: quality given at %s, at or above the critical temperature %s, where water has no two-phase region",
			name, b.fmt.written(units.Temperature, gt.Value, gt.Unit), b.fmt.written(units.Temperature, tCrit, gt.Unit)), related(gt.Span, "temperature given here"))
		keep = dropProp(keep, model.X)
		b.blocked[i] = true
	}
	switch {
	case len(keep) == 3 && has(model.P) && has(model.T) && has(model.X):
		gp, gt := s.Given[model.P], s.Given[model.T]
		ts, err := if97.Tsat(gp.Value)
		tol := max(gt.Tol, b.relTol*gt.Value, satTolMin)
		if err == nil && math.Abs(ts-gt.Value) <= tol {
			keep = dropProp(keep, model.T) // T only repeats what p says: redundant, not a conflict
			break
		}
		pw := b.fmt.written(units.Pressure, gp.Value, gp.Unit)
		msg := fmt.Sprintf("%s: T %s, p %s and a quality are inconsistent: the saturation temperature at %s is %s",
			name, b.fmt.written(units.Temperature, gt.Value, gt.Unit), pw, pw, b.fmt.writtenQ(units.Temperature, ts, gt.Unit))
		if err != nil {
			msg = fmt.Sprintf("%s: T, p and a quality are inconsistent: %s has no saturation temperature", name, pw)
		}
		b.diag(model.Error, CodeStateInconsistent, gt.Span, msg,
			related(gp.Span, "pressure given here"), related(s.Given[model.X].Span, "quality given here"))
		keep = dropProp(keep, model.T)
		b.blocked[i] = true
	case len(keep) >= 3:
		var names []string
		var rel []model.Related
		for k, p := range keep {
			names = append(names, p.String())
			if k >= 2 {
				rel = append(rel, related(s.Given[p].Span, p.String()+" given here"))
			}
		}
		b.diag(model.Error, CodeStateOverSpecified, s.Given[keep[2]].Span,
			fmt.Sprintf("%s is over-specified: %s given; a single-phase state takes two (flow apart)", name, andList(names)), rel...)
		keep = keep[:2]
		b.blocked[i] = true
	case len(keep) == 2 && has(model.P) && has(model.T):
		gp, gt := s.Given[model.P], s.Given[model.T]
		if gp.Value < pCrit {
			ts, err := if97.Tsat(gp.Value)
			if err == nil && math.Abs(ts-gt.Value) <= satWindow(gt) {
				b.diag(model.Error, CodeStateAmbiguous, gt.Span,
					fmt.Sprintf("%s: T %s is the saturation temperature at %s; give the quality x (or h) instead of T",
						name, b.fmt.written(units.Temperature, gt.Value, gt.Unit), b.fmt.written(units.Pressure, gp.Value, gp.Unit)),
					related(gp.Span, "pressure given here"))
				keep = dropProp(keep, model.T)
				b.blocked[i] = true
			}
		}
	}
	for _, p := range keep {
		g := s.Given[p]
		switch p {
		case model.P, model.H:
			b.addEq(b.linearGiven(i, p, g))
		case model.T:
			if has(model.X) && !has(model.P) {
				b.addEq(b.satTempGiven(i, g))
			} else {
				b.addEq(b.propGiven(i, p, g))
			}
		default:
			b.addEq(b.propGiven(i, p, g))
		}
	}
}

// givenInRange reports a given that no state of IF97 can have.
func (b *builder) givenInRange(i int, p model.Prop, g *model.Given) bool {
	name := b.m.Streams[i].Name
	if !finite(g.Value) {
		b.diag(model.Error, CodeStructure, g.Span, fmt.Sprintf("%s %s is not a finite number", name, p))
		return false
	}
	switch p {
	case model.P:
		if g.Value <= 0 || g.Value > pMaxIF97 {
			// The range reads in the user's unit, made absolute: it starts at zero absolute.
			u := absolute(b.fmt.unitFor(units.Pressure, g.Unit))
			b.diag(model.Error, CodeOutsideIF97, g.Span, fmt.Sprintf("%s: pressure %s is outside IAPWS-IF97 (above 0 %s, up to %s)",
				name, b.fmt.written(units.Pressure, g.Value, g.Unit), u.Symbol(), b.fmt.written(units.Pressure, pMaxIF97, u.Symbol())))
			return false
		}
	case model.T:
		if g.Value < tMinIF97 || g.Value > tMaxIF97 {
			u := b.fmt.unitFor(units.Temperature, g.Unit).Symbol()
			b.diag(model.Error, CodeOutsideIF97, g.Span, fmt.Sprintf("%s: temperature %s is outside IAPWS-IF97 (%s to %s)",
				name, b.fmt.written(units.Temperature, g.Value, g.Unit), b.fmt.written(units.Temperature, tMinIF97, u), b.fmt.written(units.Temperature, tMaxIF97, u)))
			return false
		}
	case model.X:
		if g.Value < 0 || g.Value > 1 {
			b.diag(model.Error, CodeQualityRange, g.Span, fmt.Sprintf("%s: quality %s is outside 0..1", name, b.fmt.frac(g.Value)))
			return false
		}
	}
	return true
}

func (b *builder) givenLabel(i int, p model.Prop) string {
	return "given " + b.m.Streams[i].Name + " " + p.String()
}

// linearGiven: m, p or h equals its given value.
func (b *builder) linearGiven(i int, p model.Prop, g *model.Given) Equation {
	floor := 1.0
	if p == model.Flow {
		floor = 1e-9
	}
	eq := b.fixed(b.sys.StreamVar(i, p), g.Value)
	eq.Label, eq.Kind, eq.Unit, eq.Stream, eq.Prop, eq.Given, eq.Span = b.givenLabel(i, p), EqGiven, -1, i, p, g, g.Span
	eq.Dim, eq.LHS, eq.RHS, eq.floor = p.Dim(), "solved", "given", floor
	return eq
}

// propGiven: T, s or x of (p, h) equals its given value. With p known, IF97 gives h directly.
func (b *builder) propGiven(i int, p model.Prop, g *model.Given) Equation {
	hv, pv := b.hv(i), b.pv(i)
	val := g.Value
	var of func(pp, hh float64) (float64, error)
	var inv func(pp float64) (float64, error)
	floor := 1e-3
	sys := b.sys
	// Every state computed here is remembered for the stream's result (see System.memo).
	ph := func(pp, hh float64) (if97.State, error) {
		st, err := statePH(pp, hh)
		if err == nil {
			sys.remember(i, pp, hh, st, false)
		}
		return st, err
	}
	keep := func(pp float64, st if97.State, err error) (float64, error) {
		if err != nil {
			return st.H, err
		}
		sys.remember(i, pp, st.H, st, p == model.X && (val == 0 || val == 1))
		return st.H, nil
	}
	switch p {
	case model.T:
		of = func(pp, hh float64) (float64, error) { st, err := ph(pp, hh); return st.T, err }
		win := satWindow(g)
		inv = func(pp float64) (float64, error) {
			if pp < pCrit {
				if ts, err := if97.Tsat(pp); err == nil && math.Abs(ts-val) <= win {
					return math.NaN(), if97.ErrOnSaturation
				}
			}
			st, err := if97.PT(pp, val)
			return keep(pp, st, err)
		}
	case model.S:
		of = func(pp, hh float64) (float64, error) { st, err := ph(pp, hh); return st.S, err }
		inv = func(pp float64) (float64, error) { st, err := if97.PS(pp, val); return keep(pp, st, err) }
	default: // quality
		of = qualityExt
		inv = func(pp float64) (float64, error) { st, err := if97.PX(pp, val); return keep(pp, st, err) }
		floor = 1
	}
	return Equation{
		Label: b.givenLabel(i, p), Kind: EqGiven, Unit: -1, Stream: i, Prop: p, Given: g, Span: g.Span,
		Dim: p.Dim(), LHS: "solved", RHS: "given", Vars: []int{hv, pv},
		eval: func(x []float64) (float64, float64, error) {
			v, err := of(x[pv], x[hv])
			return v, val, err
		},
		direct: func(x []float64, v int) (float64, error) {
			if v != hv {
				return math.NaN(), errNoDirect
			}
			return inv(x[pv])
		},
		floor:   floor,
		quality: p == model.X,
	}
}

// satTempGiven: a stream with T and quality but no p sits at p = psat(T).
func (b *builder) satTempGiven(i int, g *model.Given) Equation {
	pv := b.pv(i)
	val := g.Value
	return Equation{
		Label: b.givenLabel(i, model.T), Kind: EqGiven, Unit: -1, Stream: i, Prop: model.T, Given: g, Span: g.Span,
		Dim: units.Temperature, LHS: "saturation temperature", RHS: "given", Vars: []int{pv},
		eval: func(x []float64) (float64, float64, error) {
			t, err := if97.Tsat(x[pv])
			return t, val, err
		},
		direct: func([]float64, int) (float64, error) { return if97.Psat(val) },
		floor:  1e-3,
	}
}

func propIn(ps []model.Prop, p model.Prop) bool {
	for _, q := range ps {
		if q == p {
			return true
		}
	}
	return false
}

func dropProp(ps []model.Prop, p model.Prop) []model.Prop {
	var out []model.Prop
	for _, q := range ps {
		if q != p {
			out = append(out, q)
		}
	}
	return out
}

func related(s model.Span, msg string) model.Related { return model.Related{Span: s, Message: msg} }

// andList writes "a, b and c".
func andList(s []string) string {
	if len(s) <= 1 {
		return strings.Join(s, "")
	}
	return strings.Join(s[:len(s)-1], ", ") + " and " + s[len(s)-1]
}

// propErr words a property-library error for a message, in the file's units: the library
// itself speaks SI (MPa, kJ/kg), which a file in psia and Btu/lbm should not have to read.
func (f formatter) propErr(err error) string {
	var le *if97.LimitError
	switch {
	case err == nil:
		return ""
	case errors.As(err, &le):
		return f.limit(le)
	}
	return err.Error()
}

// limit words an if97.LimitError in display units.
func (f formatter) limit(le *if97.LimitError) string {
	dim := units.Dimensionless
	switch le.Quantity {
	case "pressure":
		dim = units.Pressure
	case "temperature":
		dim = units.Temperature
	case "enthalpy":
		dim = units.SpecificEnergy
	case "entropy":
		dim = units.SpecificEntropy
	}
	if !finite(le.Value) {
		return le.Quantity + " is not a finite number"
	}
	if le.Quantity == "quality" {
		return "quality " + f.frac(le.Value) + " is outside 0..1"
	}
	side, bound := "above", le.Max
	if le.Value <= le.Min { // the lower pressure limit 0 is exclusive
		side, bound = "below", le.Min
	}
	msg := fmt.Sprintf("%s %s is %s the IAPWS-IF97 limit %s", le.Quantity, f.q(dim, le.Value), side, f.q(dim, bound))
	if c := f.cond(le.Cond); c != "" {
		msg += " " + c
	}
	return msg
}

// cond rewrites the condition of a limit ("at 0.101352932 MPa", "at pressures over 50 MPa") in
// display units; the library writes pressures in MPa.
func (f formatter) cond(c string) string {
	fields := strings.Fields(c)
	if n := len(fields); n >= 2 && fields[n-1] == "MPa" {
		if v, err := strconv.ParseFloat(fields[n-2], 64); err == nil {
			return strings.Join(fields[:n-2], " ") + " " + f.q(units.Pressure, v*1e6)
		}
	}
	return c
}
