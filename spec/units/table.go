package units

import "strings"

// unit is one accepted unit. A value written in it is converted to the
// canonical unit of its kind by multiplying by 10^exp10 (every factor in the
// table is a power of ten) or, for kelvin, by subtracting 273.15.
type unit struct {
	// canon is the spelling stored in Quantity.Unit and printed by String.
	canon string
	kind  Kind
	exp10 int
	// kelvin marks the one unit with an offset instead of a factor.
	kelvin bool
	// also lists other spellings besides canon. Variants with "μ" (U+03BC)
	// and "u" for "µ" (U+00B5), and with "l" for "L", are added by
	// spellingsOf, so they are not listed here.
	also []string
}

// zeroCelsiusInKelvin is 0 °C expressed in kelvin (SI Brochure, 9th ed.
// 2019, section 2.3.1: t/°C = T/K − 273.15, exact by definition).
const zeroCelsiusInKelvin = 273.15

// unitTable lists every accepted unit. Prefix factors follow the SI Brochure,
// 9th ed. 2019, Table 7 (n = 1e-9, µ = 1e-6, m = 1e-3, k = 1e3). The order
// breaks ties between equally close suggestions: earlier entries win.
var unitTable = []unit{
	{canon: "g", kind: Mass, exp10: 0},
	{canon: "mg", kind: Mass, exp10: -3},
	{canon: "µg", kind: Mass, exp10: -6, also: []string{"mcg"}},
	{canon: "kg", kind: Mass, exp10: 3},

	{canon: "mol", kind: Substance, exp10: 0},
	{canon: "mmol", kind: Substance, exp10: -3},
	{canon: "µmol", kind: Substance, exp10: -6},
	{canon: "nmol", kind: Substance, exp10: -9},

	// M is the customary symbol for mol/L (IUPAC Green Book, 3rd ed.,
	// section 2.10); it is not an SI unit symbol but is unambiguous here.
	{canon: "M", kind: MolarConcentration, exp10: 0},
	{canon: "mM", kind: MolarConcentration, exp10: -3},
	{canon: "µM", kind: MolarConcentration, exp10: -6},
	{canon: "nM", kind: MolarConcentration, exp10: -9},
	{canon: "mol/L", kind: MolarConcentration, exp10: 0},
	{canon: "mmol/L", kind: MolarConcentration, exp10: -3},
	{canon: "µmol/L", kind: MolarConcentration, exp10: -6},
	{canon: "nmol/L", kind: MolarConcentration, exp10: -9},

	{canon: "mol/kg", kind: Molality, exp10: 0},
	{canon: "mmol/kg", kind: Molality, exp10: -3},
	{canon: "µmol/kg", kind: Molality, exp10: -6},

	{canon: "g/L", kind: MassConcentration, exp10: 0},
	{canon: "mg/L", kind: MassConcentration, exp10: -3},
	{canon: "µg/L", kind: MassConcentration, exp10: -6},
	{canon: "g/mL", kind: MassConcentration, exp10: 3},
	{canon: "mg/mL", kind: MassConcentration, exp10: 0},
	{canon: "µg/mL", kind: MassConcentration, exp10: -3},
	{canon: "g/100 mL", kind: MassConcentration, exp10: 1},
	// % w/v is grams of solute per 100 mL of solution by definition.
	{canon: "% w/v", kind: MassConcentration, exp10: 1, also: []string{"% (w/v)"}},

	{canon: "% w/w", kind: MassFraction, exp10: -2, also: []string{"% (w/w)"}},
	{canon: "ppm", kind: MassFraction, exp10: -6},
	{canon: "ppb", kind: MassFraction, exp10: -9},
	{canon: "mg/kg", kind: MassFraction, exp10: -6},
	{canon: "µg/kg", kind: MassFraction, exp10: -9},

	{canon: "L", kind: Volume, exp10: 0},
	{canon: "mL", kind: Volume, exp10: -3},
	{canon: "µL", kind: Volume, exp10: -6},

	{canon: "°C", kind: Temperature, exp10: 0, also: []string{"C", "degC", "℃"}},
	{canon: "K", kind: Temperature, kelvin: true},
}

// spelling is one way of writing a unit. In text, a space means "any run of
// white space, or none"; white space is also allowed on either side of "/".
type spelling struct {
	text string
	u    *unit
}

var (
	// spellings holds every spelling of every unit, in unitTable order.
	spellings []spelling
	// byCanon finds a unit from Quantity.Unit; it also accepts any exact
	// spelling so that a hand-built Quantity{Unit: "ml"} prints sensibly.
	byCanon = map[string]*unit{}
)

func init() {
	for i := range unitTable {
		u := &unitTable[i]
		for _, t := range spellingsOf(u) {
			spellings = append(spellings, spelling{text: t, u: u})
			if _, dup := byCanon[t]; !dup {
				byCanon[t] = u
			}
		}
	}
}

// spellingsOf returns canon and its listed alternatives with every micro
// and litre variant, canon first, without duplicates.
func spellingsOf(u *unit) []string {
	var out []string
	seen := map[string]bool{}
	add := func(s string) {
		if !seen[s] {
			seen[s] = true
			out = append(out, s)
		}
	}
	for _, base := range append([]string{u.canon}, u.also...) {
		for _, m := range []string{"µ", "μ", "u"} {
			s := strings.ReplaceAll(base, "µ", m)
			add(s)
			// Every capital L in the table is the litre, which may also be
			// written l (SI Brochure, 9th ed. 2019, Table 8).
			add(strings.ReplaceAll(s, "L", "l"))
		}
	}
	return out
}

// toCanonical converts v written in u to the canonical unit of u.kind.
// Dividing by an exact power of ten rounds once, where multiplying by an
// inexact 1e-3 would round twice.
func (u *unit) toCanonical(v float64) float64 {
	if u.kelvin {
		return v - zeroCelsiusInKelvin
	}
	return scale(v, u.exp10)
}

// fromCanonical is the inverse of toCanonical.
func (u *unit) fromCanonical(v float64) float64 {
	if u.kelvin {
		return v + zeroCelsiusInKelvin
	}
	return scale(v, -u.exp10)
}

// pow10 holds the exact powers of ten the table needs.
var pow10 = [...]float64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9}

func scale(v float64, exp10 int) float64 {
	if exp10 < 0 {
		return v / pow10[-exp10]
	}
	return v * pow10[exp10]
}
