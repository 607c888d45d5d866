package check

import "hmb/thermo/model"

// Diagnostic codes of the checker: HMB2xx for names and wiring, HMB3xx for values, units
// and settings. They are stable; quick fixes and suppression key on them.
const (
	CodeUndefined     = "HMB201"
	CodeDuplicate     = "HMB202"
	CodeTwoProducers  = "HMB203"
	CodeTwoConsumers  = "HMB204"
	CodeMissingPort   = "HMB205"
	CodeExtraPort     = "HMB206"
	CodeUnknownKind   = "HMB207"
	CodeUnknownRole   = "HMB208"
	CodeUnconnected   = "HMB209"
	CodeSelfLoop      = "HMB210"
	CodeNotAStream    = "HMB211"
	CodeUnknownResult = "HMB212"

	CodeUnknownUnit    = "HMB301"
	CodeDimension      = "HMB302"
	CodeFraction       = "HMB303"
	CodeImpossible     = "HMB304"
	CodeDuplicateGiven = "HMB305"
	CodeUnknownParam   = "HMB306"
	CodeNoUnit         = "HMB307"
	CodeUnknownSetting = "HMB308"
	CodeSettingTwice   = "HMB309"
	CodeSettingValue   = "HMB310"
	CodeFluid          = "HMB311"
	CodeTolerance      = "HMB312"
	CodeRange          = "HMB313"
	CodeEntryForm      = "HMB314"
	CodeStreamList     = "HMB315"
	CodeNegativeDrop   = "HMB316"
	CodeNoReading      = "HMB317"
	CodeRelativeDelta  = "HMB318"
	CodeRelativeTemp   = "HMB319"
	CodeNeedsRole      = "HMB330"

	CodeDuplicateCase = "HMB340"
	CodeSweepStep     = "HMB341"
	CodeSweepPoints   = "HMB342"
	CodeFreeNothing   = "HMB343"
	CodeCaseForm      = "HMB344"
	CodeSweepRange    = "HMB345"
	CodeUnknownCase   = "HMB346"
)

// Codes documents the checker's diagnostic codes.
var Codes = []model.CodeInfo{
	{Code: CodeUndefined, Name: "undeclared-name", Severity: model.Error, Summary: "name used but not declared (streams need a stream statement)", Help: "Declare the stream with a stream statement (the quick fix does it), or correct the spelling."},
	{Code: CodeDuplicate, Name: "duplicate-name", Severity: model.Error, Summary: "name declared twice (streams and units share one namespace)", Help: "Rename one of the two declarations; streams and units share one namespace."},
	{Code: CodeTwoProducers, Name: "stream-leaves-two-units", Severity: model.Error, Summary: "stream leaves two units", Help: "A stream is a state point between two units: split it with a splitter, or give each unit its own stream."},
	{Code: CodeTwoConsumers, Name: "stream-enters-two-units", Severity: model.Error, Summary: "stream enters two units", Help: "A stream can feed only one unit: add a splitter, or give each unit its own stream."},
	{Code: CodeMissingPort, Name: "missing-port", Severity: model.Error, Summary: "unit without a stream for one of its roles", Help: "Connect a stream to every role of the unit kind (the message names the role)."},
	{Code: CodeExtraPort, Name: "extra-port", Severity: model.Error, Summary: "more streams for a role than the unit kind takes", Help: "The role takes one stream; use a mixer or splitter for several."},
	{Code: CodeUnknownKind, Name: "unknown-unit-kind", Severity: model.Error, Summary: "unknown unit kind", Help: "Use one of the unit kinds in README.md (the message suggests the nearest)."},
	{Code: CodeUnknownRole, Name: "unknown-port-role", Severity: model.Error, Summary: "unknown port role for the unit kind", Help: "Use one of the roles the unit kind has (the message lists them)."},
	{Code: CodeUnconnected, Name: "unconnected-stream", Severity: model.Warning, Summary: "stream connected to no unit", Help: "Connect the stream to a unit, or delete it; it takes part in no balance."},
	{Code: CodeSelfLoop, Name: "self-loop", Severity: model.Error, Summary: "stream both enters and leaves the same unit", Help: "A stream cannot both enter and leave one unit; give the outlet its own stream."},
	{Code: CodeNotAStream, Name: "unit-where-stream-expected", Severity: model.Error, Summary: "a unit's name where a stream's is needed", Help: "A port takes a stream's name; this name belongs to a unit."},
	{Code: CodeUnknownResult, Name: "unknown-result", Severity: model.Error, Summary: "expectation on a property or result the stream or unit does not have", Help: "Expect on a property or result the stream or unit has (README.md lists them)."},
	{Code: CodeUnknownUnit, Name: "unknown-unit-spelling", Severity: model.Error, Summary: "unknown unit spelling", Help: "Use a unit spelling hmb knows (the message suggests the nearest and lists accepted ones)."},
	{Code: CodeDimension, Name: "wrong-dimension", Severity: model.Error, Summary: "unit of the wrong dimension (a flow unit for a pressure)", Help: "The unit measures a different quantity from the one the property or parameter needs."},
	{Code: CodeFraction, Name: "fraction-out-of-range", Severity: model.Error, Summary: "quality or efficiency outside 0..1 (0 %..100 %)", Help: "A quality or efficiency lies in 0..1 (0 % to 100 %)."},
	{Code: CodeImpossible, Name: "negative-absolute-value", Severity: model.Error, Summary: "absolute pressure, absolute temperature or flow below zero", Help: "An absolute pressure, absolute temperature or mass flow cannot be below zero; check the number and whether a gauge unit was meant."},
	{Code: CodeDuplicateGiven, Name: "duplicate-given", Severity: model.Error, Summary: "property or parameter given twice in one block", Help: "State each property or parameter once per block."},
	{Code: CodeUnknownParam, Name: "unknown-property", Severity: model.Error, Summary: "unknown stream property or unit parameter", Help: "Use a stream property (flow p T h s x fluid) or a parameter of the unit kind."},
	{Code: CodeNoUnit, Name: "missing-unit", Severity: model.Error, Summary: "number without the unit its quantity needs", Help: "Write the unit after the number; hmb never guesses units."},
	{Code: CodeUnknownSetting, Name: "unknown-setting", Severity: model.Error, Summary: "unknown top-level setting", Help: "Use one of the top-level settings documented in README.md."},
	{Code: CodeSettingTwice, Name: "duplicate-setting", Severity: model.Error, Summary: "setting given twice, or atmosphere together with elevation", Help: "State each setting once; atmosphere and elevation both fix the site pressure, so give one."},
	{Code: CodeSettingValue, Name: "bad-setting-value", Severity: model.Error, Summary: "setting with a value it does not take", Help: "The setting takes a different kind of value (the message says which)."},
	{Code: CodeFluid, Name: "unsupported-fluid", Severity: model.Error, Summary: "fluid other than water (steam)", Help: "hmb computes water and steam only (IAPWS-IF97)."},
	{Code: CodeTolerance, Name: "bad-tolerance", Severity: model.Error, Summary: "tolerance below zero, or 'within' on a comparison other than =", Help: "A tolerance is zero or more, and `within` applies only to `=`."},
	{Code: CodeRange, Name: "number-out-of-range", Severity: model.Error, Summary: "number too large to represent", Help: "The number is too large to represent as a double."},
	{Code: CodeEntryForm, Name: "names-versus-value", Severity: model.Error, Summary: "names where a value is needed, or a value where names are", Help: "This entry takes a value, not stream names (or names, not a value)."},
	{Code: CodeStreamList, Name: "list-with-label", Severity: model.Error, Summary: "label or block on a list of several stream names", Help: "A label or block applies to one stream; declare the streams separately."},
	{Code: CodeNegativeDrop, Name: "negative-pressure-drop", Severity: model.Error, Summary: "pressure drop (dp, dp_hot, dp_cold) below zero", Help: "A pressure drop is inlet minus outlet pressure and cannot be below zero."},
	{Code: CodeNoReading, Name: "pressure-without-reading", Severity: model.Error, Summary: "pressure in a unit that does not say absolute, gauge or vacuum (psi, inHg, inH2O, mmHg, kgf/cm2)", Help: "A bare psi or liquid column states a difference only. Write the reading: psia or psig; inHg(abs) or inHg(vac) (a vacuum below the site atmosphere); kgf/cm2(a) or kgf/cm2(g)."},
	{Code: CodeRelativeDelta, Name: "gauge-unit-on-difference", Severity: model.Error, Summary: "gauge or vacuum unit on a pressure difference (dp 5 psig)", Help: "A pressure drop is a difference, not a reading against the atmosphere: write it in psi (psid), bar, kPa or inHg; to state the outlet pressure, give p on the outlet stream."},
	{Code: CodeRelativeTemp, Name: "relative-temperature-tolerance", Severity: model.Error, Summary: "relative (%) tolerance on a temperature", Help: "A percentage of a temperature depends on where its scale puts zero (2 % of 250 C is 5 K, of 523 K is 10 K): give the tolerance in K, C, F or R."},
	{Code: CodeNeedsRole, Name: "parameter-without-its-stream", Severity: model.Error, Summary: "a parameter that needs a stream the unit does not have (blowdown_rate without a blowdown)", Help: "The parameter sets the flow of one of the unit's streams (blowdown_rate is the blowdown's share of the feedwater): connect that stream to the unit, or remove the parameter."},
	{Code: CodeDuplicateCase, Name: "duplicate-case", Severity: model.Error, Summary: "two cases, or two sweeps, of one name", Help: "Give each case and each sweep a name of its own: outputs and the command line (--case, --sweep) pick them by name."},
	{Code: CodeSweepStep, Name: "bad-sweep-step", Severity: model.Error, Summary: "sweep step of zero or pointing away from its end, a count that is not a whole number of 2 or more, or a range from a value to itself", Help: "The step goes from the first value towards the second: above zero for a rising range, below zero for a falling one (the quick fix turns its sign). A count is a whole number of points, 2 or more."},
	{Code: CodeSweepPoints, Name: "too-many-sweep-points", Severity: model.Error, Summary: "sweep of more than 10,000 points", Help: "Each point is a whole solve of the file: take a larger step or a smaller count."},
	{Code: CodeFreeNothing, Name: "free-not-given", Severity: model.Error, Summary: "case frees a value the base does not give", Help: "`NAME PROPERTY free` removes a given or parameter of the base; this one is not given there. Remove the line, or name the value the base gives."},
	{Code: CodeCaseForm, Name: "case-changes-wiring", Severity: model.Error, Summary: "case entry on a port or a stream's fluid: a case changes values, not connections", Help: "A case replaces, adds or frees givens and parameters of the base; its streams and units stay connected as the base has them. Write a separate calc file for another arrangement."},
	{Code: CodeSweepRange, Name: "sweep-range", Severity: model.Error, Summary: "sweep with no range, or with more than one", Help: "A sweep varies one value: NAME PROPERTY from A to B step C (or count N). Give each further range a sweep of its own."},
	{Code: CodeUnknownCase, Name: "unknown-case", Severity: model.Error, Summary: "sweep on a case that is not declared", Help: "`case NAME` in a sweep names a case declared in the file (the message lists them)."},
}
