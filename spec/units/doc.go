// Package units parses the amounts written in recipes, such as "50 mM",
// "8.77 g", "30 % w/w" or "25 °C", and converts each once to the canonical
// unit of its kind, so that nothing downstream handles unit strings.
//
// # Syntax
//
// An amount is a number, optional white space, and a unit. The number may
// have a leading "+" or "-" (U+2212 "−" too), a decimal point (".5" and "5."
// are accepted) and an exponent ("1e-3", "1E+3"); it may not be NaN, Inf,
// hexadecimal, or use commas or underscores. Any Unicode white space counts,
// including the no-break spaces of typeset text. Inside a unit, white space
// is optional around "/" and where the table below shows a space, so
// "%w/w", "g/100mL" and "mol / L" are accepted. Unit symbols are
// case-sensitive ("mM" is millimolar, "mm" is refused with the suggestion
// "mM"). The micro prefix may be written with the micro sign µ (U+00B5, the
// canonical spelling), the Greek mu μ (U+03BC) or "u"; every "L" (litre)
// may also be written "l".
//
// Amounts must not be negative. Temperatures may be, down to absolute zero
// (−273.15 °C, 0 K). A bare "%" is refused as ambiguous between "% w/w" and
// "% w/v". Ranges such as "4..25 C" are read by ParseRange, not Parse.
//
// # Units and conversions
//
// Prefixes are those of the SI Brochure, 9th ed. 2019, Table 7:
// n = 1e-9, µ = 1e-6, m = 1e-3, k = 1e3. Quantity.Value is in the canonical
// unit of the kind (first column); Quantity.Unit keeps the canonical
// spelling of the unit as written.
//
//	Mass (g)                      g, mg (1e-3), µg ug mcg (1e-6), kg (1e3)
//	Substance (mol)               mol, mmol (1e-3), µmol umol (1e-6), nmol (1e-9)
//	MolarConcentration (mol/L)    M mol/L (1), mM mmol/L (1e-3), µM uM µmol/L (1e-6), nM nmol/L (1e-9)
//	Molality (mol/kg of water)    mol/kg (1), mmol/kg (1e-3), µmol/kg (1e-6)
//	MassConcentration (g/L)       g/L (1), mg/L (1e-3), µg/L (1e-6), g/mL (1e3),
//	                              mg/mL (1), µg/mL (1e-3), g/100 mL (10), % w/v (10)
//	MassFraction (dimensionless)  % w/w (1e-2), ppm mg/kg (1e-6), ppb µg/kg (1e-9)
//	Volume (L)                    L l, mL ml (1e-3), µL uL ul (1e-6)
//	Temperature (°C)              °C C degC ℃, K (T/K − 273.15)
//
// # Conventions
//
// "M" is the customary symbol for mol/L (IUPAC Green Book, 3rd ed. 2007,
// section 2.10). "% w/v" means grams of solute per 100 mL of solution, by
// definition, so 0.9 % w/v is 9 g/L; "% (w/v)" is accepted too. "% w/w"
// and "% (w/w)" mean grams per 100 g of solution.
//
// ppm and ppb are mass fractions (1e-6 and 1e-9 of the solution's mass),
// not mole fractions and not mass per volume. For dilute aqueous solutions,
// whose density is close to 1 kg/L, 1 ppm ≈ 1 mg/kg ≈ 1 mg/L, but this
// package never makes that approximation: turning a mass fraction into a
// concentration needs the solution's density, which is the caller's to
// supply. mg/kg and µg/kg are read as mass fractions for the same reason,
// while mol/kg and its prefixed forms are molalities (per kilogram of water,
// not of solution).
//
// Temperatures are stored in degrees Celsius; kelvin are converted with
// t/°C = T/K − 273.15 (SI Brochure, 9th ed. 2019, section 2.3.1). The
// symbols "C" and "degC" stand for °C because "°" is awkward to type.
//
// # Errors
//
// Every error is an *Error carrying the input, the rune offset of the
// offending part (runes, like the columns of spec/diag) and, for a
// misspelt unit, the closest known unit by edit distance ignoring case.
package units
