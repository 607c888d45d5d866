package model

import "hmb/thermo/units"

// PortSpec describes one port role of a unit kind.
type PortSpec struct {
	Role  string
	Inlet bool // true: the stream flows into the unit
	Many  bool // one or more streams may take this role (e.g. mixer inlets)
	Doc   string
}

// ParamSpec describes one parameter of a unit kind.
type ParamSpec struct {
	Name  string
	Dim   units.Dim
	Delta bool // a difference (pressure drop): converted without offset or atmosphere
	Doc   string
}

// Kind is a kind of equipment: the ports it has and the parameters it takes. The balance equations
// belong to the solver; this catalogue is what the notation needs to check a file.
type Kind struct {
	Name   string
	Doc    string
	Ports  []PortSpec
	Params []ParamSpec
}

// Port returns the spec of a role, or nil.
func (k *Kind) Port(role string) *PortSpec {
	for i := range k.Ports {
		if k.Ports[i].Role == role {
			return &k.Ports[i]
		}
	}
	return nil
}

// Param returns the spec of a parameter, or nil.
func (k *Kind) Param(name string) *ParamSpec {
	for i := range k.Params {
		if k.Params[i].Name == name {
			return &k.Params[i]
		}
	}
	return nil
}

var (
	in      = PortSpec{Role: "in", Inlet: true, Doc: "inlet stream"}
	ins     = PortSpec{Role: "in", Inlet: true, Many: true, Doc: "inlet streams"}
	out     = PortSpec{Role: "out", Doc: "outlet stream"}
	outs    = PortSpec{Role: "out", Many: true, Doc: "outlet streams"}
	dp      = ParamSpec{Name: "dp", Dim: units.Pressure, Delta: true, Doc: "pressure drop, inlet to outlet"}
	loss    = ParamSpec{Name: "heat_loss", Dim: units.Power, Doc: "heat lost to surroundings"}
	duty    = ParamSpec{Name: "duty", Dim: units.Power, Doc: "heat added to the fluid"}
	effIsen = ParamSpec{Name: "efficiency", Dim: units.Dimensionless, Doc: "isentropic efficiency"}
)

// Kinds is the catalogue of unit kinds, by name.
var Kinds = map[string]*Kind{
	"mixer": {Name: "mixer", Doc: "adiabatic mixing chamber, open feedwater heater or deaerator: inlets mix into one outlet",
		Ports: []PortSpec{ins, out}, Params: []ParamSpec{loss, dp}},
	"splitter": {Name: "splitter", Doc: "tee: outlets leave at the inlet state",
		Ports: []PortSpec{in, outs}},
	"valve": {Name: "valve", Doc: "throttling valve: enthalpy conserved",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{dp}},
	"heater": {Name: "heater", Doc: "heat added to one stream",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{duty, dp}},
	"cooler": {Name: "cooler", Doc: "heat removed from one stream",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{{Name: "duty", Dim: units.Power, Doc: "heat removed from the fluid"}, dp}},
	"boiler": {Name: "boiler", Doc: "steam generator: feedwater heated to steam",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{duty, dp,
			{Name: "efficiency", Dim: units.Dimensionless, Doc: "boiler efficiency: duty over fuel input"},
			{Name: "fuel", Dim: units.Power, Doc: "fuel heat input"}}},
	"turbine": {Name: "turbine", Doc: "adiabatic expansion producing shaft power",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{effIsen,
			{Name: "power", Dim: units.Power, Doc: "shaft power produced"}}},
	"pump": {Name: "pump", Doc: "adiabatic compression of liquid taking shaft power",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{effIsen,
			{Name: "power", Dim: units.Power, Doc: "shaft power absorbed"}}},
	"exchanger": {Name: "exchanger", Doc: "two-stream heat exchanger without mixing (closed feedwater heater, condenser)",
		Ports: []PortSpec{
			{Role: "hot_in", Inlet: true, Doc: "hot-side inlet"}, {Role: "hot_out", Doc: "hot-side outlet"},
			{Role: "cold_in", Inlet: true, Doc: "cold-side inlet"}, {Role: "cold_out", Doc: "cold-side outlet"}},
		Params: []ParamSpec{{Name: "duty", Dim: units.Power, Doc: "heat passed from hot to cold side"}, loss,
			{Name: "dp_hot", Dim: units.Pressure, Delta: true, Doc: "hot-side pressure drop"},
			{Name: "dp_cold", Dim: units.Pressure, Delta: true, Doc: "cold-side pressure drop"}}},
	"flash": {Name: "flash", Doc: "flash tank or separator: feed splits into saturated vapour and saturated liquid at the tank pressure",
		Ports:  []PortSpec{ins, {Role: "vapor", Doc: "saturated vapour outlet"}, {Role: "liquid", Doc: "saturated liquid outlet"}},
		Params: []ParamSpec{loss}},
	"desuperheater": {Name: "desuperheater", Doc: "spray water into steam to reach a target outlet state",
		Ports: []PortSpec{{Role: "steam", Inlet: true, Doc: "superheated steam inlet"},
			{Role: "water", Inlet: true, Doc: "spray water inlet"}, out},
		Params: []ParamSpec{loss}},
}
