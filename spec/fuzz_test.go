package spec

import (
	"math"
	"testing"
)

// FuzzLoadRecipe feeds arbitrary bytes to the recipe loader: it must never
// panic, must return either a recipe or problems (never both, never
// neither), and every number it keeps must be finite.
func FuzzLoadRecipe(f *testing.F) {
	f.Add([]byte("recipe: a\nbasis: 1 L\ningredients:\n  - use: tris\n    amount: 50 mM\n  - use: hydrochloric-acid\n    adjust-to-ph: 7.4\n"))
	f.Add([]byte("recipe: a\ntemperature: {nominal: 25 C, range: 4..25 C}\nph: {min: 7, max: 8}\ningredients:\n  - sequence: GKDE\n    amount: 1 mg/mL\n"))
	f.Add([]byte("recipe: a\ningredients:\n  - from: b\n    amount: 20 mL\n"))
	f.Add([]byte("a: &x [1, 2]\nb: *x\n"))
	f.Add([]byte("\xef\xbb\xbfrecipe: a\r\ningredients: []\r\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		r, ps := LoadRecipe(data, "fuzz.yaml")
		if (r == nil) == (len(ps) == 0) {
			t.Fatalf("recipe %v with problems %v", r != nil, ps)
		}
		for _, p := range ps {
			if p.Line < 0 || p.Column < 0 || p.Message == "" {
				t.Fatalf("bad problem %+v", p)
			}
		}
		if r == nil {
			return
		}
		finite := func(x float64) {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				t.Fatalf("non-finite value in %+v", r)
			}
		}
		finite(r.Basis.Litres)
		finite(r.Basis.Kilograms)
		finite(r.Temperature.Nominal)
		finite(r.Density)
		for _, in := range r.Ingredients {
			if in.Amount != nil {
				finite(in.Amount.Value)
			}
		}
	})
}
