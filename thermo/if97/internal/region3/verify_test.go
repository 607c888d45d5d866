package region3

import (
	"math"
	"testing"
)

// sr5 are the verification values of IAPWS SR5-05(2016) for v(p,T), two per
// subregion (3a..3t in the release's Sec. 3 verification table, 3u..3z in its
// Sec. 4 table), printed to 10 digits. From memory; each is also recomputed
// with python3-iapws in TestVerificationIapws.
var sr5 = []struct {
	x    byte
	T, p float64
	v    float64
}{
	{'a', 630, 50, 1.470853100e-3}, {'a', 670, 80, 1.503831359e-3},
	{'b', 710, 50, 2.204728587e-3}, {'b', 750, 80, 1.973692940e-3},
	{'c', 630, 20, 1.761696406e-3}, {'c', 650, 30, 1.819560617e-3},
	{'d', 656, 26, 2.245587720e-3}, {'d', 670, 30, 2.506897702e-3},
	{'e', 661, 26, 2.970225962e-3}, {'e', 675, 30, 3.004627086e-3},
	{'f', 671, 26, 5.019029401e-3}, {'f', 690, 30, 4.656470142e-3},
	{'g', 649, 23.6, 2.163198378e-3}, {'g', 650, 24, 2.166044161e-3},
	{'h', 652, 23.6, 2.651081407e-3}, {'h', 654, 24, 2.967802335e-3},
	{'i', 653, 23.6, 3.273916816e-3}, {'i', 655, 24, 3.550329864e-3},
	{'j', 655, 23.5, 4.545001142e-3}, {'j', 660, 24, 5.100267704e-3},
	{'k', 660, 23, 6.109525997e-3}, {'k', 670, 24, 6.427325645e-3},
	{'l', 646, 22.6, 2.117860851e-3}, {'l', 646, 23, 2.062374674e-3},
	{'m', 648.6, 22.6, 2.533063780e-3}, {'m', 649.3, 22.8, 2.572971781e-3},
	{'n', 649, 22.6, 2.923432711e-3}, {'n', 649.7, 22.8, 2.913311494e-3},
	{'o', 649.1, 22.6, 3.131208996e-3}, {'o', 649.9, 22.8, 3.221160278e-3},
	{'p', 649.4, 22.6, 3.715596186e-3}, {'p', 650.2, 22.8, 3.664754790e-3},
	{'q', 640, 21.1, 1.970999272e-3}, {'q', 643, 21.8, 2.043919161e-3},
	{'r', 644, 21.1, 5.251009921e-3}, {'r', 648, 21.8, 5.256844741e-3},
	{'s', 635, 19.1, 1.932829079e-3}, {'s', 638, 20, 1.985387227e-3},
	{'t', 626, 17, 8.483262001e-3}, {'t', 640, 20, 6.227528101e-3},
	{'u', 644.6, 21.5, 2.268366647e-3}, {'u', 646.1, 22, 2.296350553e-3},
	{'v', 648.6, 22.5, 2.832373260e-3}, {'v', 647.9, 22.3, 2.811424405e-3},
	{'w', 647.5, 22.15, 3.694032281e-3}, {'w', 648.1, 22.3, 3.622226305e-3},
	{'x', 648, 22.11, 4.528072649e-3}, {'x', 649, 22.3, 4.556905799e-3},
	{'y', 646.84, 22, 2.698354719e-3}, {'y', 647.05, 22.064, 2.717655648e-3},
	{'z', 646.89, 22, 3.798732962e-3}, {'z', 647.15, 22.064, 3.701940009e-3},
}

// sr3 are verification values of IAPWS SR3-03(2014) (T and v of subregions
// 3a, 3b from (p,h) and (p,s), Eqs. 1-9) and SR4-04(2014) (p from (h,s)),
// printed to 10 digits. From memory; also recomputed with python3-iapws.
var sr3 = []struct {
	src  string
	f    string // py function name of TestVerificationIapws
	a, b float64
	want float64
}{
	{"SR3-03 Eq. 1", "h3ab", 25, 0, 2.095936454e3},
	{"SR3-03 Eq. 2", "tph", 20, 1700, 629.3083892}, {"SR3-03 Eq. 2", "tph", 50, 2000, 690.5718338},
	{"SR3-03 Eq. 2", "tph", 100, 2100, 733.6163014},
	{"SR3-03 Eq. 3", "tph", 20, 2500, 641.8418053}, {"SR3-03 Eq. 3", "tph", 50, 2400, 735.1848618},
	{"SR3-03 Eq. 3", "tph", 100, 2700, 842.0460876},
	{"SR3-03 Eq. 4", "vph", 20, 1700, 1.749903962e-3}, {"SR3-03 Eq. 4", "vph", 50, 2000, 1.908139035e-3},
	{"SR3-03 Eq. 4", "vph", 100, 2100, 1.676229776e-3},
	{"SR3-03 Eq. 5", "vph", 20, 2500, 6.670547043e-3}, {"SR3-03 Eq. 5", "vph", 50, 2400, 2.801244590e-3},
	{"SR3-03 Eq. 5", "vph", 100, 2700, 2.404234998e-3},
	{"SR3-03 Eq. 6", "tps", 20, 3.8, 628.2959869}, {"SR3-03 Eq. 6", "tps", 50, 3.6, 629.7158726},
	{"SR3-03 Eq. 6", "tps", 100, 4.0, 705.6880237},
	{"SR3-03 Eq. 7", "tps", 20, 5.0, 640.1176443}, {"SR3-03 Eq. 7", "tps", 50, 4.5, 716.3687517},
	{"SR3-03 Eq. 7", "tps", 100, 5.0, 847.4332825},
	{"SR3-03 Eq. 8", "vps", 20, 3.8, 1.733791463e-3}, {"SR3-03 Eq. 8", "vps", 50, 3.6, 1.469680170e-3},
	{"SR3-03 Eq. 8", "vps", 100, 4.0, 1.555893131e-3},
	{"SR3-03 Eq. 9", "vps", 20, 5.0, 6.262101987e-3}, {"SR3-03 Eq. 9", "vps", 50, 4.5, 2.332634294e-3},
	{"SR3-03 Eq. 9", "vps", 100, 5.0, 2.449610757e-3},
	{"SR4-04 3a", "phs", 1700, 3.8, 25.55703246}, {"SR4-04 3a", "phs", 2000, 4.2, 45.40873468},
	{"SR4-04 3a", "phs", 2100, 4.3, 60.78123340},
	{"SR4-04 3b", "phs", 2600, 5.1, 34.34999263}, {"SR4-04 3b", "phs", 2400, 4.7, 63.63924887},
	{"SR4-04 3b", "phs", 2700, 5.0, 88.39043281},
}

func sr3Eval(f string, a, b float64) float64 {
	switch f {
	case "h3ab":
		return H3ab(a)
	case "tph":
		return TPH(a, b)
	case "vph":
		return VPH(a, b)
	case "tps":
		return TPS(a, b)
	case "vps":
		return VPS(a, b)
	case "phs":
		return PHS(a, b)
	}
	return nan()
}

// tenDigits is half a unit in the 10th significant digit of v.
func tenDigits(v float64) float64 {
	return 0.5 * math.Pow(10, math.Floor(math.Log10(math.Abs(v)))-9)
}

func TestSR5Verification(t *testing.T) {
	seen := map[byte]bool{}
	for _, c := range sr5 {
		seen[c.x] = true
		if x := subregion(c.p, c.T); x != c.x {
			t.Errorf("SR5-05 (from memory): (p=%g, T=%g) lies in 3%c, subregion() says 3%c", c.p, c.T, c.x, x)
		}
		if got := VPT(c.p, c.T); math.Abs(got-c.v) > 1.01*tenDigits(c.v) {
			t.Errorf("SR5-05 3%c (from memory): v(%g MPa, %g K) = %.10e, want %.9e", c.x, c.p, c.T, got, c.v)
		}
	}
	if len(seen) != 26 {
		t.Errorf("covers %d of 26 subregions", len(seen))
	}
}

func TestSR3SR4Verification(t *testing.T) {
	for _, c := range sr3 {
		if got := sr3Eval(c.f, c.a, c.b); math.Abs(got-c.want) > 1.01*tenDigits(c.want) {
			t.Errorf("%s (from memory): %s(%g, %g) = %.10g, want %.10g", c.src, c.f, c.a, c.b, got, c.want)
		}
	}
}

// TestVerificationIapws recomputes every verification value above with
// python3-iapws (same equations: agreement to 1e-12 relative expected).
func TestVerificationIapws(t *testing.T) {
	var calls []pyCall
	for _, c := range sr5 {
		calls = append(calls, pyCall{"vx", []any{c.p, c.T, string(c.x)}})
	}
	for _, c := range sr3 {
		calls = append(calls, pyCall{c.f, []any{c.a, c.b}})
	}
	res := runIapws(t, calls)
	check := func(what string, got float64, r []float64, printed float64, tol float64) {
		if len(r) != 1 {
			t.Errorf("%s: python3-iapws gave no answer", what)
			return
		}
		if d := relDiff(got, r[0]); d > tol {
			t.Errorf("%s: python3-iapws %.15g, here %.15g (rel %.2g)", what, r[0], got, d)
		}
		if math.Abs(r[0]-printed) > 1.01*tenDigits(printed) {
			t.Errorf("%s: python3-iapws %.15g disagrees with the recalled value %.10g", what, r[0], printed)
		}
	}
	for k, c := range sr5 {
		// At p = 22.064 MPa the 3y/3z sums cancel (pi-a ~ 0.009 with powers
		// down to -8, then e = 4): rounding differs by a few 1e-12.
		tol := 1e-12
		if c.x == 'y' || c.x == 'z' {
			tol = 5e-12
		}
		check("SR5-05 3"+string(c.x), vOf(c.x, c.p, c.T), res[k], c.v, tol)
	}
	for k, c := range sr3 {
		check(c.src+" "+c.f, sr3Eval(c.f, c.a, c.b), res[len(sr5)+k], c.want, 1e-12)
	}
}
