package parser

import "hmb/thermo/model"

// Diagnostic codes of the scanner and parser. They are stable: quick fixes and suppression key
// on them. HMB1xx are the parser's; the checker's are HMB2xx (names) and
// HMB3xx (values); the solver owns HMB4xx (states), HMB5xx (balances) and HMB6xx (expectations).
const (
	CodeIllegal      = "HMB101"
	CodeString       = "HMB102"
	CodeSyntax       = "HMB103"
	CodeUnclosed     = "HMB104"
	CodeStrayBrace   = "HMB105"
	CodeMissingValue = "HMB106"
	CodeTooMany      = "HMB107"
	CodeSplitUnit    = "HMB108"
)

// Codes documents the parser's diagnostic codes.
var Codes = []model.CodeInfo{
	{Code: CodeIllegal, Name: "illegal-character", Severity: model.Error, Summary: "character that starts no token (control character, invalid UTF-8)", Help: "Remove the character or replace it; calc files are UTF-8 text and control characters other than tab have no meaning in them."},
	{Code: CodeString, Name: "unclosed-string", Severity: model.Error, Summary: "string not closed before the end of its line", Help: "Close the label with a double quote on the same line; labels cannot span lines."},
	{Code: CodeSyntax, Name: "syntax-error", Severity: model.Error, Summary: "statement or block entry that does not fit the notation", Help: "The statement does not fit the notation. Compare it with the forms in README.md (stream, unit, expect and the settings); the message names what was expected."},
	{Code: CodeUnclosed, Name: "unclosed-block", Severity: model.Error, Summary: "block opened with { and not closed with }", Help: "Add the closing brace of the block; every { needs a } before the next declaration."},
	{Code: CodeStrayBrace, Name: "stray-brace", Severity: model.Error, Summary: "} with no block open", Help: "Remove the brace or open the block it was meant to close."},
	{Code: CodeMissingValue, Name: "missing-value", Severity: model.Error, Summary: "name or keyword alone on its line, with no value after it", Help: "Write the value after the name or keyword, on the same line (e.g. `p 10 bar`)."},
	{Code: CodeTooMany, Name: "too-many-syntax-errors", Severity: model.Error, Summary: "syntax errors past the first 100, counted in one diagnostic", Help: "Fix the first syntax errors; the rest are counted, not listed, because they usually follow from the first."},
	{Code: CodeSplitUnit, Name: "unit-in-two-words", Severity: model.Error, Summary: "unit spelling broken by a space (bar g for barg)", Help: "Write the unit as one word: barg or bar(g), psig, kPa(g), inHg(vac) (the quick fix joins it)."},
}
