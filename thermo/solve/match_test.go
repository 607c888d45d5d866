package solve

import (
	"context"
	"math/rand/v2"
	"slices"
	"testing"
)

// plainMatching is the matching as first written (a cheap pass, then Kuhn's depth-first search
// for augmenting paths, recursive, from each unmatched equation in turn, givens first): the
// reference the faster search must reproduce exactly, equation for unknown.
func plainMatching(sys *System) (matchEq, matchVar []int) {
	g := newGraph(sys)
	skip := g.loopRedundant(len(sys.Vars))
	return plainClasses(sys, 2, func(e int) int {
		switch {
		case skip[e]:
			return -1
		case firstPass(sys.Eqs[e].Kind):
			return 0
		}
		return 1
	}, nil)
}

// plainClasses is the plain search class by class (class -1: left out), over the unknowns keep
// accepts (all when nil), as pressureDefaults first wrote it.
func plainClasses(sys *System, n int, class func(e int) int, keep func(v int) bool) (matchEq, matchVar []int) {
	matchEq, matchVar = make([]int, len(sys.Eqs)), make([]int, len(sys.Vars))
	for i := range matchEq {
		matchEq[i] = -1
	}
	for i := range matchVar {
		matchVar[i] = -1
	}
	ok := func(v int) bool { return keep == nil || keep(v) }
	seen := make([]int, len(sys.Vars))
	stamp := 0
	var try func(e int) bool
	try = func(e int) bool {
		for _, v := range sys.Eqs[e].Vars {
			if !ok(v) || seen[v] == stamp {
				continue
			}
			seen[v] = stamp
			if matchVar[v] < 0 || try(matchVar[v]) {
				matchVar[v], matchEq[e] = e, v
				return true
			}
		}
		return false
	}
	for c := range n {
		for e := range sys.Eqs {
			if class(e) != c {
				continue
			}
			for _, v := range sys.Eqs[e].Vars {
				if ok(v) && matchVar[v] < 0 {
					matchVar[v], matchEq[e] = e, v
					break
				}
			}
		}
		for e := range sys.Eqs {
			if matchEq[e] < 0 && class(e) == c {
				stamp++
				try(e)
			}
		}
	}
	return matchEq, matchVar
}

// TestMatchClassesAsPlainSearch: with three classes and a subset of the unknowns (the matching
// that decides the pressure-drop defaults), the matching is the plain search's too.
func TestMatchClassesAsPlainSearch(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	for trial := range 3000 {
		nv := 1 + r.IntN(40)
		sys := randomSystem(r, 1+r.IntN(2*nv), nv)
		classes := make([]int, len(sys.Eqs))
		for e := range classes {
			classes[e] = r.IntN(4) - 1
		}
		keep := func(v int) bool { return v%3 != 1 }
		class := func(e int) int { return classes[e] }
		wantEq, _ := plainClasses(sys, 3, class, keep)
		st := newStructure(context.Background(), newGraphOf(sys, keep), len(sys.Eqs), nv)
		if err := st.matchClasses(3, class); err != nil {
			t.Fatal(err)
		}
		checkMatching(t, sys, st)
		if !slices.Equal(wantEq, st.matchEq) {
			t.Fatalf("trial %d: %v, the plain search gives %v", trial, st.matchEq, wantEq)
		}
	}
}

// randomSystem is a structure only (no equations to evaluate): ne equations over nv unknowns,
// each touching 1 to 4 distinct unknowns, about a fifth of them givens of one unknown, some
// mass balances so that the closed-loop rule has something to find.
func randomSystem(r *rand.Rand, ne, nv int) *System {
	sys := &System{Vars: make([]Variable, nv), Eqs: make([]Equation, ne)}
	for e := range sys.Eqs {
		eq := &sys.Eqs[e]
		switch r.IntN(5) {
		case 0:
			eq.Kind = EqGiven
			eq.Vars = []int{r.IntN(nv)}
			continue
		case 1:
			eq.Kind = EqMass
		default:
			eq.Kind = EqEnergy
		}
		k := 1 + r.IntN(min(4, nv))
		for len(eq.Vars) < k {
			v := r.IntN(nv)
			if !contains(eq.Vars, v) {
				eq.Vars = append(eq.Vars, v)
			}
		}
	}
	return sys
}

// checkMatching fails unless the matching is consistent: each side names the other, and an
// equation determines an unknown it touches.
func checkMatching(t *testing.T, sys *System, st *structure) {
	t.Helper()
	for e, v := range st.matchEq {
		if v >= 0 && (st.matchVar[v] != e || !contains(sys.Eqs[e].Vars, v)) {
			t.Fatalf("equation %d matched to unknown %d, which is matched to %d (touches %v)", e, v, st.matchVar[v], sys.Eqs[e].Vars)
		}
	}
	for v, e := range st.matchVar {
		if e >= 0 && st.matchEq[e] != v {
			t.Fatalf("unknown %d matched to equation %d, which is matched to %d", v, e, st.matchEq[e])
		}
	}
}

func countMatched(sys *System, matchEq []int) (givens, all int) {
	for e, v := range matchEq {
		if v >= 0 {
			all++
			if sys.Eqs[e].Kind == EqGiven {
				givens++
			}
		}
	}
	return givens, all
}

// TestMatchingAsPlainSearch: the search that skips dead equations finds exactly the matching of
// the plain depth-first search, on random structures from sparse to dense, under- and
// over-determined.
func TestMatchingAsPlainSearch(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for trial := range 3000 {
		nv := 1 + r.IntN(40)
		ne := 1 + r.IntN(2*nv)
		sys := randomSystem(r, ne, nv)
		wantEq, wantVar := plainMatching(sys)
		st, err := analyse(context.Background(), sys)
		if err != nil {
			t.Fatal(err)
		}
		checkMatching(t, sys, st)
		for e := range wantEq {
			if st.matchEq[e] != wantEq[e] {
				t.Fatalf("trial %d: equation %d (touches %v) determines %d, the plain search says %d", trial, e, sys.Eqs[e].Vars, st.matchEq[e], wantEq[e])
			}
		}
		for v := range wantVar {
			if st.matchVar[v] != wantVar[v] {
				t.Fatalf("trial %d: unknown %d determined by %d, the plain search says %d", trial, v, st.matchVar[v], wantVar[v])
			}
		}
	}
}

// TestMatchingFallback: past its budget the search hands over to Hopcroft-Karp, whose matching
// is as large, class by class (as many givens matched, as many equations in all).
func TestMatchingFallback(t *testing.T) {
	defer func(b int) { searchBudget = b }(searchBudget)
	searchBudget = 0
	r := rand.New(rand.NewPCG(3, 4))
	for trial := range 3000 {
		nv := 1 + r.IntN(60)
		ne := 1 + r.IntN(2*nv)
		sys := randomSystem(r, ne, nv)
		wantEq, _ := plainMatching(sys)
		st, err := analyse(context.Background(), sys)
		if err != nil {
			t.Fatal(err)
		}
		checkMatching(t, sys, st)
		wg, wa := countMatched(sys, wantEq)
		g, a := countMatched(sys, st.matchEq)
		if g != wg || a != wa {
			t.Fatalf("trial %d: %d givens and %d equations matched, want %d and %d", trial, g, a, wg, wa)
		}
	}
}

// longChain is the worst case of the plain search in a flowsheet: n units in series, each with
// an outlet unknown x_(i+1) and a power p_i, an energy balance (x_(i+1), x_i, p_i) and an
// efficiency (x_(i+1), x_i). The cheap pass gives x_(i+1) to the balance and leaves the
// efficiency without an unknown; its search has to move the balance onto p_i, but tries x_i
// first, which leads up the whole chain before it. A given fixes x_0.
func longChain(n int) *System {
	x := func(i int) int { return i }
	p := func(i int) int { return n + 1 + i }
	sys := &System{Vars: make([]Variable, 2*n+1)}
	sys.Eqs = append(sys.Eqs, Equation{Kind: EqGiven, Vars: []int{x(0)}})
	for i := range n {
		sys.Eqs = append(sys.Eqs,
			Equation{Kind: EqEnergy, Vars: []int{x(i + 1), x(i), p(i)}},
			Equation{Kind: EqWork, Vars: []int{x(i + 1), x(i)}})
	}
	return sys
}

// TestMatchingLongChain: a chain of 100,000 units matches completely, without deep recursion,
// and in work linear in its length (the plain search takes work quadratic in it).
func TestMatchingLongChain(t *testing.T) {
	for _, n := range []int{1000, 100000} {
		sys := longChain(n)
		st, err := analyse(context.Background(), sys)
		if err != nil {
			t.Fatal(err)
		}
		checkMatching(t, sys, st)
		if _, all := countMatched(sys, st.matchEq); all != len(sys.Eqs) {
			t.Errorf("n=%d: %d of %d equations matched", n, all, len(sys.Eqs))
		}
		if st.steps > 20*len(sys.Eqs) {
			t.Errorf("n=%d: %d steps for %d equations", n, st.steps, len(sys.Eqs))
		}
		if n <= 1000 {
			if want, _ := plainMatching(sys); !slices.Equal(want, st.matchEq) {
				t.Errorf("n=%d: the matching differs from the plain search's", n)
			}
		}
	}
}

// TestAnalyseTimeLimit: the time limit cuts the structural analysis short.
func TestAnalyseTimeLimit(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := analyse(ctx, longChain(100000)); err == nil {
		t.Fatal("a cancelled analysis of 300,000 equations finished")
	}
}
