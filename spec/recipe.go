package spec

import (
	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec/units"
	"gopkg.in/yaml.v3"
)

// Pos is a 1-based line and column in a recipe file. Columns count Unicode
// code points (runes), as the YAML parser reports them.
type Pos struct {
	Line   int `json:"line"`
	Column int `json:"column"`
}

// Text is a string value with its position.
type Text struct {
	Value string
	Pos   Pos
}

// Num is a number with its position.
type Num struct {
	Value float64
	Pos   Pos
}

// Amount is a parsed quantity with the text it came from and its position.
type Amount struct {
	units.Quantity
	Raw string
	Pos Pos
}

// BasisKind says what the amounts of a recipe are made up to.
type BasisKind int

const (
	// NoBasis: every amount is already a concentration.
	NoBasis BasisKind = iota
	// VolumeBasis: a final volume after water q.s.; concentrations in mol/L.
	VolumeBasis
	// WaterMassBasis: a mass of water; concentrations are molalities in mol/kg.
	WaterMassBasis
)

// Basis is the batch size a recipe's masses, moles and volumes refer to.
type Basis struct {
	Kind BasisKind
	// Litres is the final volume (VolumeBasis).
	Litres float64
	// Kilograms is the mass of water (WaterMassBasis).
	Kilograms float64
	Raw       string
	Pos       Pos
	// Assumed marks the 1 L basis phgate takes for a recipe that gives
	// none but needs one to report q.s. amounts per batch.
	Assumed bool
}

// Temperature is the recipe's nominal temperature and the range it must
// hold its pH over, in °C. Without a declared range, Min = Max = Nominal.
type Temperature struct {
	Nominal, Min, Max float64
	Pos               Pos
	// Declared reports whether the recipe gave a temperature at all
	// (otherwise 25 °C is assumed).
	Declared bool
	// HasRange reports whether a range was given.
	HasRange bool
}

// Window is a target interval; either end may be absent.
type Window struct {
	Min, Max *Num
	Pos      Pos
}

// Ingredient is one line of a recipe's ingredient list. Exactly one of
// Use, From and Sequence is set.
type Ingredient struct {
	// Index is the 0-based position in the list.
	Index int
	Pos   Pos
	// Use is a catalog ingredient id.
	Use Text
	// From is another recipe of the project used as a stock or premix.
	From Text
	// Sequence is a peptide's one-letter amino-acid sequence.
	Sequence Text
	// Name is a display name (for sequences).
	Name Text
	// Amount is nil for a q.s. ingredient (water, or adjust-to-ph).
	Amount *Amount
	// QS marks "amount: q.s." (water made up to the basis).
	QS bool
	// Stock is the concentration of the stock a volume amount is taken from.
	Stock *Amount
	// StockDensity is the density of a % w/w stock, g/mL.
	StockDensity *Amount
	// AdjustToPH, when set, makes this ingredient the q.s. titrant.
	AdjustToPH *Num
	// Tolerance is the weighing tolerance in percent, when declared.
	Tolerance *Num
}

// Label is how the ingredient is named in messages.
func (in *Ingredient) Label() string {
	switch {
	case in.Use.Value != "":
		return in.Use.Value
	case in.From.Value != "":
		return "from " + in.From.Value
	case in.Name.Value != "":
		return in.Name.Value
	}
	return "peptide " + shorten(in.Sequence.Value, 12)
}

func shorten(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n]) + "…"
}

// Waiver accepts a rule's findings on purpose, with a reason.
type Waiver struct {
	Rule    Text
	Reason  Text
	Expires Text
	// Recipes limits a project-wide waiver to these recipe ids (empty: all).
	Recipes []Text
	Path    string
	Pos     Pos
}

// Recipe is a loaded, validated recipe file with positions on every value.
type Recipe struct {
	Path        string
	ID          Text
	Title       Text
	Basis       Basis
	Temperature Temperature
	PH          *Window
	Osmolarity  *Window
	// Density of the finished product in g/mL (default 1).
	Density     float64
	DensityPos  Pos
	Activity    solver.ActivityModel
	Ingredients []Ingredient
	// Catalog is the inline `catalog:` node, decoded by the catalog package.
	Catalog *yaml.Node
	// Rules is the `rules:` node with per-recipe rule settings.
	Rules   *yaml.Node
	Waivers []Waiver
	// KeyPos maps top-level keys ("ph", "temperature", ...) to positions.
	KeyPos map[string]Pos
}

// Titrant returns the adjust-to-ph ingredient, or nil.
func (r *Recipe) Titrant() *Ingredient {
	for i := range r.Ingredients {
		if r.Ingredients[i].AdjustToPH != nil {
			return &r.Ingredients[i]
		}
	}
	return nil
}

// PosOf returns the position of a top-level key, or of the recipe id.
func (r *Recipe) PosOf(key string) Pos {
	if p, ok := r.KeyPos[key]; ok {
		return p
	}
	return r.ID.Pos
}
