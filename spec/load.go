package spec

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"

	"github.com/phgate/phgate/schemas"
	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/units"
	"github.com/phgate/phgate/spec/yamldoc"
	"gopkg.in/yaml.v3"
)

// Physical limits that turn an implausible amount into an error.
const (
	// MaxMolarity is the largest concentration accepted for one
	// ingredient, mol/L. Few salts dissolve beyond about 10–20 mol/L; 25
	// leaves room for acids such as concentrated phosphoric acid (common
	// practice).
	MaxMolarity = 25.0
	// DefaultTemperatureC is assumed when a recipe declares none.
	DefaultTemperatureC = 25.0
	// DefaultDensity is the finished product's density in g/mL when the
	// recipe declares none (dilute aqueous solution).
	DefaultDensity = 1.0
	// MaxIngredients bounds the ingredient list; real recipes have tens.
	MaxIngredients = 500
)

var (
	recipeSchemaOnce sync.Once
	recipeSchemaMap  map[string]any
	recipeSchemaErr  error
)

// RecipeSchema returns the recipe JSON Schema as raw bytes.
func RecipeSchema() []byte {
	b, err := schemas.FS.ReadFile("recipe.schema.json")
	if err != nil {
		panic("embedded recipe schema missing: " + err.Error())
	}
	return b
}

func recipeSchemaKeys(ptr string) []string {
	recipeSchemaOnce.Do(func() {
		recipeSchemaErr = json.Unmarshal(RecipeSchema(), &recipeSchemaMap)
	})
	if recipeSchemaErr != nil {
		return nil
	}
	return yamldoc.KeysFromSchema(recipeSchemaMap, ptr)
}

// IsRecipe reports whether a decoded YAML document is a recipe (a mapping
// with a top-level "recipe" key). Other YAML files in a folder are skipped.
func IsRecipe(d *yamldoc.Doc) bool {
	if d == nil || d.Root == nil || d.Root.Kind != yaml.MappingNode {
		return false
	}
	return d.Node("/recipe") != nil
}

// LoadRecipe decodes, validates and converts a recipe file. It returns
// every problem it finds, each with line and column; the recipe is nil
// when there is any problem.
func LoadRecipe(data []byte, path string) (*Recipe, diag.Problems) {
	d, ps := yamldoc.Parse(data, path)
	if ps != nil {
		return nil, ps
	}
	return FromDoc(d)
}

// FromDoc validates an already decoded document and converts it.
func FromDoc(d *yamldoc.Doc) (*Recipe, diag.Problems) {
	if d.Root.Kind != yaml.MappingNode {
		return nil, diag.Problems{d.ProblemAt("", "a recipe must be a mapping of keys (recipe:, ingredients:, ...)")}
	}
	schema, err := yamldoc.CompileSchema("recipe.schema.json", RecipeSchema())
	if err != nil {
		panic("embedded recipe schema does not compile: " + err.Error())
	}
	if ps := d.Validate(schema, recipeSchemaKeys); len(ps) > 0 {
		return nil, ps
	}
	l := loader{doc: d, r: &Recipe{Path: d.Path, KeyPos: map[string]Pos{}}}
	l.convert()
	if len(l.problems) > 0 {
		l.problems.Sort()
		return nil, l.problems
	}
	return l.r, nil
}

type loader struct {
	doc      *yamldoc.Doc
	r        *Recipe
	problems diag.Problems
}

func (l *loader) pos(ptr string) Pos {
	if n := l.doc.Node(ptr); n != nil {
		return Pos{n.Line, n.Column}
	}
	return Pos{}
}

func (l *loader) str(ptr string) Text {
	n := l.doc.Node(ptr)
	if n == nil {
		return Text{}
	}
	return Text{Value: n.Value, Pos: Pos{n.Line, n.Column}}
}

func (l *loader) num(ptr string) *Num {
	n := l.doc.Node(ptr)
	if n == nil {
		return nil
	}
	var f float64
	if err := n.Decode(&f); err != nil || math.IsNaN(f) || math.IsInf(f, 0) {
		l.addAt(ptr, fmt.Sprintf("%q is not a finite number", n.Value))
		return nil
	}
	return &Num{Value: f, Pos: Pos{n.Line, n.Column}}
}

func (l *loader) addAt(ptr, msg string) {
	l.problems = append(l.problems, l.doc.ProblemAt(ptr, msg))
}

func (l *loader) add(p Pos, msg string) {
	l.problems = append(l.problems, diag.Problem{Path: l.doc.Path, Line: p.Line, Column: p.Column, Message: msg})
}

// quantity parses the scalar at ptr as one of the allowed kinds, placing
// unit errors at the exact rune inside the scalar.
func (l *loader) quantity(ptr, what string, allowed ...units.Kind) *Amount {
	n := l.doc.Node(ptr)
	if n == nil {
		return nil
	}
	q, err := units.ParseKind(n.Value, allowed...)
	if err != nil {
		p := Pos{n.Line, n.Column}
		var ue *units.Error
		if errors.As(err, &ue) && n.Style&(yaml.LiteralStyle|yaml.FoldedStyle) == 0 {
			p.Column += ue.Offset
			if n.Style&(yaml.DoubleQuotedStyle|yaml.SingleQuotedStyle) != 0 {
				p.Column++
			}
		}
		msg := fmt.Sprintf("%s in %s", err.Error(), what)
		if ue != nil {
			msg = fmt.Sprintf("%s in %s", ue.Message, what)
			if ue.Suggestion != "" {
				alts := strings.Split(ue.Suggestion, " or ")
				for i := range alts {
					alts[i] = strconv.Quote(alts[i])
				}
				msg += "; did you mean " + strings.Join(alts, " or ") + "?"
			}
		}
		l.add(p, msg)
		return nil
	}
	return &Amount{Quantity: q, Raw: n.Value, Pos: Pos{n.Line, n.Column}}
}

func (l *loader) convert() {
	r := l.r
	for _, k := range l.doc.Keys("") {
		if kn := l.doc.Key("/" + k); kn != nil {
			r.KeyPos[k] = Pos{kn.Line, kn.Column}
		}
	}
	r.ID = l.str("/recipe")
	r.Title = l.str("/title")
	l.basis()
	l.temperature()
	r.PH = l.window("/ph", "pH window")
	r.Osmolarity = l.window("/osmolarity", "osmolarity window")
	r.Density = DefaultDensity
	if a := l.quantity("/density", "density", units.MassConcentration); a != nil {
		// g/L → g/mL
		r.Density = a.Value / 1000
		r.DensityPos = a.Pos
		if r.Density < 0.5 || r.Density > 3 {
			l.add(a.Pos, fmt.Sprintf("density %s is outside 0.5–3 g/mL; write it as g/mL, e.g. 1.02 g/mL", a.Raw))
		}
	}
	if t := l.str("/activity"); t.Value == "ideal" {
		r.Activity = solver.Ideal
	}
	r.Catalog = l.doc.Node("/catalog")
	r.Rules = l.doc.Node("/rules")
	r.Waivers = LoadWaivers(l.doc, "/waivers", r.Path)
	l.ingredients()
}

func (l *loader) basis() {
	a := l.quantity("/basis", "basis", units.Volume, units.Mass)
	if a == nil {
		return
	}
	b := &l.r.Basis
	b.Raw, b.Pos = a.Raw, a.Pos
	switch a.Kind {
	case units.Volume:
		b.Kind, b.Litres = VolumeBasis, a.Value
	case units.Mass:
		b.Kind, b.Kilograms = WaterMassBasis, a.Value/1000
	}
	if a.Value <= 0 {
		l.add(a.Pos, "basis must be larger than zero")
	}
}

func (l *loader) temperature() {
	t := &l.r.Temperature
	t.Nominal, t.Min, t.Max = DefaultTemperatureC, DefaultTemperatureC, DefaultTemperatureC
	n := l.doc.Node("/temperature")
	if n == nil {
		return
	}
	t.Declared = true
	t.Pos = Pos{n.Line, n.Column}
	nominalPtr := "/temperature"
	if n.Kind == yaml.MappingNode {
		nominalPtr = "/temperature/nominal"
	}
	a := l.quantity(nominalPtr, "temperature", units.Temperature)
	if a == nil {
		return
	}
	t.Nominal, t.Min, t.Max = a.Value, a.Value, a.Value
	if a.Value < 0 || a.Value > 100 {
		l.add(a.Pos, fmt.Sprintf("temperature %s is outside liquid water at ambient pressure (0–100 °C)", a.Raw))
	}
	rn := l.doc.Node("/temperature/range")
	if rn == nil {
		return
	}
	lo, hi, err := units.ParseRange(rn.Value, units.Temperature)
	if err != nil {
		l.add(Pos{rn.Line, rn.Column}, fmt.Sprintf("%s in temperature range (write it as 4..25 C)", err.Error()))
		return
	}
	if lo.Value < 0 || hi.Value > 100 {
		l.add(Pos{rn.Line, rn.Column}, "temperature range must lie within 0–100 °C")
		return
	}
	t.HasRange = true
	t.Min, t.Max = math.Min(lo.Value, a.Value), math.Max(hi.Value, a.Value)
}

func (l *loader) window(ptr, what string) *Window {
	n := l.doc.Node(ptr)
	if n == nil {
		return nil
	}
	w := &Window{Pos: Pos{n.Line, n.Column}, Min: l.num(ptr + "/min"), Max: l.num(ptr + "/max")}
	if w.Min != nil && w.Max != nil && w.Min.Value > w.Max.Value {
		l.add(w.Min.Pos, fmt.Sprintf("%s has min %g above max %g", what, w.Min.Value, w.Max.Value))
	}
	return w
}

func (l *loader) ingredients() {
	n := l.doc.Node("/ingredients")
	if n == nil {
		return
	}
	if len(n.Content) > MaxIngredients {
		l.addAt("/ingredients", fmt.Sprintf("%d ingredients is more than the limit of %d", len(n.Content), MaxIngredients))
		return
	}
	titrants := 0
	allConcentrations := true
	for i := range n.Content {
		ptr := fmt.Sprintf("/ingredients/%d", i)
		in := Ingredient{Index: i, Pos: l.pos(ptr)}
		in.Use = l.str(ptr + "/use")
		in.From = l.str(ptr + "/from")
		in.Sequence = l.str(ptr + "/sequence")
		in.Name = l.str(ptr + "/name")
		in.AdjustToPH = l.num(ptr + "/adjust-to-ph")
		in.Tolerance = l.num(ptr + "/tolerance")
		amountNode := l.doc.Node(ptr + "/amount")
		switch {
		case amountNode != nil && isQS(amountNode.Value):
			in.QS = true
			if in.Use.Value != "purified-water" {
				l.addAt(ptr+"/amount", fmt.Sprintf("q.s. is for purified-water; to adjust %s to a pH use adjust-to-ph", in.Label()))
			}
		case amountNode != nil:
			kinds := []units.Kind{units.Mass, units.Substance, units.MolarConcentration, units.Molality, units.MassConcentration, units.MassFraction, units.Volume}
			if in.From.Value != "" {
				kinds = []units.Kind{units.Volume, units.Mass}
			}
			in.Amount = l.quantity(ptr+"/amount", "amount", kinds...)
		}
		in.Stock = l.quantity(ptr+"/stock", "stock", units.MolarConcentration, units.MassFraction, units.MassConcentration, units.Molality)
		in.StockDensity = l.quantity(ptr+"/stock-density", "stock-density", units.MassConcentration)
		if in.AdjustToPH != nil {
			titrants++
			if titrants > 1 {
				l.add(in.AdjustToPH.Pos, "only one ingredient can carry adjust-to-ph")
			}
			if amountNode != nil {
				l.addAt(ptr+"/amount", "an ingredient with adjust-to-ph gets its amount from phgate; remove amount")
			}
			if in.From.Value != "" || in.Sequence.Value != "" {
				l.add(in.AdjustToPH.Pos, "adjust-to-ph needs a catalog ingredient (use:), e.g. hydrochloric-acid or sodium-hydroxide")
			}
		} else if amountNode == nil {
			l.add(in.Pos, fmt.Sprintf("%s has no amount; give one (e.g. amount: 10 mM) or adjust-to-ph", in.Label()))
		}
		if in.Amount != nil {
			l.checkAmount(&in, ptr)
			switch in.Amount.Kind {
			case units.Mass, units.Substance, units.Volume:
				allConcentrations = false
			}
		}
		if in.Stock != nil && in.AdjustToPH == nil && (in.Amount == nil || in.Amount.Kind != units.Volume) {
			l.add(in.Stock.Pos, "stock only applies to an amount given as a volume (e.g. amount: 25 mL)")
		}
		l.r.Ingredients = append(l.r.Ingredients, in)
	}
	if l.r.Basis.Kind == NoBasis {
		if !allConcentrations {
			l.add(Pos{1, 1}, "basis is missing: amounts given as mass, moles or volume need a batch size (basis: 1 L, or basis: 1 kg for water mass)")
		} else if t := l.r.Titrant(); t != nil {
			// q.s. amounts are reported per litre when there is no basis.
			l.r.Basis = Basis{Kind: VolumeBasis, Litres: 1, Raw: "1 L (assumed)", Assumed: true}
		}
	}
}

func isQS(s string) bool {
	s = strings.ToLower(strings.TrimSpace(s))
	return s == "q.s." || s == "qs" || s == "q.s"
}

func (l *loader) checkAmount(in *Ingredient, ptr string) {
	a := in.Amount
	if a.Value < 0 {
		l.add(a.Pos, "amount must not be negative")
	}
	if a.Kind == units.Volume && in.Stock == nil && in.From.Value == "" {
		l.addAt(ptr+"/amount", fmt.Sprintf("a volume of %s needs stock: on the same ingredient (e.g. stock: 1 M)", in.Label()))
	}
	switch a.Kind {
	case units.MolarConcentration, units.Molality:
		if a.Value > MaxMolarity {
			l.add(a.Pos, fmt.Sprintf("%s is more than can dissolve (above %g mol/L)", a.Raw, MaxMolarity))
		}
	case units.MassFraction:
		if a.Value >= 1 {
			l.add(a.Pos, fmt.Sprintf("%s leaves no room for water", a.Raw))
		}
	case units.MassConcentration:
		if a.Value > 1000*l.r.Density {
			l.add(a.Pos, fmt.Sprintf("%s is more solute than the solution weighs", a.Raw))
		}
	case units.Mass:
		switch l.r.Basis.Kind {
		case VolumeBasis:
			if a.Value > l.r.Basis.Litres*1000*l.r.Density {
				l.add(a.Pos, fmt.Sprintf("%s is more solute than %s of solution weighs", a.Raw, l.r.Basis.Raw))
			}
		}
	}
}

// LoadWaivers reads a waiver list at ptr.
func LoadWaivers(d *yamldoc.Doc, ptr, path string) []Waiver {
	n := d.Node(ptr)
	if n == nil {
		return nil
	}
	var ws []Waiver
	for i := range n.Content {
		p := fmt.Sprintf("%s/%d", ptr, i)
		w := Waiver{Path: path}
		if vn := d.Node(p); vn != nil {
			w.Pos = Pos{vn.Line, vn.Column}
		}
		get := func(k string) Text {
			if vn := d.Node(p + "/" + k); vn != nil {
				return Text{Value: vn.Value, Pos: Pos{vn.Line, vn.Column}}
			}
			return Text{}
		}
		w.Rule, w.Reason, w.Expires = get("rule"), get("reason"), get("expires")
		if rn := d.Node(p + "/recipes"); rn != nil {
			for _, c := range rn.Content {
				w.Recipes = append(w.Recipes, Text{Value: c.Value, Pos: Pos{c.Line, c.Column}})
			}
		}
		ws = append(ws, w)
	}
	return ws
}
