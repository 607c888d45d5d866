package model

import "hmb/thermo/units"

// PortSpec describes one port role of a unit kind.
type PortSpec struct {
	Role  string
	Inlet bool // true: the stream flows into the unit
	Many  bool // one or more streams may take this role (e.g. mixer inlets)
	// Optional roles may name no stream (a boiler without blowdown).
	Optional bool
	Doc      string
}

// ParamSpec describes one parameter of a unit kind.
type ParamSpec struct {
	Name  string
	Dim   units.Dim
	Delta bool // a difference (pressure drop): converted without offset or atmosphere
	Doc   string
	// Words, when set, are the values the parameter takes instead of a number, the default
	// first (an exchanger's flow arrangement); a file states one as a name: "arrangement
	// parallel". It is lowered to Unit.Options.
	Words []string
	// Needs is a role the parameter needs a stream for (blowdown_rate needs a blowdown).
	Needs string
}

// ResultSpec describes one result: a value the solver finds for a stream or a unit, which outputs
// show and an expectation may check. Its value comes from solve.Result.Value, the one lookup of
// a result by name; a new result is one row here and one computation there.
type ResultSpec struct {
	Name string
	Dim  units.Dim
	// Delta marks a difference (a pressure drop, a superheat): shown and written without offset
	// or atmosphere, like a ParamSpec's Delta.
	Delta bool
	Doc   string
}

// Show writes a value of the result in d: a difference (Delta) without offset or gauge reading.
func (r *ResultSpec) Show(d units.Display, si float64) string {
	if r.Delta {
		return d.Delta(r.Dim, si)
	}
	return d.Show(r.Dim, si)
}

// Kind is a kind of equipment: the ports it has, the parameters it takes and the results the
// solver reports for it. The balance equations belong to the solver; this catalogue is what the
// notation needs to check a file and what every output names results by.
type Kind struct {
	Name    string
	Doc     string
	Ports   []PortSpec
	Params  []ParamSpec
	Results []ResultSpec
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

// Result returns the spec of a result, or nil.
func (k *Kind) Result(name string) *ResultSpec { return findResult(k.Results, name) }

func findResult(rs []ResultSpec, name string) *ResultSpec {
	for i := range rs {
		if rs[i].Name == name {
			return &rs[i]
		}
	}
	return nil
}

// StreamResults are the results of every stream, in display order. The first six are the
// properties a file may give (Prop); the rest are derived from the state.
var StreamResults = []ResultSpec{
	{Name: "flow", Dim: units.MassFlow, Doc: "mass flow of the stream"},
	{Name: "p", Dim: units.Pressure, Doc: "pressure (absolute, or gauge against the site atmosphere with a gauge unit)"},
	{Name: "T", Dim: units.Temperature, Doc: "temperature"},
	{Name: "h", Dim: units.SpecificEnergy, Doc: "specific enthalpy (IAPWS-IF97 reference: liquid at the triple point has u = 0, s = 0)"},
	{Name: "s", Dim: units.SpecificEntropy, Doc: "specific entropy"},
	{Name: "x", Dim: units.Dimensionless, Doc: "quality: the vapour mass fraction of wet steam, 0 (saturated liquid) to 1 (saturated vapour)"},
	{Name: "v", Dim: units.SpecificVolume, Doc: "specific volume"},
	{Name: "rho", Dim: units.Density, Doc: "density"},
	{Name: "vol_flow", Dim: units.VolumeFlow, Doc: "volumetric flow at the stream's state: flow over density"},
	{Name: "Tsat", Dim: units.Temperature, Doc: "saturation temperature at the stream's pressure (none above the critical pressure)"},
	{Name: "superheat", Dim: units.Temperature, Delta: true, Doc: "degrees of superheat, T - Tsat: vapour only"},
	{Name: "subcooling", Dim: units.Temperature, Delta: true, Doc: "degrees of subcooling, Tsat - T: liquid only"},
}

// StreamResult returns the spec of a stream result, or nil.
func StreamResult(name string) *ResultSpec { return findResult(StreamResults, name) }

// SubjectKind says what a result belongs to.
type SubjectKind uint8

const (
	StreamSubject SubjectKind = iota
	UnitSubject
	// TotalSubject is the whole file: TotalResults, named "total" in an expectation.
	TotalSubject
)

// TotalName is the subject an expectation names for the whole file's totals.
const TotalName = "total"

// TotalResults are the results of the whole file: the totals of its units' shaft powers and
// heat duties (see solve.Totals for which units count where).
var TotalResults = []ResultSpec{
	{Name: "power_out", Dim: units.ShaftPower, Doc: "shaft power produced by every turbine"},
	{Name: "power_in", Dim: units.ShaftPower, Doc: "shaft power absorbed by every pump"},
	{Name: "net_power", Dim: units.ShaftPower, Doc: "power_out - power_in"},
	{Name: "heat_in", Dim: units.Power, Doc: "heat added by boilers and heaters (and exchangers heated from outside the file)"},
	{Name: "heat_out", Dim: units.Power, Doc: "heat removed by coolers and condensers (exchangers cooled from outside the file)"},
	{Name: "efficiency", Dim: units.Dimensionless, Doc: "net_power / heat_in: the cycle's thermal efficiency (none without net power)"},
	{Name: "heat_rate", Dim: units.HeatRate, Doc: "heat_in / net_power: heat per unit of net work, kJ/kWh or Btu/kWh (none without net power)"},
}

// Subject is a stream or a unit of a model, by index into Model.Streams or Model.Units.
type Subject struct {
	Kind  SubjectKind
	Index int
}

// Subject is what the expectation checks.
func (e *Expect) Subject() Subject {
	if e.Total {
		return Subject{Kind: TotalSubject}
	}
	if e.Unit >= 0 {
		return Subject{Kind: UnitSubject, Index: e.Unit}
	}
	return Subject{Kind: StreamSubject, Index: e.Stream}
}

// Results lists the results of a subject of m: StreamResults, or the results of the unit's kind
// (none for an index out of range or a unit of unknown kind).
func (m *Model) Results(sub Subject) []ResultSpec {
	switch sub.Kind {
	case StreamSubject:
		if sub.Index >= 0 && sub.Index < len(m.Streams) {
			return StreamResults
		}
	case UnitSubject:
		if sub.Index >= 0 && sub.Index < len(m.Units) && m.Units[sub.Index] != nil && m.Units[sub.Index].Kind != nil {
			return m.Units[sub.Index].Kind.Results
		}
	case TotalSubject:
		return TotalResults
	}
	return nil
}

// Result returns the spec of the result name of a subject of m, or nil.
func (m *Model) Result(sub Subject, name string) *ResultSpec { return findResult(m.Results(sub), name) }

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

	sgen     = ResultSpec{Name: "sgen", Dim: units.EntropyRate, Doc: "entropy generated: zero for a reversible process, below zero impossible"}
	lossR    = ResultSpec{Name: "heat_loss", Dim: units.Power, Doc: "heat lost to surroundings, as given (zero when not given)"}
	dutyIn   = ResultSpec{Name: "duty", Dim: units.Power, Doc: "heat added to the fluid"}
	effIsenR = ResultSpec{Name: "efficiency", Dim: units.Dimensionless, Doc: "isentropic efficiency, given or solved"}
	dpR      = ResultSpec{Name: "dp", Dim: units.Pressure, Delta: true, Doc: "pressure drop: the lowest inlet pressure less the highest outlet pressure (below zero for a rise)"}

	// tBound is where a duty crosses the boundary, for the entropy generation (see the README).
	tBound = ParamSpec{Name: "T_boundary", Dim: units.Temperature, Doc: "temperature at which the duty crosses the unit's boundary (heating medium, flue gas, cooling water), for the entropy generation"}
)

// Kinds is the catalogue of unit kinds, by name.
var Kinds = map[string]*Kind{
	"mixer": {Name: "mixer", Doc: "adiabatic mixing chamber or open feedwater heater: inlets mix into one outlet",
		Ports: []PortSpec{ins, out}, Params: []ParamSpec{loss, dp},
		Results: []ResultSpec{lossR, dpR, sgen}},
	"splitter": {Name: "splitter", Doc: "tee: outlets leave at the inlet state",
		Ports: []PortSpec{in, outs}, Results: []ResultSpec{dpR, sgen}},
	"valve": {Name: "valve", Doc: "throttling valve: enthalpy conserved",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{dp}, Results: []ResultSpec{dpR, sgen}},
	"heater": {Name: "heater", Doc: "heat added to one stream",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{duty, dp, tBound}, Results: []ResultSpec{dutyIn, dpR, sgen}},
	"cooler": {Name: "cooler", Doc: "heat removed from one stream",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{{Name: "duty", Dim: units.Power, Doc: "heat removed from the fluid"}, dp, tBound},
		Results: []ResultSpec{{Name: "duty", Dim: units.Power, Doc: "heat removed from the fluid"}, dpR, sgen}},
	"boiler": {Name: "boiler", Doc: "steam generator: feedwater heated to steam, with an optional blowdown of saturated drum water",
		Ports: []PortSpec{in, out, {Role: "blowdown", Optional: true, Doc: "blowdown: saturated liquid purged from the drum at the steam outlet pressure (optional)"}},
		Params: []ParamSpec{duty, dp,
			{Name: "efficiency", Dim: units.Dimensionless, Doc: "boiler efficiency: duty over fuel input"},
			{Name: "fuel", Dim: units.Power, Doc: "fuel heat input"}, tBound,
			{Name: "blowdown_rate", Dim: units.Dimensionless, Needs: "blowdown", Doc: "blowdown flow as a share of the feedwater flow (needs a blowdown stream)"}},
		Results: []ResultSpec{dutyIn,
			{Name: "efficiency", Dim: units.Dimensionless, Doc: "boiler efficiency, duty over fuel input, given or solved"},
			{Name: "fuel", Dim: units.Power, Doc: "fuel heat input, given or solved"}, dpR,
			{Name: "blowdown_rate", Dim: units.Dimensionless, Doc: "blowdown flow over feedwater flow, given or solved (none without a blowdown stream)"}, sgen}},
	"deaerator": {Name: "deaerator", Doc: "deaerator with a vent: inlets (water and heating steam) meet in a tank; saturated steam leaves by the vent and saturated water below, both at the tank pressure",
		Ports: []PortSpec{ins, {Role: "vent", Doc: "vent: saturated steam at the tank pressure"}, {Role: "out", Doc: "deaerated water: saturated liquid at the tank pressure"}},
		Params: []ParamSpec{loss, {Name: "dp", Dim: units.Pressure, Delta: true, Doc: "tank pressure below the lowest inlet pressure"},
			{Name: "vent_rate", Dim: units.Dimensionless, Doc: "vent flow as a share of the deaerated water flow"}},
		Results: []ResultSpec{lossR, dpR,
			{Name: "vent_rate", Dim: units.Dimensionless, Doc: "vent flow over deaerated water flow, given or solved"}, sgen}},
	"turbine": {Name: "turbine", Doc: "adiabatic expansion producing shaft power",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{effIsen,
			{Name: "power", Dim: units.ShaftPower, Doc: "shaft power produced"}},
		Results: []ResultSpec{{Name: "power", Dim: units.ShaftPower, Doc: "shaft power produced"}, effIsenR, dpR, sgen}},
	"pump": {Name: "pump", Doc: "adiabatic compression of liquid taking shaft power",
		Ports: []PortSpec{in, out}, Params: []ParamSpec{effIsen,
			{Name: "power", Dim: units.ShaftPower, Doc: "shaft power absorbed"}},
		Results: []ResultSpec{{Name: "power", Dim: units.ShaftPower, Doc: "shaft power absorbed"}, effIsenR, dpR, sgen}},
	"exchanger": {Name: "exchanger", Doc: "two-stream heat exchanger without mixing (closed feedwater heater, condenser)",
		Ports: []PortSpec{
			{Role: "hot_in", Inlet: true, Doc: "hot-side inlet"}, {Role: "hot_out", Doc: "hot-side outlet"},
			{Role: "cold_in", Inlet: true, Doc: "cold-side inlet"}, {Role: "cold_out", Doc: "cold-side outlet"}},
		Params: []ParamSpec{{Name: "duty", Dim: units.Power, Doc: "heat passed from hot to cold side"}, loss,
			{Name: "dp_hot", Dim: units.Pressure, Delta: true, Doc: "hot-side pressure drop"},
			{Name: "dp_cold", Dim: units.Pressure, Delta: true, Doc: "cold-side pressure drop"},
			{Name: "arrangement", Words: []string{"counterflow", "parallel"}, Doc: "flow arrangement: counterflow (the default) or parallel"},
			{Name: "min_approach", Dim: units.Temperature, Delta: true, Doc: "least temperature difference wanted along the profile: a warning below it"}},
		Results: []ResultSpec{{Name: "duty", Dim: units.Power, Doc: "heat passed from hot to cold side"}, lossR,
			{Name: "dp_hot", Dim: units.Pressure, Delta: true, Doc: "hot-side pressure drop, inlet less outlet"},
			{Name: "dp_cold", Dim: units.Pressure, Delta: true, Doc: "cold-side pressure drop, inlet less outlet"},
			{Name: "dT_min", Dim: units.Temperature, Delta: true, Doc: "least hot-minus-cold temperature difference along the profile, zone by zone (below zero: a cross)"},
			{Name: "lmtd", Dim: units.Temperature, Delta: true, Doc: "log-mean temperature difference, zone-weighted where a side changes phase: duty over UA"},
			{Name: "UA", Dim: units.EntropyRate, Doc: "overall conductance: the sum over the zones of each zone's duty over its log-mean temperature difference"},
			sgen}},
	"flash": {Name: "flash", Doc: "flash tank or separator: feed splits into saturated vapour and saturated liquid at the tank pressure",
		Ports:  []PortSpec{ins, {Role: "vapor", Doc: "saturated vapour outlet"}, {Role: "liquid", Doc: "saturated liquid outlet"}},
		Params: []ParamSpec{loss}, Results: []ResultSpec{lossR, dpR, sgen}},
	"desuperheater": {Name: "desuperheater", Doc: "spray water into steam to reach a target outlet state",
		Ports: []PortSpec{{Role: "steam", Inlet: true, Doc: "superheated steam inlet"},
			{Role: "water", Inlet: true, Doc: "spray water inlet"}, out},
		Params:  []ParamSpec{loss, {Name: "dp", Dim: units.Pressure, Delta: true, Doc: "pressure drop, steam inlet to outlet"}},
		Results: []ResultSpec{lossR, dpR, sgen}},
}
