package solve

import "hmb/thermo/model"

// Diagnostic codes of the solver. They are stable: quick fixes and suppressions key on them.
const (
	CodeStateOverSpecified = "HMB401"
	CodeStateInconsistent  = "HMB402"
	CodeStateAmbiguous     = "HMB403"
	CodeOutsideIF97        = "HMB404"
	CodeQualityRange       = "HMB405"
	CodeNoDome             = "HMB406"
	CodeNegativeFlow       = "HMB407"
	CodeOutletState        = "HMB408"
	CodeOverspray          = "HMB409"
	CodeVolumeNotLiquid    = "HMB420"

	CodeUnderSpecified = "HMB501"
	CodeConflict       = "HMB502"
	CodeNotClosed      = "HMB503"
	CodeClosure        = "HMB504"
	CodeNoConvergence  = "HMB505"
	CodeEntropy        = "HMB506"
	CodeEfficiency     = "HMB507"
	CodeTempCross      = "HMB508"
	CodePumpInlet      = "HMB509"
	CodeWetExhaust     = "HMB510"
	CodeStructure      = "HMB511"
	CodeTimeout        = "HMB512"
	CodeFlashFeed      = "HMB513"
	CodePressureRise   = "HMB514"
	CodeApproach       = "HMB515"
	CodeDeaeratorFeed  = "HMB530"

	CodeExpectFailed   = "HMB601"
	CodeExpectUnsolved = "HMB602"
	CodeExpectUnknown  = "HMB603"
)

// Codes documents every code the solver reports.
var Codes = []model.CodeInfo{
	{Code: CodeStateOverSpecified, Name: "state-over-specified", Severity: model.Error, Summary: "a stream gives more than two intensive properties (p, T, h, s, x) of a single-phase state", Help: "A single-phase state is fixed by two intensive properties; drop the extra given."},
	{Code: CodeStateInconsistent, Name: "state-inconsistent", Severity: model.Error, Summary: "a stream gives p, T and quality, but T is not the saturation temperature at p", Help: "With p, T and a quality given, T must be the saturation temperature at p."},
	{Code: CodeStateAmbiguous, Name: "state-ambiguous", Severity: model.Error, Summary: "a stream gives p and T on the saturation line; its quality is needed to fix the state", Help: "p and T on the saturation line do not fix a state; give the quality x (or h) instead of T."},
	{Code: CodeOutsideIF97, Name: "outside-iapws-if97", Severity: model.Error, Summary: "a given or solved state lies outside the range of IAPWS-IF97", Help: "The state lies outside the range of IAPWS-IF97 (273.15 K to 2273.15 K, up to 100 MPa; above 1073.15 K only to 50 MPa)."},
	{Code: CodeQualityRange, Name: "quality-out-of-range", Severity: model.Error, Summary: "a given quality is outside 0..1", Help: "A quality lies in 0..1."},
	{Code: CodeNoDome, Name: "no-two-phase-region", Severity: model.Error, Summary: "a quality is given at or above the critical pressure, where there is no two-phase region", Help: "At or above the critical pressure (22.064 MPa) there is no two-phase region, so a quality has no meaning."},
	{Code: CodeNegativeFlow, Name: "negative-flow", Severity: model.Error, Summary: "a solved mass flow is negative: the givens named force the stream against its stated direction", Help: "A solved flow runs against its stated direction, which no plant does; the givens named in the message force it: correct one of them."},
	{Code: CodeOutletState, Name: "outlet-state-contradicts-unit", Severity: model.Error, Summary: "an outlet state contradicts the unit's model (a flash tank's vapour or liquid not saturated at the tank pressure)", Help: "The givens leave an outlet in a state the unit cannot deliver (a flash tank's outlets leave saturated at the tank pressure); one of the givens named is wrong or one too many."},
	{Code: CodeOverspray, Name: "desuperheater-overspray", Severity: model.Warning, Summary: "a desuperheater's outlet is wet: more spray water than the steam can evaporate", Help: "The spray water is more than the steam can evaporate, so water reaches the pipe downstream; aim the outlet above the saturation temperature."},
	{Code: CodeVolumeNotLiquid, Name: "volume-flow-not-liquid", Severity: model.Error, Summary: "a flow given in volume units (gpm, m3/h, L/s) on a stream that is not liquid", Help: "A volume flow is taken at the stream's own density, which is well defined for a liquid; a steam or wet-steam flow is metered and stated as a mass flow (kg/s, t/h, lbm/h): give it in mass units."},

	{Code: CodeUnderSpecified, Name: "under-specified", Severity: model.Error, Summary: "the system is under-specified: some unknowns are fixed by no given or balance", Help: "Some unknowns are fixed by no given or balance; state one of the values the message lists."},
	{Code: CodeConflict, Name: "conflicting-given", Severity: model.Error, Summary: "a given conflicts with the value the other givens and the balances fix", Help: "A given disagrees with the value the other givens and the balances fix; drop one or correct it."},
	{Code: CodeNotClosed, Name: "balance-not-closed", Severity: model.Error, Summary: "a redundant balance does not close within the tolerance", Help: "A balance that the givens over-determine does not close within the tolerance."},
	{Code: CodeClosure, Name: "balance-closed", Severity: model.Info, Summary: "a redundant balance or given closes within the tolerance", Help: "A redundant balance or given closes within the tolerance (information)."},
	{Code: CodeNoConvergence, Name: "no-convergence", Severity: model.Error, Summary: "the solver could not find values satisfying a group of equations", Help: "No values satisfy the group of equations named in the message; check the givens it lists."},
	{Code: CodeEntropy, Name: "negative-entropy-generation", Severity: model.Error, Summary: "a unit generates negative entropy: the process is impossible", Help: "The unit would destroy entropy: the process described is impossible."},
	{Code: CodeEfficiency, Name: "efficiency-out-of-range", Severity: model.Error, Summary: "an isentropic or boiler efficiency is outside 0..1", Help: "A solved isentropic or boiler efficiency lies outside 0..1: the process described is impossible."},
	{Code: CodeTempCross, Name: "temperature-cross", Severity: model.Error, Summary: "temperature cross: an exchanger's hot side is colder than its cold side somewhere along the profile, or a heater's source (cooler's sink) at T_boundary is on the wrong side of the fluid", Help: "Heat would have to flow from cold to hot: in an exchanger the hot side is colder than the cold side somewhere (at an end, or inside where a side changes phase); a heater's T_boundary is below the fluid it heats, or a cooler's above the fluid it cools."},
	{Code: CodePumpInlet, Name: "pump-inlet-not-liquid", Severity: model.Warning, Summary: "a pump inlet is not liquid", Help: "A pump inlet should be liquid; a wet or vapour inlet cavitates."},
	{Code: CodeWetExhaust, Name: "wet-turbine-exhaust", Severity: model.Warning, Summary: "a turbine exhaust has more than 10 % moisture (common practice, no source)", Help: "More than 10 % moisture at a turbine exhaust erodes the last blades (common practice, no source)."},
	{Code: CodeStructure, Name: "unsolvable-model", Severity: model.Error, Summary: "the model cannot be turned into equations (a port naming no stream, an unsupported fluid)", Help: "The model cannot be turned into equations."},
	{Code: CodeTimeout, Name: "solver-time-limit", Severity: model.Error, Summary: "solving stopped at the time limit or on cancellation", Help: "Solving stopped at the time limit or on cancellation; the values shown are incomplete."},
	{Code: CodeFlashFeed, Name: "flash-feed-single-phase", Severity: model.Error, Summary: "a flash tank's feed is subcooled (nothing can flash) or superheated (no liquid is left) at the tank pressure", Help: "A flash tank splits a feed that lies inside the saturation dome at the tank pressure; lower the tank pressure or check the feed's state."},
	{Code: CodePressureRise, Name: "flow-against-pressure", Severity: model.Error, Summary: "a stream would flow to a higher pressure through a unit that cannot raise it (or a turbine's outlet is above its inlet)", Help: "Only a pump raises the pressure of a stream; a feed below the pressure it enters, or an outlet above its inlet, needs a pump or a corrected pressure."},
	{Code: CodeApproach, Name: "approach-below-minimum", Severity: model.Warning, Summary: "an exchanger's minimum temperature difference is below its min_approach", Help: "The closest approach of the hot and cold profiles is below the minimum the unit states: the exchanger would need more area than intended."},
	{Code: CodeDeaeratorFeed, Name: "deaerator-feed-off-saturation", Severity: model.Error, Summary: "a deaerator's inlets, mixed, are subcooled (too little heating steam) or superheated (no water left) at the tank pressure", Help: "A deaerator heats its water to saturation at the tank pressure with steam: give more heating steam (or leave its flow to the balances), a lower tank pressure, or check the inlet states."},

	{Code: CodeExpectFailed, Name: "expectation-failed", Severity: model.Error, Summary: "an expectation does not hold for the solved values", Help: "An expectation does not hold for the solved values."},
	{Code: CodeExpectUnsolved, Name: "expectation-unsolved", Severity: model.Error, Summary: "an expectation cannot be checked: the value it names was not solved", Help: "The value the expectation names was not solved."},
	{Code: CodeExpectUnknown, Name: "expectation-unknown-property", Severity: model.Error, Summary: "an expectation names a property the solver does not compute", Help: "The expectation names a property the solver does not compute."},
}
