package parser

import (
	"errors"
	"testing"

	"github.com/alecthomas/participle/v2"

	"hmb/lang/token"
)

// TestParticipleErrors pins what the driver reads from participle: a failure is an error of
// participle's own types (participle.Error, and for a wrong token *participle.UnexpectedTokenError
// naming it), positioned at the index of the token it could not take; what fits there is found
// by asking the grammar. An upgrade of participle that changes any of this fails here, not
// silently in the messages.
func TestParticipleErrors(t *testing.T) {
	p := &parser{}
	tests := []struct {
		src        string
		at         int    // index of the token participle could not take; len(piece) at the end
		unexpected bool   // the error is an *UnexpectedTokenError naming that token
		expect     string // the grammar's answer
	}{
		{"stream A \"x\" 5", 3, true, "{ or the end of the line"},
		{"stream", 1, true, "a name"},
		{"stream A,", 3, true, "a name"},
		{"expect S1 x", 3, true, "=, <, <=, > or >="},
		{"expect S1 x = 0.9 within", 6, true, "a number"},
		{"expect S1 x == 3", 4, true, "a number"},
		{"expect S1 T = 5 C 5", 6, true, "a label string, ±, within or the end of the line"},
	}
	for _, tt := range tests {
		src := []byte(tt.src)
		toks, _ := token.Scan(src)
		toks = toks[:len(toks)-1] // the piece, without EOF
		p.src, p.str = src, tt.src
		var err error
		var exp expected
		if p.isKeyword(toks[0], "stream") {
			_, err = participleParse(streamParser, p.lexTokens(toks))
		} else {
			_, err = participleParse(expectParser, p.lexTokens(toks))
		}
		var pe participle.Error
		if !errors.As(err, &pe) {
			t.Errorf("%q: error %v is not a participle.Error", tt.src, err)
			continue
		}
		if got := pe.Position().Offset; got != tt.at {
			t.Errorf("%q: participle fails at token %d, want %d", tt.src, got, tt.at)
		}
		var ue *participle.UnexpectedTokenError
		if errors.As(err, &ue) != tt.unexpected {
			t.Errorf("%q: UnexpectedTokenError %v, want %v (%T)", tt.src, ue != nil, tt.unexpected, err)
		} else if ue != nil && ue.Unexpected.Pos.Offset != tt.at {
			t.Errorf("%q: unexpected token at %d, want %d", tt.src, ue.Unexpected.Pos.Offset, tt.at)
		}
		if p.isKeyword(toks[0], "stream") {
			exp = expectedAt(streamParser, p.lexTokens(toks[:min(tt.at, len(toks))]))
		} else {
			exp = expectedAt(expectParser, p.lexTokens(toks[:min(tt.at, len(toks))]))
		}
		if exp.String() != tt.expect {
			t.Errorf("%q: expected %q, want %q", tt.src, exp, tt.expect)
		}
	}
	// A piece that fits parses without error.
	src := []byte("expect S1 x >= 0.9 \"dry enough\"")
	toks, _ := token.Scan(src)
	p.src, p.str = src, string(src)
	if _, err := participleParse(expectParser, p.lexTokens(toks[:len(toks)-1])); err != nil {
		t.Errorf("a good expectation: %v", err)
	}
}
