package token

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// Scan splits src into tokens, ending with an EOF token at len(src). It never fails: characters
// that start no token become Illegal tokens and are reported in errs, as is a string left open at
// the end of its line. Comments and newlines are tokens, so that the formatter can keep them.
//
// The scanner is written by hand rather than with regular expressions: it runs on every
// keystroke in the editor and over files of tens of thousands of lines.
//
// A source of more than MaxSource bytes is not scanned: it yields only an EOF token at offset 0
// and an error saying why.
func Scan(src []byte) (toks []Token, errs []Error) {
	if len(src) > MaxSource {
		return []Token{{Kind: EOF}}, []Error{{0, 0, "file is too large (2 GiB or more) to check"}}
	}
	toks = make([]Token, 0, len(src)/3+1) // calc files run to about one token per 4-5 bytes
	i := 0
	if len(src) >= 3 && src[0] == 0xEF && src[1] == 0xBB && src[2] == 0xBF { // UTF-8 byte order mark
		i = 3
	}
	for i < len(src) {
		c := src[i]
		switch {
		case ascii[c]&identStart != 0: // most tokens are names: straight to them
			tok := wordToken(src, i)
			toks = append(toks, tok)
			i = int(tok.End)
			continue
		case isDigit(c): // then numbers
			end := scanNumber(src, i)
			toks = append(toks, newToken(Number, i, end))
			i = end
			continue
		case isBlank(c):
			for i++; i < len(src) && isBlank(src[i]); i++ {
			}
			continue
		case c == '"':
			end, closed := scanString(src, i)
			toks = append(toks, newToken(String, i, end))
			if !closed {
				errs = append(errs, Error{i, end, "string not terminated before the end of the line"})
			}
			i = end
			continue
		}
		if tok, ok := punctuation(src, i); ok {
			toks = append(toks, tok)
			i = int(tok.End)
			continue
		}
		tok, msg := other(src, i)
		if msg != "" {
			errs = append(errs, Error{i, int(tok.End), msg})
		}
		if tok.Kind != EOF { // EOF marks a blank (a no-break space): no token
			toks = append(toks, tok)
		}
		i = int(tok.End)
	}
	toks = append(toks, newToken(EOF, len(src), len(src)))
	return toks, errs
}

// punctuation scans the token at i when it is a line break, separator, comment, brace,
// comparison, tolerance sign or a number starting with a sign or a point.
func punctuation(src []byte, i int) (Token, bool) {
	c := src[i]
	one := func(k Kind) (Token, bool) { return newToken(k, i, i+1), true }
	switch {
	case c == '\n':
		return one(Newline)
	case c == '\r': // "\r\n", or a lone "\r": a line ends there, as editors count lines
		if i+1 < len(src) && src[i+1] == '\n' {
			return newToken(Newline, i, i+2), true
		}
		return one(Newline)
	case c == ';':
		return one(Semi)
	case c == '#':
		end := i
		for end < len(src) && src[end] != '\n' && src[end] != '\r' {
			end++
		}
		return newToken(Comment, i, end), true
	case c == '{':
		return one(LBrace)
	case c == '}':
		return one(RBrace)
	case c == ',':
		return one(Comma)
	case c == '=':
		return one(Eq)
	case c == '<' || c == '>':
		k, end := Lt, i+1
		if c == '>' {
			k = Gt
		}
		if end < len(src) && src[end] == '=' {
			end++
			k++ // Le follows Lt, Ge follows Gt
		}
		return newToken(k, i, end), true
	case c == '+' && i+1 < len(src) && src[i+1] == '-':
		return newToken(PlusMinus, i, i+2), true
	case c == '+' && i+2 < len(src) && src[i+1] == '/' && src[i+2] == '-':
		return newToken(PlusMinus, i, i+3), true
	case c == 0xC2 && i+1 < len(src) && src[i+1] == 0xB1: // ±
		return newToken(PlusMinus, i, i+2), true
	case (c == '.' || c == '-' || c == '+') && startsNumber(src, i):
		return newToken(Number, i, scanNumber(src, i)), true
	}
	return Token{}, false
}

// other scans what starts at i when it is no punctuation: a name or unit spelling, a blank
// (a no-break space pasted from a document: an EOF-kind token that only moves the scanner on),
// or an illegal character, with the message that reports it.
func other(src []byte, i int) (Token, string) {
	c := src[i]
	r, size := rune(c), 1
	if c >= utf8.RuneSelf {
		r, size = utf8.DecodeRune(src[i:])
		if r == utf8.RuneError && size == 1 {
			end := i
			for end < len(src) && src[end] >= utf8.RuneSelf {
				if r, s := utf8.DecodeRune(src[end:]); r != utf8.RuneError || s != 1 {
					break
				}
				end++
			}
			return newToken(Illegal, i, end), "invalid UTF-8 encoding"
		}
		if unicode.IsSpace(r) {
			return newToken(EOF, i, i+size), ""
		}
	}
	if r < ' ' || r == 0x7F || unicode.IsControl(r) {
		return newToken(Illegal, i, i+size), "unexpected control character"
	}
	return wordToken(src, i), ""
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

func isBlank(c byte) bool { return c == ' ' || c == '\t' || c == '\f' || c == '\v' }

// Classes of ASCII bytes, for the scanner's fast paths.
const (
	identStart = 1 << iota // a letter or "_"
	identPart              // a letter, digit, "_" or "-"
	wordEnd                // ends a word wherever it stands: space, punctuation, control
)

var ascii = func() (t [256]uint8) {
	for c := 0; c < 0x80; c++ {
		letter := 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || c == '_'
		if letter {
			t[c] |= identStart | identPart
		}
		if '0' <= c && c <= '9' || c == '-' {
			t[c] |= identPart
		}
		if c < ' ' || c == 0x7F || strings.IndexByte(" {},;#\"=<>", byte(c)) >= 0 {
			t[c] |= wordEnd
		}
	}
	return t
}()

// startsNumber reports whether a '.', '+' or '-' at i begins a number: -4.5, +3, .5, -.5
func startsNumber(src []byte, i int) bool {
	if src[i] != '.' {
		i++
	}
	if i < len(src) && src[i] == '.' {
		i++
	}
	return i < len(src) && isDigit(src[i])
}

func scanNumber(src []byte, i int) int {
	if src[i] == '+' || src[i] == '-' {
		i++
	}
	for i < len(src) && isDigit(src[i]) {
		i++
	}
	if i < len(src) && src[i] == '.' {
		i++
		for i < len(src) && isDigit(src[i]) {
			i++
		}
	}
	// An exponent only when digits follow, so that "2e" stays a number and a name.
	if i < len(src) && (src[i] == 'e' || src[i] == 'E') {
		j := i + 1
		if j < len(src) && (src[j] == '+' || src[j] == '-') {
			j++
		}
		if j < len(src) && isDigit(src[j]) {
			for j < len(src) && isDigit(src[j]) {
				j++
			}
			i = j
		}
	}
	return i
}

// scanString returns the end of the string starting at i and whether it was closed on its line.
func scanString(src []byte, i int) (int, bool) {
	for i++; i < len(src); i++ {
		switch src[i] {
		case '\\':
			if i+1 < len(src) && src[i+1] != '\n' && src[i+1] != '\r' {
				i++
			}
		case '"':
			return i + 1, true
		case '\n', '\r':
			return i, false
		}
	}
	return i, false
}

// scanWord scans a run of characters that are not spaces, punctuation of the notation, or
// control characters, and reports whether the run is an identifier. Inside parentheses spaces
// belong to the word, so that "kJ/(kg K)" is one unit spelling.
// wordToken scans the name or word starting at i.
func wordToken(src []byte, i int) Token {
	end, ident := scanWord(src, i)
	// Spaces belong to a word only inside its parentheses ("J/(kg K)"); a parenthesis left open
	// must not carry the spaces before a comment or the line end into the word.
	for end > i+1 && isBlank(src[end-1]) {
		end--
	}
	if ident {
		return newToken(Ident, i, end)
	}
	return newToken(Word, i, end)
}

func scanWord(src []byte, i int) (end int, ident bool) {
	// Fast path: an ASCII identifier ending at a space, punctuation or the end of the file, which
	// the general loop below would scan to the same end.
	if ascii[src[i]]&identStart != 0 {
		j := i + 1
		for j < len(src) && ascii[src[j]]&identPart != 0 {
			j++
		}
		if j == len(src) || ascii[src[j]]&wordEnd != 0 {
			return j, true
		}
	}
	ident = true
	depth := 0
	for n := 0; i < len(src); n++ {
		c := src[i]
		r, size := rune(c), 1
		if c >= utf8.RuneSelf {
			r, size = utf8.DecodeRune(src[i:])
			if r == utf8.RuneError && size == 1 || r == '±' || unicode.IsControl(r) {
				return i, ident && n > 0
			}
			if unicode.IsSpace(r) && depth == 0 {
				return i, ident
			}
		} else {
			switch c {
			case ' ', '\t', '\f', '\v':
				if depth == 0 {
					return i, ident
				}
			case '\n', '\r', '{', '}', ',', ';', '#', '"', '=', '<', '>':
				return i, ident
			case '+':
				if i+1 < len(src) && (src[i+1] == '-' || src[i+1] == '/' && i+2 < len(src) && src[i+2] == '-') {
					return i, ident
				}
			case '(':
				depth++
			case ')':
				if depth > 0 {
					depth--
				}
			}
			if c < ' ' || c == 0x7F {
				return i, ident
			}
		}
		if ident {
			letter := r == '_' || unicode.IsLetter(r)
			if n == 0 && !letter || n > 0 && !letter && !unicode.IsDigit(r) && r != '-' {
				ident = false
			}
		}
		i += size
	}
	return i, ident
}
