package solve

import "context"

// structure is the matching of equations to unknowns and the order of the blocks it implies.
type structure struct {
	matchEq  []int   // equation -> unknown it determines, or -1 (left over: over-specified)
	matchVar []int   // unknown -> equation that determines it, or -1 (under-specified)
	blocks   [][]int // strongly connected groups of matched equations, in solving order
	graph
	// steps counts the edges the analysis scanned (matching, ordering and the searches behind
	// the diagnostics): the measure of its work that the scaling tests hold linear.
	steps int
	ctx   context.Context
}

// graph is the incidence of equations and unknowns in both directions, each as one array in
// compressed rows: the searches of the analysis pass over it many times, and reading it from
// the Equations themselves (large, each with its own slice) would miss the cache at every step.
type graph struct {
	eqStart, eqVar  []int32 // unknowns of equation e: eqVar[eqStart[e]:eqStart[e+1]], as Equation.Vars
	varStart, varEq []int32 // equations touching unknown v, in index order
	given, mass     []bool  // equation kinds the analysis asks about; given: matched first (firstPass)
}

func (g *graph) vars(e int) []int32 { return g.eqVar[g.eqStart[e]:g.eqStart[e+1]] }
func (g *graph) eqs(v int) []int32  { return g.varEq[g.varStart[v]:g.varStart[v+1]] }

func newGraph(sys *System) graph { return newGraphOf(sys, nil) }

// newGraphOf is the graph of sys restricted to the unknowns keep accepts (all when nil): an
// equation's row lists its kept unknowns in the order of its Vars.
func newGraphOf(sys *System, keep func(v int) bool) graph {
	nv, ne := len(sys.Vars), len(sys.Eqs)
	g := graph{eqStart: make([]int32, ne+1), varStart: make([]int32, nv+1), given: make([]bool, ne), mass: make([]bool, ne)}
	n := 0
	for e := range sys.Eqs {
		n += len(sys.Eqs[e].Vars)
	}
	g.eqVar = make([]int32, 0, n)
	for e := range sys.Eqs {
		eq := &sys.Eqs[e]
		g.given[e], g.mass[e] = firstPass(eq.Kind), eq.Kind == EqMass
		for _, v := range eq.Vars {
			if keep != nil && !keep(v) {
				continue
			}
			g.eqVar = append(g.eqVar, int32(v))
			g.varStart[v+1]++
		}
		g.eqStart[e+1] = int32(len(g.eqVar))
	}
	for v := range nv {
		g.varStart[v+1] += g.varStart[v]
	}
	g.varEq = make([]int32, len(g.eqVar))
	fill := make([]int32, nv)
	copy(fill, g.varStart)
	for e := range ne {
		for _, v := range g.vars(e) {
			g.varEq[fill[v]] = int32(e)
			fill[v]++
		}
	}
	return g
}

// newStructure is an empty matching over g.
func newStructure(ctx context.Context, g graph, ne, nv int) *structure {
	st := &structure{matchEq: make([]int, ne), matchVar: make([]int, nv), graph: g, ctx: ctx}
	for i := range st.matchEq {
		st.matchEq[i] = -1
	}
	for i := range st.matchVar {
		st.matchVar[i] = -1
	}
	st.steps += 2 * len(st.eqVar)
	return st
}

// matchClasses matches the equations class by class, class(e) from 0 to n-1 (-1: left out):
// within a class, a cheap pass (an equation takes the first free unknown it lists, which fixes
// nearly everything in a flowsheet) and then the augmenting searches of matcher, in equation
// order. Augmenting never unmatches an equation, so a class keeps every equation it matched.
func (st *structure) matchClasses(n int, class func(e int) int) error {
	ne, nv := len(st.matchEq), len(st.matchVar)
	m := newMatcher(st, ne, nv)
	var free []int
	for c := range n {
		free = free[:0]
		for e := range ne {
			if class(e) != c {
				continue
			}
			for _, v := range st.vars(e) {
				st.steps++
				if st.matchVar[v] < 0 {
					st.matchVar[v], st.matchEq[e] = e, int(v)
					break
				}
			}
			if st.matchEq[e] < 0 {
				free = append(free, e)
			}
		}
		if err := m.match(free); err != nil {
			return err
		}
	}
	return nil
}

// checkEvery is how many steps the analysis takes between looks at the time limit.
const checkEvery = 1 << 14

// analyse matches equations to unknowns, givens before unit equations so that a redundant
// balance rather than a given is left over (see matcher), then orders the matched equations into
// blocks (Tarjan 1972, strongly connected components of "equation e needs the unknown that
// equation f determines"). It returns ctx's error when the time limit cuts the analysis short.
func analyse(ctx context.Context, sys *System) (*structure, error) {
	nv, ne := len(sys.Vars), len(sys.Eqs)
	st := newStructure(ctx, newGraph(sys), ne, nv)
	skip := st.loopRedundant(nv)
	class := func(e int) int {
		switch {
		case skip[e]:
			return -1
		case st.given[e]:
			return 0
		}
		return 1
	}
	if err := st.matchClasses(2, class); err != nil {
		return st, err
	}
	st.blocks = st.order()
	if err := ctx.Err(); err != nil {
		return st, err
	}
	return st, nil
}

// firstPass reports the equations the matching takes before the units' equations: givens, and
// the pressure-drop defaults that build kept (see pressureDefaults).
func firstPass(k EqKind) bool { return k == EqGiven || k == EqDefault }

// order runs Tarjan's algorithm iteratively (chains of 100,000 units would otherwise nest as
// deep). Tarjan emits a component only after every component it reaches, which is exactly the
// order in which they can be solved. It stops early, with the blocks found so far, when the
// time limit passes; analyse then reports the limit.
func (st *structure) order() [][]int {
	ne := len(st.matchEq)
	matched := 0
	for _, v := range st.matchEq {
		if v >= 0 {
			matched++
		}
	}
	index := make([]int32, ne)
	low := make([]int32, ne)
	onStack := make([]bool, ne)
	for i := range index {
		index[i] = -1
	}
	var stack []int
	// Blocks are sub-slices of one array: each matched equation lands in exactly one block.
	blocks := make([][]int, 0, matched)
	members := make([]int, 0, matched)
	next := int32(0)
	var call []frame
	for root := 0; root < ne; root++ {
		if st.matchEq[root] < 0 || index[root] >= 0 {
			continue
		}
		call = append(call[:0], frame{e: root})
		index[root], low[root] = next, next
		next++
		stack = append(stack, root)
		onStack[root] = true
		for len(call) > 0 {
			f := &call[len(call)-1]
			if vars := st.vars(f.e); int(f.k) < len(vars) {
				if st.tick() {
					return blocks
				}
				v := int(vars[f.k]) // the k-th dependency of e: the equation that fixes v
				f.k++
				w := st.matchVar[v]
				if v == st.matchEq[f.e] || w < 0 {
					continue
				}
				if index[w] < 0 {
					index[w], low[w] = next, next
					next++
					stack = append(stack, w)
					onStack[w] = true
					call = append(call, frame{e: w})
				} else if onStack[w] {
					low[f.e] = min(low[f.e], index[w])
				}
				continue
			}
			e := f.e
			call = call[:len(call)-1]
			if len(call) > 0 {
				p := call[len(call)-1].e
				low[p] = min(low[p], low[e])
			}
			if low[e] == index[e] {
				start := len(members)
				for {
					w := stack[len(stack)-1]
					stack = stack[:len(stack)-1]
					onStack[w] = false
					members = append(members, w)
					if w == e {
						break
					}
				}
				blocks = append(blocks, members[start:len(members):len(members)])
			}
		}
	}
	return blocks
}

// underdetermined returns the unknowns reachable from the unmatched unknown u by alternating
// paths (u, an equation touching it, the unknown that equation determines, ...), nearest first:
// giving any one of them frees the matching to fix u. In a large plant that may be most of it,
// for each of many missing values: the search stops at the maxReach nearest, and whole says
// whether it saw them all.
func (st *structure) underdetermined(sys *System, u int, mark []int, stamp int) (reach []int, whole bool) {
	queue := []int{u}
	mark[u] = stamp
	for k := 0; k < len(queue); k++ {
		v := queue[k]
		for _, e := range st.eqs(v) {
			st.steps++
			w := st.matchEq[e]
			if w >= 0 && mark[w] != stamp {
				if len(queue) == maxReach {
					return queue, false
				}
				mark[w] = stamp
				queue = append(queue, w)
			}
		}
	}
	return queue, true
}

// maxReach bounds the unknowns an under-specified group offers: far more than a message names.
const maxReach = 256

// determining returns the givens that fix the unknowns of equation e through the matching:
// the other side of a conflict.
func (st *structure) determining(sys *System, e int) []int {
	seenE := map[int]bool{e: true}
	queue := []int{e}
	var givens []int
	for k := 0; k < len(queue) && len(givens) < 8; k++ {
		for _, v := range st.vars(queue[k]) {
			st.steps++
			f := st.matchVar[v]
			if f < 0 || seenE[f] {
				continue
			}
			seenE[f] = true
			queue = append(queue, f)
			if st.given[f] && sys.Eqs[f].Kind == EqGiven {
				givens = append(givens, f)
			}
		}
	}
	return givens
}

// loopRedundant marks one mass balance of every closed loop. Mass balances are linear in the
// flows: within a group of balances joined by shared streams, where every stream is both made
// by one balance of the group and taken by another (a closed cycle, no feed or product), the
// balances sum to zero whatever the flows, so one of them says nothing. The matching cannot see
// this: it would count that balance on to fix a flow and leave a singular block. Left out of the
// matching, the balance is checked after solving like any other redundant one.
func (g *graph) loopRedundant(nv int) []bool {
	ne := len(g.mass)
	skip := make([]bool, ne)
	parent := make([]int32, ne) // union-find over mass balances, by equation index
	for e := range parent {
		parent[e] = int32(e)
	}
	find := func(e int32) int32 {
		for parent[e] != e {
			parent[e] = parent[parent[e]]
			e = parent[e]
		}
		return e
	}
	// For each flow unknown: how many mass balances it appears in, and the first two.
	count := make([]int32, nv)
	first := make([]int32, nv)
	second := make([]int32, nv)
	for e := range ne {
		if !g.mass[e] {
			continue
		}
		for _, v := range g.vars(e) {
			switch count[v] {
			case 0:
				first[v] = int32(e)
			case 1:
				second[v] = int32(e)
			}
			count[v]++
		}
	}
	for v := range count {
		if count[v] == 2 {
			if a, b := find(first[v]), find(second[v]); a != b {
				parent[a] = b
			}
		}
	}
	open := make([]bool, ne) // by root: the group has a stream with one end outside it
	for v := range count {
		if count[v] != 0 && count[v] != 2 {
			open[find(first[v])] = true
		}
	}
	last := make([]int32, ne) // by root: the last balance of the group, the one left out
	for e := range last {
		last[e] = -1
	}
	for e := range ne {
		if g.mass[e] {
			last[find(int32(e))] = int32(e)
		}
	}
	for root, e := range last {
		if e >= 0 && !open[root] {
			skip[e] = true
		}
	}
	return skip
}
