package evaluate

import (
	"math"
	"strings"
	"testing"

	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/diag"
)

func load(t *testing.T, src string) *spec.Recipe {
	t.Helper()
	r, ps := spec.LoadRecipe([]byte(src), "t.yaml")
	if len(ps) > 0 {
		t.Fatalf("load: %v", ps)
	}
	return r
}

func noStocks(id string, at spec.Pos) (*Result, *diag.Problem) {
	return nil, &diag.Problem{Message: "no stocks in this test"}
}

// Molar masses below are computed from IUPAC standard atomic weights:
// NaCl 58.44, lactic acid C3H6O3 90.08, HCl 36.46 (from memory, each to 0.01 g/mol).
func TestConcentrations(t *testing.T) {
	cases := []struct {
		name string
		src  string
		line int
		want float64 // mol/L or mol/kg
		tol  float64
	}{
		{"mass on a volume basis", "recipe: a\nbasis: 1 L\ningredients:\n  - use: sodium-chloride\n    amount: 8.766 g\n", 0, 0.15, 1e-4},
		{"mass on a half-litre basis", "recipe: a\nbasis: 500 mL\ningredients:\n  - use: sodium-chloride\n    amount: 2.922 g\n", 0, 0.1, 1e-4},
		{"molar concentration as written", "recipe: a\ningredients:\n  - use: tris\n    amount: 50 mM\n", 0, 0.05, 1e-12},
		{"mass concentration", "recipe: a\ningredients:\n  - use: sodium-chloride\n    amount: 9 g/L\n", 0, 9 / 58.44, 1e-4},
		{"percent w/v", "recipe: a\ningredients:\n  - use: sodium-chloride\n    amount: 0.9 % w/v\n", 0, 9 / 58.44, 1e-4},
		{"percent w/w with product density", "recipe: a\ndensity: 1.02 g/mL\ningredients:\n  - use: lactic-acid\n    amount: 5 % w/w\n", 0, 0.05 * 1020 / 90.08, 1e-3},
		{"percent w/w on a water-mass basis", "recipe: a\nbasis: 1 kg\ningredients:\n  - use: sodium-chloride\n    amount: 1 % w/w\n", 0, 0.01 / 0.99 * 1000 / 58.44, 1e-4},
		{"volume of a molar stock", "recipe: a\nbasis: 1 L\ningredients:\n  - use: hydrochloric-acid\n    amount: 20 mL\n    stock: 1 M\n", 0, 0.02, 1e-12},
		{"volume of a % w/w stock", "recipe: a\nbasis: 1 L\ningredients:\n  - use: hydrochloric-acid\n    amount: 10 mL\n    stock: 37 % w/w\n    stock-density: 1.18 g/mL\n", 0, 10 * 1.18 * 0.37 / 36.46, 1e-4},
		{"moles on a water-mass basis", "recipe: a\nbasis: 2 kg\ningredients:\n  - use: sodium-chloride\n    amount: 0.2 mol\n", 0, 0.1, 1e-12},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res, ps := Evaluate(load(t, tc.src), catalog.Default(), noStocks)
			if len(ps) > 0 {
				t.Fatalf("evaluate: %v", ps)
			}
			if got := res.Lines[tc.line].Conc; math.Abs(got-tc.want) > tc.tol*math.Max(1, tc.want) {
				t.Errorf("concentration = %.6g, want %.6g", got, tc.want)
			}
		})
	}
}

func TestAdjustToPH(t *testing.T) {
	src := "recipe: a\nbasis: 2 L\ningredients:\n  - use: tris\n    amount: 50 mM\n  - use: hydrochloric-acid\n    adjust-to-ph: 8.07\n    stock: 1 M\n"
	res, ps := Evaluate(load(t, src), catalog.Default(), noStocks)
	if len(ps) > 0 {
		t.Fatalf("evaluate: %v", ps)
	}
	if math.Abs(res.Equilibrium.PH-8.07) > 1e-6 {
		t.Errorf("pH after q.s. = %.6f, want 8.07", res.Equilibrium.PH)
	}
	a := res.Adjustment
	if a == nil {
		t.Fatal("no adjustment")
	}
	// Near pKa (8.072, Goldberg et al. 2002, from memory) roughly half the
	// Tris is protonated; activity corrections at I ≈ 0.025 move that a
	// little, so the acid lies between 40 % and 60 % of the Tris.
	if a.Conc < 0.02 || a.Conc > 0.03 {
		t.Errorf("HCl = %.4g mol/L, want about 0.025", a.Conc)
	}
	if math.Abs(a.Moles-2*a.Conc) > 1e-12 || math.Abs(a.Millilitres-a.Moles*1000) > 1e-9 {
		t.Errorf("per batch: %+v", a)
	}
}

func TestUnknownIngredientSuggests(t *testing.T) {
	src := "recipe: a\ningredients:\n  - use: sodium-chlorid\n    amount: 5 mM\n"
	_, ps := Evaluate(load(t, src), catalog.Default(), noStocks)
	if len(ps) != 1 || ps[0].Line != 3 || ps[0].Column != 10 {
		t.Fatalf("problems = %v", ps)
	}
	if want := `unknown ingredient "sodium-chlorid"; did you mean "sodium-chloride"`; len(ps[0].Message) < len(want) || ps[0].Message[:len(want)] != want {
		t.Errorf("message = %q", ps[0].Message)
	}
}

func TestPeptide(t *testing.T) {
	// A peptide dissolved in water buffers itself near its pI; strong acid
	// drives it below the pI (net positive), strong base above (net negative).
	for _, tc := range []struct {
		titrant  string
		positive bool
	}{{"hydrochloric-acid", true}, {"sodium-hydroxide", false}} {
		t.Run(tc.titrant, func(t *testing.T) {
			src := "recipe: a\ningredients:\n  - sequence: GKDEYHRLAKSE\n    amount: 1 mM\n  - use: " + tc.titrant + "\n    amount: 3 mM\n"
			res, ps := Evaluate(load(t, src), catalog.Default(), noStocks)
			if len(ps) > 0 {
				t.Fatalf("evaluate: %v", ps)
			}
			if len(res.Peptides) != 1 {
				t.Fatalf("peptides = %v", res.Peptides)
			}
			p := res.Peptides[0]
			if below := res.Equilibrium.PH < p.PI; below != tc.positive || (p.NetCharge > 0) != tc.positive {
				t.Errorf("pH %.2f, pI %.2f, net charge %.2f", res.Equilibrium.PH, p.PI, p.NetCharge)
			}
			if pep := res.Lines[0].Peptide; math.Abs(pep.Charge(p.PI)) > 1e-6 {
				t.Errorf("charge at pI = %g", pep.Charge(p.PI))
			}
		})
	}
}

// TestPercentStockNeedsItsDensity: the density of a % w/w stock depends on
// its strength, so phgate never borrows the catalog's density (which is
// for one commercial strength) for another.
func TestPercentStockNeedsItsDensity(t *testing.T) {
	for line, src := range map[int]string{
		6: "recipe: a\nbasis: 1 L\ningredients:\n  - use: sodium-hydroxide\n    amount: 10 mL\n    stock: 10 % w/w\n",
		8: "recipe: a\nbasis: 1 L\ningredients:\n  - use: acetic-acid\n    amount: 10 mM\n  - use: sodium-hydroxide\n    adjust-to-ph: 4.7\n    stock: 10 % w/w\n",
	} {
		_, ps := Evaluate(load(t, src), catalog.Default(), noStocks)
		if len(ps) != 1 || ps[0].Line != line || ps[0].Column != 12 || !strings.Contains(ps[0].Message, "needs its density") {
			t.Errorf("problems = %v", ps)
		}
	}
}
