package feature

// This file implements hover: the solved state of a stream, the balance and results of a unit,
// the solved tables of the whole file on its title, the SI value of a unit spelling and one line
// of help on keywords, kinds, roles, parameters, properties and results.

import (
	"context"
	"fmt"
	"math"
	"strings"

	"go.lsp.dev/protocol"

	"hmb/lang"
	"hmb/lang/check"
	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// Hover returns the hover at byte offset off, or nil when there is nothing to say. A hover on a
// stream or unit waits (under ctx) for the snapshot's solution.
func Hover(ctx context.Context, snap *cache.Snapshot, off int) (*protocol.Hover, error) {
	res := snap.Check()
	var text string
	var span model.Span
	if o, id := nameAt(res, off); o != nil {
		sol, err := snap.Solution(ctx)
		if err != nil && ctx.Err() != nil {
			return nil, err
		}
		// A superseded snapshot has no solution; describe the symbol without values.
		span = spanOf(id)
		if o.IsUnit {
			text = UnitHover(res, sol, o)
		} else {
			text = StreamHover(res, sol, o)
		}
		if sol != nil {
			text += CaseHover(res, sol, snap.Cases(), o)
		}
	} else if g := measuredAt(res, off); g != nil && !onSpelling(snap.Tokens(), off) {
		// A reading: measured and reconciled. Its unit spelling keeps the spelling's hover.
		sol, err := snap.Solution(ctx)
		if err != nil && ctx.Err() != nil {
			return nil, err
		}
		span, text = g.Span, MeasurementHover(res, sol, off)
	} else if t := tokenAt(snap.Tokens(), off); t >= 0 {
		toks := snap.Tokens()
		span = model.Span{Start: toks[t].Pos, End: toks[t].End}
		if sp, ok := titleSpan(snap.Src(), toks, t); ok && res.Model != nil {
			// The title stands for the whole file: its hover is the file's solved tables.
			tables, err := Tables(ctx, snap)
			if err != nil && ctx.Err() != nil {
				return nil, err
			}
			if err == nil {
				span, text = sp, tables
			}
		}
		if text == "" && isTotalAt(res, toks[t].Pos) {
			// An expectation's subject total: the file's totals.
			sol, err := snap.Solution(ctx)
			if err != nil && ctx.Err() != nil {
				return nil, err
			}
			text = TotalsHover(res, sol)
		}
		if text == "" {
			text = tokenHover(snap.Src(), res, toks, t)
		}
	}
	if text == "" {
		return nil, nil
	}
	rng := snap.Mapper.Range(span)
	return &protocol.Hover{
		Contents: protocol.MarkupContent{Kind: protocol.Markdown, Value: text},
		Range:    &rng,
	}, nil
}

func tokenHover(src []byte, res *lang.Result, toks []lang.Token, t int) string {
	tok := toks[t]
	word := string(src[tok.Pos:tok.End])
	switch tok.Kind {
	case lang.KeywordToken:
		if doc := lang.KeywordDoc(word); doc != "" {
			return fmt.Sprintf("`%s`: %s", word, doc)
		}
	case lang.KindToken:
		if k := model.Kinds[word]; k != nil {
			return fmt.Sprintf("`%s`: %s", k.Name, k.Doc)
		}
	case lang.RoleToken, lang.ParamToken:
		u := enclosingUnit(res, tok.Pos)
		if u == nil || u.Kind == nil {
			return ""
		}
		k := u.Kind
		if p := k.Port(word); p != nil && tok.Kind == lang.RoleToken {
			dir := "outlet"
			if p.Inlet {
				dir = "inlet"
			}
			return fmt.Sprintf("`%s` (%s port of a %s): %s", word, dir, k.Name, p.Doc)
		}
		if p := k.Param(word); p != nil {
			return fmt.Sprintf("`%s` (%s parameter of a %s): %s", word, p.Dim, k.Name, p.Doc)
		}
	case lang.PropToken:
		// After a unit's name (an expectation on a unit) the word is one of the unit's results.
		if t > 0 && toks[t-1].Kind == lang.UnitToken {
			o := res.Info.Objects[string(src[toks[t-1].Pos:toks[t-1].End])]
			if o == nil || o.Kind == nil {
				return ""
			}
			if r := o.Kind.Result(word); r != nil {
				return fmt.Sprintf("`%s` (%s result of a %s): %s", word, r.Dim, o.Kind.Name, r.Doc)
			}
			return ""
		}
		if t > 0 && isTotalAt(res, toks[t-1].Pos) {
			for _, r := range model.TotalResults {
				if r.Name == word {
					return fmt.Sprintf("`%s` (%s total of the file): %s", word, r.Dim, r.Doc)
				}
			}
			return ""
		}
		if r := model.StreamResult(word); r != nil {
			return fmt.Sprintf("`%s`: %s", word, r.Doc)
		}
	case lang.SpellingToken:
		return SpellingHover(src, res, toks, t)
	case lang.CaseToken:
		return caseNameHover(res, word)
	}
	return ""
}

// SpellingHover describes the unit spelling of token t: its dimension and, when a number stands
// before it, the value in SI base units.
func SpellingHover(src []byte, res *lang.Result, toks []lang.Token, t int) string {
	tok := toks[t]
	spelling := string(src[tok.Pos:tok.End])
	u, err := units.Lookup(spelling)
	if err != nil {
		return fmt.Sprintf("`%s`: %v", spelling, err)
	}
	atm := units.StandardAtmosphere
	if res.Model != nil && res.Model.Atm > 0 {
		atm = res.Model.Atm
	}
	var b strings.Builder
	fmt.Fprintf(&b, "`%s`: %s", spelling, u.Dim())
	if u.Symbol() != spelling {
		fmt.Fprintf(&b, ", written `%s` in canonical form", u.Symbol())
	}
	switch u.Reading() {
	case units.Gauge:
		fmt.Fprintf(&b, ", gauge (above a site atmosphere of %s Pa)", units.Format(atm, 6))
	case units.Vacuum:
		fmt.Fprintf(&b, ", vacuum (below a site atmosphere of %s Pa)", units.Format(atm, 6))
	case units.Difference:
		var rs []string
		for _, r := range u.Readings() {
			rs = append(rs, "`"+r.Symbol()+"`")
		}
		fmt.Fprintf(&b, ", a difference only (a pressure itself is %s)", strings.Join(rs, " or "))
	}
	base := units.Base(u.Dim()).Symbol()
	if t > 0 && toks[t-1].Kind == lang.NumberToken {
		raw := string(src[toks[t-1].Pos:toks[t-1].End])
		if v, _, err := units.ParseQuantity(raw); err == nil {
			fmt.Fprintf(&b, "\n\n%s %s = %s %s", raw, spelling, units.Format(u.ToSI(v, atm), 7), base)
			if u.Relative() {
				b.WriteString(" absolute")
			}
			return b.String()
		}
	}
	if base != "" {
		fmt.Fprintf(&b, "\n\n1 %s = %s %s", spelling, units.Format(u.DeltaToSI(1), 7), base)
	}
	return b.String()
}

// display is how a checked file shows its results.
func display(res *lang.Result) units.Display {
	if res.Model == nil {
		return units.Display{}
	}
	return res.Model.Shown()
}

// show writes an SI value in the display unit of its dimension; unknown values say so rather
// than print NaN.
func show(d units.Display, r *model.ResultSpec, v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "unknown"
	}
	return r.Show(d, v)
}

// StreamHover is the Markdown description of a stream: every stream result of the catalogue,
// each value with where it came from. sol may be nil (not solved: a newer version arrived).
func StreamHover(res *lang.Result, sol *solve.Result, o *check.Object) string {
	var b strings.Builder
	fmt.Fprintf(&b, "**stream** `%s`", o.Name)
	if o.Label != "" {
		fmt.Fprintf(&b, " %s", o.Label)
	}
	if sol == nil || res.Model == nil || o.Index < 0 || o.Index >= len(sol.Streams) {
		b.WriteString("\n\nnot solved")
		return b.String()
	}
	sr := &sol.Streams[o.Index]
	sub := model.Subject{Kind: model.StreamSubject, Index: o.Index}
	disp := display(res)
	rec := reconcile.Of(sol)
	b.WriteString("\n\n| | value | from |\n|---|---:|---|\n")
	for _, r := range model.StreamResults {
		v, _, _ := sol.Value(res.Model, sub, r.Name)
		val := show(disp, &r, v)
		if half := rec.U(sub, r.Name); half > 0 && !math.IsNaN(v) {
			val = showU(disp, &r, v, half)
		}
		switch {
		case r.Name == "x" && sol.Lacks(res.Model, sub, r.Name):
			val = "none (single phase)"
		case sol.Lacks(res.Model, sub, r.Name):
			val = "none (" + sr.State.Phase.String() + ")"
		}
		fmt.Fprintf(&b, "| %s | %s | %s |\n", r.Name, val, mdCell(source(sr, r.Name, v)))
	}
	phase := "unknown"
	if sr.HasState {
		phase = sr.State.Phase.String()
	}
	fmt.Fprintf(&b, "| phase | %s | |\n", mdCell(phase))
	return b.String()
}

// given is the source of a value the file states for the stream itself.
const given = "given"

// derived is the source of a value IAPWS-IF97 gives from the stream's p and h. The solver's own
// label also names the sources of p and h, which the hover shows in their rows already.
const derived = "IAPWS-IF97 from p and h"

// source says where a stream's value came from: "given" for the stream's own given, else the
// solver's label ("energy balance of mixer DA", "given S1 T"); "" when not solved, and for a
// quality of a single-phase state, which comes from nowhere.
func source(sr *solve.StreamResult, name string, v float64) string {
	p := model.NumProps
	for q := model.Prop(0); q < model.NumProps; q++ {
		if q.String() == name {
			p = q
		}
	}
	switch {
	case math.IsNaN(v):
		return ""
	case p == model.NumProps:
		return derived // not a property a file gives: computed from the state
	}
	switch pv := sr.Source[p]; pv.Kind {
	case solve.ProvNone:
		return ""
	case solve.ProvGiven:
		return given
	case solve.ProvDerived:
		return derived
	default:
		return pv.Label
	}
}

// UnitHover is the Markdown description of a unit: its mass and energy balance and every result
// of its kind.
func UnitHover(res *lang.Result, sol *solve.Result, o *check.Object) string {
	var b strings.Builder
	fmt.Fprintf(&b, "**%s** `%s`", o.KindName, o.Name)
	if o.Label != "" {
		fmt.Fprintf(&b, " %s", o.Label)
	}
	if o.Kind != nil {
		fmt.Fprintf(&b, "\n\n%s", o.Kind.Doc)
	}
	if sol == nil || res.Model == nil || o.Index < 0 || o.Index >= len(sol.Units) {
		b.WriteString("\n\nnot solved")
		return b.String()
	}
	u := &sol.Units[o.Index]
	disp := display(res)
	b.WriteString("\n\n| balance | in | out |\n|---|---:|---:|\n")
	mass, energy := &model.ResultSpec{Dim: units.MassFlow}, &model.ResultSpec{Dim: units.Power}
	fmt.Fprintf(&b, "| mass | %s | %s |\n", show(disp, mass, u.MassIn), show(disp, mass, u.MassOut))
	fmt.Fprintf(&b, "| energy | %s | %s |\n", show(disp, energy, u.EnergyIn), show(disp, energy, u.EnergyOut))
	sub := model.Subject{Kind: model.UnitSubject, Index: o.Index}
	rec := reconcile.Of(sol)
	for _, r := range res.Model.Results(sub) {
		if v, _, _ := sol.Value(res.Model, sub, r.Name); !math.IsNaN(v) {
			val := show(disp, &r, v)
			if half := rec.U(sub, r.Name); half > 0 {
				val = showU(disp, &r, v, half)
			}
			fmt.Fprintf(&b, "\n%s %s", r.Name, val)
		}
	}
	// A closure is known only for a balance that was redundant: it checks the givens.
	if !math.IsNaN(u.MassClosure) {
		fmt.Fprintf(&b, "\nmass balance closes within %s%%", units.Format(100*u.MassClosure, 3))
	}
	if !math.IsNaN(u.EnergyClosure) {
		fmt.Fprintf(&b, "\nenergy balance closes within %s%%", units.Format(100*u.EnergyClosure, 3))
	}
	return b.String()
}

// onSpelling reports whether byte offset off lies on a unit spelling.
func onSpelling(toks []lang.Token, off int) bool {
	t := tokenAt(toks, off)
	return t >= 0 && toks[t].Kind == lang.SpellingToken
}

// mdCell keeps a table cell on one line and its pipes from splitting it.
func mdCell(s string) string {
	s = strings.ReplaceAll(s, "\n", " ")
	return strings.ReplaceAll(s, "|", `\|`)
}
