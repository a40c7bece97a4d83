package units

import (
	"strconv"
	"strings"
)

// Error is a problem with an amount string. Parse, ParseKind and ParseRange
// return every error as an *Error.
type Error struct {
	// Input is the whole string that was parsed.
	Input string
	// Offset is where the offending part starts, counted in runes (Unicode
	// code points) from the start of Input, 0-based; it equals the rune
	// count of Input when something is missing at the end. Runes match the
	// column convention of spec/diag, so a caller adds Offset to the
	// scalar's column.
	Offset int
	// Message says what is wrong, without the input, e.g. `unknown unit "mgs"`.
	Message string
	// Suggestion is a replacement for the offending part, or "" when there is
	// none. When two replacements fit equally they are joined by " or ",
	// e.g. "% w/v or % w/w" (no unit spelling contains " or ").
	Suggestion string
}

// Error returns the message, the input and the suggestion, e.g.
// `unknown unit "mgs" in "5 mgs"; did you mean "mg"?`.
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.Message)
	b.WriteString(" in ")
	b.WriteString(strconv.Quote(e.Input))
	if e.Suggestion != "" {
		b.WriteString("; did you mean ")
		for i, alt := range strings.Split(e.Suggestion, " or ") {
			if i > 0 {
				b.WriteString(" or ")
			}
			b.WriteString(strconv.Quote(alt))
		}
		b.WriteString("?")
	}
	return b.String()
}
