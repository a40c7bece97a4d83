package units

import (
	"strings"
	"unicode/utf8"
)

// ParseRange reads a range of one kind, written LOW..HIGH:
//
//	4..25 C        the unit after the upper bound applies to both bounds
//	4 C..25 C      each bound with its own unit
//	4 C .. 298 K   units may differ if they measure the same kind
//
// White space around ".." is optional. The upper bound must carry a unit;
// the lower bound may omit it. Both bounds obey the rules of Parse and must
// measure kind, and lo.Value must not exceed hi.Value (equal bounds are a
// range of one value). A hyphen or dash between the bounds ("2-8 °C") is
// refused with a suggestion of "..", because "-" also writes a negative
// temperature ("-5..-2 C"). Error offsets count from the start of s.
func ParseRange(s string, kind Kind) (lo, hi Quantity, err error) {
	fail := func(offset int, msg, suggestion string) (Quantity, Quantity, error) {
		return Quantity{}, Quantity{}, &Error{Input: s, Offset: offset, Message: msg, Suggestion: suggestion}
	}
	runes := func(byteIndex int) int { return utf8.RuneCountInString(s[:byteIndex]) }
	want := "expected a range such as " + rangeExample(kind)

	sep := strings.Index(s, "..")
	if sep < 0 {
		if dash := rangeDash(s); dash >= 0 {
			return fail(runes(dash), `write a range with "..", not a dash; `+want, "..")
		}
		return fail(0, want, "")
	}
	if strings.HasPrefix(s[sep:], "...") {
		return fail(runes(sep), `write a range with two dots ".."`, "..")
	}
	if again := strings.Index(s[sep+2:], ".."); again >= 0 {
		return fail(runes(sep+2+again), `a range has one ".."`, "")
	}
	left, right := s[:sep], s[sep+2:]
	if strings.TrimSpace(right) == "" {
		return fail(utf8.RuneCountInString(s), "missing upper bound after \"..\"; "+want, "")
	}
	if strings.TrimSpace(left) == "" {
		return fail(0, "missing lower bound before \"..\"; "+want, "")
	}

	hi, err = parse(right, []Kind{kind}, nil)
	if err != nil {
		return fail(shift(err, s, runes(sep+2)))
	}
	lo, err = parse(left, []Kind{kind}, byCanon[hi.Unit])
	if err != nil {
		return fail(shift(err, s, 0))
	}
	if lo.Value > hi.Value {
		return fail(0, "range is reversed: "+lo.String()+" is above "+hi.String(), "")
	}
	return lo, hi, nil
}

// shift moves an error from parsing part of s to the coordinates of s.
func shift(err error, s string, base int) (int, string, string) {
	e := err.(*Error) // parse returns only *Error
	return base + e.Offset, e.Message, e.Suggestion
}

func rangeExample(k Kind) string {
	if k == Temperature {
		return "4..25 C"
	}
	if !k.valid() {
		return "1..2 " + k.String()
	}
	// "50 mM" → "0..50 mM": every example is "number unit".
	return "0.." + kindInfo[k].example
}

// rangeDash returns the byte index of a hyphen or dash that separates two
// bounds, i.e. one that follows a digit or unit (not a leading minus sign),
// or -1.
func rangeDash(s string) int {
	prevContent, exponent := false, false
	var prev rune
	for i, c := range s {
		switch {
		case c == '-' && exponent:
			// the sign of an exponent, as in 1e-3
		case (c == '-' || c == '–' || c == '—') && prevContent:
			return i
		case isSpace(c):
		default:
			prevContent = isDigit(c) || isUnitRune(c)
		}
		exponent = (c == 'e' || c == 'E') && isDigit(prev)
		prev = c
	}
	return -1
}
