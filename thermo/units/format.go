package units

import (
	"math"
	"strconv"
	"strings"
)

// Format writes v with sig significant figures (clamped to 1..17), keeping trailing zeros because
// they carry the precision. Magnitudes from 1e-4 up to 1e9 print without an exponent; others as
// 1.23e-5 or 4.56e12. NaN and infinities print as "n/a", never as a number.
func Format(v float64, sig int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "n/a"
	}
	sig = max(1, min(sig, 17))
	if v == 0 {
		return "0"
	}
	// Round once in exponent form; the exponent of the rounded value decides the layout
	// (9.9996 at 4 figures is 10.00, not 9.9996).
	e := strconv.FormatFloat(v, 'e', sig-1, 64)
	k := strings.IndexByte(e, 'e')
	exp, _ := strconv.Atoi(e[k+1:])
	if exp >= -4 && exp < 9 {
		r, _ := strconv.ParseFloat(e, 64)
		return strconv.FormatFloat(r, 'f', max(0, sig-1-exp), 64)
	}
	return e[:k] + "e" + strconv.Itoa(exp)
}
