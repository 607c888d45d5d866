package units

import (
	"fmt"
	"slices"
	"strings"
	"unicode/utf8"
)

var (
	exact      map[string]uint8 // every listed spelling
	folded     map[string]uint8 // lower-cased spellings that name exactly one unit
	candidates []candidate      // suggestion order: canonical symbols, then the other spellings
	bySymbol   map[string]Unit
)

func init() {
	exact = make(map[string]uint8)
	folded = make(map[string]uint8)
	bySymbol = make(map[string]Unit)
	ambiguous := make(map[string]bool)
	addFold := func(s string, id uint8) {
		k := strings.ToLower(s)
		if prev, ok := folded[k]; ok && prev != id {
			ambiguous[k] = true
		}
		folded[k] = id
	}
	for i, d := range defs {
		id := uint8(i)
		bySymbol[d.sym] = Unit{id}
		for _, s := range append([]string{d.sym}, d.alt...) {
			if _, dup := exact[s]; dup {
				panic("units: duplicate spelling " + s) // a table bug; the tests catch it
			}
			exact[s] = id
			if !d.strict && utf8.RuneCountInString(s) >= 2 {
				addFold(s, id)
			}
		}
		if d.sym != "" {
			candidates = append(candidates, newCandidate(d.sym))
		}
	}
	for _, d := range defs {
		for _, a := range d.alt {
			candidates = append(candidates, newCandidate(a))
		}
	}
	for k := range ambiguous {
		delete(folded, k)
	}
}

// UnknownError reports a unit spelling that Lookup does not accept. Suggestion is the closest
// accepted spelling, or "" when none is close enough to help.
type UnknownError struct {
	Spelling, Suggestion string
}

func (e *UnknownError) Error() string {
	if e.Suggestion == "" {
		return fmt.Sprintf("unknown unit %q", e.Spelling)
	}
	return fmt.Sprintf("unknown unit %q; did you mean %q?", e.Spelling, e.Suggestion)
}

// Lookup finds the unit for a spelling. The empty spelling is the bare number. Listed spellings
// match exactly; other letter cases ("kpa", "KPA", "BTU/lb") are accepted unless the spelling is a
// single letter or its unit is marked strict (MPa, MW, MJ/kg, mbar: mega against milli). The
// error is always an *UnknownError.
func Lookup(spelling string) (Unit, error) {
	s := strings.TrimSpace(spelling)
	if id, ok := exact[s]; ok {
		return Unit{id}, nil
	}
	if id, ok := folded[strings.ToLower(s)]; ok {
		return Unit{id}, nil
	}
	sug, _ := nearest(s, candidates)
	return Unit{}, &UnknownError{Spelling: spelling, Suggestion: sug}
}

// Spellings returns every listed spelling of a dimension, sorted, for completion. Case variants
// are not listed, nor is the empty spelling of a bare number.
func Spellings(d Dim) []string {
	var out []string
	for _, u := range defs {
		if u.dim != d.Measure() {
			continue
		}
		if u.sym != "" {
			out = append(out, u.sym)
		}
		out = append(out, u.alt...)
	}
	slices.Sort(out)
	return out
}

// Symbols returns the canonical symbol of every unit of a dimension, in the table's order (SI
// first within a kind), for messages that list what is accepted. The bare number is left out.
func Symbols(d Dim) []Unit {
	var out []Unit
	for i, u := range defs {
		if u.dim == d.Measure() && u.sym != "" {
			out = append(out, Unit{uint8(i)})
		}
	}
	return out
}

// Alternatives returns the unit's other accepted spellings (bara, bar(a) for bar), in the table's
// order; letter-case variants are not listed.
func (u Unit) Alternatives() []string { return slices.Clone(u.def().alt) }
