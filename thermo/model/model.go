// Package model is the system description that the notation hands to the balance solver: streams
// with their givens in SI base units, units (equipment) with their kind, ports and parameters, and
// expectations. It holds no tokens and no syntax trees; every element carries the byte span of the
// source text it came from so that the solver's findings can be reported at a position.
package model

import "hmb/thermo/units"

// Span is a half-open byte range [Start, End) in the source file.
type Span struct{ Start, End int }

// Prop names a stream property a calc file may give or an expectation may check.
type Prop uint8

const (
	Flow Prop = iota // mass flow, kg/s
	P                // pressure, Pa (absolute)
	T                // temperature, K
	H                // specific enthalpy, J/kg
	S                // specific entropy, J/(kg K)
	X                // quality, fraction 0..1
	NumProps
)

var propNames = [NumProps]string{"flow", "p", "T", "h", "s", "x"}

func (p Prop) String() string {
	if p < NumProps {
		return propNames[p]
	}
	return "?"
}

// Dim is the dimension of the property.
func (p Prop) Dim() units.Dim {
	switch p {
	case Flow:
		return units.MassFlow
	case P:
		return units.Pressure
	case T:
		return units.Temperature
	case H:
		return units.SpecificEnergy
	case S:
		return units.SpecificEntropy
	}
	return units.Dimensionless
}

// Given is one stated value, converted to SI base units.
//
// A given written with a ± is a measurement (Measured): its ± is the half-width of the 95 %
// confidence interval of the measurement's error, normally distributed, so that its standard
// deviation is Tol/1.96 (Sigma). A percentage is of the value as written. A given without a ± is
// exact: a design value or a constraint.
type Given struct {
	Value    float64 // SI base units (absolute pressure, kelvin, fraction)
	Tol      float64 // the stated ± as an absolute SI difference; 0 when none was given
	Measured bool    // written with a ±: a measurement whose 95 % half-width is Tol
	Unit     string  // the spelling the user wrote, for messages
	Span     Span    // the whole statement that gives the value
}

// Coverage95 is the coverage factor of a 95 % two-sided interval of a normal distribution: the
// 0.975 quantile of the standard normal distribution, 1.959964 (ISO/IEC Guide 98-3 (GUM),
// Table G.1, rounded there to 1.960).
const Coverage95 = 1.96

// Sigma is the standard deviation of a measurement's error, in SI; 0 for an exact given.
func (g *Given) Sigma() float64 {
	if g == nil || !g.Measured {
		return 0
	}
	return g.Tol / Coverage95
}

// Stream is a state point: one fluid at one state with one mass flow.
type Stream struct {
	Name  string
	Label string
	Fluid string // "water" (liquid or steam: IAPWS-IF97)
	Span  Span   // the stream's name where it is declared
	Given [NumProps]*Given
	// VolFlow is a flow given in volume units (flow 120 gpm), m3/s: the solver takes the mass
	// flow from it and the stream's density. Given[Flow] is nil when it is set.
	VolFlow *Given
}

// Port connects a unit to a stream.
type Port struct {
	Role   string // a role of the unit's kind (see Kinds), e.g. "in", "out", "hot_in"
	Stream int    // index into Model.Streams
	Span   Span   // where the stream is named in the unit
}

// Unit is one piece of equipment joining streams.
type Unit struct {
	Name   string
	Label  string
	Kind   *Kind
	Span   Span // the unit's name where it is declared
	Ports  []Port
	Params map[string]*Given // by parameter name (see Kind.Params), SI base units
	// Options holds the parameters stated as a word (ParamSpec.Words), by name; a parameter
	// not stated takes its first word.
	Options map[string]*Option
}

// Option is a unit parameter stated as one of its words: "arrangement parallel".
type Option struct {
	Value string
	Span  Span // the whole entry
}

// Option returns the word a unit states for a parameter, or the parameter's default (its first
// word); "" when the kind has no such parameter.
func (u *Unit) Option(name string) string {
	if o := u.Options[name]; o != nil {
		return o.Value
	}
	if u.Kind != nil {
		if p := u.Kind.Param(name); p != nil && len(p.Words) > 0 {
			return p.Words[0]
		}
	}
	return ""
}

// Op is the comparison an expectation makes.
type Op uint8

const (
	Eq Op = iota // |value - target| <= Tol
	Lt
	Le
	Gt
	Ge
)

func (o Op) String() string { return [...]string{"=", "<", "<=", ">", ">="}[o] }

// Expect is an assertion about a solved value, checked after solving.
type Expect struct {
	Stream   int    // index into Model.Streams, or -1
	Unit     int    // index into Model.Units, or -1
	Prop     string // a stream Prop name ("x", "T", ...) or a unit result ("duty", "power", "sgen")
	Total    bool   // the subject is the whole file (TotalName): Prop is one of TotalResults
	Op       Op
	Value    float64 // SI
	Tol      float64 // absolute SI tolerance (Eq only)
	Spelling string  // the unit spelling the user wrote, for messages
	Span     Span
}

// Sheet is the title block a report carries: the project, the document and its revision, who
// prepared and who checked the calc, and when. Every field is optional; a report leaves an
// empty field blank for a hand to fill in.
type Sheet struct {
	Project, Document, Revision, PreparedBy, CheckedBy, Date string
}

// Model is a whole calc file, ready to solve.
type Model struct {
	Title   string
	Sheet   Sheet
	Display units.System // the unit system results are shown in
	// Pick holds the units the file chose per quantity (display_flow t/h), shown instead of
	// Display's defaults; Shown joins them.
	Pick      units.Picks
	Atm       float64 // site atmosphere, Pa (gauge pressures are already converted)
	Tolerance float64 // relative closure tolerance of balances (fraction, e.g. 0.001)
	// Ambient is the temperature of the surroundings, K: heat losses leave at it. Zero means
	// DefaultAmbient.
	Ambient float64
	Streams []*Stream
	Units   []*Unit
	Expects []*Expect
	Cases   []*Case  // variants of the model, solved each on its own (see WithCase)
	Sweeps  []*Sweep // one value varied over a range
	// Incomplete is set when the notation dropped broken statements; the solver then does not
	// report under-specification, which would only echo the errors already reported.
	Incomplete bool
}

// DefaultAmbient is the temperature of the surroundings when a file states none: 25 C, the usual
// reference temperature of exergy tables (common practice, no source).
const DefaultAmbient = 298.15

// AmbientOr is the model's ambient temperature, K, or DefaultAmbient when none is set.
func (m *Model) AmbientOr() float64 {
	if m != nil && m.Ambient > 0 {
		return m.Ambient
	}
	return DefaultAmbient
}

// Shown is how the model's results are shown: its unit system, the units it chose per quantity
// and its site atmosphere. Every output formats through it.
func (m *Model) Shown() units.Display {
	if m == nil {
		return units.Display{}
	}
	return units.Display{System: m.Display, Atm: m.Atm, Pick: m.Pick}
}

// SetSystem shows the model in sys (a command line's --si or --us), keeping only the units it
// chose per quantity that belong to sys.
func (m *Model) SetSystem(sys units.System) {
	m.Display = sys
	m.Pick = m.Pick.Keep(sys)
}
