package model

// Severity orders diagnostics; the numbering matches the LSP's DiagnosticSeverity.
type Severity uint8

const (
	Error   Severity = 1
	Warning Severity = 2
	Info    Severity = 3
	Hint    Severity = 4
)

func (s Severity) String() string {
	switch s {
	case Error:
		return "error"
	case Warning:
		return "warning"
	case Info:
		return "info"
	case Hint:
		return "hint"
	}
	return "?"
}

// Related points at another place that contributed to a diagnostic: the other given of a conflict,
// a stream of a balance that does not close.
type Related struct {
	Span    Span
	Message string
}

// Diagnostic is one finding about a calc file. Code is stable (see the table in README.md): quick
// fixes and suppression key on it and on the structured fields below, never on Message, which
// names streams and values in the user's units and may be reworded.
type Diagnostic struct {
	Span     Span
	Severity Severity
	Code     string
	Message  string
	Related  []Related
	// Fix, when set, is a suggested replacement of the text at Span (a nearest spelling, say).
	Fix string
	// Specify lists, for an under-specified system, values a file could state to fix it, the
	// nearest first (the message names the same ones).
	Specify []Spec
	// Undeclared, when set, is a stream the file names but never declares: a declaration
	// "stream NAME" fixes it.
	Undeclared string
	// Case is the case the finding belongs to ("" for the file itself); its message then starts
	// with "case NAME: ".
	Case string
}

// Spec names one value a calc file could state: a property of a stream or a parameter of a unit.
type Spec struct {
	Name string // the stream or unit
	Prop string // as written in a file: "flow", "p", "T" (a stream's state), "dp", "duty"...
}

// CodeInfo documents one diagnostic code.
type CodeInfo struct {
	Code     string // "HMB" and three digits; the hundreds name the stage (1 parse ... 6 expectations)
	Name     string // a readable rule name, kebab-case, unique: "negative-flow"
	Severity Severity
	Summary  string // one line: what the code reports
	Help     string // what to do about it
}
