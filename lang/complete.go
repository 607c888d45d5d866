package lang

import (
	"slices"

	"hmb/lang/check"
	"hmb/lang/token"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// ContextKind says what may be typed at an offset.
type ContextKind uint8

const (
	AtTopLevel    ContextKind = iota // a statement: stream, expect, a unit kind, a setting
	InStreamBlock                    // a stream property or fluid
	InUnitBlock                      // a role or parameter of Context.Kind
	AfterNumber                      // a unit spelling of Context.Dim
	AfterRole                        // stream names
	ExpectTarget                     // a stream or unit name
	ExpectProp                       // a property of a stream or a result of a unit (Context.Target)
	InComment                        // nothing to offer
	AfterKey                         // a value: nothing fixed to offer (a number, a label, a name)
)

// Context is where an offset stands, for completion.
type Context struct {
	Kind   ContextKind
	Unit   *model.Kind // the unit kind of the block (InUnitBlock, AfterRole), nil if unknown
	Dim    units.Dim   // AfterNumber: the dimension wanted
	Target string      // ExpectProp: the stream or unit named
	Words  []string    // what fits there: keywords, names or unit spellings
}

// Keywords lists the words that may start a top-level statement.
func Keywords() []string {
	kw := append([]string{"stream", "expect"}, check.Settings...)
	for k := range model.Kinds {
		kw = append(kw, k)
	}
	slices.Sort(kw)
	return kw
}

// ContextAt reports what may be typed at a byte offset of the checked file.
func (r *Result) ContextAt(offset int) Context {
	toks := r.File.Tokens
	src := r.File.Src.Src
	text := func(t token.Token) string { return string(src[t.Pos:t.End]) }
	// Walk to the offset, keeping the current block's header and the current line's tokens.
	var header, line []token.Token
	inBlock := false
	for _, t := range toks {
		if t.Kind == token.EOF || int(t.Pos) >= offset {
			break
		}
		if t.Kind == token.Comment && offset <= int(t.End) {
			return Context{Kind: InComment}
		}
		switch t.Kind {
		case token.LBrace:
			header, line, inBlock = line, nil, true
		case token.RBrace:
			header, line, inBlock = nil, nil, false
		case token.Newline, token.Semi:
			if n := len(line); n > 0 && line[n-1].Kind == token.Comma {
				continue // a list goes on
			}
			line = nil
		case token.Comment:
		default:
			if int(t.End) == offset && t.Kind == token.Ident {
				continue // the word being typed
			}
			line = append(line, t)
		}
	}
	if inBlock && len(header) > 0 && text(header[0]) != "stream" {
		// a new statement typed where a block was left open still counts as top level
		if len(line) > 0 && (text(line[0]) == "stream" || text(line[0]) == "expect") {
			inBlock = false
		}
	}
	switch {
	case !inBlock:
		return r.topContext(line, text)
	case len(header) > 0 && text(header[0]) == "stream":
		if len(line) == 0 {
			return Context{Kind: InStreamBlock, Words: check.StreamKeys[:]}
		}
		if len(line) >= 2 && line[len(line)-1].Kind == token.Number {
			if p, ok := propDim(text(line[0])); ok {
				return spellings(p)
			}
		}
		return Context{Kind: AfterKey}
	default:
		var k *model.Kind
		if len(header) > 0 {
			k = model.Kinds[text(header[0])]
		}
		if len(line) == 0 {
			c := Context{Kind: InUnitBlock, Unit: k}
			if k != nil {
				c.Words = check.Keys(k)
			}
			return c
		}
		if k == nil {
			return Context{Kind: AfterKey}
		}
		role := text(line[0])
		if role == "vapour" {
			role = "vapor"
		}
		if k.Port(role) != nil {
			return Context{Kind: AfterRole, Unit: k, Words: r.names(false)}
		}
		if p := k.Param(role); p != nil && line[len(line)-1].Kind == token.Number {
			return spellings(p.Dim)
		}
		return Context{Kind: AfterKey, Unit: k}
	}
}

func (r *Result) topContext(line []token.Token, text func(token.Token) string) Context {
	if len(line) == 0 {
		return Context{Kind: AtTopLevel, Words: Keywords()}
	}
	last := line[len(line)-1]
	switch text(line[0]) {
	case "expect":
		switch len(line) {
		case 1:
			return Context{Kind: ExpectTarget, Words: append(r.names(false), r.names(true)...)}
		case 2:
			target := text(line[1])
			c := Context{Kind: ExpectProp, Target: target, Words: check.StreamProps}
			if o := r.Info.Objects[target]; o != nil && o.IsUnit && o.Kind != nil {
				c.Words = check.Results(o.Kind)
			}
			return c
		}
		if last.Kind == token.Number {
			if p, ok := propDim(text(line[2])); ok {
				return spellings(p)
			}
			return spellings(units.Power)
		}
	case "atmosphere":
		if last.Kind == token.Number {
			return spellings(units.Pressure)
		}
	case "elevation":
		if last.Kind == token.Number {
			return spellings(units.Length)
		}
	case "tolerance":
		if last.Kind == token.Number {
			return spellings(units.Dimensionless)
		}
	case "display":
		return Context{Kind: AfterKey, Words: []string{"SI", "US"}}
	}
	return Context{Kind: AfterKey}
}

func propDim(name string) (units.Dim, bool) {
	for p := model.Prop(0); p < model.NumProps; p++ {
		if p.String() == name {
			return p.Dim(), true
		}
	}
	return 0, false
}

func spellings(d units.Dim) Context {
	return Context{Kind: AfterNumber, Dim: d, Words: units.Spellings(d)}
}

// names lists the declared streams (or units), in declaration order.
func (r *Result) names(unitsWanted bool) []string {
	var out []string
	for _, o := range r.Info.Order {
		if o.IsUnit == unitsWanted {
			out = append(out, o.Name)
		}
	}
	return out
}
