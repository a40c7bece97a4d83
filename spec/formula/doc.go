// Package formula parses chemical formulas such as "Na2HPO4·7H2O" or
// "Ca3(PO4)2" into element counts and computes molar masses from the
// IUPAC (CIAAW) abridged standard atomic weights.
//
// Grammar (whitespace is not allowed, charges are not part of a formula):
//
//	formula  = part { dot part }
//	dot      = "·" | "•" | "⋅" | "." | "*"      (hydrate or adduct separator)
//	part     = [ number ] group { group }       (leading multiplier, may be decimal: 1.5H2O)
//	group    = element [ count ] | "(" group { group } ")" [ count ] | "[" group { group } "]" [ count ]
//	element  = upper-case letter [ lower-case letter ]
//	count    = digits
//
// Error offsets count runes from 0, so a caller that knows where the
// formula starts in a file can add the offset to its column.
package formula
