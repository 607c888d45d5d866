package report

import (
	"math"
	"strconv"
)

// axis maps values in display units to pixels, linearly or by decades.
type axis struct {
	lo, hi float64 // display units; both > 0 on a log axis
	log    bool
	p0, p1 float64 // pixels of lo and hi
	title  string
}

func (a *axis) px(v float64) float64 {
	if a.log {
		return a.p0 + (math.Log10(v)-math.Log10(a.lo))/(math.Log10(a.hi)-math.Log10(a.lo))*(a.p1-a.p0)
	}
	return a.p0 + (v-a.lo)/(a.hi-a.lo)*(a.p1-a.p0)
}

// inside reports whether v lies on the axis, with a little slack for rounding.
func (a *axis) inside(v float64) bool {
	if math.IsNaN(v) || (a.log && v <= 0) {
		return false
	}
	p := a.px(v)
	return p >= math.Min(a.p0, a.p1)-0.5 && p <= math.Max(a.p0, a.p1)+0.5
}

// niceStep is the 1, 2 or 5 times a power of ten nearest above span/n.
func niceStep(span float64, n int) float64 {
	raw := span / float64(n)
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, f := range []float64{1, 2, 2.5, 5, 10} {
		if f*mag >= raw*(1-1e-9) {
			return f * mag
		}
	}
	return 10 * mag
}

// fit widens [lo, hi] to whole steps of a readable tick spacing.
func (a *axis) fit(lo, hi float64) {
	if a.log {
		a.lo, a.hi = floor125(lo), ceil125(hi)
		return
	}
	if !(hi > lo) {
		hi = lo + 1
	}
	step := niceStep(hi-lo, 8)
	a.lo = math.Floor(lo/step+1e-9) * step
	a.hi = math.Ceil(hi/step-1e-9) * step
}

// floor125 and ceil125 round to the 1-2-5 sequence, the usual stops of a log scale.
func floor125(v float64) float64 {
	e := math.Floor(math.Log10(v))
	m := v / math.Pow(10, e)
	switch {
	case m >= 5:
		m = 5
	case m >= 2:
		m = 2
	default:
		m = 1
	}
	return roundSig(m*math.Pow(10, e), 12)
}

func ceil125(v float64) float64 {
	e := math.Floor(math.Log10(v))
	m := v / math.Pow(10, e)
	switch {
	case m <= 1+1e-12:
		m = 1
	case m <= 2:
		m = 2
	case m <= 5:
		m = 5
	default:
		m = 10
	}
	return roundSig(m*math.Pow(10, e), 12)
}

func roundSig(v float64, n int) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'e', n-1, 64), 64)
	return r
}

// ticks lists the labelled values: whole steps on a linear axis; decades, with 2 and 5 between
// them on short log axes.
func (a *axis) ticks() []float64 {
	var out []float64
	if a.log {
		decades := math.Log10(a.hi) - math.Log10(a.lo)
		mult := []float64{1}
		if decades <= 4.5 {
			mult = []float64{1, 2, 5}
		}
		for e := math.Floor(math.Log10(a.lo)); e <= math.Ceil(math.Log10(a.hi)); e++ {
			for _, m := range mult {
				v := roundSig(m*math.Pow(10, e), 12)
				if v >= a.lo*(1-1e-9) && v <= a.hi*(1+1e-9) {
					out = append(out, v)
				}
			}
		}
		return out
	}
	step := niceStep(a.hi-a.lo, 8)
	for k := 0; ; k++ {
		v := roundSig(a.lo+float64(k)*step, 12)
		if v > a.hi+step*1e-9 {
			break
		}
		out = append(out, v)
	}
	return out
}

// tickText writes a tick value with no more digits than it has.
func tickText(v float64) string {
	if v == 0 {
		return "0"
	}
	return strconv.FormatFloat(roundSig(v, 10), 'f', -1, 64)
}
