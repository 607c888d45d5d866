package feature

// This file implements hover: the solved state of a stream, the balance of a unit, the solved
// tables of the whole file on its title, the SI value of a unit spelling and one line of help on
// keywords, kinds, roles, parameters and properties.

import (
	"context"
	"fmt"
	"math"
	"strings"

	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Hover returns the hover at byte offset off, or nil when there is nothing to say. A hover on a
// stream or unit waits (under ctx) for the snapshot's solution.
func Hover(ctx context.Context, snap *cache.Snapshot, off int) (*protocol.Hover, error) {
	syn := snap.Syntax()
	var text string
	var span model.Span
	if i := refAt(syn, off); i >= 0 && syn.Refs[i].Symbol >= 0 {
		r := syn.Refs[i]
		sym := &syn.Symbols[r.Symbol]
		sol, err := snap.Solution(ctx)
		if err != nil && ctx.Err() != nil {
			return nil, err
		}
		// A superseded snapshot has no solution; describe the symbol without values.
		span = r.Span
		if sym.Kind == cache.StreamSymbol {
			text = StreamHover(syn, sol, sym)
		} else {
			text = UnitHover(syn, sol, sym)
		}
	} else if t := tokenAt(syn, off); t >= 0 {
		tok := syn.Tokens[t]
		span = tok.Span
		if sp, ok := titleSpan(snap.Src(), syn, t); ok && syn.Model != nil {
			// The title stands for the whole file: its hover is the file's solved tables.
			tables, err := Tables(ctx, snap)
			if err != nil && ctx.Err() != nil {
				return nil, err
			}
			if err == nil {
				span, text = sp, tables
			}
		}
		if text == "" {
			text = tokenHover(snap, syn, t)
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

func tokenHover(snap *cache.Snapshot, syn *cache.Syntax, t int) string {
	tok := syn.Tokens[t]
	word := string(snap.Src()[tok.Span.Start:tok.Span.End])
	switch tok.Kind {
	case cache.KeywordToken:
		for _, k := range snap.Analyzer().Keywords() {
			if k.Name == word {
				return fmt.Sprintf("`%s`: %s", k.Name, k.Doc)
			}
		}
	case cache.KindToken:
		if k := model.Kinds[word]; k != nil {
			return fmt.Sprintf("`%s`: %s", k.Name, k.Doc)
		}
	case cache.RoleToken, cache.ParamToken:
		u := enclosingUnit(syn, tok.Span.Start)
		if u == nil {
			return ""
		}
		k := model.Kinds[u.UnitKind]
		if k == nil {
			return ""
		}
		if p := k.Port(word); p != nil && tok.Kind == cache.RoleToken {
			dir := "outlet"
			if p.Inlet {
				dir = "inlet"
			}
			return fmt.Sprintf("`%s` (%s port of a %s): %s", word, dir, k.Name, p.Doc)
		}
		if p := k.Param(word); p != nil {
			return fmt.Sprintf("`%s` (%s parameter of a %s): %s", word, p.Dim, k.Name, p.Doc)
		}
	case cache.PropToken:
		// After a unit's name (an expectation on a unit) the word is one of the unit's results.
		if t > 0 && syn.Tokens[t-1].Kind == cache.UnitToken {
			return resultHover(snap.Src(), syn, syn.Tokens[t-1].Span, word)
		}
		if doc := propDoc(word); doc != "" {
			return fmt.Sprintf("`%s`: %s", word, doc)
		}
	case cache.SpellingToken:
		return SpellingHover(snap.Src(), syn, t)
	}
	return ""
}

// resultHover describes what an expectation checks on the unit named at name: the result's entry
// in the kind catalogue.
func resultHover(src []byte, syn *cache.Syntax, name model.Span, word string) string {
	var k *model.Kind
	for _, s := range syn.Symbols {
		if s.Kind == cache.UnitSymbol && s.Name == string(src[name.Start:name.End]) {
			k = model.Kinds[s.UnitKind]
		}
	}
	if k == nil {
		return ""
	}
	if r := k.Result(word); r != nil {
		return fmt.Sprintf("`%s` (%s result of a %s): %s", word, r.Dim, k.Name, r.Doc)
	}
	return ""
}

// propDoc is the help on a stream property or result, from the catalogue.
func propDoc(name string) string {
	if r := model.StreamResult(name); r != nil {
		return r.Doc
	}
	return ""
}

// SpellingHover describes the unit spelling of token t: its dimension and, when a number stands
// before it, the value in SI base units.
func SpellingHover(src []byte, syn *cache.Syntax, t int) string {
	tok := syn.Tokens[t]
	spelling := string(src[tok.Span.Start:tok.Span.End])
	u, err := units.Lookup(spelling)
	if err != nil {
		return fmt.Sprintf("`%s`: %v", spelling, err)
	}
	var b strings.Builder
	fmt.Fprintf(&b, "`%s`: %s", spelling, u.Dim())
	if u.Symbol() != spelling {
		fmt.Fprintf(&b, ", written `%s` in canonical form", u.Symbol())
	}
	switch u.Reading() {
	case units.Gauge:
		fmt.Fprintf(&b, ", gauge (above a site atmosphere of %s Pa)", units.Format(syn.Atm, 6))
	case units.Vacuum:
		fmt.Fprintf(&b, ", vacuum (below a site atmosphere of %s Pa)", units.Format(syn.Atm, 6))
	case units.Difference:
		var rs []string
		for _, r := range u.Readings() {
			rs = append(rs, "`"+r.Symbol()+"`")
		}
		fmt.Fprintf(&b, ", a difference only (a pressure itself is %s)", strings.Join(rs, " or "))
	}
	base := units.Base(u.Dim()).Symbol()
	if t > 0 && syn.Tokens[t-1].Kind == cache.NumberToken {
		num := syn.Tokens[t-1].Span
		raw := string(src[num.Start:num.End])
		if v, _, err := units.ParseQuantity(raw); err == nil {
			si := u.ToSI(v, syn.Atm)
			fmt.Fprintf(&b, "\n\n%s %s = %s %s", raw, spelling, units.Format(si, 7), base)
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

// show writes an SI value in the display unit of its dimension; unknown values say so rather
// than print NaN.
func show(v float64, d units.Dim, sys units.System, atm float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "unknown"
	}
	return units.Display{System: sys, Atm: atm}.Show(d, v)
}

// StreamHover is the Markdown description of a stream: its solved state, each value with where it
// came from. sol may be nil (not solved: a newer version arrived, or the file did not lower).
func StreamHover(syn *cache.Syntax, sol *cache.Solution, sym *cache.Symbol) string {
	var b strings.Builder
	fmt.Fprintf(&b, "**stream** `%s`", sym.Name)
	if sym.Label != "" {
		fmt.Fprintf(&b, " %s", sym.Label)
	}
	if sol == nil || sym.Index < 0 || sym.Index >= len(sol.Streams) {
		b.WriteString("\n\nnot solved")
		return b.String()
	}
	st := &sol.Streams[sym.Index]
	b.WriteString("\n\n| | value | from |\n|---|---:|---|\n")
	for q := cache.Quantity(0); q < cache.NumQuantities; q++ {
		v := st.Values[q]
		val := show(v, q.Dim(), syn.Display, syn.Atm)
		if q == cache.QX && math.IsNaN(v) && st.Phase != "" {
			val = "none (single phase)"
		}
		fmt.Fprintf(&b, "| %s | %s | %s |\n", q, val, mdCell(st.Source[q]))
	}
	phase := st.Phase
	if phase == "" {
		phase = "unknown"
	}
	fmt.Fprintf(&b, "| phase | %s | |\n", mdCell(phase))
	return b.String()
}

// UnitHover is the Markdown description of a unit: its mass and energy balance, duty or power,
// and entropy generated.
func UnitHover(syn *cache.Syntax, sol *cache.Solution, sym *cache.Symbol) string {
	var b strings.Builder
	fmt.Fprintf(&b, "**%s** `%s`", sym.UnitKind, sym.Name)
	if sym.Label != "" {
		fmt.Fprintf(&b, " %s", sym.Label)
	}
	if k := model.Kinds[sym.UnitKind]; k != nil {
		fmt.Fprintf(&b, "\n\n%s", k.Doc)
	}
	if sol == nil || sym.Index < 0 || sym.Index >= len(sol.Units) {
		b.WriteString("\n\nnot solved")
		return b.String()
	}
	u := &sol.Units[sym.Index]
	sys, atm := syn.Display, syn.Atm
	b.WriteString("\n\n| balance | in | out |\n|---|---:|---:|\n")
	fmt.Fprintf(&b, "| mass | %s | %s |\n", show(u.MassIn, units.MassFlow, sys, atm), show(u.MassOut, units.MassFlow, sys, atm))
	fmt.Fprintf(&b, "| energy | %s | %s |\n", show(u.EnergyIn, units.Power, sys, atm), show(u.EnergyOut, units.Power, sys, atm))
	if !math.IsNaN(u.Duty) {
		fmt.Fprintf(&b, "\nduty %s", show(u.Duty, units.Power, sys, atm))
	}
	if !math.IsNaN(u.Power) {
		fmt.Fprintf(&b, "\npower %s", show(u.Power, units.Power, sys, atm))
	}
	if !math.IsNaN(u.Efficiency) {
		fmt.Fprintf(&b, "\nefficiency %s", show(u.Efficiency, units.Dimensionless, sys, atm))
	}
	if !math.IsNaN(u.Sgen) {
		fmt.Fprintf(&b, "\nentropy generated %s", show(u.Sgen, units.EntropyRate, sys, atm))
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

// mdCell keeps a table cell on one line and its pipes from splitting it.
func mdCell(s string) string {
	s = strings.ReplaceAll(s, "\n", " ")
	return strings.ReplaceAll(s, "|", `\|`)
}
