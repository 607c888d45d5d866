package solve

import "hmb/thermo/model"

// Diagnostic codes of the solver. They are stable: quick fixes and suppressions key on them.
const (
	CodeStateOverSpecified = "S401"
	CodeStateInconsistent  = "S402"
	CodeStateAmbiguous     = "S403"
	CodeOutsideIF97        = "S404"
	CodeQualityRange       = "S405"
	CodeNoDome             = "S406"
	CodeNegativeFlow       = "S407"

	CodeUnderSpecified = "B501"
	CodeConflict       = "B502"
	CodeNotClosed      = "B503"
	CodeClosure        = "B504"
	CodeNoConvergence  = "B505"
	CodeEntropy        = "B506"
	CodeEfficiency     = "B507"
	CodeTempCross      = "B508"
	CodePumpInlet      = "B509"
	CodeWetExhaust     = "B510"
	CodeStructure      = "B511"
	CodeTimeout        = "B512"

	CodeExpectFailed   = "E601"
	CodeExpectUnsolved = "E602"
	CodeExpectUnknown  = "E603"
)

// Codes documents every code the solver reports.
var Codes = []model.CodeInfo{
	{Code: CodeStateOverSpecified, Severity: model.Error, Summary: "a stream gives more than two intensive properties (p, T, h, s, x) of a single-phase state"},
	{Code: CodeStateInconsistent, Severity: model.Error, Summary: "a stream gives p, T and quality, but T is not the saturation temperature at p"},
	{Code: CodeStateAmbiguous, Severity: model.Error, Summary: "a stream gives p and T on the saturation line; its quality is needed to fix the state"},
	{Code: CodeOutsideIF97, Severity: model.Error, Summary: "a given or solved state lies outside the range of IAPWS-IF97"},
	{Code: CodeQualityRange, Severity: model.Error, Summary: "a given quality is outside 0..1"},
	{Code: CodeNoDome, Severity: model.Error, Summary: "a quality is given at or above the critical pressure, where there is no two-phase region"},
	{Code: CodeNegativeFlow, Severity: model.Warning, Summary: "a solved mass flow is negative: the stream runs against its stated direction"},

	{Code: CodeUnderSpecified, Severity: model.Error, Summary: "the system is under-specified: some unknowns are fixed by no given or balance"},
	{Code: CodeConflict, Severity: model.Error, Summary: "a given conflicts with the value the other givens and the balances fix"},
	{Code: CodeNotClosed, Severity: model.Error, Summary: "a redundant balance does not close within the tolerance"},
	{Code: CodeClosure, Severity: model.Info, Summary: "a redundant balance or given closes within the tolerance"},
	{Code: CodeNoConvergence, Severity: model.Error, Summary: "the solver could not find values satisfying a group of equations"},
	{Code: CodeEntropy, Severity: model.Error, Summary: "a unit generates negative entropy: the process is impossible"},
	{Code: CodeEfficiency, Severity: model.Error, Summary: "an isentropic or boiler efficiency is outside 0..1"},
	{Code: CodeTempCross, Severity: model.Error, Summary: "temperature cross in a counterflow exchanger: the hot side is colder than the cold side at an end"},
	{Code: CodePumpInlet, Severity: model.Warning, Summary: "a pump inlet is not liquid"},
	{Code: CodeWetExhaust, Severity: model.Warning, Summary: "a turbine exhaust has more than 10 % moisture (common practice, no source)"},
	{Code: CodeStructure, Severity: model.Error, Summary: "the model cannot be turned into equations (a port naming no stream, an unsupported fluid)"},
	{Code: CodeTimeout, Severity: model.Error, Summary: "solving stopped at the time limit or on cancellation"},

	{Code: CodeExpectFailed, Severity: model.Error, Summary: "an expectation does not hold for the solved values"},
	{Code: CodeExpectUnsolved, Severity: model.Error, Summary: "an expectation cannot be checked: the value it names was not solved"},
	{Code: CodeExpectUnknown, Severity: model.Error, Summary: "an expectation names a property the solver does not compute"},
}
