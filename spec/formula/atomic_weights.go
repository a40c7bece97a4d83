package formula

// AtomicWeight is a standard atomic weight in g/mol with the status of
// the number.
type AtomicWeight struct {
	// Value is the abridged standard atomic weight in g/mol.
	Value float64
	// Status is "from memory" for every entry: the 5-figure abridged
	// table was not read in a copy; the 14 elements also in the checked
	// 4-significant-figure IUPAC 2016 table agree with it after rounding.
	Status string
}

// WeightsSource names the table the atomic weights come from.
const WeightsSource = "CIAAW/IUPAC abridged standard atomic weights, 2021 revision (Prohaska et al., Pure Appl. Chem. 94 (2022) 573); values from memory, consistent with the IUPAC 2016 four-significant-figure table"

const fromMemory = "from memory"

// atomicWeights holds the abridged standard atomic weights (CIAAW 2021,
// five significant figures where the abridged table gives them). H, C,
// N, O, Na, Mg, P, S, Cl, K, Ca, Fe, Zn, B, F and Al are the values listed
// in phgate's reference notes; the others were added for catalog entries
// and are also from memory.
var atomicWeights = map[string]AtomicWeight{
	"H":  {1.0080, fromMemory},
	"Li": {6.94, fromMemory},
	"B":  {10.81, fromMemory},
	"C":  {12.011, fromMemory},
	"N":  {14.007, fromMemory},
	"O":  {15.999, fromMemory},
	"F":  {18.998, fromMemory},
	"Na": {22.990, fromMemory},
	"Mg": {24.305, fromMemory},
	"Al": {26.982, fromMemory},
	"Si": {28.085, fromMemory},
	"P":  {30.974, fromMemory},
	"S":  {32.06, fromMemory},
	"Cl": {35.45, fromMemory},
	"K":  {39.098, fromMemory},
	"Ca": {40.078, fromMemory},
	"Ti": {47.867, fromMemory},
	"Cr": {51.996, fromMemory},
	"Mn": {54.938, fromMemory},
	"Fe": {55.845, fromMemory},
	"Co": {58.933, fromMemory},
	"Ni": {58.693, fromMemory},
	"Cu": {63.546, fromMemory},
	"Zn": {65.38, fromMemory},
	"Se": {78.971, fromMemory},
	"Br": {79.904, fromMemory},
	"Sr": {87.62, fromMemory},
	"Mo": {95.95, fromMemory},
	"Ag": {107.87, fromMemory},
	"Sn": {118.71, fromMemory},
	"I":  {126.90, fromMemory},
	"Ba": {137.33, fromMemory},
	"Bi": {208.98, fromMemory},
}

// Weight returns the abridged standard atomic weight of an element
// symbol, and false for a symbol not in the table.
func Weight(symbol string) (AtomicWeight, bool) {
	w, ok := atomicWeights[symbol]
	return w, ok
}
