package units

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"
)

func near(got, want, rel float64) bool {
	if want == 0 {
		return math.Abs(got) <= rel
	}
	return math.Abs(got-want) <= rel*math.Abs(want)
}

func mustLookup(t testing.TB, s string) Unit {
	t.Helper()
	u, err := Lookup(s)
	if err != nil {
		t.Fatalf("Lookup(%q): %v", s, err)
	}
	return u
}

// Conversion factors: one unit of each, in SI base units.
func TestFactors(t *testing.T) {
	const sp811 = "NIST SP 811 (2008) App. B.8, from memory"
	const sp7 = 5e-7 // SP 811 prints 7 significant figures: half a unit in the last one
	tests := []struct {
		unit   string
		want   float64
		rel    float64 // the precision the source states the value to
		source string
	}{
		{"Pa", 1, 0, "SI definition"},
		{"kPa", 1e3, 0, "SI prefix"},
		{"MPa", 1e6, 0, "SI prefix"},
		{"bar", 1e5, 0, sp811 + " (exact)"},
		{"mbar", 100, 1e-15, sp811 + " (exact)"},
		{"atm", 101325, 0, sp811 + " (exact, standard atmosphere)"},
		{"psia", 6894.757293168, 1e-12, "lbf = 0.45359237 kg x 9.80665 m/s2 over (0.0254 m)^2; " + sp811 + " 6.894 757 E+03"},
		{"psia", 6.894757e3, sp7, sp811},
		{"inHg", 3.386389e3, sp7, sp811 + ", inch of mercury, conventional (32 F)"},
		{"inH2O", 2.490889e2, sp7, sp811 + ", inch of water, conventional"},
		{"J/kg", 1, 0, "SI base"},
		{"MJ/kg", 1e6, 0, "SI prefix"},
		{"Btu/lbm", 2326, 1e-15, sp811 + ", Btu_IT/lb = 2.326 E+03 (exact)"},
		{"kJ/(kg K)", 1e3, 0, "SI prefix"},
		{"Btu/(lbm R)", 4186.8, 1e-15, sp811 + ", Btu_IT/(lb F) = 4.1868 E+03 (exact)"},
		{"ft3/lbm", 6.242796e-2, sp7, sp811 + ", cubic foot per pound"},
		{"L/kg", 1e-3, 0, "SI (litre = 1e-3 m3)"},
		{"lbm/ft3", 1.601846e1, sp7, sp811 + ", pound per cubic foot"},
		{"kg/h", 1 / 3600.0, 1e-15, "definition of the hour"},
		{"t/h", 1 / 3.6, 1e-15, "tonne = 1000 kg"},
		{"lbm/s", 0.45359237, 0, "International yard and pound agreement (1959)"},
		{"lbm/h", 1.259979e-4, sp7, sp811 + ", pound per hour"},
		{"klb/h", 1.259979e-1, sp7, sp811 + ", pound per hour x 1000"},
		{"kpph", 1.259979e-1, sp7, "thousand lb/h: common practice, no source"},
		{"Btu/h", 2.930711e-1, sp7, sp811 + ", Btu_IT per hour"},
		{"MBH", 2.930711e2, sp7, "1000 Btu/h: common practice, no source"},
		{"MMBtu/h", 2.930711e5, sp7, sp811 + ", Btu_IT per hour x 1e6"},
		{"hp", 745.69987158227022, 1e-15, "550 ft lbf/s; " + sp811 + " 7.456 999 E+02"},
		{"hp", 7.456999e2, sp7, sp811},
		{"TR", 3.516853e3, sp7, sp811 + ", ton of refrigeration (12 000 Btu_IT/h)"},
		{"ton", 3.516853e3, sp7, sp811 + ", ton of refrigeration (12 000 Btu_IT/h)"},
		{"ft", 0.3048, 0, "International yard and pound agreement (1959)"},
		{"kW/K", 1e3, 0, "SI prefix"},
		{"Btu/(h R)", 5.275279e-1, sp7, sp811 + ", Btu_IT/h = 2.930 711 E-01 W, over 5/9 K"},
		{"Btu/h/R", 0.52752792631, 1e-10, "1055.05585262 J / 3600 s / (5/9 K): Btu_IT (1956) and the rankine"},
		{"km", 1000, 0, "SI prefix"},
		{"%", 0.01, 0, "per cent"},
		{"hPa", 100, 0, "SI prefix"},
		{"psi", 6.894757e3, sp7, sp811 + " (a pressure difference)"},
		{"psid", 6.894757e3, sp7, sp811 + " (a pressure difference)"},
		{"mmHg", 1.333224e2, sp7, sp811 + ", millimeter of mercury, conventional"},
		{"mmHg(abs)", 1.333224e2, sp7, sp811 + ", millimeter of mercury, conventional"},
		{"inHg(abs)", 3.386389e3, sp7, sp811 + ", inch of mercury, conventional (32 F)"},
		{"inH2O(abs)", 2.490889e2, sp7, sp811 + ", inch of water, conventional"},
		{"kgf/cm2", 9.80665e4, 1e-15, sp811 + ", kilogram-force per square centimeter (exact)"},
		{"kgf/cm2(a)", 9.80665e4, 1e-15, sp811 + ", kilogram-force per square centimeter (exact)"},
		{"kg/cm2a", 9.80665e4, 1e-15, sp811 + ", kilogram-force per square centimeter (exact)"},
		{"kcal/kg", 4186.8, 0, sp811 + ", calorie_IT per gram = 4.1868 E+03 J/kg (exact)"},
		{"kcal/(kg K)", 4186.8, 0, sp811 + ", calorie_IT per gram kelvin = 4.1868 E+03 (exact)"},
		{"kJ/(kg·°C)", 1e3, 0, "SI prefix; a degree Celsius is a kelvin in size"},
		{"kJ/(kg*C)", 1e3, 0, "SI prefix; a degree Celsius is a kelvin in size"},
		{"kJ/kg/degC", 1e3, 0, "SI prefix; a degree Celsius is a kelvin in size"},
		{"kJ/h", 1 / 3.6, 1e-15, "SI prefix and the hour (3600 s)"},
		{"GJ/h", 1e9 / 3600, 1e-15, "SI prefix and the hour (3600 s)"},
		{"MJ/h", 1e6 / 3600, 1e-15, "SI prefix and the hour (3600 s)"},
		{"kcal/h", 1.163, 1e-15, sp811 + ", calorie_IT = 4.1868 J (exact), per 3600 s"},
		{"Mlb/h", 1.259979e-1, sp7, sp811 + ", pound per hour x 1000 (M = thousand: common practice, no source)"},
		{"MMlb/h", 1.259979e2, sp7, sp811 + ", pound per hour x 1e6 (MM = million: common practice, no source)"},
		{"m3/s", 1, 0, "SI base"},
		{"m3/h", 1 / 3600.0, 1e-15, "definition of the hour"},
		{"L/s", 1e-3, 0, sp811 + ", liter = 1.0 E-03 m3 (exact)"},
		{"L/min", 1e-3 / 60, 1e-15, sp811 + ", liter = 1.0 E-03 m3 (exact), per 60 s"},
		{"gpm", 6.309020e-5, sp7, sp811 + ", gallon (U.S.) per minute (gpm)"},
		{"gal/min", 3.785411784e-3 / 60, 1e-15, "U.S. gallon = 231 in3 exactly; " + sp811 + " 3.785 412 E-03 m3"},
		{"cfm", 4.719474e-4, sp7, sp811 + ", cubic foot per minute"},
		{"ft3/s", 2.831685e-2, sp7, sp811 + ", cubic foot per second"},
		{"kJ/kWh", 1 / 3600.0, 1e-15, sp811 + ", kilowatt hour = 3.6 E+06 J (exact)"},
		{"Btu/kWh", 2.930711e-4, sp7, sp811 + ", Btu_IT = 1.055 056 E+03 J over kilowatt hour = 3.6 E+06 J"},
		{"kcal/kWh", 4186.8 / 3.6e6, 1e-15, sp811 + ", calorie_IT = 4.1868 J and kilowatt hour = 3.6 E+06 J (both exact)"},
		{"kJ/kJ", 1, 0, "a ratio"},
	}
	for _, tt := range tests {
		u := mustLookup(t, tt.unit)
		if got := u.ToSI(1, StandardAtmosphere); !near(got, tt.want, tt.rel) {
			t.Errorf("1 %s = %.15g SI, want %.15g (%s)", tt.unit, got, tt.want, tt.source)
		}
		if got := u.DeltaToSI(1); !near(got, tt.want, tt.rel) {
			t.Errorf("delta 1 %s = %.15g SI, want %.15g (%s)", tt.unit, got, tt.want, tt.source)
		}
	}
}

func TestTemperature(t *testing.T) {
	const its90 = "Celsius/Fahrenheit definitions, NIST SP 811 (2008) App. B.9, from memory"
	tests := []struct {
		unit     string
		v, wantK float64
		delta    bool
		source   string
	}{
		{"F", 212, 373.15, false, its90 + " (boiling point at 1 atm)"},
		{"°F", 32, 273.15, false, its90},
		{"degF", -40, 233.15, false, its90 + " (-40 F = -40 C)"},
		{"C", 100, 373.15, false, its90},
		{"°C", -273.15, 0, false, its90},
		{"K", 300, 300, false, its90},
		{"R", 671.67, 373.15, false, its90 + " (R = 9/5 K)"},
		{"°R", 0, 0, false, its90},
		{"F", 2, 10.0 / 9, true, its90 + " (difference: 2 F = 1.1111 K)"},
		{"C", 5, 5, true, its90},
		{"R", 9, 5, true, its90},
		{"dF", 2, 10.0 / 9, false, its90},
		{"dR", 18, 10, false, its90},
		{"dC", 7, 7, false, its90},
		{"ΔK", 7, 7, false, its90},
	}
	for _, tt := range tests {
		u := mustLookup(t, tt.unit)
		var got float64
		if tt.delta {
			got = u.DeltaToSI(tt.v)
		} else {
			got = u.ToSI(tt.v, StandardAtmosphere)
		}
		if !near(got, tt.wantK, 1e-12) {
			t.Errorf("%g %s (delta %v) = %.15g K, want %.15g (%s)", tt.v, tt.unit, tt.delta, got, tt.wantK, tt.source)
		}
	}
	// A temperature difference unit has its own dimension; a temperature unit does not carry one.
	if d := mustLookup(t, "dF").Dim(); d != TemperatureDiff {
		t.Errorf("dF dim = %v", d)
	}
	if d := mustLookup(t, "F").Dim(); d != Temperature {
		t.Errorf("F dim = %v", d)
	}
}

func TestGauge(t *testing.T) {
	site, err := AtmosphereAt(1500)
	if err != nil {
		t.Fatal(err)
	}
	const psi = 6894.757293168 // NIST SP 811 (2008) App. B.8 from the lbf definition, from memory
	tests := []struct {
		unit   string
		v, atm float64
		wantPa float64
		source string
	}{
		{"psig", 150, StandardAtmosphere, 150*psi + 101325, "gauge + 1 atm (NIST SP 811 factors)"},
		{"psig", 0, StandardAtmosphere, 101325, "gauge zero is the atmosphere"},
		{"psig", 150, 84560, 150*psi + 84560, "site at 1500 m: U.S. Standard Atmosphere 1976 Table I 84.56 kPa, from memory"},
		{"psia", 150, 84560, 150 * psi, "absolute ignores the site"},
		{"barg", 10, 84560, 1e6 + 84560, "bar = 1e5 Pa (exact)"},
		{"bar(g)", 10, StandardAtmosphere, 1e6 + 101325, "bar = 1e5 Pa (exact)"},
		{"kPa(g)", 500, StandardAtmosphere, 601325, "SI prefix"},
		{"kPag", -101.325, StandardAtmosphere, 0, "full vacuum"},
		{"MPa(g)", 1, StandardAtmosphere, 1101325, "SI prefix"},
		{"psig", -20, StandardAtmosphere, 101325 - 20*psi, "below zero absolute: the caller's to flag"},
	}
	for _, tt := range tests {
		u := mustLookup(t, tt.unit)
		got := u.ToSI(tt.v, tt.atm)
		if !near(got, tt.wantPa, 1e-12) && math.Abs(got-tt.wantPa) > 1e-9 {
			t.Errorf("%g %s at atm %g = %.15g Pa, want %.15g (%s)", tt.v, tt.unit, tt.atm, got, tt.wantPa, tt.source)
		}
		if back := u.FromSI(got, tt.atm); math.Abs(back-tt.v) > 1e-9*math.Max(1, math.Abs(tt.v)) {
			t.Errorf("%s round trip %g -> %g", tt.unit, tt.v, back)
		}
	}
	// A tolerance on a gauge pressure is a size, not a level: no atmosphere.
	if got := mustLookup(t, "psig").DeltaToSI(5); !near(got, 5*psi, 1e-12) {
		t.Errorf("delta 5 psig = %g Pa, want %g", got, 5*psi)
	}
	// The computed site atmosphere feeds gauge conversion the same way.
	if got := mustLookup(t, "psig").ToSI(0, site); got != site {
		t.Errorf("0 psig at 1500 m = %g, want %g", got, site)
	}
	for _, s := range []string{"psig", "barg", "bar(g)", "kPa(g)", "kPag", "MPa(g)", "MPag", "psi(g)"} {
		if !mustLookup(t, s).Gauge() {
			t.Errorf("%s not gauge", s)
		}
	}
	for _, s := range []string{"psia", "psi", "bara", "bar", "kPa", "kPa(a)", "MPa", "inHg", "atm"} {
		if mustLookup(t, s).Gauge() {
			t.Errorf("%s gauge", s)
		}
	}
}

// Vacuum readings are the site atmosphere less the value; a difference-only unit has no level.
func TestReadings(t *testing.T) {
	const inHg = 3386.389 // NIST SP 811 (2008) App. B.8, inch of mercury, conventional, from memory
	const mmHg = 133.3224 // NIST SP 811 (2008) App. B.8, millimeter of mercury, conventional, from memory
	tests := []struct {
		unit    string
		reading Reading
		v, atm  float64
		wantPa  float64
		source  string
	}{
		{"inHg(vac)", Vacuum, 28, StandardAtmosphere, 101325 - 28*inHg, "vacuum: atmosphere less the reading"},
		{"inHg(vac)", Vacuum, 28, 84560, 84560 - 28*inHg, "below zero absolute at a site of 84.56 kPa: the caller's to flag"},
		{"inHg(vac)", Vacuum, 0, 84560, 84560, "zero vacuum is the atmosphere"},
		{"inHg(abs)", Absolute, 2, 84560, 2 * inHg, "absolute ignores the site"},
		{"inHg(a)", Absolute, 2, 84560, 2 * inHg, "absolute ignores the site"},
		{"mmHg(vac)", Vacuum, 700, StandardAtmosphere, 101325 - 700*mmHg, "vacuum: atmosphere less the reading"},
		{"mmHg(abs)", Absolute, 60, StandardAtmosphere, 60 * mmHg, "absolute"},
		{"inH2O(vac)", Vacuum, 10, StandardAtmosphere, 101325 - 10*249.0889, "NIST SP 811 inch of water, from memory"},
		{"kgf/cm2(g)", Gauge, 10, StandardAtmosphere, 10*98066.5 + 101325, "NIST SP 811 kgf/cm2 (exact), gauge"},
		{"kg/cm2g", Gauge, 10, 84560, 10*98066.5 + 84560, "NIST SP 811 kgf/cm2 (exact), gauge"},
		{"psig", Gauge, 0, StandardAtmosphere, 101325, "gauge"},
		{"psi", Difference, 5, StandardAtmosphere, 5 * 6894.757293168, "a difference converts by scale alone"},
		{"psid", Difference, 5, StandardAtmosphere, 5 * 6894.757293168, "a difference converts by scale alone"},
		{"inHg", Difference, 1, StandardAtmosphere, inHg, "a difference converts by scale alone"},
		{"mmHg", Difference, 1, StandardAtmosphere, mmHg, "a difference converts by scale alone"},
		{"kgf/cm2", Difference, 1, StandardAtmosphere, 98066.5, "a difference converts by scale alone"},
		{"bar", Absolute, 1, StandardAtmosphere, 1e5, "SI pressures are absolute"},
		{"hPa", Absolute, 1013.25, StandardAtmosphere, 101325, "SI pressures are absolute"},
	}
	for _, tt := range tests {
		u := mustLookup(t, tt.unit)
		if u.Reading() != tt.reading {
			t.Errorf("%s reads %v, want %v", tt.unit, u.Reading(), tt.reading)
		}
		if u.Level() != (tt.reading != Difference) || u.Relative() != (tt.reading == Gauge || tt.reading == Vacuum) {
			t.Errorf("%s: Level %v Relative %v", tt.unit, u.Level(), u.Relative())
		}
		got := u.ToSI(tt.v, tt.atm)
		// SP 811 prints seven figures: half a unit in the last one, times the reading.
		if math.Abs(got-tt.wantPa) > 5e-7*tt.v*u.DeltaToSI(1)+1e-9 {
			t.Errorf("%g %s at %g Pa = %.10g Pa, want %.10g (%s)", tt.v, tt.unit, tt.atm, got, tt.wantPa, tt.source)
		}
		if back := u.FromSI(got, tt.atm); math.Abs(back-tt.v) > 1e-9*math.Max(1, tt.v) {
			t.Errorf("%s: round trip %g -> %g", tt.unit, tt.v, back)
		}
		if d := u.DeltaToSI(1); !near(d, mustLookup(t, tt.unit).DeltaUnit().DeltaToSI(1), 0) {
			t.Errorf("%s: delta unit %s has another size", tt.unit, u.DeltaUnit())
		}
	}
	for _, tt := range []struct{ unit, delta, readings string }{
		{"psia", "psi", ""}, {"psig", "psi", ""}, {"psi", "psi", "psia psig"}, {"psid", "psi", "psia psig"},
		{"bar(g)", "bar", ""}, {"barg", "bar", ""}, {"kPa(g)", "kPa", ""}, {"MPa(g)", "MPa", ""}, {"bar", "bar", ""},
		{"inHg(vac)", "inHg", ""}, {"inHg(abs)", "inHg", ""}, {"inHg", "inHg", "inHg(abs) inHg(vac)"},
		{"inH2O", "inH2O", "inH2O(abs) inH2O(vac)"}, {"mmHg", "mmHg", "mmHg(abs) mmHg(vac)"},
		{"kgf/cm2(g)", "kgf/cm2", ""}, {"kg/cm2", "kgf/cm2", "kgf/cm2(a) kgf/cm2(g)"},
		{"C", "C", ""}, {"kg/s", "kg/s", ""},
	} {
		u := mustLookup(t, tt.unit)
		if got := u.DeltaUnit().Symbol(); got != tt.delta {
			t.Errorf("%s.DeltaUnit() = %s, want %s", tt.unit, got, tt.delta)
		}
		var rs []string
		for _, r := range u.Readings() {
			rs = append(rs, r.Symbol())
		}
		if got := strings.Join(rs, " "); got != tt.readings {
			t.Errorf("%s.Readings() = %q, want %q", tt.unit, got, tt.readings)
		}
	}
}

// Every listed spelling resolves to its dimension, converts both ways, and its canonical symbol
// looks up to the same unit. Case variants either reach the same unit or are refused.
func TestRoundTripEverySpelling(t *testing.T) {
	total := 0
	for d := Dim(0); d < numDims; d++ {
		sp := Spellings(d)
		if d != Dimensionless && len(sp) == 0 {
			t.Errorf("no spellings for %v", d)
		}
		for _, s := range sp {
			total++
			u := mustLookup(t, s)
			if !u.Measures(d) {
				t.Errorf("%q: dim %v, want %v", s, u.Dim(), d)
			}
			if back := mustLookup(t, u.Symbol()); back != u {
				t.Errorf("%q: Lookup(Symbol() %q) = %q", s, u.Symbol(), back.Symbol())
			}
			for _, atm := range []float64{StandardAtmosphere, 84560} {
				for _, v := range []float64{-40, 0, 1, 123.456, 6.02e5} {
					si := u.ToSI(v, atm)
					if got := u.FromSI(si, atm); math.Abs(got-v) > 1e-12*math.Max(math.Abs(v), math.Abs(si))+1e-9 {
						t.Errorf("%q: FromSI(ToSI(%g)) = %.17g", s, v, got)
					}
					if got := u.DeltaFromSI(u.DeltaToSI(v)); math.Abs(got-v) > 1e-12*math.Abs(v) {
						t.Errorf("%q: DeltaFromSI(DeltaToSI(%g)) = %.17g", s, v, got)
					}
				}
			}
			for _, variant := range []string{strings.ToLower(s), strings.ToUpper(s)} {
				got, err := Lookup(variant)
				if err == nil && got != u {
					t.Errorf("case variant %q of %q reaches %q", variant, s, got.Symbol())
				}
			}
		}
	}
	if total < 100 {
		t.Errorf("only %d spellings", total)
	}
}

func TestLookupCase(t *testing.T) {
	tests := []struct {
		in, want string // want "" means refused
	}{
		{"kpa", "kPa"}, {"KPA", "kPa"}, {"Kpa", "kPa"},
		{"btu/lbm", "Btu/lbm"}, {"BTU/lb", "Btu/lbm"}, {"BTU/LBM", "Btu/lbm"},
		{"PSIG", "psig"}, {"Psia", "psia"}, {"kj/kg", "kJ/kg"}, {"KJ/KG-K", "kJ/(kg K)"},
		{"degf", "F"}, {"KW", "kW"}, {"mmbtu/h", "MMBtu/h"}, {"mbh", "MBH"}, {" psig ", "psig"},
		{"", ""}, // the bare number
		// Case carries meaning: kelvin is K, mega is M.
		{"k", "!K"}, {"c", "!C"}, {"f", "!F"}, {"w", "!W"}, {"M", "!m"},
		{"mpa", "!MPa"}, {"mw", "!MW"}, {"mj/kg", "!MJ/kg"}, {"Mbar", "!mbar"},
		// M in a US flow unit is the Roman thousand; a lower-case m (milli) is not guessed.
		{"mlb/h", "!Mlb/h"}, {"mmlb/h", "!MMlb/h"},
		{"INHG(VAC)", "inHg(vac)"}, {"mmhg(abs)", "mmHg(abs)"}, {"KGF/CM2G", "kgf/cm2(g)"}, {"PSID", "psi"},
	}
	for _, tt := range tests {
		u, err := Lookup(tt.in)
		if strings.HasPrefix(tt.want, "!") {
			var ue *UnknownError
			if !errors.As(err, &ue) {
				t.Errorf("Lookup(%q) = %q, %v; want refusal", tt.in, u.Symbol(), err)
				continue
			}
			if ue.Suggestion != tt.want[1:] {
				t.Errorf("Lookup(%q) suggests %q, want %q", tt.in, ue.Suggestion, tt.want[1:])
			}
			continue
		}
		if err != nil || u.Symbol() != tt.want {
			t.Errorf("Lookup(%q) = %q, %v; want %q", tt.in, u.Symbol(), err, tt.want)
		}
	}
}

func TestUnknown(t *testing.T) {
	tests := []struct{ in, suggestion, msg string }{
		{"psai", "psia", `unknown unit "psai"; did you mean "psia"?`},
		{"kj/kgg", "kJ/kg", `unknown unit "kj/kgg"; did you mean "kJ/kg"?`},
		{"Btu/lbn", "Btu/lbm", `unknown unit "Btu/lbn"; did you mean "Btu/lbm"?`},
		{"pisg", "psig", `unknown unit "pisg"; did you mean "psig"?`},
		{"lbm/hh", "lbm/h", `unknown unit "lbm/hh"; did you mean "lbm/h"?`},
		{"furlong", "", `unknown unit "furlong"`},
		{"x", "", `unknown unit "x"`},
	}
	for _, tt := range tests {
		_, err := Lookup(tt.in)
		var ue *UnknownError
		if !errors.As(err, &ue) {
			t.Fatalf("Lookup(%q) error %v, want *UnknownError", tt.in, err)
		}
		if ue.Spelling != tt.in || ue.Suggestion != tt.suggestion || err.Error() != tt.msg {
			t.Errorf("Lookup(%q) = %+v %q, want suggestion %q, message %q", tt.in, *ue, err, tt.suggestion, tt.msg)
		}
	}
}

func TestDimString(t *testing.T) {
	tests := []struct {
		d    Dim
		want string
	}{
		{Dimensionless, "dimensionless"}, {Pressure, "pressure"}, {Temperature, "temperature"},
		{TemperatureDiff, "temperature difference"}, {SpecificEnergy, "specific enthalpy"},
		{SpecificEntropy, "specific entropy"}, {SpecificVolume, "specific volume"},
		{Density, "density"}, {MassFlow, "mass flow"}, {Power, "power"}, {Length, "length"},
		{Dim(200), "Dim(200)"},
	}
	for _, tt := range tests {
		if got := tt.d.String(); got != tt.want {
			t.Errorf("Dim(%d).String() = %q, want %q", tt.d, got, tt.want)
		}
	}
}

func TestSystem(t *testing.T) {
	for _, tt := range []struct {
		in   string
		want System
		ok   bool
	}{{"SI", SI, true}, {"si", SI, true}, {"US", US, true}, {"us", US, true}, {"imperial", SI, false}, {"", SI, false}} {
		got, ok := ParseSystem(tt.in)
		if got != tt.want || ok != tt.ok {
			t.Errorf("ParseSystem(%q) = %v, %v", tt.in, got, ok)
		}
	}
	want := map[System][numDims]string{
		SI: {"", "kPa", "C", "dK", "kJ/kg", "kJ/(kg K)", "m3/kg", "kg/m3", "kg/s", "kW", "m", "m/s", "kW/K", "kW", "m3/h", "kJ/kWh"},
		// Heat in Btu/h, work in hp: US trade usage (common practice, no source).
		US: {"", "psia", "F", "dR", "Btu/lbm", "Btu/(lbm R)", "ft3/lbm", "lbm/ft3", "lbm/h", "Btu/h", "ft", "ft/s", "Btu/(h R)", "hp", "gpm", "Btu/kWh"},
	}
	for sys, syms := range want {
		for d := Dim(0); d < numDims; d++ {
			u := sys.Default(d)
			if u.Symbol() != syms[d] || !u.Measures(d) || u.Gauge() {
				t.Errorf("%v.Default(%v) = %q (%v, gauge %v), want %q", sys, d, u.Symbol(), u.Dim(), u.Gauge(), syms[d])
			}
		}
	}
}

// TestSystemFamily: which units a system owns decides the display system hmb props infers.
func TestSystemFamily(t *testing.T) {
	for _, tt := range []struct {
		sym    string
		us, si bool
	}{{"psig", true, false}, {"kPa", false, true}, {"F", true, false}, {"C", false, true},
		{"lbm/h", true, false}, {"t/h", false, true}, {"%", true, true}, {"ft/s", true, false}} {
		u, err := Lookup(tt.sym)
		if err != nil {
			t.Fatal(err)
		}
		if US.Has(u) != tt.us || SI.Has(u) != tt.si {
			t.Errorf("%s: US.Has %v SI.Has %v, want %v %v", tt.sym, US.Has(u), SI.Has(u), tt.us, tt.si)
		}
	}
	if US.Gauge().Symbol() != "psig" || SI.Gauge().Symbol() != "kPa(g)" {
		t.Errorf("gauge units %v %v", US.Gauge(), SI.Gauge())
	}
}

func TestZeroUnit(t *testing.T) {
	var u Unit
	if u.Symbol() != "" || u.Dim() != Dimensionless || u.ToSI(0.25, 0) != 0.25 || u != mustLookup(t, "") {
		t.Errorf("zero Unit is not the bare number: %q %v", u.Symbol(), u.Dim())
	}
}

func BenchmarkLookup(b *testing.B) {
	for _, in := range []string{"psig", "kJ/(kg K)", "BTU/LB", "psai"} {
		b.Run(in, func(b *testing.B) {
			for b.Loop() {
				Lookup(in)
			}
		})
	}
}

func TestSpellings(t *testing.T) {
	tests := []struct {
		d    Dim
		want []string // must be present
	}{
		{Pressure, []string{"Pa", "hPa", "kPa", "MPa", "bar", "mbar", "psia", "psi", "psid", "psig", "bar(g)", "barg", "bara", "kPa(g)", "kPag", "kPa(a)", "MPa(g)",
			"inHg", "inHg(abs)", "inHg(vac)", "inH2O", "inH2O(abs)", "inH2O(vac)", "mmHg", "mmHg(abs)", "mmHg(vac)", "kgf/cm2(a)", "kgf/cm2(g)", "kgf/cm2", "atm"}},
		{Temperature, []string{"K", "degC", "C", "°C", "degF", "F", "°F", "R", "degR", "°R"}},
		{TemperatureDiff, []string{"dF", "dC", "dK", "dR"}},
		{SpecificEnergy, []string{"J/kg", "kJ/kg", "MJ/kg", "Btu/lbm", "Btu/lb", "kcal/kg"}},
		{SpecificEntropy, []string{"J/(kg K)", "kJ/(kg K)", "kJ/kgK", "kJ/kg-K", "Btu/(lbm R)", "Btu/lbm-R", "Btu/(lbm F)", "kJ/(kg·°C)", "kJ/(kg C)", "kcal/(kg K)"}},
		{SpecificVolume, []string{"m3/kg", "ft3/lbm", "L/kg"}},
		{Density, []string{"kg/m3", "lbm/ft3"}},
		{MassFlow, []string{"kg/s", "kg/h", "kg/min", "t/h", "lbm/s", "lbm/min", "lbm/h", "lb/h", "klb/h", "kpph", "Mlb/h", "MMlb/h"}},
		{Power, []string{"W", "kW", "MW", "Btu/h", "MBH", "MMBtu/h", "hp", "TR", "ton", "kJ/h", "MJ/h", "GJ/h", "kcal/h"}},
		{Length, []string{"m", "ft", "km"}},
		{Dimensionless, []string{"%", "frac"}},
	}
	for _, tt := range tests {
		got := Spellings(tt.d)
		if !slices.IsSorted(got) {
			t.Errorf("Spellings(%v) not sorted", tt.d)
		}
		for _, w := range tt.want {
			if !slices.Contains(got, w) {
				t.Errorf("Spellings(%v) lacks %q", tt.d, w)
			}
		}
	}
}

func TestSymbols(t *testing.T) {
	var got []string
	for _, u := range Symbols(MassFlow) {
		got = append(got, u.Symbol())
	}
	want := "kg/s kg/min kg/h t/h lbm/s lbm/min lbm/h klbm/h Mlb/h MMlb/h"
	if strings.Join(got, " ") != want {
		t.Errorf("Symbols(MassFlow) = %q, want %q", strings.Join(got, " "), want)
	}
	if n := len(Symbols(Dimensionless)); n != 2 {
		t.Errorf("Symbols(Dimensionless) has %d units, want %% and frac", n)
	}
}

// Shaft power is measured in the units of power and shown in its own: kW, or hp in US units.
func TestShaftPower(t *testing.T) {
	if ShaftPower.Measure() != Power || Power.Measure() != Power || Pressure.Measure() != Pressure {
		t.Errorf("Measure: %v %v %v", ShaftPower.Measure(), Power.Measure(), Pressure.Measure())
	}
	for _, s := range []string{"hp", "kW", "MW", "Btu/h", "kJ/h"} {
		if u := mustLookup(t, s); !u.Measures(ShaftPower) || !u.Measures(Power) || u.Measures(MassFlow) {
			t.Errorf("%s does not measure power and shaft power alone", s)
		}
	}
	// 1 hp = 745.699 872 W (NIST SP 811 (2008) App. B.8, horsepower (550 ft lbf/s), from memory).
	if got := US.Default(ShaftPower).FromSI(745.69987, 0); math.Abs(got-1) > 1e-8 {
		t.Errorf("745.69987 W = %g hp", got)
	}
	if !slices.Equal(Spellings(ShaftPower), Spellings(Power)) || len(Symbols(ShaftPower)) != len(Symbols(Power)) {
		t.Error("shaft power has spellings of its own")
	}
}
