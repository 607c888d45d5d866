package units

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
)

// QuantityError reports input ParseQuantity cannot read. Offset is the byte offset in the input
// where the trouble starts, so the notation can point at it.
type QuantityError struct {
	Input  string
	Offset int
	Msg    string
}

func (e *QuantityError) Error() string {
	return fmt.Sprintf("%s in %q", e.Msg, e.Input)
}

// ParseQuantity splits a given such as "150psig", "600 F", "2800kJ/kg", "85%" or "0.9" into its
// number and its unit spelling ("" for a bare number). Space between the two is optional. The
// unit spelling is not checked here; pass it to Lookup. A Unicode minus sign is accepted.
// The error is a *QuantityError.
func ParseQuantity(s string) (v float64, unit string, err error) {
	fail := func(off int, msg string) (float64, string, error) {
		return 0, "", &QuantityError{Input: s, Offset: off, Msg: msg}
	}
	start := 0
	for start < len(s) && (s[start] == ' ' || s[start] == '\t') {
		start++
	}
	if start == len(s) {
		return fail(start, "missing number")
	}
	i := start
	var num strings.Builder
	switch {
	case s[i] == '+' || s[i] == '-':
		num.WriteByte(s[i])
		i++
	case strings.HasPrefix(s[i:], "−"): // U+2212 MINUS SIGN
		num.WriteByte('-')
		i += len("−")
	}
	digits := 0
	for ; i < len(s) && isDigit(s[i]); i++ {
		num.WriteByte(s[i])
		digits++
	}
	if i < len(s) && s[i] == '.' {
		num.WriteByte('.')
		for i++; i < len(s) && isDigit(s[i]); i++ {
			num.WriteByte(s[i])
			digits++
		}
	}
	if digits == 0 {
		return fail(start, "missing number")
	}
	// An exponent only when digits follow, so that a unit may start with e or E.
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		if j < len(s) && isDigit(s[j]) {
			for j < len(s) && isDigit(s[j]) {
				j++
			}
			num.WriteString(s[i:j])
			i = j
		}
	}
	v, perr := strconv.ParseFloat(num.String(), 64)
	if perr != nil {
		if errors.Is(perr, strconv.ErrRange) {
			return fail(start, "number out of range")
		}
		return fail(start, "malformed number")
	}
	unitStart := i
	for unitStart < len(s) && (s[unitStart] == ' ' || s[unitStart] == '\t') {
		unitStart++
	}
	unit = strings.TrimRight(s[unitStart:], " \t")
	if unit != "" && (isDigit(unit[0]) || unit[0] == '.' || unit[0] == '+' || unit[0] == '-') {
		return fail(unitStart, "malformed number")
	}
	return v, unit, nil
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }
