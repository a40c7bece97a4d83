package units

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// Quantity is a parsed amount, converted once to the canonical unit of its
// kind (see the package documentation).
type Quantity struct {
	// Value is the amount in the canonical unit of Kind: g, mol, mol/L,
	// mol/kg, g/L, a plain fraction, L or °C. It is always finite.
	Value float64
	// Kind is what the unit measures.
	Kind Kind
	// Unit is the canonical spelling of the unit as the user wrote it, e.g.
	// "mM" for "50 mM" (Value 0.05) and "µL" for "250 uL"; String prints the
	// amount in this unit.
	Unit string
}

// String returns the amount in the unit it was written in, e.g. "50 mM".
// The number has at most 15 significant digits unless more are needed to
// parse back to the same Value, so Parse(q.String()) returns q again within
// rounding. A Unit that is not a spelling of a unit of Kind is replaced by
// the kind's canonical unit ("% w/w" for mass fractions).
func (q Quantity) String() string {
	u, ok := byCanon[q.Unit]
	if !ok || u.kind != q.Kind {
		if !q.Kind.valid() {
			return formatNumber(q.Value) + " " + q.Unit
		}
		u = byCanon[kindInfo[q.Kind].display]
	}
	v := u.fromCanonical(q.Value)
	if math.IsInf(v, 0) && !math.IsInf(q.Value, 0) {
		// Undoing a division by 10^k can round just past the largest float.
		v = math.Copysign(math.MaxFloat64, v)
	}
	return formatNumber(v) + " " + u.canon
}

// formatNumber prints v with 15 significant digits, which hides the last-bit
// noise of unit conversion (0.05 mol/L → 50 mM, not 50.00000000000001),
// falling back to the shortest exact form when 15 digits would not parse
// back (near the largest float).
func formatNumber(v float64) string {
	s := strconv.FormatFloat(v, 'g', 15, 64)
	if _, err := strconv.ParseFloat(s, 64); err != nil {
		s = strconv.FormatFloat(v, 'g', -1, 64)
	}
	return s
}

// Parse reads an amount such as "50 mM", "8.77 g" or "25 °C" and converts it
// to the canonical unit of its kind. The number may carry a leading "+",
// a decimal point and an exponent ("1e-3", "1E-3"); white space between
// number and unit is optional. Amounts must not be negative; temperatures
// may be, down to absolute zero. Every error is an *Error.
func Parse(s string) (Quantity, error) {
	return parse(s, nil, nil)
}

// ParseKind is Parse that also requires the unit to measure one of the
// allowed kinds; with no kinds listed it accepts any, like Parse. Its error
// says what was expected ("expected a temperature such as 25 C"), and its
// suggestions for misspelt units come from the allowed kinds only.
func ParseKind(s string, allowed ...Kind) (Quantity, error) {
	return parse(s, allowed, nil)
}

// parse implements Parse and ParseKind. When implied is not nil, an amount
// without a unit is read in implied (the lower bound of a range).
func parse(s string, allowed []Kind, implied *unit) (Quantity, error) {
	r := []rune(s)
	fail := func(offset int, msg, suggestion string) (Quantity, error) {
		return Quantity{}, &Error{Input: s, Offset: offset, Message: msg, Suggestion: suggestion}
	}
	end := len(r)
	for end > 0 && isSpace(r[end-1]) {
		end--
	}
	r = r[:end] // offsets are unchanged: only trailing space is dropped
	start := skipSpace(r, 0)
	if start == len(r) {
		return fail(0, "empty amount; expected a number and a unit such as 50 mM", "")
	}

	numText, numEnd, ok := scanNumber(r, start)
	if !ok {
		return fail(start, numberProblem(r, start), "")
	}
	if numEnd < len(r) && r[numEnd] == ',' && numEnd+1 < len(r) && isDigit(r[numEnd+1]) {
		return fail(numEnd, "comma in number; write a decimal point and no thousands separator", "")
	}
	v, err := strconv.ParseFloat(numText, 64)
	if err != nil {
		if errors.Is(err, strconv.ErrRange) {
			return fail(start, "number "+numText+" is out of range", "")
		}
		// scanNumber only accepts what ParseFloat reads, so this is a bug.
		panic("units: scanned number " + strconv.Quote(numText) + " does not parse: " + err.Error())
	}
	if v == 0 {
		v = 0 // "-0 g" is zero, and must not print as "-0 g"
	}

	unitStart := skipSpace(r, numEnd)
	var u *unit
	switch {
	case unitStart == len(r) && implied != nil:
		u = implied
	case unitStart == len(r):
		msg := "missing unit after the number"
		if len(allowed) > 0 {
			msg += "; expected " + expectation(allowed)
		}
		return fail(unitStart, msg, "")
	case hasPrefix(r[unitStart:], ".."):
		return fail(unitStart, `a range ("..") is not allowed here`, "")
	default:
		var matchEnd int
		u, matchEnd = matchUnit(r, unitStart)
		if u == nil {
			return fail(unitProblem(r, unitStart, allowed))
		}
		if rest := skipSpace(r, matchEnd); rest < len(r) {
			return fail(rest, "unexpected text "+excerpt(r[rest:])+" after the unit", "")
		}
	}

	if len(allowed) > 0 && !contains(allowed, u.kind) {
		return fail(unitStart, "expected "+expectation(allowed)+", but "+strconv.Quote(u.canon)+" is a unit of "+strings.TrimPrefix(strings.TrimPrefix(u.kind.noun(), "a "), "an "), "")
	}
	switch {
	case u.kind == Temperature && u.toCanonical(v) < -zeroCelsiusInKelvin, u.kelvin && v < 0:
		return fail(start, "temperature is below absolute zero (-273.15 °C, 0 K)", "")
	case u.kind != Temperature && v < 0:
		return fail(start, "amount must not be negative", "")
	}
	value := u.toCanonical(v)
	if math.IsInf(value, 0) {
		return fail(start, "number "+numText+" is out of range in "+u.canon, "")
	}
	return Quantity{Value: value, Kind: u.kind, Unit: u.canon}, nil
}

// scanNumber reads [sign] digits [. digits] [(e|E) [sign] digits] at i, with
// at least one digit before or after the point, and returns it in the form
// strconv.ParseFloat reads. Unlike ParseFloat alone it refuses "Inf", "NaN",
// hexadecimal and underscores, which are not ordinary notation for amounts.
func scanNumber(r []rune, i int) (text string, end int, ok bool) {
	var b strings.Builder
	j := i
	if j < len(r) && isSign(r[j]) {
		if r[j] != '+' {
			b.WriteByte('-')
		}
		j++
	}
	digits := 0
	for ; j < len(r) && isDigit(r[j]); j++ {
		b.WriteRune(r[j])
		digits++
	}
	// A point followed by a second point starts a range, not a fraction.
	if j < len(r) && r[j] == '.' && !hasPrefix(r[j:], "..") {
		b.WriteByte('.')
		for j++; j < len(r) && isDigit(r[j]); j++ {
			b.WriteRune(r[j])
			digits++
		}
	}
	if digits == 0 {
		return "", i, false
	}
	if j < len(r) && (r[j] == 'e' || r[j] == 'E') {
		k := j + 1
		neg := false
		if k < len(r) && isSign(r[k]) {
			neg = r[k] != '+'
			k++
		}
		if k < len(r) && isDigit(r[k]) {
			b.WriteByte('e')
			if neg {
				b.WriteByte('-')
			}
			for ; k < len(r) && isDigit(r[k]); k++ {
				b.WriteRune(r[k])
			}
			j = k
		}
	}
	return b.String(), j, true
}

// numberProblem explains why no number starts at i.
func numberProblem(r []rune, i int) string {
	j := i
	if isSign(r[j]) {
		j++
	}
	word := strings.ToLower(string(r[j:min(j+3, len(r))]))
	if word == "nan" || word == "inf" {
		return "amount must be a finite number"
	}
	if j < len(r) && (isUnitRune(r[j]) || r[j] == '.') && !isDigit(r[j]) {
		return "missing number before the unit"
	}
	return "expected a number"
}

// matchUnit returns the unit with the longest spelling that matches r at i
// and ends at a unit boundary, and the rune offset where the match ends;
// nil when none does.
func matchUnit(r []rune, i int) (*unit, int) {
	var best *unit
	bestEnd := -1
	for _, sp := range spellings {
		end, ok := matchSpelling(r, i, sp.text)
		if !ok || end <= bestEnd {
			continue
		}
		// "mg" must not match the start of "mgs", nor "g" the start of "g/L".
		if end < len(r) && isUnitRune(r[end]) {
			continue
		}
		best, bestEnd = sp.u, end
	}
	return best, bestEnd
}

// matchSpelling matches pattern at r[i:], letting a space in the pattern
// stand for any run of white space or none, and allowing white space around
// "/". It returns where the match ends.
func matchSpelling(r []rune, i int, pattern string) (int, bool) {
	j := i
	for _, p := range pattern {
		switch p {
		case ' ':
			j = skipSpace(r, j)
			continue
		case '/':
			j = skipSpace(r, j)
		}
		if j >= len(r) || r[j] != p {
			return 0, false
		}
		j++
		if p == '/' {
			j = skipSpace(r, j)
		}
	}
	return j, true
}

// unitProblem builds the error for an unknown unit starting at i: its
// offset, message and the closest known spelling.
func unitProblem(r []rune, i int, allowed []Kind) (int, string, string) {
	text := string(r[i:])
	if text == "%" {
		sug := "% w/v or % w/w"
		switch {
		case contains(allowed, MassConcentration) && !contains(allowed, MassFraction):
			sug = "% w/v"
		case contains(allowed, MassFraction) && !contains(allowed, MassConcentration):
			sug = "% w/w"
		}
		return i, `"%" alone is ambiguous (mass fraction or mass per volume)`, sug
	}
	sug := suggest(text, allowed)
	if sug == "" && strings.HasPrefix(text, "%") {
		sug = "% w/v or % w/w"
	}
	return i, "unknown unit " + excerpt(r[i:]), sug
}

// excerpt quotes r for a message, cut short so that a long line pasted
// into a field does not flood the report.
func excerpt(r []rune) string {
	const most = 40
	if len(r) > most {
		return strconv.Quote(string(r[:most-1]) + "…")
	}
	return strconv.Quote(string(r))
}

func contains(kinds []Kind, k Kind) bool {
	for _, x := range kinds {
		if x == k {
			return true
		}
	}
	return false
}

func hasPrefix(r []rune, p string) bool {
	return strings.HasPrefix(string(r[:min(len(r), len(p))]), p)
}

func skipSpace(r []rune, i int) int {
	for i < len(r) && isSpace(r[i]) {
		i++
	}
	return i
}

// isSpace accepts any Unicode white space, including the no-break and
// narrow no-break spaces that typeset numbers often carry before a unit.
func isSpace(c rune) bool { return unicode.IsSpace(c) }

func isDigit(c rune) bool { return '0' <= c && c <= '9' }

// isSign accepts the minus sign U+2212 as well as the hyphen-minus, since
// text pasted from documents often carries it.
func isSign(c rune) bool { return c == '+' || c == '-' || c == '−' }

// isUnitRune reports whether c can continue a unit, so that a unit ends
// only at white space, punctuation or the end of the input.
func isUnitRune(c rune) bool {
	return unicode.IsLetter(c) || unicode.IsDigit(c) || c == '%' || c == '/' || c == '°' || c == '℃'
}
