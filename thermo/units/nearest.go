package units

import "unicode"

// Nearest returns the candidate closest to word by Damerau-Levenshtein distance (the optimal
// string alignment form: insert, delete, substitute, swap two neighbours), ignoring letter case.
// ok is false when even the closest is too far to be a useful suggestion: a one-letter word must
// match up to case, words of 2-5 letters may be one edit away, longer ones one edit per three
// letters (at most three). Ties go to the smaller case-sensitive distance, then to the earlier
// candidate, so callers list preferred spellings first.
func Nearest(word string, candidates []string) (string, bool) {
	cs := make([]candidate, len(candidates))
	for i, c := range candidates {
		cs[i] = newCandidate(c)
	}
	return nearest(word, cs)
}

// candidate caches a spelling's runes so that Lookup's error path does not redo them.
type candidate struct {
	s            string
	runes, lower []rune
}

func newCandidate(s string) candidate {
	r := []rune(s)
	return candidate{s, r, lowerRunes(r)}
}

func nearest(word string, candidates []candidate) (string, bool) {
	w := []rune(word)
	limit := len(w) / 3
	switch {
	case len(w) <= 1:
		limit = 0
	case limit < 1:
		limit = 1
	case limit > 3:
		limit = 3
	}
	wl := lowerRunes(w)
	var rows [3][]int
	best, bestCI, bestCS := "", limit+1, 0
	for _, c := range candidates {
		if abs(len(c.runes)-len(w)) > limit {
			continue // the length gap alone costs more edits than allowed
		}
		ci := osaDistance(wl, c.lower, &rows)
		if ci > limit || ci > bestCI {
			continue
		}
		cs := osaDistance(w, c.runes, &rows)
		if ci < bestCI || cs < bestCS {
			best, bestCI, bestCS = c.s, ci, cs
		}
	}
	if bestCI > limit {
		return "", false
	}
	return best, true
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

func lowerRunes(r []rune) []rune {
	out := make([]rune, len(r))
	for i, c := range r {
		out[i] = unicode.ToLower(c)
	}
	return out
}

// osaDistance is the optimal string alignment distance: Levenshtein's edits plus Damerau's (1964)
// transposition of adjacent letters, without editing a substring twice. Three rolling rows.
// rows is scratch space reused between calls.
func osaDistance(a, b []rune, rows *[3][]int) int {
	if len(a) == 0 {
		return len(b)
	}
	if len(b) == 0 {
		return len(a)
	}
	for k := range rows {
		if cap(rows[k]) < len(b)+1 {
			rows[k] = make([]int, len(b)+1)
		}
		rows[k] = rows[k][:len(b)+1]
	}
	prev2, prev, cur := rows[0], rows[1], rows[2]
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			d := min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				d = min(d, prev2[j-2]+1)
			}
			cur[j] = d
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(b)]
}
