package cache

import (
	"context"

	"hmb/thermo/model"
	"hmb/thermo/units"
)

// An Analyzer is the language the server serves: everything notation- or physics-specific that
// the editor features need, behind one interface, so that the server is the same thin shell over
// the same check the command line runs. Implementations must be safe for concurrent use; they
// may panic (the snapshot recovers and reports an internal error).
type Analyzer interface {
	// Check parses and checks one version of a file: syntax, names, wiring, dimensions, lowering.
	// It is fast (no physics) and never returns nil.
	Check(name string, src []byte) *Syntax
	// Solve solves the model of a checked file. It returns early, with a partial or empty
	// result, when ctx is done. It is not called when Syntax.Model is nil.
	Solve(ctx context.Context, syn *Syntax) *Solution
	// Format returns src in canonical layout, or an error when src does not parse.
	Format(name string, src []byte) ([]byte, error)
	// Site says what may be written at byte offset off: what completion offers there.
	Site(syn *Syntax, off int) Site
	// Keywords lists the notation's keywords with one line of help each.
	Keywords() []Keyword
	// ValidName reports whether name may name a stream or a unit (for rename).
	ValidName(name string) bool
	// QuickFixes proposes edits for one diagnostic beyond its Fix (declare a stream, add a
	// missing specification). sol may be nil.
	QuickFixes(syn *Syntax, sol *Solution, d model.Diagnostic) []QuickFix
	// Tables writes the stream table and the unit table of a checked file as Markdown, in the
	// file's display units, as hmb table does. sol may be nil (not solved: every value unknown).
	// It is an error when the file could not be lowered (Syntax.Model is nil).
	Tables(name string, src []byte, syn *Syntax, sol *Solution) (string, error)
}

// Syntax is what the fast stage knows about one version of a file.
type Syntax struct {
	Diagnostics []model.Diagnostic
	// Model is the lowered file, or nil when nothing could be lowered.
	Model   *model.Model
	Display units.System // the unit system results are shown in
	Atm     float64      // site atmosphere, Pa
	Symbols []Symbol     // declarations, in source order
	Refs    []Ref        // every occurrence of a stream or unit name, declarations included, in source order
	Tokens  []Token      // lexical tokens (no newlines), in source order
	// Data is the implementation's own (a syntax tree, say) for Site and QuickFixes.
	Data any
}

// SymbolKind tells streams from units.
type SymbolKind uint8

const (
	StreamSymbol SymbolKind = iota
	UnitSymbol
)

func (k SymbolKind) String() string {
	if k == UnitSymbol {
		return "unit"
	}
	return "stream"
}

// Symbol is one declared stream or unit.
type Symbol struct {
	Kind     SymbolKind
	Name     string
	Label    string
	UnitKind string     // the unit's kind (mixer, turbine...), "" for streams
	NameSpan model.Span // the name where it is declared
	Span     model.Span // the whole declaration
	Index    int        // index into Model.Streams or Model.Units, -1 when not lowered
}

// Ref is one occurrence of a name.
type Ref struct {
	Name   string
	Span   model.Span
	Symbol int  // index into Syntax.Symbols, -1 when undefined
	Decl   bool // the declaring occurrence
	Kind   SymbolKind
}

// TokenKind is the role of a token, as highlighting and hover see it.
type TokenKind uint8

const (
	KeywordToken TokenKind = iota
	StreamToken            // a stream name
	UnitToken              // a unit (equipment) name
	KindToken              // a unit kind: mixer, turbine...
	RoleToken              // a port role: in, out, hot_in...
	ParamToken             // a unit parameter: duty, efficiency...
	PropToken              // a stream property: p, T, h...
	NumberToken
	SpellingToken // a unit spelling: psig, °F, kJ/kg
	StringToken
	CommentToken
	OperatorToken
	numTokenKinds
)

// Token is one token with its role.
type Token struct {
	Span model.Span
	Kind TokenKind
	Decl bool // a name where it is declared
}

// SiteKind is a set of things completion may offer at a place.
type SiteKind uint16

const (
	SiteKeyword  SiteKind = 1 << iota // a statement keyword
	SiteUnitKind                      // a unit kind
	SiteRole                          // a port role of Site.UnitKind
	SiteParam                         // a parameter of Site.UnitKind
	SiteProp                          // a stream property
	SiteSpelling                      // a unit spelling of dimension Site.Dim
	SiteStream                        // the name of a declared stream
	SiteUnit                          // the name of a declared unit
	SiteResult                        // what an expectation may check on a unit: Site.Results
)

// Site is what may be written at one place.
type Site struct {
	Kinds    SiteKind
	UnitKind string     // for SiteRole, SiteParam, SiteResult
	Dim      units.Dim  // for SiteSpelling
	Results  []string   // for SiteResult, with Site.UnitKind
	Replace  model.Span // the partly typed word completion replaces (empty at a fresh place)
}

// Keyword is one keyword of the notation with its help.
type Keyword struct {
	Name, Doc string
}

// QuickFix is one proposed change.
type QuickFix struct {
	Title string
	Edits []Edit
}

// Edit replaces the text at Span.
type Edit struct {
	Span    model.Span
	NewText string
}

// Quantity names a value of a solved state, in display order.
type Quantity uint8

const (
	QFlow Quantity = iota
	QP
	QT
	QH
	QS
	QV
	QX
	NumQuantities
)

var quantityNames = [NumQuantities]string{"flow", "p", "T", "h", "s", "v", "x"}

func (q Quantity) String() string {
	if q < NumQuantities {
		return quantityNames[q]
	}
	return "?"
}

// Dim is the dimension the quantity is shown in.
func (q Quantity) Dim() units.Dim {
	return [NumQuantities]units.Dim{units.MassFlow, units.Pressure, units.Temperature,
		units.SpecificEnergy, units.SpecificEntropy, units.SpecificVolume, units.Dimensionless}[q]
}

// Solution is what the solver found for one version of a file.
type Solution struct {
	Diagnostics []model.Diagnostic
	Streams     []StreamState // indexed like Model.Streams
	Units       []UnitBalance // indexed like Model.Units
	// Data is the implementation's own (the solver's own result, say) for Tables.
	Data any
}

// StreamState is the solved state of one stream. A quantity the solver did not find is NaN.
type StreamState struct {
	Values [NumQuantities]float64 // SI base units
	Source [NumQuantities]string  // where each value came from: Given, "energy balance of turbine T1"...
	Phase  string                 // "liquid", "wet steam", "superheated steam"...; "" when unknown
}

// Given is the Source of a value the file states for the stream itself.
const Given = "given"

// UnitBalance is the solved balance of one unit. Unknown values are NaN.
type UnitBalance struct {
	MassIn, MassOut     float64 // kg/s
	EnergyIn, EnergyOut float64 // W, flow times enthalpy summed over the ports
	Duty                float64 // W, heat added to the fluid (NaN when the kind has none)
	Power               float64 // W, shaft power (NaN when the kind has none)
	Sgen                float64 // W/K, entropy generated (NaN when unknown)
	Efficiency          float64 // the kind's efficiency parameter, given or solved (NaN when none)
	// Relative closure |in - out| / max(|in|, |out|) of a balance that was redundant; NaN when
	// the balance was used to solve (it then closes by construction).
	MassClosure, EnergyClosure float64
}
