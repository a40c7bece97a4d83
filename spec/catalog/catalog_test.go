package catalog

import (
	"math"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/phgate/phgate/spec/diag"
	"gopkg.in/yaml.v3"
)

// requiredIDs are the ingredient ids other packages and users rely on.
var requiredIDs = []string{
	"purified-water", "hydrochloric-acid", "sodium-hydroxide", "potassium-hydroxide", "phosphoric-acid",
	"potassium-dihydrogen-phosphate", "dipotassium-hydrogen-phosphate", "sodium-dihydrogen-phosphate-monohydrate",
	"sodium-dihydrogen-phosphate-dihydrate", "disodium-hydrogen-phosphate", "disodium-hydrogen-phosphate-dihydrate",
	"disodium-hydrogen-phosphate-heptahydrate", "disodium-hydrogen-phosphate-dodecahydrate", "acetic-acid",
	"sodium-acetate", "sodium-acetate-trihydrate", "citric-acid", "citric-acid-monohydrate",
	"trisodium-citrate-dihydrate", "potassium-dihydrogen-citrate", "lactic-acid", "sodium-lactate", "malic-acid",
	"tartaric-acid", "succinic-acid", "benzoic-acid", "sodium-benzoate", "sorbic-acid", "potassium-sorbate",
	"ascorbic-acid", "boric-acid", "sodium-tetraborate-decahydrate", "sodium-bicarbonate", "sodium-carbonate",
	"potassium-hydrogen-phthalate", "potassium-tetroxalate-dihydrate", "tris", "tris-hydrochloride", "hepes", "mes",
	"mops", "glycine", "histidine", "arginine", "triethanolamine", "ammonium-chloride", "sodium-chloride",
	"potassium-chloride", "calcium-chloride-dihydrate", "magnesium-chloride-hexahydrate",
	"magnesium-sulfate-heptahydrate", "zinc-sulfate-heptahydrate", "edta-disodium-dihydrate", "sucrose", "glycerol",
	"mannitol",
}

func TestDefaultRequiredIDs(t *testing.T) {
	c := Default()
	for _, id := range requiredIDs {
		if _, ok := c.Ingredient(id); !ok {
			t.Errorf("built-in catalog lacks %q", id)
		}
	}
}

func checkSource(t *testing.T, c *Catalog, what string, s Source) {
	t.Helper()
	got, ok := c.Sources[s.ID]
	if !ok || got.Cite != s.Cite {
		t.Errorf("%s: source %q is not defined in the catalog", what, s.ID)
	}
	switch s.Status {
	case StatusChecked, StatusFromMemory, StatusDerived:
	default:
		t.Errorf("%s: source %q has status %q", what, s.ID, s.Status)
	}
}

func TestDefaultEverythingSourced(t *testing.T) {
	c := Default()
	for _, id := range c.IDs() {
		ing := c.Ingredients[id]
		if len(ing.Sources) == 0 {
			t.Errorf("ingredient %s has no source", id)
		}
		for _, s := range ing.Sources {
			checkSource(t, c, "ingredient "+id, s)
		}
		for _, v := range []*Value{ing.Density, ing.IntrinsicSolubility, ing.PI, ing.Preservative} {
			if v != nil {
				checkSource(t, c, "ingredient "+id, v.Source)
			}
		}
	}
	for id, sys := range c.Systems {
		for i, st := range sys.Steps {
			what := "system " + id + " step " + strconv.Itoa(i+1)
			checkSource(t, c, what, st.PKa.Source)
			for _, v := range []*Value{st.DeltaH, st.DeltaCp} {
				if v != nil {
					checkSource(t, c, what, v.Source)
				}
			}
		}
	}
	for _, s := range c.Salts {
		checkSource(t, c, "salt "+s.ID, s.PKsp.Source)
	}
	for _, x := range c.Complexes {
		checkSource(t, c, "complex "+x.ID, x.LogK.Source)
	}
	for _, g := range c.Peptide {
		checkSource(t, c, "peptide group "+g.Code, g.PKa.Source)
	}
}

// TestDefaultNeutral recomputes each ingredient's charge independently of
// the loader: ion charges and species charges (top charge minus index)
// plus outright protons must cancel.
func TestDefaultNeutral(t *testing.T) {
	c := Default()
	for _, id := range c.IDs() {
		ing := c.Ingredients[id]
		q := ing.Protons
		for _, s := range ing.Ions {
			ion, ok := c.Ions[s.Ion]
			if !ok {
				t.Fatalf("%s: unknown ion %s", id, s.Ion)
			}
			q += float64(ion.Charge) * s.Count
		}
		for _, s := range ing.Systems {
			sys := c.Systems[s.System]
			i := sys.SpeciesIndex(s.Species)
			if i < 0 {
				t.Fatalf("%s: species %s not in %s", id, s.Species, s.System)
			}
			q += float64(sys.SpeciesCharge(i)) * s.Count
		}
		if math.Abs(q) > NeutralityTolerance {
			t.Errorf("%s releases net charge %g per mole", id, q)
		}
	}
	for _, s := range c.Salts {
		q := 0
		for _, term := range s.Terms {
			switch {
			case term.Ref.Ion == WaterH:
				q += term.Count
			case term.Ref.Ion == WaterOH:
				q -= term.Count
			case term.Ref.Ion != "":
				q += c.Ions[term.Ref.Ion].Charge * term.Count
			default:
				sys := c.Systems[term.Ref.System]
				q += sys.SpeciesCharge(sys.SpeciesIndex(term.Ref.Species)) * term.Count
			}
		}
		if q != 0 {
			t.Errorf("salt %s dissolves to net charge %d", s.ID, q)
		}
	}
}

func TestDefaultPKaSane(t *testing.T) {
	for id, sys := range Default().Systems {
		if len(sys.Species) != len(sys.Steps)+1 {
			t.Errorf("%s: %d species for %d steps", id, len(sys.Species), len(sys.Steps))
		}
		for i, st := range sys.Steps {
			if st.PKa.V < -10 || st.PKa.V > 20 {
				t.Errorf("%s step %d: pKa %g outside -10..20", id, i+1, st.PKa.V)
			}
			if i > 0 && st.PKa.V < sys.Steps[i-1].PKa.V {
				t.Errorf("%s step %d: pKa %g below previous %g", id, i+1, st.PKa.V, sys.Steps[i-1].PKa.V)
			}
		}
		for i, l := range sys.Species {
			if LabelCharge(l) != sys.SpeciesCharge(i) {
				t.Errorf("%s: label %s vs charge %d", id, l, sys.SpeciesCharge(i))
			}
		}
	}
}

func TestDefaultValues(t *testing.T) {
	c := Default()
	tests := []struct {
		name   string
		system string
		step   int
		pka    float64
	}{
		{"phosphate pK2", "phosphate", 1, 7.198},  // Goldberg et al. 2002 (from memory)
		{"carbonate pK2", "carbonate", 1, 10.329}, // Harned & Scholes 1941 (checked)
		{"Tris", "tris", 0, 8.072},                // Goldberg et al. 2002 (from memory)
		{"MES", "mes", 0, 6.270},                  // Vega & Bates 1976 (checked)
		{"glycine pK1", "glycine", 0, 2.351},      // Goldberg et al. 2002 (from memory)
		{"glycine pK2", "glycine", 1, 9.780},      // Goldberg et al. 2002 (from memory)
		{"benzoic", "benzoate", 0, 4.202},         // Wikipedia infobox (checked)
		{"HSO4-", "sulfate", 0, 1.99},             // CRC (from memory)
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got := c.Systems[tt.system].Steps[tt.step].PKa.V
			if math.Abs(got-tt.pka) > 1e-9 {
				t.Errorf("pKa = %g, want %g", got, tt.pka)
			}
		})
	}
}

func TestDefaultHydrateMolarMasses(t *testing.T) {
	c := Default()
	const tol = 0.02 // abridged atomic weights reproduce monograph values to ±0.01
	tests := []struct {
		id   string
		want float64
	}{
		{"disodium-hydrogen-phosphate-heptahydrate", 268.07},  // USP (reference notes §6, checked)
		{"disodium-hydrogen-phosphate-dodecahydrate", 358.14}, // pharmacopoeial (reference notes §6, checked)
		{"disodium-hydrogen-phosphate-dihydrate", 177.99},     // pharmacopoeial (reference notes §6, checked)
		{"disodium-hydrogen-phosphate", 141.96},               // pharmacopoeial (reference notes §6, checked)
		{"citric-acid-monohydrate", 210.14},                   // USP (reference notes §6, checked)
		{"trisodium-citrate-dihydrate", 294.10},               // USP (reference notes §6, checked)
		{"trisodium-citrate", 258.07},                         // pharmacopoeial (reference notes §6, checked)
		{"sodium-tetraborate-decahydrate", 381.37},            // USP (reference notes §6, checked)
		{"potassium-dihydrogen-phosphate", 136.09},            // Ph. Eur.-style reagent text (reference notes §6, checked)
		{"potassium-hydrogen-phthalate", 204.22},              // pharmacopoeial (reference notes §6, checked)
		{"potassium-tetroxalate-dihydrate", 254.19},           // derived (reference notes §6)
		{"purified-water", 18.015},                            // derived (reference notes §6)
	}
	for _, tt := range tests {
		t.Run(tt.id, func(t *testing.T) {
			ing, ok := c.Ingredient(tt.id)
			if !ok {
				t.Fatalf("missing %s", tt.id)
			}
			if math.Abs(ing.MolarMass-tt.want) > tol {
				t.Errorf("molar mass %.3f, want %.2f ± %.2f", ing.MolarMass, tt.want, tol)
			}
		})
	}
	// Every ingredient with no formula must still carry a sourced molar
	// mass (water excepted, which has both).
	for _, id := range c.IDs() {
		ing := c.Ingredients[id]
		if ing.MolarMass <= 0 || ing.MolarMass > 1e6 {
			t.Errorf("%s: molar mass %g g/mol is not plausible", id, ing.MolarMass)
		}
	}
}

func TestPeptideGroups(t *testing.T) {
	want := map[string]struct {
		pka   float64
		basic bool
	}{ // Grimsley, Scholtz & Pace 2009, averages in folded proteins (from memory); R: model value (from memory)
		"Nterm": {7.7, true}, "Cterm": {3.3, false}, "D": {3.5, false}, "E": {4.2, false}, "C": {6.8, false},
		"Y": {10.3, false}, "H": {6.6, true}, "K": {10.5, true}, "R": {12.5, true},
	}
	gs := Default().PeptideGroups()
	if len(gs) != len(want) {
		t.Fatalf("%d peptide groups, want %d", len(gs), len(want))
	}
	for _, g := range gs {
		w, ok := want[g.Code]
		if !ok || math.Abs(g.PKa.V-w.pka) > 1e-9 || g.Basic != w.basic {
			t.Errorf("group %s = %+v, want %+v", g.Code, g, w)
		}
	}
}

func TestLabelCharge(t *testing.T) {
	tests := []struct {
		label string
		want  int
	}{
		{"HPO4-2", -2}, {"H2PO4-", -1}, {"TrisH+", 1}, {"Tris", 0}, {"CO2", 0}, {"Ca+2", 2}, {"H3His+2", 2}, {"B(OH)4-", -1},
	}
	for _, tt := range tests {
		if got := LabelCharge(tt.label); got != tt.want {
			t.Errorf("LabelCharge(%q) = %d, want %d", tt.label, got, tt.want)
		}
	}
}

func TestSuggest(t *testing.T) {
	c := Default()
	tests := []struct {
		query string
		first string
	}{
		{"sodium-cloride", "sodium-chloride"},
		{"trisodium-citrate-dihidrate", "trisodium-citrate-dihydrate"},
		{"glycerin", "glycerol"},
		{"hepes-na", "hepes"},
	}
	for _, tt := range tests {
		got := c.Suggest(tt.query, 3)
		if len(got) == 0 || got[0] != tt.first {
			t.Errorf("Suggest(%q) = %v, want %q first", tt.query, got, tt.first)
		}
	}
	if got := c.Suggest("xylophone-resin-zz", 3); len(got) != 0 {
		t.Errorf("Suggest of nonsense = %v, want none", got)
	}
	ids := c.IDs()
	if !sort.StringsAreSorted(ids) || len(ids) != len(c.Ingredients) {
		t.Error("IDs not sorted or incomplete")
	}
}

var wantRe = regexp.MustCompile(`# want (?:(\d+) )?"((?:[^"\\]|\\.)*)"`)

type expectation struct {
	line, col int
	text      string
}

// expectations reads `# want [COL] "substring"` comments.
func expectations(t *testing.T, data []byte) []expectation {
	var out []expectation
	for i, line := range strings.Split(string(data), "\n") {
		for _, m := range wantRe.FindAllStringSubmatch(line, -1) {
			col, _ := strconv.Atoi(m[1])
			text, err := strconv.Unquote(`"` + m[2] + `"`)
			if err != nil {
				t.Fatalf("line %d: bad want comment: %v", i+1, err)
			}
			out = append(out, expectation{i + 1, col, text})
		}
	}
	return out
}

func matchProblems(t *testing.T, probs diag.Problems, want []expectation) {
	t.Helper()
	used := make([]bool, len(want))
	for _, p := range probs {
		found := false
		for i, w := range want {
			if !used[i] && p.Line == w.line && (w.col == 0 || p.Column == w.col) && strings.Contains(p.Message, w.text) {
				used[i], found = true, true
				break
			}
		}
		if !found {
			t.Errorf("unexpected problem %s", p.Error())
		}
	}
	for i, w := range want {
		if !used[i] {
			t.Errorf("missing problem at line %d col %d containing %q", w.line, w.col, w.text)
		}
	}
}

func TestParseFixtures(t *testing.T) {
	files, _ := filepath.Glob("testdata/*.yaml")
	if len(files) < 3 {
		t.Fatalf("fixtures missing: %v", files)
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			data, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			_, probs := Parse(data, f)
			for _, p := range probs {
				if p.Path != f || p.Line <= 0 || p.Column <= 0 {
					t.Errorf("problem without full position: %s", p.Error())
				}
			}
			matchProblems(t, probs, expectations(t, data))
		})
	}
}

func TestMerge(t *testing.T) {
	data, err := os.ReadFile("testdata/good.yaml")
	if err != nil {
		t.Fatal(err)
	}
	proj, probs := Parse(data, "good.yaml")
	if len(probs) > 0 {
		t.Fatal(probs)
	}
	merged, err := Default().Merge(proj)
	if err != nil {
		t.Fatal(err)
	}
	if len(merged.Ingredients) != len(Default().Ingredients)+len(proj.Ingredients) {
		t.Errorf("merged has %d ingredients", len(merged.Ingredients))
	}
	ing, ok := merged.Ingredient("sodium-house-acid")
	if !ok || merged.Systems[ing.Systems[0].System] == nil {
		t.Fatal("merged catalog cannot resolve the project ingredient's system")
	}
	if p, ok := merged.Position(SectionIngredients, "dextran-40"); !ok || p.Path != "good.yaml" || p.Line == 0 {
		t.Errorf("position of dextran-40 = %+v, %v", p, ok)
	}
	if m := merged.Ingredients["dextran-40"]; m.MolarMass != 40000 || m.MolarMassSource == nil {
		t.Errorf("explicit molar mass not kept: %+v", m)
	}
	if _, err := merged.Merge(proj); err == nil || !strings.Contains(err.Error(), "dextran-40") {
		t.Errorf("merging twice: err = %v, want an error naming dextran-40", err)
	}
	if len(Default().Ingredients) == len(merged.Ingredients) {
		t.Error("Merge modified the default catalog")
	}
}

func TestFromNodeInline(t *testing.T) {
	src := "recipe: eye-rinse\ncatalog:\n  ingredients:\n    bad-salt:\n      name: Bad\n      formula: NaCl\n      ions: {Na+: 1}\n      sources: [ciaaw-2021]\n"
	var root yaml.Node
	if err := yaml.Unmarshal([]byte(src), &root); err != nil {
		t.Fatal(err)
	}
	cat := field(root.Content[0], "catalog")
	_, probs := FromNode(cat, "recipe.yaml")
	if len(probs) != 1 || probs[0].Line != 4 || probs[0].Column != 5 || !strings.Contains(probs[0].Message, "net charge +1") {
		t.Errorf("problems = %v, want one at recipe.yaml:4:5 about net charge", probs)
	}
}

func TestParseMalformed(t *testing.T) {
	tests := []struct {
		name string
		src  string
		line int
	}{
		{"syntax error", "ingredients:\n  a: [\n", 2},
		{"not a mapping", "- a\n- b\n", 1},
		{"empty", "", 0},
		{"two documents", "title: a\n---\ntitle: b\n", 2},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, probs := Parse([]byte(tt.src), "x.yaml")
			if len(probs) == 0 || probs[0].Line != tt.line {
				t.Errorf("problems = %v, want first at line %d", probs, tt.line)
			}
		})
	}
}

func FuzzParse(f *testing.F) {
	for _, name := range []string{"testdata/good.yaml", "testdata/broken-schema.yaml"} {
		if data, err := os.ReadFile(name); err == nil {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		_, probs := Parse(data, "fuzz.yaml")
		for _, p := range probs {
			if p.Message == "" {
				t.Fatalf("empty message in %v", probs)
			}
		}
	})
}
