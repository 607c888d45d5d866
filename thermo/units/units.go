// Package units converts the quantities of a heat and material balance between the units
// engineers type (SI and US customary, absolute and gauge) and absolute SI base units.
//
// Every conversion factor is exact by definition or carries its source. The package knows no
// physics of water: it scales, offsets and adds the site atmosphere, nothing more.
package units

import "fmt"

// Dim is the physical dimension of a quantity, as the notation checks it.
type Dim uint8

const (
	Dimensionless Dim = iota
	Pressure
	Temperature
	TemperatureDiff
	SpecificEnergy
	SpecificEntropy
	SpecificVolume
	Density
	MassFlow
	Power
	Length
	Velocity
	EntropyRate // entropy generated per unit time, W/K
	// ShaftPower is power crossing as work (a turbine's output, a pump's input): measured in the
	// units of Power, but shown in kW or hp where a heat duty shows in kW or Btu/h.
	ShaftPower
	VolumeFlow // volumetric flow, m3/s
	// HeatRate is heat in per unit of net work out (a plant's heat rate): a ratio, J/J, shown as
	// kJ/kWh or Btu/kWh.
	HeatRate

	numDims = iota
)

var dimNames = [numDims]string{
	Dimensionless:   "dimensionless",
	Pressure:        "pressure",
	Temperature:     "temperature",
	TemperatureDiff: "temperature difference",
	SpecificEnergy:  "specific enthalpy",
	SpecificEntropy: "specific entropy",
	SpecificVolume:  "specific volume",
	Density:         "density",
	MassFlow:        "mass flow",
	Power:           "power",
	Length:          "length",
	Velocity:        "speed",
	EntropyRate:     "rate of entropy generation",
	ShaftPower:      "shaft power",
	VolumeFlow:      "volumetric flow",
	HeatRate:        "heat rate",
}

// Dims lists every dimension, in the order of the constants.
func Dims() []Dim {
	out := make([]Dim, numDims)
	for i := range out {
		out[i] = Dim(i)
	}
	return out
}

// Measure is the dimension whose units measure d: Power for ShaftPower, d itself otherwise.
func (d Dim) Measure() Dim {
	if d == ShaftPower {
		return Power
	}
	return d
}

// Measures reports whether u is a unit of a quantity of dimension d (hp and Btu/h both measure
// a shaft power).
func (u Unit) Measures(d Dim) bool { return u.Dim() == d.Measure() }

// String names the dimension in the words a diagnostic uses ("expected pressure, got ...").
func (d Dim) String() string {
	if int(d) < len(dimNames) {
		return dimNames[d]
	}
	return fmt.Sprintf("Dim(%d)", uint8(d))
}

// Unit is one accepted unit. The zero Unit is the bare number (dimensionless, factor 1).
// Units are small values and compare with ==.
type Unit struct {
	id uint8 // index into defs
}

func (u Unit) def() *def {
	if int(u.id) < len(defs) {
		return &defs[u.id]
	}
	return &defs[0]
}

// Symbol is the canonical spelling; Lookup(u.Symbol()) == u for every unit.
func (u Unit) Symbol() string { return u.def().sym }

// Dim is the dimension the unit measures.
func (u Unit) Dim() Dim { return u.def().dim }

// US reports whether the unit belongs to the US customary family (psia, F, Btu/lbm, lbm/h...).
func (u Unit) US() bool { return u.def().us }

// Reading says where a pressure unit's zero lies: the reading a number in it is.
type Reading uint8

const (
	Absolute   Reading = iota // zero at vacuum; every unit that is not a pressure reads so too
	Gauge                     // zero at the site atmosphere, positive above it (psig, bar(g))
	Vacuum                    // zero at the site atmosphere, positive below it (inHg(vac))
	Difference                // no zero: a pressure difference only (psi, psid, bare inHg)
)

var readingNames = [...]string{
	Absolute:   "absolute",
	Gauge:      "gauge (above the site atmosphere)",
	Vacuum:     "vacuum (below the site atmosphere)",
	Difference: "a pressure difference (no zero of its own)",
}

func (r Reading) String() string {
	if int(r) < len(readingNames) {
		return readingNames[r]
	}
	return fmt.Sprintf("Reading(%d)", uint8(r))
}

// Reading is where the unit's zero lies. Only pressure units read other than Absolute.
func (u Unit) Reading() Reading { return u.def().reading }

// Gauge reports whether the unit measures pressure above the site atmosphere.
func (u Unit) Gauge() bool { return u.def().reading == Gauge }

// Level reports whether a number in u can state a pressure (or any other quantity) itself, not
// only a difference: false for psi, psid and the bare mercury and water columns, which say
// neither absolute nor gauge nor vacuum.
func (u Unit) Level() bool { return u.def().reading != Difference }

// Relative reports whether the unit reads from the site atmosphere (gauge or vacuum), so that a
// pressure difference written in it is ambiguous.
func (u Unit) Relative() bool { r := u.def().reading; return r == Gauge || r == Vacuum }

// Readings lists the spellings that state a level in the same unit as u, when u states only a
// difference: psia and psig for psi, inHg(abs) and inHg(vac) for inHg. Nil for other units.
func (u Unit) Readings() []Unit {
	d := u.def()
	if d.reading != Difference {
		return nil
	}
	var out []Unit
	for i := range defs {
		if e := &defs[i]; e.dim == d.dim && e.scale == d.scale && e.reading != Difference {
			out = append(out, Unit{uint8(i)})
		}
	}
	return out
}

// DeltaUnit is the unit a difference of two values in u is written in: psi for psia and psig,
// bar for bar(g), inHg for inHg(vac); u itself for other units.
func (u Unit) DeltaUnit() Unit {
	d := u.def()
	if d.dim != Pressure || d.reading == Difference {
		return u
	}
	for i := range defs {
		if e := &defs[i]; e.dim == d.dim && e.scale == d.scale && e.reading == Difference {
			return Unit{uint8(i)}
		}
	}
	if d.reading == Gauge {
		for i := range defs {
			if e := &defs[i]; e.dim == d.dim && e.scale == d.scale && e.reading == Absolute {
				return Unit{uint8(i)}
			}
		}
	}
	return u
}

// String returns the canonical symbol, so units print as they are spelled.
func (u Unit) String() string { return u.Symbol() }

// ToSI converts a value in u to absolute SI base units: Pa, K, J/kg, J/(kg K), m3/kg, kg/m3,
// kg/s, W, m, m/s, W/K, and a plain fraction for dimensionless units. atm is the site atmosphere in Pa and
// is used only by gauge units. A gauge value below -atm yields a negative absolute pressure; the
// caller decides how to report it.
//
// A vacuum reading is the site atmosphere less the value (28 inHg(vac) at 14.696 psia is 1.9 inHg
// absolute). A unit that states only a difference (Level is false) converts here as if absolute;
// callers refuse it where a pressure itself is meant.
func (u Unit) ToSI(v, atm float64) float64 {
	d := u.def()
	switch d.reading {
	case Gauge:
		return v*d.scale + atm
	case Vacuum:
		return atm - v*d.scale
	}
	return (v + d.offset) * d.scale
}

// FromSI is the inverse of ToSI.
func (u Unit) FromSI(si, atm float64) float64 {
	d := u.def()
	switch d.reading {
	case Gauge:
		return (si - atm) / d.scale
	case Vacuum:
		return (atm - si) / d.scale
	}
	return si/d.scale - d.offset
}

// DeltaToSI converts a difference or tolerance expressed in u: scale only, without the
// temperature offset or the atmosphere (2 F -> 1.111 K, 5 psig -> 34474 Pa). A tolerance on a
// temperature therefore uses DeltaToSI of the temperature unit itself.
func (u Unit) DeltaToSI(dv float64) float64 { return dv * u.def().scale }

// DeltaFromSI is the inverse of DeltaToSI.
func (u Unit) DeltaFromSI(d float64) float64 { return d / u.def().scale }
