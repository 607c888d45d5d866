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
}

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

// Gauge reports whether the unit measures pressure above the site atmosphere.
func (u Unit) Gauge() bool { return u.def().gauge }

// String returns the canonical symbol, so units print as they are spelled.
func (u Unit) String() string { return u.Symbol() }

// ToSI converts a value in u to absolute SI base units: Pa, K, J/kg, J/(kg K), m3/kg, kg/m3,
// kg/s, W, m, m/s, W/K, and a plain fraction for dimensionless units. atm is the site atmosphere in Pa and
// is used only by gauge units. A gauge value below -atm yields a negative absolute pressure; the
// caller decides how to report it.
func (u Unit) ToSI(v, atm float64) float64 {
	d := u.def()
	if d.gauge {
		return v*d.scale + atm
	}
	return (v + d.offset) * d.scale
}

// FromSI is the inverse of ToSI.
func (u Unit) FromSI(si, atm float64) float64 {
	d := u.def()
	if d.gauge {
		return (si - atm) / d.scale
	}
	return si/d.scale - d.offset
}

// DeltaToSI converts a difference or tolerance expressed in u: scale only, without the
// temperature offset or the atmosphere (2 F -> 1.111 K, 5 psig -> 34474 Pa). A tolerance on a
// temperature therefore uses DeltaToSI of the temperature unit itself.
func (u Unit) DeltaToSI(dv float64) float64 { return dv * u.def().scale }

// DeltaFromSI is the inverse of DeltaToSI.
func (u Unit) DeltaFromSI(d float64) float64 { return d / u.def().scale }
