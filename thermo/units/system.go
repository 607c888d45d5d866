package units

import "strings"

// System is a family of display units.
type System uint8

const (
	SI System = iota
	US
)

func (s System) String() string {
	if s == US {
		return "US"
	}
	return "SI"
}

// ParseSystem accepts "SI" or "US" in either case.
func ParseSystem(s string) (System, bool) {
	switch {
	case strings.EqualFold(s, "SI"):
		return SI, true
	case strings.EqualFold(s, "US"):
		return US, true
	}
	return SI, false
}

var defaults = [2][numDims]string{
	SI: {
		Dimensionless:   "",
		Pressure:        "kPa",
		Temperature:     "C",
		TemperatureDiff: "dK",
		SpecificEnergy:  "kJ/kg",
		SpecificEntropy: "kJ/(kg K)",
		SpecificVolume:  "m3/kg",
		Density:         "kg/m3",
		MassFlow:        "kg/s",
		Power:           "kW",
		Length:          "m",
		Velocity:        "m/s",
		EntropyRate:     "kW/K",
		ShaftPower:      "kW",
		VolumeFlow:      "m3/h",
		HeatRate:        "kJ/kWh",
	},
	US: {
		Dimensionless:   "",
		Pressure:        "psia",
		Temperature:     "F",
		TemperatureDiff: "dR",
		SpecificEnergy:  "Btu/lbm",
		SpecificEntropy: "Btu/(lbm R)",
		SpecificVolume:  "ft3/lbm",
		Density:         "lbm/ft3",
		MassFlow:        "lbm/h",
		Power:           "Btu/h",
		Length:          "ft",
		Velocity:        "ft/s",
		EntropyRate:     "Btu/(h R)",
		ShaftPower:      "hp", // work in horsepower, heat in Btu/h: US trade usage
		VolumeFlow:      "gpm",
		HeatRate:        "Btu/kWh",
	},
}

// Default is the unit a report shows a dimension in. Pressures are absolute; a temperature
// difference shows as dK (SI) or dR (US), the kelvin and rankine scales. An unknown system or
// dimension gets the bare number.
func (s System) Default(d Dim) Unit {
	if int(s) >= len(defaults) || int(d) >= numDims {
		return Unit{}
	}
	return bySymbol[defaults[s][d]]
}

// Has reports whether u is one of the system's own units. Units that belong to neither family
// (the bare number, %) belong to both.
func (s System) Has(u Unit) bool {
	if u.Dim() == Dimensionless {
		return true
	}
	return u.US() == (s == US)
}

// Gauge is the gauge-pressure unit a report of the system shows beside the absolute pressure:
// psig (US) or kPa(g) (SI).
func (s System) Gauge() Unit {
	if s == US {
		return bySymbol["psig"]
	}
	return bySymbol["kPa(g)"]
}
