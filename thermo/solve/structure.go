package solve

import "context"

// structure is the matching of equations to unknowns and the order of the blocks it implies.
type structure struct {
	matchEq  []int   // equation -> unknown it determines, or -1 (left over: over-specified)
	matchVar []int   // unknown -> equation that determines it, or -1 (under-specified)
	varEqs   [][]int // unknown -> equations touching it
	blocks   [][]int // strongly connected groups of matched equations, in solving order
	// steps counts the edges the analysis scanned (matching, ordering and the searches behind
	// the diagnostics): the measure of its work that the scaling tests hold linear.
	steps int
	ctx   context.Context
}

// checkEvery is how many steps the analysis takes between looks at the time limit.
const checkEvery = 1 << 14

// analyse matches equations to unknowns, givens before unit equations so that a redundant
// balance rather than a given is left over (see matcher), then orders the matched equations into
// blocks (Tarjan 1972, strongly connected components of "equation e needs the unknown that
// equation f determines"). It returns ctx's error when the time limit cuts the analysis short.
func analyse(ctx context.Context, sys *System) (*structure, error) {
	nv, ne := len(sys.Vars), len(sys.Eqs)
	st := &structure{matchEq: make([]int, ne), matchVar: make([]int, nv), varEqs: make([][]int, nv), ctx: ctx}
	for i := range st.matchEq {
		st.matchEq[i] = -1
	}
	for i := range st.matchVar {
		st.matchVar[i] = -1
	}
	// varEqs as sub-slices of one array (counted, then filled): one allocation, not one per unknown.
	count := make([]int, nv+1)
	for e := range sys.Eqs {
		for _, v := range sys.Eqs[e].Vars {
			count[v+1]++
		}
	}
	for v := 0; v < nv; v++ {
		count[v+1] += count[v]
	}
	flat := make([]int, count[nv])
	for v := 0; v < nv; v++ {
		st.varEqs[v] = flat[count[v]:count[v]:count[v+1]]
	}
	for e := range sys.Eqs {
		for _, v := range sys.Eqs[e].Vars {
			st.varEqs[v] = append(st.varEqs[v], e)
		}
	}
	st.steps += 2 * len(flat)
	skip := loopRedundant(sys)
	m := newMatcher(st, sys, len(flat))
	var free []int
	for _, givens := range []bool{true, false} {
		free = free[:0]
		for e := range sys.Eqs { // cheap pass: a free unknown at hand
			if (sys.Eqs[e].Kind == EqGiven) != givens || skip[e] {
				continue
			}
			for _, v := range sys.Eqs[e].Vars {
				st.steps++
				if st.matchVar[v] < 0 {
					st.matchVar[v], st.matchEq[e] = e, v
					break
				}
			}
			if st.matchEq[e] < 0 {
				free = append(free, e)
			}
		}
		if err := m.match(free); err != nil {
			return st, err
		}
	}
	st.blocks = st.order(sys)
	if err := ctx.Err(); err != nil {
		return st, err
	}
	return st, nil
}

// order runs Tarjan's algorithm iteratively (chains of 100,000 units would otherwise nest as
// deep). Tarjan emits a component only after every component it reaches, which is exactly the
// order in which they can be solved. It stops early, with the blocks found so far, when the
// time limit passes; analyse then reports the limit.
func (st *structure) order(sys *System) [][]int {
	ne := len(sys.Eqs)
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
			if vars := sys.Eqs[f.e].Vars; int(f.k) < len(vars) {
				if st.tick() {
					return blocks
				}
				v := vars[f.k] // the k-th dependency of e: the equation that fixes v
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
		for _, e := range st.varEqs[v] {
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
		for _, v := range sys.Eqs[queue[k]].Vars {
			st.steps++
			f := st.matchVar[v]
			if f < 0 || seenE[f] {
				continue
			}
			seenE[f] = true
			queue = append(queue, f)
			if sys.Eqs[f].Kind == EqGiven {
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
func loopRedundant(sys *System) []bool {
	ne, nv := len(sys.Eqs), len(sys.Vars)
	skip := make([]bool, ne)
	parent := make([]int, ne) // union-find over mass balances, by equation index
	for e := range parent {
		parent[e] = e
	}
	find := func(e int) int {
		for parent[e] != e {
			parent[e] = parent[parent[e]]
			e = parent[e]
		}
		return e
	}
	// For each flow unknown: how many mass balances it appears in, and the first two.
	count := make([]int, nv)
	first := make([]int, nv)
	second := make([]int, nv)
	for e := range sys.Eqs {
		if sys.Eqs[e].Kind != EqMass {
			continue
		}
		for _, v := range sys.Eqs[e].Vars {
			switch count[v] {
			case 0:
				first[v] = e
			case 1:
				second[v] = e
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
	last := make([]int, ne) // by root: the last balance of the group, the one left out
	for e := range last {
		last[e] = -1
	}
	for e := range sys.Eqs {
		if sys.Eqs[e].Kind == EqMass {
			last[find(e)] = e
		}
	}
	for root, e := range last {
		if e >= 0 && !open[root] {
			skip[e] = true
		}
	}
	return skip
}
