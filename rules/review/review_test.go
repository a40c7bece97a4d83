package review

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/project"
)

func defaultRules(*project.Project) (Rules, diag.Problems) { return rules.DefaultPolicy(), nil }

func TestRoundNeverNegativeZero(t *testing.T) {
	tests := []struct {
		name string
		x    float64
		want float64
	}{
		{"tiny negative", -1e-17, 0},
		{"negative below the last decimal", -0.00004, 0},
		{"keeps four decimals", 0.12344, 0.1234},
		{"negative", -0.25, -0.25},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := round(tc.x, 4)
			if got != tc.want || math.Signbit(got) != math.Signbit(tc.want) {
				t.Errorf("round(%g) = %g (sign bit %v), want %g", tc.x, got, math.Signbit(got), tc.want)
			}
		})
	}
	if d := delta(7.1, 7.1); d != 0 || math.Signbit(d) {
		t.Errorf("delta of equal values = %g", d)
	}
}

func finding(rule string, sev rules.Severity, msg string, line int) rules.Finding {
	return rules.Finding{Rule: rule, Severity: sev, Message: msg, Line: line, Column: 3}
}

func TestFindingChanges(t *testing.T) {
	tests := []struct {
		name           string
		old, new       []rules.Finding
		appeared, gone []string
	}{
		{"same finding on another line", []rules.Finding{finding("ph-window", rules.Error, "pH 6.0 below 6.5", 4)},
			[]rules.Finding{finding("ph-window", rules.Error, "pH 6.0 below 6.5", 9)}, nil, nil},
		{"numbers in the message moved", []rules.Finding{finding("ph-window", rules.Error, "pH 6.0 below 6.5", 4)},
			[]rules.Finding{finding("ph-window", rules.Error, "pH 5.1 below 6.5", 4)}, nil, nil},
		{"severity rose", []rules.Finding{finding("weak-buffer", rules.Warning, "β low", 4)},
			[]rules.Finding{finding("weak-buffer", rules.Error, "β low", 4)}, []string{"weak-buffer"}, []string{"weak-buffer"}},
		{"one more of the same rule", []rules.Finding{finding("precipitation", rules.Warning, "brushite", 4)},
			[]rules.Finding{finding("precipitation", rules.Warning, "calcite", 5), finding("precipitation", rules.Warning, "brushite", 4)},
			[]string{"precipitation"}, nil},
		{"fixed", []rules.Finding{finding("ph-window", rules.Error, "x", 4)}, nil, nil, []string{"ph-window"}},
	}
	names := func(fs []rules.Finding) []string {
		var out []string
		for _, f := range fs {
			out = append(out, f.Rule)
		}
		return out
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			a, g := findingChanges(tc.old, tc.new)
			if strings.Join(names(a), ",") != strings.Join(tc.appeared, ",") || strings.Join(names(g), ",") != strings.Join(tc.gone, ",") {
				t.Errorf("appeared %v gone %v, want %v and %v", names(a), names(g), tc.appeared, tc.gone)
			}
		})
	}
}

func TestMarkdownQuoting(t *testing.T) {
	tests := []struct{ in, code, cell string }{
		{"plain", "`plain`", "plain"},
		{"a|b", "`a|b`", `a\|b`},
		{"tick`inside", "``tick`inside``", "tick`inside"},
		{"`edge", "`` `edge ``", "`edge"},
		{"<script>\nx", "`<script>\nx`", "&lt;script> x"},
	}
	for _, tc := range tests {
		if got := code(tc.in); got != tc.code {
			t.Errorf("code(%q) = %q, want %q", tc.in, got, tc.code)
		}
		if got := cell(tc.in); got != tc.cell {
			t.Errorf("cell(%q) = %q, want %q", tc.in, got, tc.cell)
		}
	}
}

func TestPair(t *testing.T) {
	old := []*Recipe{{ID: "a", Path: "x/a.yaml"}, {ID: "b", Path: "b.yaml"}, {Path: "broken.yaml"}, {ID: "gone", Path: "g.yaml"}}
	new := []*Recipe{{ID: "a", Path: "y/a.yaml"}, {Path: "b.yaml"}, {ID: "fixed", Path: "broken.yaml"}, {ID: "new", Path: "g2.yaml"}}
	var got []string
	for _, p := range pair(old, new, false) {
		o, n := "-", "-"
		if p.old != nil {
			o = p.old.Path
		}
		if p.new != nil {
			n = p.new.Path
		}
		got = append(got, o+">"+n)
	}
	want := "x/a.yaml>y/a.yaml b.yaml>b.yaml broken.yaml>broken.yaml g.yaml>- ->g2.yaml"
	if strings.Join(got, " ") != want {
		t.Errorf("pairs %v, want %s", got, want)
	}
}

func writeRecipes(t *testing.T, dir string, files map[string]string) {
	t.Helper()
	for name, body := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

var recipes = map[string]string{
	"stock.yaml": `recipe: stock
basis: 1 L
ingredients:
  - use: dipotassium-hydrogen-phosphate
    amount: 52.3 g
  - use: potassium-dihydrogen-phosphate
    amount: 27.2 g
  - use: purified-water
    amount: q.s.
`,
	"use.yaml": `recipe: user
basis: 1 L
ingredients:
  - from: stock
    amount: 20 mL
  - use: sodium-chloride
    amount: 8.5 g
  - use: purified-water
    amount: q.s.
`,
	"qs.yaml": `recipe: lotion
basis: 1 kg
density: 1.02 g/mL
ingredients:
  - use: lactic-acid
    amount: 5 % w/w
  - use: sodium-hydroxide
    adjust-to-ph: 3.9
    stock: 10 % w/w
    stock-density: 1.11 g/mL
  - use: purified-water
    amount: q.s.
`,
}

// TestSolveIsDeterministic loads the same recipes twice, as two sides of
// a diff do, and needs bit-identical results: that is what lets an
// unchanged recipe report a shift of exactly 0.
func TestSolveIsDeterministic(t *testing.T) {
	dir := t.TempDir()
	writeRecipes(t, dir, recipes)
	a := Load("a", dir, []string{dir}, defaultRules)
	b := Load("b", dir, []string{dir}, defaultRules)
	if len(a.Recipes) != len(recipes) || len(b.Recipes) != len(recipes) {
		t.Fatalf("loaded %d and %d recipes, want %d", len(a.Recipes), len(b.Recipes), len(recipes))
	}
	for i := range a.Recipes {
		ra, rb := a.Recipes[i], b.Recipes[i]
		if ra.Result == nil || rb.Result == nil {
			t.Fatalf("%s: not solved: %v %v", ra.Path, ra.Problems, rb.Problems)
		}
		ea, eb := ra.Result.Equilibrium, rb.Result.Equilibrium
		if math.Float64bits(ea.PH) != math.Float64bits(eb.PH) || ea.BufferCapacity != eb.BufferCapacity || ea.IonicStrength != eb.IonicStrength {
			t.Errorf("%s: two solves differ: pH %v vs %v", ra.Path, ea.PH, eb.PH)
		}
		if resultsMoved(ra, rb) {
			t.Errorf("%s: reports differ between two loads", ra.Path)
		}
	}
	d := Compare(a, b, Options{})
	if len(d.Changes) != 0 || d.Unchanged != len(recipes) {
		t.Errorf("same folder twice: %d changes, %d unchanged", len(d.Changes), d.Unchanged)
	}
}

func TestCompareNamesCauses(t *testing.T) {
	oldDir, newDir := t.TempDir(), t.TempDir()
	writeRecipes(t, oldDir, recipes)
	changed := map[string]string{}
	for k, v := range recipes {
		changed[k] = v
	}
	changed["stock.yaml"] = strings.Replace(recipes["stock.yaml"], "52.3 g", "40 g", 1)
	changed["qs.yaml"] = strings.Replace(recipes["qs.yaml"], "adjust-to-ph: 3.9", "adjust-to-ph: 4.2", 1)
	writeRecipes(t, newDir, changed)
	d := Compare(Load("old", oldDir, []string{oldDir}, defaultRules), Load("new", newDir, []string{newDir}, defaultRules), Options{})
	byID := map[string]Change{}
	for _, c := range d.Changes {
		byID[c.Recipe] = c
	}
	if len(byID) != 3 {
		t.Fatalf("want 3 changes, got %+v", d.Changes)
	}
	u := byID["user"]
	if u.RecipeEdited || len(u.Causes) != 1 || u.Causes[0] != (Cause{Kind: CauseStock, Name: "stock", Path: "stock.yaml"}) {
		t.Errorf("user: edited %v causes %+v", u.RecipeEdited, u.Causes)
	}
	// Less hydrogen phosphate in the stock lowers the pH (common practice).
	if u.DeltaPH == nil || *u.DeltaPH >= 0 {
		t.Errorf("user: ΔpH %v, want < 0", u.DeltaPH)
	}
	l := byID["lotion"]
	if len(l.QS) != 1 || l.QS[0].Use != "sodium-hydroxide" || l.QS[0].After.Mol <= l.QS[0].Before.Mol {
		t.Errorf("lotion: q.s. changes %+v, want more sodium hydroxide for a higher target", l.QS)
	}
	if len(l.Ingredients) != 0 {
		t.Errorf("lotion: the titrant belongs to q.s. changes, not ingredients: %+v", l.Ingredients)
	}
	// A q.s. titration to a target lands on the target (to the solver's
	// tolerance), so ΔpH is the change of target.
	if l.DeltaPH == nil || math.Abs(*l.DeltaPH-0.3) > 1e-3 {
		t.Errorf("lotion: ΔpH %v, want 0.3", l.DeltaPH)
	}
	limit := 0.2
	if !d.Apply(Gates{MaxPHShift: &limit}) || len(d.GatesCrossed) != 1 || !strings.HasPrefix(d.GatesCrossed[0], "lotion:") {
		t.Errorf("gates crossed %q, want lotion only", d.GatesCrossed)
	}
}
