package units

import (
	"math"
	"strings"
	"testing"
)

// Every label hmb prints, for every quantity in both systems, as a value and as a difference,
// reads back through Lookup as a unit of the same dimension (a temperature difference may read
// back as a temperature unit, which the notation accepts for a tolerance).
func TestPrintedLabelsParseBack(t *testing.T) {
	for _, sys := range []System{SI, US} {
		for _, atm := range []float64{0, 84560} {
			disp := Display{System: sys, Atm: atm}
			for d := Dim(0); d < numDims; d++ {
				for _, out := range []string{disp.Show(d, 12.5), disp.Delta(d, 12.5)} {
					num, lab, _ := strings.Cut(out, " ")
					if _, _, err := ParseQuantity(num); err != nil {
						t.Errorf("%v %v: %q: number does not parse: %v", sys, d, out, err)
					}
					u, err := Lookup(lab)
					if err != nil {
						t.Errorf("%v %v: %q: label %q does not parse: %v", sys, d, out, lab, err)
						continue
					}
					want := d
					if d == Temperature && strings.HasPrefix(out, disp.Delta(d, 12.5)) {
						want = TemperatureDiff
					}
					if !u.Measures(want) && !(d == Temperature && u.Dim() == TemperatureDiff) {
						t.Errorf("%v %v: %q: label %q reads back as %v", sys, d, out, lab, u.Dim())
					}
				}
			}
		}
	}
	// Every unit's own label, as ShowIn and ShowDelta write it after a user wrote that unit.
	for _, d := range defs {
		u := mustLookup(t, d.sym)
		for _, out := range []string{ShowIn(u, 1, StandardAtmosphere), ShowDelta(u, 1)} {
			_, lab, _ := strings.Cut(out, " ")
			back, err := Lookup(lab)
			if err != nil || back.Dim() != u.Dim() {
				t.Errorf("%q written as %q: label reads back as %v, %v", d.sym, out, back.Dim(), err)
			}
		}
	}
}

func TestShow(t *testing.T) {
	si := Display{System: SI}
	us := Display{System: US, Atm: 84560}
	tests := []struct {
		got, want string
	}{
		{si.Show(Temperature, 373.15), "100.00 C"},
		{us.Show(Temperature, 373.15), "212.00 F"},
		{si.Show(Pressure, 101325), "101.33 kPa"},
		{us.Show(Pressure, 101325), "14.696 psia"},
		{si.Delta(Pressure, 5000), "5.0000 kPa"},
		{us.Delta(Pressure, 6894.757293168), "1.0000 psi"},
		{si.Delta(Temperature, 2), "2.0000 dK"},
		{us.Delta(Temperature, 5.0/9), "1.0000 dR"},
		{si.Show(EntropyRate, 4069.4617), "4.0695 kW/K"},
		// 1 W/K = 3600/1055.05585262 Btu/h per K = 1.8956 Btu/(h R) (NIST SP 811 Btu_IT, 1 R = 5/9 K)
		{us.Show(EntropyRate, 1), "1.8956 Btu/(h R)"},
		// Work in kW or hp, heat in Btu/h: 1 hp = 745.699 872 W (NIST SP 811 (2008) App. B.8, from memory).
		{us.Show(ShaftPower, 745699.872), "1000.0 hp"},
		{si.Show(ShaftPower, 745699.872), "745.70 kW"},
		{us.Show(Power, 293071.07), "1000000 Btu/h"},
		{si.Show(Dimensionless, 1), "1.0000"},
		{si.Show(Dimensionless, 0), "0.0000"},
		{si.Show(Dimensionless, -1e-9), "0.0000"},
		{si.Show(Power, math.NaN()), "n/a"},
		{si.Number(MassFlow, 2.5), "2.5000"},
		{ShowIn(mustLookup(t, "%"), 0.85, 0), "85.00 %"},
		{ShowIn(mustLookup(t, "psig"), 101325+6894.757293168*150, 101325), "150.00 psig"},
		{ShowDelta(mustLookup(t, "kPa(g)"), 2000), "2.0000 kPa"},
		{Trim(1), "1"}, {Trim(2.50), "2.5"}, {Trim(1.5e-7), "1.5e-7"}, {Trim(123456), "123460"},
	}
	for i, tt := range tests {
		if tt.got != tt.want {
			t.Errorf("%d: got %q, want %q", i, tt.got, tt.want)
		}
	}
}

func TestBase(t *testing.T) {
	want := map[Dim]string{Dimensionless: "", Pressure: "Pa", Temperature: "K", TemperatureDiff: "dK",
		SpecificEnergy: "J/kg", SpecificEntropy: "J/(kg K)", SpecificVolume: "m3/kg", Density: "kg/m3",
		MassFlow: "kg/s", Power: "W", Length: "m", Velocity: "m/s", EntropyRate: "W/K", ShaftPower: "W",
		VolumeFlow: "m3/s", HeatRate: "kJ/kJ"}
	for d := Dim(0); d < numDims; d++ {
		u := Base(d)
		if u.Symbol() != want[d] || !u.Measures(d) || u.ToSI(2.5, StandardAtmosphere) != 2.5 {
			t.Errorf("Base(%v) = %q", d, u.Symbol())
		}
	}
}

// A unit picked for a dimension is shown instead of the system's default, a gauge pick reads
// from the site atmosphere, a picked temperature scale carries its differences, and Keep drops
// the picks of the other system.
func TestPick(t *testing.T) {
	var p Picks
	for _, s := range []string{"t/h", "bar(g)", "MW", "F"} {
		u := mustLookup(t, s)
		if !p.Set(u.Dim(), u) {
			t.Fatalf("Set(%s) refused", s)
		}
	}
	if p.Set(Dimensionless, Unit{}) {
		t.Error("the bare number was picked")
	}
	d := Display{System: SI, Atm: 84560, Pick: p}
	tests := []struct{ got, want string }{
		{d.Show(MassFlow, 10), "36.000 t/h"},
		// 1 MPa absolute at a site atmosphere of 84.56 kPa: 9.1544 bar above it.
		{d.Show(Pressure, 1e6), "9.1544 bar(g)"},
		{d.Delta(Pressure, 2e5), "2.0000 bar"},
		{d.Show(Power, 2.5e6), "2.5000 MW"},
		{d.Show(Temperature, 373.15), "212.00 F"},
		{d.Delta(Temperature, 5), "9.0000 dF"},
		{d.Show(SpecificEnergy, 2.8e6), "2800.0 kJ/kg"},
	}
	for _, tt := range tests {
		if tt.got != tt.want {
			t.Errorf("got %q, want %q", tt.got, tt.want)
		}
	}
	us := Display{System: US, Pick: p.Keep(US)}
	if got := us.Show(MassFlow, 0.45359237); got != "3600.0 lbm/h" {
		t.Errorf("t/h kept under US: %q", got)
	}
	if got := us.Show(Temperature, 373.15); got != "212.00 F" {
		t.Errorf("F dropped under US: %q", got)
	}
}
