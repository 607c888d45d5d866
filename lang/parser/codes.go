package parser

import "hmb/thermo/model"

// Diagnostic codes of the scanner and parser. They are stable: quick fixes and suppression key
// on them. The checker's codes are N2xx and V3xx; the solver owns S4xx, B5xx and E6xx.
const (
	CodeIllegal      = "P101"
	CodeString       = "P102"
	CodeSyntax       = "P103"
	CodeUnclosed     = "P104"
	CodeStrayBrace   = "P105"
	CodeMissingValue = "P106"
	CodeTooMany      = "P107"
)

// Codes documents the parser's diagnostic codes.
var Codes = []model.CodeInfo{
	{Code: CodeIllegal, Severity: model.Error, Summary: "character that starts no token (control character, invalid UTF-8)"},
	{Code: CodeString, Severity: model.Error, Summary: "string not closed before the end of its line"},
	{Code: CodeSyntax, Severity: model.Error, Summary: "statement or block entry that does not fit the notation"},
	{Code: CodeUnclosed, Severity: model.Error, Summary: "block opened with { and not closed with }"},
	{Code: CodeStrayBrace, Severity: model.Error, Summary: "} with no block open"},
	{Code: CodeMissingValue, Severity: model.Error, Summary: "name or keyword alone on its line, with no value after it"},
	{Code: CodeTooMany, Severity: model.Error, Summary: "syntax errors past the first 100, counted in one diagnostic"},
}
