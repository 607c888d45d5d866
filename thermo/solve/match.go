package solve

// matcher completes the matching of one class of equations (givens, then unit equations) after
// the cheap pass, in two stages with one result and a proven bound:
//
//   - Augmenting paths by depth-first search from each unmatched equation in turn, its unknowns
//     tried in the order the equation lists them (Kuhn 1955). The order is what makes the
//     matching read well: an equation fixes the unknown it names first unless another equation
//     needs it, so a missing value is reported as the pressure or flow a file would give, not as
//     whichever unknown a search happened to end on. The plain search is O(V E): each search may
//     walk the whole flowsheet upstream of it. Here an equation from which no augmenting path
//     leads is marked dead for good (an augmenting path never passes next to such an equation,
//     so flipping it cannot revive one, and the free unknowns only grow fewer). Which equations
//     are dead is found within the search itself, as Tarjan finds strongly connected components:
//     an equation whose search failed without leaning on one still open below it on the stack is
//     dead, with everything that leaned on it. Skipping dead equations finds exactly the paths
//     the plain search finds; on flowsheets every equation is searched about once.
//   - Should the searches pass a budget linear in the size of the system, the equations still
//     unmatched go to Hopcroft and Karp's algorithm (SIAM J. Comput. 2(4), 1973): phases of
//     vertex-disjoint shortest augmenting paths, O(E sqrt(V)) for E equation-unknown incidences.
//     The matching is as large, though a different one may be chosen.
//
// Augmenting never unmatches an equation, only changes the unknown it fixes: a class matched
// before keeps every equation it matched.
type matcher struct {
	st     *structure
	budget int // steps the depth-first searches may take before Hopcroft-Karp takes over

	// Depth-first search.
	dead  []bool
	seen  []int32 // search stamp of the last search that entered an equation
	index []int32 // order of entry within the search
	low   []int32 // least index of an open equation the equation's search leaned on
	open  []bool  // entered and not yet found dead in this search (Tarjan's stack)
	call  []frame
	tstk  []int
	stamp int32

	// Hopcroft-Karp.
	dist  []int32 // BFS layer of an equation in the current phase; unreached (or used) is -1
	next  []int32 // per equation: how many of its unknowns the phase has tried
	queue []int
	live  []int
}

// searchBudget is the depth-first searches' budget per equation, unknown and incidence of the
// system. Flowsheets need a few; a variable so that tests can send everything to Hopcroft-Karp.
var searchBudget = 32

type frame struct {
	e int
	k int32 // unknowns of e tried so far
}

func newMatcher(st *structure, ne, nv int) *matcher {
	m := &matcher{st: st, budget: searchBudget*(len(st.eqVar)+ne+nv) + 1024,
		dead: make([]bool, ne), seen: make([]int32, ne), index: make([]int32, ne), low: make([]int32, ne), open: make([]bool, ne),
		dist: make([]int32, ne), next: make([]int32, ne)}
	for e := range m.dist {
		m.dist[e] = -1
	}
	return m
}

// tick counts one step and says whether the time limit has passed.
func (st *structure) tick() bool {
	st.steps++
	return st.steps%checkEvery == 0 && st.ctx.Err() != nil
}

// match augments the matching from the unmatched equations free, in index order.
func (m *matcher) match(free []int) error {
	for k, e := range free {
		found, err := m.search(e)
		if err != nil {
			return err
		}
		if !found && !m.dead[e] { // the budget is spent: a finished search marks its root dead
			return m.hopcroftKarp(free[k:])
		}
	}
	return nil
}

// search looks for an augmenting path from the unmatched equation root and flips it when found.
// It stops, with nothing flipped, when the time limit passes or the budget is spent; match then
// hands root on.
func (m *matcher) search(root int) (bool, error) {
	st := m.st
	m.stamp++
	if m.stamp <= 0 { // wrapped: old stamps could collide
		clear(m.seen)
		m.stamp = 1
	}
	n := int32(0)
	enter := func(e int) {
		m.seen[e], m.index[e], m.low[e], m.open[e] = m.stamp, n, n, true
		n++
		m.call = append(m.call, frame{e: e})
		m.tstk = append(m.tstk, e)
	}
	defer func() {
		for _, e := range m.tstk {
			m.open[e] = false
		}
		m.call, m.tstk = m.call[:0], m.tstk[:0]
	}()
	enter(root)
	for len(m.call) > 0 {
		fr := &m.call[len(m.call)-1]
		e := fr.e
		vars := st.vars(e)
		if int(fr.k) < len(vars) {
			if st.tick() {
				return false, st.ctx.Err()
			}
			if st.steps > m.budget {
				return false, nil
			}
			v := vars[fr.k]
			fr.k++
			f := st.matchVar[v]
			switch {
			case f < 0:
				// Flip the path: each equation on it takes the unknown it was trying.
				for _, g := range m.call {
					w := st.vars(g.e)[g.k-1]
					st.matchVar[w], st.matchEq[g.e] = g.e, int(w)
				}
				return true, nil
			case m.dead[f]:
			case m.seen[f] == m.stamp:
				if m.open[f] {
					m.low[e] = min(m.low[e], m.index[f])
				}
			default:
				enter(f)
			}
			continue
		}
		// Every unknown of e tried: no path through it now.
		m.call = m.call[:len(m.call)-1]
		if m.low[e] == m.index[e] {
			for {
				g := m.tstk[len(m.tstk)-1]
				m.tstk = m.tstk[:len(m.tstk)-1]
				m.open[g], m.dead[g] = false, true
				if g == e {
					break
				}
			}
		}
		if len(m.call) > 0 {
			p := m.call[len(m.call)-1].e
			m.low[p] = min(m.low[p], m.low[e])
		}
	}
	return false, nil
}

// hopcroftKarp augments the matching from the unmatched equations free until no augmenting path
// is left.
func (m *matcher) hopcroftKarp(free []int) error {
	st := m.st
	m.live = m.live[:0]
	for _, e := range free {
		if !m.dead[e] {
			m.live = append(m.live, e)
		}
	}
	defer func() {
		for _, e := range m.queue {
			m.dist[e] = -1
		}
		m.queue = m.queue[:0]
	}()
	for len(m.live) > 0 {
		if err := st.ctx.Err(); err != nil {
			return err
		}
		// Layers: unmatched equations at 0; the equation that fixes an unknown one layer past
		// the equation that reaches it. Stop at the first layer that reaches a free unknown.
		for _, e := range m.queue {
			m.dist[e] = -1
		}
		m.queue = m.queue[:0]
		for _, e := range m.live {
			m.dist[e], m.next[e] = 0, 0
			m.queue = append(m.queue, e)
		}
		last := int32(-1)
		for k := 0; k < len(m.queue); k++ {
			e := m.queue[k]
			d := m.dist[e]
			if last >= 0 && d >= last {
				break
			}
			for _, v := range st.vars(e) {
				if st.tick() {
					return st.ctx.Err()
				}
				f := st.matchVar[v]
				if f < 0 {
					last = d
				} else if m.dist[f] < 0 && !m.dead[f] {
					m.dist[f], m.next[f] = d+1, 0
					m.queue = append(m.queue, f)
				}
			}
		}
		if last < 0 {
			return nil
		}
		// One depth-first search per free equation along the layers; each equation and edge
		// is passed at most once in the phase (next keeps where an equation's search stood, and
		// an equation that leads nowhere, or lies on a path found, leaves the layers).
		kept := m.live[:0]
		for _, root := range m.live {
			ok, err := m.layered(root, last)
			if err != nil {
				return err
			}
			if !ok {
				kept = append(kept, root)
			}
		}
		if len(kept) == len(m.live) {
			return nil
		}
		m.live = kept
	}
	return nil
}

// layered looks for a shortest augmenting path from root along the phase's layers, iteratively
// (a path through a chain of 100,000 units is as deep), and flips it when found.
func (m *matcher) layered(root int, last int32) (bool, error) {
	st := m.st
	if m.dist[root] != 0 {
		return false, nil
	}
	m.call = append(m.call[:0], frame{e: root})
	defer func() { m.call = m.call[:0] }()
	for len(m.call) > 0 {
		fr := &m.call[len(m.call)-1]
		e := fr.e
		vars := st.vars(e)
		if int(m.next[e]) >= len(vars) {
			m.dist[e] = -1
			m.call = m.call[:len(m.call)-1]
			continue
		}
		if st.tick() {
			return false, st.ctx.Err()
		}
		v := vars[m.next[e]]
		f := st.matchVar[v]
		if f < 0 && m.dist[e] == last {
			for _, g := range m.call {
				w := st.vars(g.e)[m.next[g.e]]
				st.matchVar[w], st.matchEq[g.e] = g.e, int(w)
				m.dist[g.e] = -1 // on a path now: no other path of this phase may pass it
			}
			return true, nil
		}
		if f >= 0 && m.dist[e] < last && m.dist[f] == m.dist[e]+1 {
			m.call = append(m.call, frame{e: f})
			continue
		}
		m.next[e]++
	}
	return false, nil
}
