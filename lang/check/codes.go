package check

import "hmb/thermo/model"

// Diagnostic codes of the checker: N2xx for names and wiring, V3xx for values, units and
// settings. They are stable; quick fixes and suppression key on them.
const (
	CodeUndefined     = "N201"
	CodeDuplicate     = "N202"
	CodeTwoProducers  = "N203"
	CodeTwoConsumers  = "N204"
	CodeMissingPort   = "N205"
	CodeExtraPort     = "N206"
	CodeUnknownKind   = "N207"
	CodeUnknownRole   = "N208"
	CodeUnconnected   = "N209"
	CodeSelfLoop      = "N210"
	CodeNotAStream    = "N211"
	CodeUnknownResult = "N212"

	CodeUnknownUnit    = "V301"
	CodeDimension      = "V302"
	CodeFraction       = "V303"
	CodeImpossible     = "V304"
	CodeDuplicateGiven = "V305"
	CodeUnknownParam   = "V306"
	CodeNoUnit         = "V307"
	CodeUnknownSetting = "V308"
	CodeSettingTwice   = "V309"
	CodeSettingValue   = "V310"
	CodeFluid          = "V311"
	CodeTolerance      = "V312"
	CodeRange          = "V313"
	CodeEntryForm      = "V314"
	CodeStreamList     = "V315"
	CodeNegativeDrop   = "V316"
)

// Codes documents the checker's diagnostic codes.
var Codes = []model.CodeInfo{
	{Code: CodeUndefined, Severity: model.Error, Summary: "name used but not declared (streams need a stream statement)"},
	{Code: CodeDuplicate, Severity: model.Error, Summary: "name declared twice (streams and units share one namespace)"},
	{Code: CodeTwoProducers, Severity: model.Error, Summary: "stream leaves two units"},
	{Code: CodeTwoConsumers, Severity: model.Error, Summary: "stream enters two units"},
	{Code: CodeMissingPort, Severity: model.Error, Summary: "unit without a stream for one of its roles"},
	{Code: CodeExtraPort, Severity: model.Error, Summary: "more streams for a role than the unit kind takes"},
	{Code: CodeUnknownKind, Severity: model.Error, Summary: "unknown unit kind"},
	{Code: CodeUnknownRole, Severity: model.Error, Summary: "unknown port role for the unit kind"},
	{Code: CodeUnconnected, Severity: model.Warning, Summary: "stream connected to no unit"},
	{Code: CodeSelfLoop, Severity: model.Error, Summary: "stream both enters and leaves the same unit"},
	{Code: CodeNotAStream, Severity: model.Error, Summary: "a unit's name where a stream's is needed"},
	{Code: CodeUnknownResult, Severity: model.Error, Summary: "expectation on a property or result the stream or unit does not have"},
	{Code: CodeUnknownUnit, Severity: model.Error, Summary: "unknown unit spelling"},
	{Code: CodeDimension, Severity: model.Error, Summary: "unit of the wrong dimension (a flow unit for a pressure)"},
	{Code: CodeFraction, Severity: model.Error, Summary: "quality or efficiency outside 0..1 (0 %..100 %)"},
	{Code: CodeImpossible, Severity: model.Error, Summary: "absolute pressure, absolute temperature or flow below zero"},
	{Code: CodeDuplicateGiven, Severity: model.Error, Summary: "property or parameter given twice in one block"},
	{Code: CodeUnknownParam, Severity: model.Error, Summary: "unknown stream property or unit parameter"},
	{Code: CodeNoUnit, Severity: model.Error, Summary: "number without the unit its quantity needs"},
	{Code: CodeUnknownSetting, Severity: model.Error, Summary: "unknown top-level setting"},
	{Code: CodeSettingTwice, Severity: model.Error, Summary: "setting given twice, or atmosphere together with elevation"},
	{Code: CodeSettingValue, Severity: model.Error, Summary: "setting with a value it does not take"},
	{Code: CodeFluid, Severity: model.Error, Summary: "fluid other than water (steam)"},
	{Code: CodeTolerance, Severity: model.Error, Summary: "tolerance below zero, or 'within' on a comparison other than ="},
	{Code: CodeRange, Severity: model.Error, Summary: "number too large to represent"},
	{Code: CodeEntryForm, Severity: model.Error, Summary: "names where a value is needed, or a value where names are"},
	{Code: CodeStreamList, Severity: model.Error, Summary: "label or block on a list of several stream names"},
	{Code: CodeNegativeDrop, Severity: model.Error, Summary: "pressure drop (dp, dp_hot, dp_cold) below zero"},
}
