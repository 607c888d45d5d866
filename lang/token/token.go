// Package token defines the tokens of the calc-file notation and the scanner that produces them.
// Tokens are byte ranges into the source; nothing here computes lines or columns (see
// lang/source).
package token

// Kind is the lexical class of a token.
type Kind uint8

const (
	EOF       Kind = iota
	Illegal        // a character that starts no token, or invalid UTF-8
	Newline        // "\n", "\r\n" or a lone "\r": ends a statement or a block entry
	Semi           // ";": ends a statement or a block entry, like a newline
	Comment        // "#" to the end of the line
	Ident          // a name or keyword: a letter or "_", then letters, digits, "_" or "-"
	Number         // 150, -4.5, .5, 1e5
	String         // "a label", with \" and \\ escapes
	Word           // a unit spelling that is not an identifier: lbm/h, °F, %, m³/kg, kJ/(kg K)
	LBrace         // {
	RBrace         // }
	Comma          // ,
	Eq             // =
	Lt             // <
	Le             // <=
	Gt             // >
	Ge             // >=
	PlusMinus      // ± or +- or +/-
	numKinds
)

var kindNames = [numKinds]string{"EOF", "Illegal", "Newline", "Semi", "Comment", "Ident", "Number",
	"String", "Word", "LBrace", "RBrace", "Comma", "Eq", "Lt", "Le", "Gt", "Ge", "PlusMinus"}

// String is the kind's symbol name (also its name in the parser's grammar).
func (k Kind) String() string {
	if k < numKinds {
		return kindNames[k]
	}
	return "?"
}

// Describe is the kind as a diagnostic message names it; "" for punctuation, which is shown as
// written.
func (k Kind) Describe() string {
	switch k {
	case EOF:
		return "end of file"
	case Newline:
		return "end of line"
	case Ident:
		return "name"
	case Number:
		return "number"
	case String:
		return "string"
	case Word:
		return "unit spelling"
	case Comment:
		return "comment"
	case Illegal:
		return "character"
	}
	return ""
}

// Token is one token: its kind and the byte range [Pos, End) of its text.
//
// The offsets are int32 so that a token takes 12 bytes rather than 24: a file's token slice is
// kept with its syntax tree, and on large files it was the biggest single allocation. Scan
// refuses a source of more than MaxSource bytes, so the offsets cannot overflow.
type Token struct {
	Kind     Kind
	Pos, End int32
}

// MaxSource is the largest source Scan takes (2 GiB less a byte), as token offsets are int32.
const MaxSource = 1<<31 - 1

func newToken(k Kind, pos, end int) Token { return Token{k, int32(pos), int32(end)} }

// IsSeparator reports whether the token ends a statement or an entry.
func (t Token) IsSeparator() bool { return t.Kind == Newline || t.Kind == Semi }

// Text is the token's source text.
func (t Token) Text(src []byte) string { return string(src[t.Pos:t.End]) }

// Error is a lexical error at a byte range.
type Error struct {
	Pos, End int
	Msg      string
}
