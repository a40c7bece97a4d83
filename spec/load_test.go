package spec

import (
	"math"
	"strings"
	"testing"

	"github.com/phgate/phgate/spec/units"
)

func TestLoadRecipeConverts(t *testing.T) {
	src := `# yaml-language-server: $schema=../schemas/recipe.schema.json
recipe: wash-buffer-a
title: Column wash buffer A
basis: 500 mL
temperature: {nominal: 25 °C, range: 4..25 C}
ph: {min: 7.2, max: 7.6}
ingredients:
  - use: tris
    amount: 50 mM
  - use: sodium-chloride
    amount: 8.77 g
  - use: hydrochloric-acid
    adjust-to-ph: 7.4
    stock: 1 M
  - use: purified-water
    amount: q.s.
`
	r, ps := LoadRecipe([]byte(src), "wash.yaml")
	if len(ps) > 0 {
		t.Fatalf("unexpected problems: %v", ps)
	}
	if r.ID.Value != "wash-buffer-a" || r.ID.Pos != (Pos{2, 9}) {
		t.Errorf("id = %+v", r.ID)
	}
	if r.Basis.Kind != VolumeBasis || math.Abs(r.Basis.Litres-0.5) > 1e-12 {
		t.Errorf("basis = %+v", r.Basis)
	}
	if r.Temperature.Nominal != 25 || r.Temperature.Min != 4 || r.Temperature.Max != 25 || !r.Temperature.HasRange {
		t.Errorf("temperature = %+v", r.Temperature)
	}
	if r.PH.Min.Value != 7.2 || r.PH.Max.Value != 7.6 || r.PH.Max.Pos != (Pos{6, 21}) {
		t.Errorf("ph = %+v %+v", *r.PH.Min, *r.PH.Max)
	}
	if len(r.Ingredients) != 4 {
		t.Fatalf("ingredients = %d", len(r.Ingredients))
	}
	if a := r.Ingredients[0].Amount; a.Kind != units.MolarConcentration || math.Abs(a.Value-0.05) > 1e-12 {
		t.Errorf("tris amount = %+v", a)
	}
	if ti := r.Titrant(); ti == nil || ti.Use.Value != "hydrochloric-acid" || ti.AdjustToPH.Value != 7.4 {
		t.Errorf("titrant = %+v", ti)
	}
	if !r.Ingredients[3].QS {
		t.Errorf("water not q.s.")
	}
}

func TestLoadRecipeProblems(t *testing.T) {
	cases := []struct {
		name string
		src  string
		want []string // each "line:col: fragment"
	}{
		{"unknown unit with suggestion", "recipe: a\nbasis: 1 L\ningredients:\n  - use: tris\n    amount: 5 mgs\n",
			[]string{`5:15: unknown unit "mgs"`, `did you mean "mg"?`}},
		{"misspelt key", "recipe: a\nbasis: 1 L\ningredients:\n  - use: tris\n    amout: 5 mM\n",
			[]string{`5:5: unknown key "amout"; did you mean "amount"?`}},
		{"window reversed", "recipe: a\nph: {min: 8, max: 7}\ningredients:\n  - use: tris\n    amount: 5 mM\n",
			[]string{`2:11: pH window has min 8 above max 7`}},
		{"negative amount", "recipe: a\ningredients:\n  - use: tris\n    amount: -5 mM\n",
			[]string{`4:13:`, `negative`}},
		{"missing basis for a mass", "recipe: a\ningredients:\n  - use: tris\n    amount: 5 g\n",
			[]string{`1:1: basis is missing`}},
		{"volume without stock", "recipe: a\nbasis: 1 L\ningredients:\n  - use: hydrochloric-acid\n    amount: 5 mL\n",
			[]string{`5:13: a volume of hydrochloric-acid needs stock:`}},
		{"too concentrated", "recipe: a\ningredients:\n  - use: sodium-chloride\n    amount: 30 M\n",
			[]string{`4:13: 30 M is more than can dissolve`}},
		{"more solute than solution", "recipe: a\nbasis: 100 mL\ningredients:\n  - use: sucrose\n    amount: 150 g\n",
			[]string{`5:13: 150 g is more solute than 100 mL of solution weighs`}},
		{"bad id", "recipe: Wash Buffer\ningredients:\n  - use: tris\n    amount: 5 mM\n",
			[]string{`1:9: recipe: value "Wash Buffer" has the wrong form`}},
		{"two of use/from", "recipe: a\ningredients:\n  - use: tris\n    from: b\n    amount: 5 mM\n",
			[]string{`4:11: ingredients[1]: "from" cannot be combined with "use"`}},
		{"none of use/from/sequence", "recipe: a\ningredients:\n  - amount: 5 mM\n",
			[]string{`3:5: value does not match any allowed form for ingredients[1] (an ingredient has exactly one of use, from or sequence)`}},
		{"missing recipe key", "ingredients:\n  - use: tris\n    amount: 5 mM\n",
			[]string{`1:1: missing required key "recipe"`}},
		{"q.s. on a solute", "recipe: a\ningredients:\n  - use: tris\n    amount: q.s.\n",
			[]string{`4:13: q.s. is for purified-water`}},
		{"two titrants", "recipe: a\ningredients:\n  - use: tris\n    amount: 5 mM\n  - use: hydrochloric-acid\n    adjust-to-ph: 7\n  - use: sodium-hydroxide\n    adjust-to-ph: 7\n",
			[]string{`8:19: only one ingredient can carry adjust-to-ph`}},
		{"syntax error", "recipe: a\ningredients: [\n", []string{`YAML syntax`}},
		{"empty file", "", []string{`file is empty`}},
		{"not a mapping", "- a\n- b\n", []string{`1:1: a recipe must be a mapping`}},
		{"duplicate key", "recipe: a\nrecipe: b\ningredients: []\n", []string{`2:1: key "recipe" appears twice`}},
		{"non-ASCII column", "recipe: a\ntitle: Lösung für Äpfel\nbasis: 1 L\ningredients:\n  - use: tris\n    amount: 5 µmols\n",
			[]string{`6:15: unknown unit "µmols"`}},
		{"temperature out of range", "recipe: a\ntemperature: 120 C\ningredients:\n  - use: tris\n    amount: 5 mM\n",
			[]string{`2:14: temperature 120 C is outside liquid water`}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, ps := LoadRecipe([]byte(tc.src), "r.yaml")
			if len(ps) == 0 {
				t.Fatalf("no problems; want %q", tc.want)
			}
			all := ps.Error()
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("problems\n%s\ndo not contain %q", all, w)
				}
			}
		})
	}
}
