package units

import (
	"errors"
	"math"
	"strings"
	"testing"
	"unicode/utf8"
)

// approx reports whether got is within a relative 1e-12 (or an absolute
// 1e-300 near zero) of want: conversions by powers of ten round at most a
// few times, far below this.
func approx(got, want float64) bool {
	return math.Abs(got-want) <= 1e-12*math.Max(math.Abs(got), math.Abs(want))+1e-300
}

func TestParse(t *testing.T) {
	tests := []struct {
		name  string
		in    string
		value float64
		kind  Kind
		unit  string
	}{
		// Mass, canonical g. Prefixes: SI Brochure, 9th ed. 2019, Table 7.
		{"gram", "8.77 g", 8.77, Mass, "g"},
		{"milligram", "5 mg", 5e-3, Mass, "mg"},
		{"microgram micro sign", "5 µg", 5e-6, Mass, "µg"},
		{"microgram Greek mu", "5 μg", 5e-6, Mass, "µg"},
		{"microgram u", "5 ug", 5e-6, Mass, "µg"},
		{"microgram mcg", "5 mcg", 5e-6, Mass, "µg"},
		{"kilogram", "1.2 kg", 1200, Mass, "kg"},

		// Amount of substance, canonical mol.
		{"mole", "0.1 mol", 0.1, Substance, "mol"},
		{"millimole", "2 mmol", 2e-3, Substance, "mmol"},
		{"micromole", "3 µmol", 3e-6, Substance, "µmol"},
		{"micromole u", "3 umol", 3e-6, Substance, "µmol"},
		{"nanomole", "4 nmol", 4e-9, Substance, "nmol"},

		// Molar concentration, canonical mol/L; M = mol/L (IUPAC Green Book, 3rd ed., 2.10).
		{"molar", "2 M", 2, MolarConcentration, "M"},
		{"millimolar", "50 mM", 0.05, MolarConcentration, "mM"},
		{"micromolar", "7 µM", 7e-6, MolarConcentration, "µM"},
		{"micromolar u", "7 uM", 7e-6, MolarConcentration, "µM"},
		{"micromolar Greek mu", "7 μM", 7e-6, MolarConcentration, "µM"},
		{"nanomolar", "9 nM", 9e-9, MolarConcentration, "nM"},
		{"mol per litre no space", "0.5mol/L", 0.5, MolarConcentration, "mol/L"},
		{"mol per small l", "0.5 mol/l", 0.5, MolarConcentration, "mol/L"},
		{"mol per litre spaced slash", "0.5 mol / L", 0.5, MolarConcentration, "mol/L"},
		{"mmol per litre", "10 mmol/L", 0.01, MolarConcentration, "mmol/L"},
		{"mmol per small l", "10 mmol/l", 0.01, MolarConcentration, "mmol/L"},
		{"umol per l", "10 umol/l", 1e-5, MolarConcentration, "µmol/L"},
		{"nmol per litre", "10 nmol/L", 1e-8, MolarConcentration, "nmol/L"},

		// Molality, canonical mol/kg of water.
		{"molal", "0.1 mol/kg", 0.1, Molality, "mol/kg"},
		{"millimolal", "150 mmol/kg", 0.15, Molality, "mmol/kg"},
		{"micromolal", "150 µmol/kg", 1.5e-4, Molality, "µmol/kg"},

		// Mass concentration, canonical g/L.
		{"g per litre", "9 g/L", 9, MassConcentration, "g/L"},
		{"g per small l", "9 g/l", 9, MassConcentration, "g/L"},
		{"mg per litre", "9 mg/L", 9e-3, MassConcentration, "mg/L"},
		{"ug per litre", "9 µg/L", 9e-6, MassConcentration, "µg/L"},
		{"mg per mL equals g per L", "1.5 mg/mL", 1.5, MassConcentration, "mg/mL"},
		{"mg per small ml", "1.5 mg/ml", 1.5, MassConcentration, "mg/mL"},
		{"ug per mL", "20 µg/mL", 0.02, MassConcentration, "µg/mL"},
		{"ug per ml ascii", "20 ug/ml", 0.02, MassConcentration, "µg/mL"},
		{"g per mL", "1.2 g/mL", 1200, MassConcentration, "g/mL"},
		// g/100 mL and % w/v: 1 g per 0.1 L is 10 g/L, by definition.
		{"g per 100 mL", "0.9 g/100 mL", 9, MassConcentration, "g/100 mL"},
		{"g per 100mL no space", "0.9 g/100mL", 9, MassConcentration, "g/100 mL"},
		{"percent w/v", "0.9 % w/v", 9, MassConcentration, "% w/v"},
		{"percent w/v tight", "0.9%w/v", 9, MassConcentration, "% w/v"},
		{"percent (w/v)", "0.9 % (w/v)", 9, MassConcentration, "% w/v"},

		// Mass fraction, dimensionless; percent is 1e-2, ppm 1e-6, ppb 1e-9 by definition.
		{"percent w/w", "30 % w/w", 0.3, MassFraction, "% w/w"},
		{"percent w/w tight", "30 %w/w", 0.3, MassFraction, "% w/w"},
		{"percent w/w no spaces", "30%w/w", 0.3, MassFraction, "% w/w"},
		{"percent (w/w)", "30 % (w/w)", 0.3, MassFraction, "% w/w"},
		{"ppm", "2 ppm", 2e-6, MassFraction, "ppm"},
		{"ppb", "2 ppb", 2e-9, MassFraction, "ppb"},
		{"mg per kg", "2 mg/kg", 2e-6, MassFraction, "mg/kg"},
		{"ug per kg", "2 µg/kg", 2e-9, MassFraction, "µg/kg"},

		// Volume, canonical L; l is an accepted symbol for the litre (SI Brochure, Table 8).
		{"litre", "1 L", 1, Volume, "L"},
		{"small l", "1 l", 1, Volume, "L"},
		{"millilitre", "250 mL", 0.25, Volume, "mL"},
		{"millilitre small l", "250 ml", 0.25, Volume, "mL"},
		{"microlitre", "250 µL", 2.5e-4, Volume, "µL"},
		{"microlitre Greek mu", "250 μL", 2.5e-4, Volume, "µL"},
		{"microlitre u", "250 uL", 2.5e-4, Volume, "µL"},
		{"microlitre ul", "250 ul", 2.5e-4, Volume, "µL"},

		// Temperature, canonical °C; t/°C = T/K − 273.15 (SI Brochure, 2.3.1).
		{"degree Celsius", "25 °C", 25, Temperature, "°C"},
		{"C", "25 C", 25, Temperature, "°C"},
		{"degC", "25 degC", 25, Temperature, "°C"},
		{"one-rune Celsius sign", "25 ℃", 25, Temperature, "°C"},
		{"kelvin", "298.15 K", 25, Temperature, "K"},
		{"absolute zero in K", "0 K", -273.15, Temperature, "K"},
		{"absolute zero in C", "-273.15 C", -273.15, Temperature, "°C"},
		{"negative Celsius", "-20 °C", -20, Temperature, "°C"},
		{"minus sign U+2212", "−20 °C", -20, Temperature, "°C"},

		// Number syntax.
		{"leading plus", "+5 g", 5, Mass, "g"},
		{"exponent", "1e-3 M", 1e-3, MolarConcentration, "M"},
		{"capital exponent", "1E-3 M", 1e-3, MolarConcentration, "M"},
		{"exponent with plus", "1.5e+2 mg", 0.15, Mass, "mg"},
		{"exponent no space", "1e3mM", 1, MolarConcentration, "mM"},
		{"leading point", ".5 g", 0.5, Mass, "g"},
		{"trailing point", "5. g", 5, Mass, "g"},
		{"zero", "0 g", 0, Mass, "g"},
		{"negative zero is zero", "-0 g", 0, Mass, "g"},
		{"underflow to zero", "1e-400 g", 0, Mass, "g"},
		{"surrounding space", "  50 mM \t", 0.05, MolarConcentration, "mM"},
		{"no-break space", "50\u00a0mM", 0.05, MolarConcentration, "mM"},
		{"narrow no-break space", "50\u202fmM", 0.05, MolarConcentration, "mM"},
		{"largest float", "1.7976931348623157e308 g", math.MaxFloat64, Mass, "g"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			q, err := Parse(tt.in)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tt.in, err)
			}
			if !approx(q.Value, tt.value) || q.Kind != tt.kind || q.Unit != tt.unit {
				t.Errorf("Parse(%q) = %v %v %q, want %v %v %q", tt.in, q.Value, q.Kind, q.Unit, tt.value, tt.kind, tt.unit)
			}
			if math.Signbit(q.Value) && q.Value == 0 {
				t.Errorf("Parse(%q) returned negative zero", tt.in)
			}
		})
	}
}

func TestParseErrors(t *testing.T) {
	tests := []struct {
		name       string
		in         string
		offset     int    // rune offset of the offending part
		message    string // substring of Message
		suggestion string
	}{
		{"empty", "", 0, "empty amount", ""},
		{"blank", "   ", 0, "empty amount", ""},
		{"missing number", "mg", 0, "missing number", ""},
		{"missing number after space", "  mM", 2, "missing number", ""},
		{"missing number after sign", "- g", 0, "expected a number", ""},
		{"not a number", "abc?", 0, "missing number", ""},
		{"question mark", "?", 0, "expected a number", ""},
		{"missing unit", "50", 2, "missing unit", ""},
		{"missing unit trailing space", "50  ", 2, "missing unit", ""},
		{"NaN", "NaN g", 0, "finite", ""},
		{"Inf", "Inf g", 0, "finite", ""},
		{"negative infinity", "-inf C", 0, "finite", ""},
		{"overflow", "1e400 g", 0, "out of range", ""},
		{"overflow after conversion", "1e308 kg", 0, "out of range", ""},
		{"negative mass", "-5 g", 0, "must not be negative", ""},
		{"negative after space", "  -5 mM", 2, "must not be negative", ""},
		{"negative with minus sign", "−5 mL", 0, "must not be negative", ""},
		{"below absolute zero C", "-273.16 °C", 0, "absolute zero", ""},
		{"below absolute zero K", "-1 K", 0, "absolute zero", ""},
		{"trailing word", "5 mg extra", 5, `unexpected text "extra"`, ""},
		{"trailing punctuation", "50 mM;", 5, `unexpected text ";"`, ""},
		{"trailing parenthesis", "50 mM(final)", 5, `unexpected text "(final)"`, ""},
		{"decimal comma", "0,5 g", 1, "comma", ""},
		{"range in amount", "4..25 C", 1, "range", ""},
		// Suggestions: closest unit ignoring case, case decides ties.
		{"extra letter", "5 mgs", 2, `unknown unit "mgs"`, "mg"},
		{"wrong case mm", "5 mm", 2, `unknown unit "mm"`, "mM"},
		{"wrong case m", "5 m", 2, `unknown unit "m"`, "M"},
		{"wrong case ML", "5 ML", 2, `unknown unit "ML"`, "mL"},
		{"wrong case MG", "5 MG", 2, `unknown unit "MG"`, "mg"},
		{"transposed", "5 mlo", 2, `unknown unit "mlo"`, "mol"},
		{"typo in compound", "5 mg/mk", 2, `unknown unit "mg/mk"`, "mg/mL"},
		{"space inside unit", "5 m g", 2, `unknown unit "m g"`, "mg"},
		{"letter after slash unit", "5 g/Lx", 2, `unknown unit "g/Lx"`, "g/L"},
		{"Greek mu typo", "5 μgs", 2, `unknown unit "μgs"`, "µg"},
		{"non-ASCII offset", "½ g", 0, "expected a number", ""},
		{"offset counts runes", "5 µgx", 2, `unknown unit "µgx"`, "µg"},
		{"no suggestion", "5 furlongs", 2, `unknown unit "furlongs"`, ""},
		{"one-letter no suggestion", "5 u", 2, `unknown unit "u"`, ""},
		{"long unknown unit is cut short", "5 " + strings.Repeat("x", 100), 2, `unknown unit "` + strings.Repeat("x", 39) + `…"`, ""},
		{"bare percent", "30 %", 3, "ambiguous", "% w/v or % w/w"},
		{"percent no space", "30%", 2, "ambiguous", "% w/v or % w/w"},
		{"percent typo", "30 % w/x", 3, "unknown unit", "% w/v"},
		{"percent unknown", "30 %w", 3, "unknown unit", "% w/v or % w/w"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			q, err := Parse(tt.in)
			if err == nil {
				t.Fatalf("Parse(%q) = %v, want an error", tt.in, q)
			}
			checkError(t, err, tt.in, tt.offset, tt.message, tt.suggestion)
		})
	}
}

// checkError checks that err is an *Error about in with the given offset,
// message substring and suggestion.
func checkError(t *testing.T, err error, in string, offset int, message, suggestion string) {
	t.Helper()
	var e *Error
	if !errors.As(err, &e) {
		t.Fatalf("error %v is %T, want *Error", err, err)
	}
	if e.Input != in {
		t.Errorf("Input = %q, want %q", e.Input, in)
	}
	if e.Offset != offset {
		t.Errorf("Offset = %d, want %d (%v)", e.Offset, offset, err)
	}
	if !strings.Contains(e.Message, message) {
		t.Errorf("Message = %q, want it to contain %q", e.Message, message)
	}
	if e.Suggestion != suggestion {
		t.Errorf("Suggestion = %q, want %q", e.Suggestion, suggestion)
	}
	if e.Offset < 0 || e.Offset > utf8.RuneCountInString(in) {
		t.Errorf("Offset %d outside the input", e.Offset)
	}
}

func TestErrorString(t *testing.T) {
	tests := []struct {
		name string
		in   string
		want string
	}{
		{"suggestion", "5 mgs", `unknown unit "mgs" in "5 mgs"; did you mean "mg"?`},
		{"two suggestions", "30 %", `"%" alone is ambiguous (mass fraction or mass per volume) in "30 %"; did you mean "% w/v" or "% w/w"?`},
		{"no suggestion", "-5 g", `amount must not be negative in "-5 g"`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Parse(tt.in)
			if err == nil || err.Error() != tt.want {
				t.Errorf("Parse(%q) error = %v, want %s", tt.in, err, tt.want)
			}
		})
	}
}

func TestParseKind(t *testing.T) {
	tests := []struct {
		name       string
		in         string
		allowed    []Kind
		wantErr    string // substring of the message; "" for success
		offset     int
		suggestion string
	}{
		{"temperature ok", "25 C", []Kind{Temperature}, "", 0, ""},
		{"any kind when none listed", "5 mg", nil, "", 0, ""},
		{"one of several", "5 mmol/kg", []Kind{MolarConcentration, Molality}, "", 0, ""},
		{"wrong kind", "5 mg", []Kind{Temperature}, `expected a temperature such as 25 C, but "mg" is a unit of mass`, 2, ""},
		{"several expected", "5 mL", []Kind{MolarConcentration, Molality},
			"expected a molar concentration such as 50 mM or a molality such as 0.1 mol/kg", 2, ""},
		{"missing unit says what is expected", "25", []Kind{Temperature}, "expected a temperature such as 25 C", 2, ""},
		// Suggestions come from the allowed kinds only: "mm" is closest to mM,
		// but among volumes mL is.
		{"suggestion limited to kinds", "5 mm", []Kind{Volume}, `unknown unit "mm"`, 2, "mL"},
		{"percent for fractions", "30 %", []Kind{MassFraction}, "ambiguous", 3, "% w/w"},
		{"percent for concentrations", "30 %", []Kind{MassConcentration}, "ambiguous", 3, "% w/v"},
		{"negative kelvin still checked", "-3 K", []Kind{Temperature}, "absolute zero", 0, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			q, err := ParseKind(tt.in, tt.allowed...)
			if tt.wantErr == "" {
				if err != nil {
					t.Fatalf("ParseKind(%q): %v", tt.in, err)
				}
				if len(tt.allowed) > 0 && !contains(tt.allowed, q.Kind) {
					t.Errorf("kind %v not in %v", q.Kind, tt.allowed)
				}
				return
			}
			if err == nil {
				t.Fatalf("ParseKind(%q) = %v, want an error", tt.in, q)
			}
			checkError(t, err, tt.in, tt.offset, tt.wantErr, tt.suggestion)
		})
	}
}

func TestString(t *testing.T) {
	tests := []struct {
		name string
		q    Quantity
		want string
	}{
		{"as written", mustParse(t, "50 mM"), "50 mM"},
		{"alias prints canonically", mustParse(t, "250 uL"), "250 µL"},
		{"kelvin", mustParse(t, "298.15 K"), "298.15 K"},
		{"percent", mustParse(t, "30 %w/w"), "30 % w/w"},
		{"conversion noise hidden", mustParse(t, "0.1 mM"), "0.1 mM"},
		{"exponent", mustParse(t, "1e-7 M"), "1e-07 M"},
		{"zero value", Quantity{}, "0 g"},
		{"hand-built alias", Quantity{Value: 0.25, Kind: Volume, Unit: "ml"}, "250 mL"},
		{"unit of another kind", Quantity{Value: 0.3, Kind: MassFraction, Unit: "g"}, "30 % w/w"},
		{"invalid kind", Quantity{Value: 1, Kind: Kind(42), Unit: "x"}, "1 x"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.q.String(); got != tt.want {
				t.Errorf("String() = %q, want %q", got, tt.want)
			}
		})
	}
}

func mustParse(t *testing.T, s string) Quantity {
	t.Helper()
	q, err := Parse(s)
	if err != nil {
		t.Fatal(err)
	}
	return q
}

func TestKindString(t *testing.T) {
	want := []string{"Mass", "Substance", "MolarConcentration", "Molality",
		"MassConcentration", "MassFraction", "Volume", "Temperature"}
	for k, w := range want {
		if got := Kind(k).String(); got != w {
			t.Errorf("Kind(%d).String() = %q, want %q", k, got, w)
		}
	}
	if got := Kind(-1).String(); got != "Kind(-1)" {
		t.Errorf("Kind(-1).String() = %q", got)
	}
}

// TestTable checks the unit table itself: no spelling names two units, every
// canonical spelling parses to its own unit, and the round trip holds.
func TestTable(t *testing.T) {
	owner := map[string]string{}
	for _, sp := range spellings {
		if o, dup := owner[sp.text]; dup && o != sp.u.canon {
			t.Errorf("spelling %q belongs to both %q and %q", sp.text, o, sp.u.canon)
		}
		owner[sp.text] = sp.u.canon
		t.Run(sp.text, func(t *testing.T) {
			q, err := Parse("2 " + sp.text)
			if err != nil {
				t.Fatal(err)
			}
			if q.Unit != sp.u.canon || q.Kind != sp.u.kind {
				t.Errorf("got %q %v, want %q %v", q.Unit, q.Kind, sp.u.canon, sp.u.kind)
			}
			if got := q.String(); got != "2 "+sp.u.canon {
				t.Errorf("String() = %q", got)
			}
		})
	}
	if len(kindInfo) != int(Temperature)+1 {
		t.Errorf("kindInfo has %d entries", len(kindInfo))
	}
	for k := range kindInfo {
		if _, ok := byCanon[kindInfo[k].display]; !ok {
			t.Errorf("display unit %q of %v is not in the table", kindInfo[k].display, Kind(k))
		}
		if q, err := ParseKind(kindInfo[k].example, Kind(k)); err != nil || q.Kind != Kind(k) {
			t.Errorf("example %q of %v: %v", kindInfo[k].example, Kind(k), err)
		}
	}
}

func TestDistance(t *testing.T) {
	tests := []struct {
		a, b string
		want int
	}{
		{"", "", 0},
		{"mg", "mg", 0},
		{"mgs", "mg", 1},
		{"mlo", "mol", 1}, // one transposition
		{"", "abc", 3},
		{"kitten", "sitting", 3}, // textbook Levenshtein example
	}
	for _, tt := range tests {
		if got := distance([]rune(tt.a), []rune(tt.b)); got != tt.want {
			t.Errorf("distance(%q, %q) = %d, want %d", tt.a, tt.b, got, tt.want)
		}
	}
}
