package units

import "strconv"

// Kind is the physical quantity a unit measures. Each kind has one canonical
// unit that Quantity.Value is expressed in (see the package documentation).
type Kind int

const (
	// Mass is measured in grams.
	Mass Kind = iota
	// Substance is an amount of substance, measured in moles.
	Substance
	// MolarConcentration is amount per volume of solution, in mol/L.
	MolarConcentration
	// Molality is amount per mass of water, in mol/kg.
	Molality
	// MassConcentration is mass per volume of solution, in g/L.
	MassConcentration
	// MassFraction is mass per mass of solution, dimensionless (0.3 for 30 % w/w).
	MassFraction
	// Volume is measured in litres.
	Volume
	// Temperature is measured in degrees Celsius.
	Temperature
)

// kindInfo holds what messages and Quantity.String need to know about each
// kind. display is the unit used to print a Quantity whose Unit is missing
// or does not belong to its Kind.
var kindInfo = [...]struct {
	name, noun, example, display string
}{
	Mass:               {"Mass", "a mass", "8.77 g", "g"},
	Substance:          {"Substance", "an amount of substance", "0.1 mol", "mol"},
	MolarConcentration: {"MolarConcentration", "a molar concentration", "50 mM", "mol/L"},
	Molality:           {"Molality", "a molality", "0.1 mol/kg", "mol/kg"},
	MassConcentration:  {"MassConcentration", "a mass concentration", "1.5 mg/mL", "g/L"},
	MassFraction:       {"MassFraction", "a mass fraction", "30 % w/w", "% w/w"},
	Volume:             {"Volume", "a volume", "250 mL", "L"},
	Temperature:        {"Temperature", "a temperature", "25 C", "°C"},
}

func (k Kind) valid() bool { return k >= 0 && int(k) < len(kindInfo) }

// String returns the kind's Go name, e.g. "MolarConcentration", or
// "Kind(N)" for a value outside the declared constants.
func (k Kind) String() string {
	if !k.valid() {
		return "Kind(" + strconv.Itoa(int(k)) + ")"
	}
	return kindInfo[k].name
}

// noun returns the kind with an indefinite article, for messages.
func (k Kind) noun() string {
	if !k.valid() {
		return "a " + k.String()
	}
	return kindInfo[k].noun
}

// expectation describes the allowed kinds with an example each, e.g.
// "a temperature such as 25 C".
func expectation(allowed []Kind) string {
	s := ""
	for i, k := range allowed {
		switch {
		case i == 0:
		case i == len(allowed)-1:
			s += " or "
		default:
			s += ", "
		}
		s += k.noun()
		if k.valid() {
			s += " such as " + kindInfo[k].example
		}
	}
	return s
}
