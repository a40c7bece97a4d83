package formula

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"
)

// Limits that keep a hostile formula from costing much.
const (
	// MaxLength is the longest formula accepted, in runes.
	MaxLength = 512
	// MaxDepth is the deepest bracket nesting accepted.
	MaxDepth = 16
	// MaxCount is the largest count or multiplier accepted; real formulas
	// stay far below it, and it keeps products of nested counts finite.
	MaxCount = 10000
)

// Composition maps element symbols to the number of atoms in one formula
// unit. Counts are float64 because hydrate multipliers may be fractional
// ("1.5H2O").
type Composition map[string]float64

// Elements returns the element symbols in alphabetical order.
func (c Composition) Elements() []string {
	out := make([]string, 0, len(c))
	for e := range c {
		out = append(out, e)
	}
	sort.Strings(out)
	return out
}

// MolarMass sums the atomic weights of the composition in g/mol.
func (c Composition) MolarMass() (float64, error) {
	m := 0.0
	for _, e := range c.Elements() {
		w, ok := atomicWeights[e]
		if !ok {
			return 0, fmt.Errorf("no atomic weight for element %q", e)
		}
		m += w.Value * c[e]
	}
	return m, nil
}

// SyntaxError is a malformed formula.
type SyntaxError struct {
	// Formula is the text that was parsed.
	Formula string
	// Offset is the 0-based rune index of the offending character
	// (the rune count of Formula when the text ended too early).
	Offset int
	// Msg says what is wrong.
	Msg string
}

// Error formats the error as `formula "X", rune N: message` with N
// counted from 1 for people.
func (e *SyntaxError) Error() string {
	return fmt.Sprintf("formula %q, character %d: %s", e.Formula, e.Offset+1, e.Msg)
}

// Parse reads a formula into element counts. It never panics; every
// failure is a *SyntaxError.
func Parse(formula string) (Composition, error) {
	if !utf8.ValidString(formula) {
		return nil, &SyntaxError{Formula: formula, Msg: "not valid UTF-8 text"}
	}
	p := &parser{src: formula, runes: []rune(formula)}
	if len(p.runes) == 0 {
		return nil, p.fail(0, "empty formula")
	}
	if len(p.runes) > MaxLength {
		return nil, p.fail(MaxLength, fmt.Sprintf("formula longer than %d characters", MaxLength))
	}
	comp, err := p.formula()
	if err != nil {
		return nil, err
	}
	return comp, nil
}

// MolarMass parses a formula and returns its molar mass in g/mol from the
// abridged standard atomic weights (see WeightsSource).
func MolarMass(formula string) (float64, error) {
	c, err := Parse(formula)
	if err != nil {
		return 0, err
	}
	return c.MolarMass()
}

type parser struct {
	src   string
	runes []rune
	pos   int
}

func (p *parser) fail(at int, msg string) *SyntaxError {
	return &SyntaxError{Formula: p.src, Offset: at, Msg: msg}
}

func (p *parser) peek() rune {
	if p.pos >= len(p.runes) {
		return 0
	}
	return p.runes[p.pos]
}

func isDot(r rune) bool {
	switch r {
	case '·', '•', '⋅', '.', '*':
		return true
	}
	return false
}

func isDigit(r rune) bool { return r >= '0' && r <= '9' }
func isUpper(r rune) bool { return r >= 'A' && r <= 'Z' }
func isLower(r rune) bool { return r >= 'a' && r <= 'z' }

func (p *parser) formula() (Composition, error) {
	total := Composition{}
	for {
		part, err := p.part()
		if err != nil {
			return nil, err
		}
		for e, n := range part {
			total[e] += n
		}
		if p.pos == len(p.runes) {
			return total, nil
		}
		r := p.peek()
		if !isDot(r) {
			return nil, p.unexpected()
		}
		p.pos++
		if p.pos == len(p.runes) {
			return nil, p.fail(p.pos, "formula ends after a hydrate separator; expected something like 2H2O")
		}
	}
}

// part = [number] group {group}
func (p *parser) part() (Composition, error) {
	mult := 1.0
	if isDigit(p.peek()) {
		start := p.pos
		m, err := p.number(true)
		if err != nil {
			return nil, err
		}
		if m == 0 {
			return nil, p.fail(start, "multiplier must be greater than zero")
		}
		mult = m
	}
	comp, err := p.groups(0, 0)
	if err != nil {
		return nil, err
	}
	for e := range comp {
		comp[e] *= mult
	}
	return comp, nil
}

// groups reads groups until the closing bracket (close != 0) or the end
// of the part.
func (p *parser) groups(close rune, depth int) (Composition, error) {
	comp := Composition{}
	n := 0
	for {
		r := p.peek()
		switch {
		case p.pos == len(p.runes) || isDot(r):
			if close != 0 {
				return nil, p.fail(p.pos, fmt.Sprintf("missing %q", close))
			}
			if n == 0 {
				return nil, p.fail(p.pos, "expected an element symbol")
			}
			return comp, nil
		case r == ')' || r == ']':
			if r != close {
				if close == 0 {
					return nil, p.fail(p.pos, fmt.Sprintf("%q without a matching opening bracket", r))
				}
				return nil, p.fail(p.pos, fmt.Sprintf("%q closes a bracket that expects %q", r, close))
			}
			if n == 0 {
				return nil, p.fail(p.pos, "empty brackets")
			}
			return comp, nil
		case r == '(' || r == '[':
			if depth+1 > MaxDepth {
				return nil, p.fail(p.pos, fmt.Sprintf("brackets nested deeper than %d", MaxDepth))
			}
			want := ')'
			if r == '[' {
				want = ']'
			}
			p.pos++
			inner, err := p.groups(want, depth+1)
			if err != nil {
				return nil, err
			}
			p.pos++ // the closing bracket
			k, err := p.count()
			if err != nil {
				return nil, err
			}
			for e, c := range inner {
				comp[e] += c * k
			}
		case isUpper(r):
			start := p.pos
			p.pos++
			if isLower(p.peek()) {
				p.pos++
			}
			sym := string(p.runes[start:p.pos])
			if _, ok := atomicWeights[sym]; !ok {
				if isLower(p.peek()) {
					return nil, p.fail(start, fmt.Sprintf("unknown element %q (element symbols have one capital and at most one small letter)", sym+string(p.peek())))
				}
				return nil, p.fail(start, fmt.Sprintf("unknown element %q", sym))
			}
			k, err := p.count()
			if err != nil {
				return nil, err
			}
			comp[sym] += k
		default:
			return nil, p.unexpected()
		}
		n++
	}
}

func (p *parser) unexpected() error {
	r := p.peek()
	switch {
	case r == '+' || r == '-':
		return p.fail(p.pos, "charges are not part of a formula")
	case r == ' ' || r == '\t':
		return p.fail(p.pos, "spaces are not allowed in a formula")
	case isLower(r):
		return p.fail(p.pos, fmt.Sprintf("%q: element symbols start with a capital letter", r))
	case isDigit(r):
		return p.fail(p.pos, "a count must follow an element or a closing bracket")
	}
	return p.fail(p.pos, fmt.Sprintf("unexpected character %q", r))
}

// count reads an optional integer count after an element or bracket.
func (p *parser) count() (float64, error) {
	if !isDigit(p.peek()) {
		return 1, nil
	}
	start := p.pos
	k, err := p.number(false)
	if err != nil {
		return 0, err
	}
	if k == 0 {
		return 0, p.fail(start, "count must be greater than zero")
	}
	return k, nil
}

// number reads digits, with a decimal fraction when allowed (hydrate
// multipliers such as 1.5H2O).
func (p *parser) number(decimal bool) (float64, error) {
	start := p.pos
	for isDigit(p.peek()) {
		p.pos++
	}
	if decimal && p.peek() == '.' && p.pos+1 < len(p.runes) && isDigit(p.runes[p.pos+1]) {
		p.pos++
		for isDigit(p.peek()) {
			p.pos++
		}
	}
	text := string(p.runes[start:p.pos])
	v, err := strconv.ParseFloat(text, 64)
	if err != nil || math.IsInf(v, 0) || v > MaxCount {
		return 0, p.fail(start, fmt.Sprintf("number %s is larger than %d", text, MaxCount))
	}
	if strings.HasPrefix(text, "0") && len(text) > 1 && text[1] != '.' {
		return 0, p.fail(start, fmt.Sprintf("number %s has a leading zero", text))
	}
	return v, nil
}
