package project

import (
	"github.com/phgate/phgate/spec"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func write(t *testing.T, dir, name string, data []byte) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(p, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

const goodRecipe = "recipe: %s\nbasis: 1 L\ningredients:\n  - use: sodium-chloride\n    amount: 1 g\n"

func TestHostileFiles(t *testing.T) {
	laughs := "recipe: lol\na0: &a0 [x, x, x, x, x, x, x, x, x, x]\n"
	for i := 1; i < 9; i++ {
		laughs += "a" + string(rune('0'+i)) + ": &a" + string(rune('0'+i)) + " [" + strings.Repeat("*a"+string(rune('0'+i-1))+", ", 9) + "*a" + string(rune('0'+i-1)) + "]\n"
	}
	cases := []struct {
		name, file string
		data       []byte
		want       string
	}{
		{"binary", "bin.yaml", []byte("recipe: a\x00\x01"), "binary"},
		{"not UTF-8", "latin1.yaml", []byte("recipe: caf\xe9\n"), "not valid UTF-8"},
		{"empty", "empty.yaml", nil, "file is empty"},
		{"only comments", "comments.yaml", []byte("# nothing yet\n"), "file is empty"},
		{"alias bomb", "laughs.yaml", []byte(laughs), "too heavily aliased"},
		{"deep nesting", "deep.yaml", []byte("recipe: a\nx: " + strings.Repeat("[", 200) + strings.Repeat("]", 200) + "\n"), "nesting deeper than"},
		{"too large", "big.yaml", []byte("recipe: a\n" + strings.Repeat("# padding line\n", 80000)), "larger than the"},
		{"two documents", "two.yaml", []byte("recipe: a\ningredients: []\n---\nrecipe: b\n"), "more than one YAML document"},
		{"BOM and CRLF keep positions", "crlf.yaml", []byte("\xef\xbb\xbfrecipe: a\r\nbasis: 1 L\r\ningredients:\r\n  - use: tris\r\n    amount: 5 gs\r\n"), "crlf.yaml:5:15: unknown unit"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			p := write(t, dir, tc.file, tc.data)
			run := Discover([]string{p})
			if len(run.Files) != 1 {
				t.Fatalf("files = %d", len(run.Files))
			}
			_, ps := run.Files[0].Evaluate()
			if len(ps) == 0 || !strings.Contains(ps.Error(), tc.want) {
				t.Fatalf("problems %q do not mention %q", ps.Error(), tc.want)
			}
		})
	}
}

func TestFolderWalk(t *testing.T) {
	for _, lazy := range []bool{false, true} {
		t.Run(map[bool]string{false: "parsed", true: "lazy"}[lazy], func(t *testing.T) { testFolderWalk(t, lazy) })
	}
}

func testFolderWalk(t *testing.T, lazy bool) {
	dir := t.TempDir()
	write(t, dir, "a.yaml", []byte(strings.ReplaceAll(goodRecipe, "%s", "alpha")))
	write(t, dir, "sub/b.yml", []byte(strings.ReplaceAll(goodRecipe, "%s", "beta")))
	write(t, dir, "sub/dup.yaml", []byte(strings.ReplaceAll(goodRecipe, "%s", "alpha")))
	write(t, dir, "notes.yaml", []byte("owner: QC lab\n"))
	write(t, dir, "readme.txt", []byte("not yaml"))
	write(t, dir, "broken.yaml", []byte("recipe: [\n"))
	if err := os.Symlink(dir, filepath.Join(dir, "sub", "loop")); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(filepath.Join(dir, "missing.yaml"), filepath.Join(dir, "dangling.yaml")); err != nil {
		t.Fatal(err)
	}
	run := DiscoverWith([]string{dir}, Options{Lazy: lazy})
	if run.Skipped != 1 {
		t.Errorf("skipped = %d, want 1 (notes.yaml)", run.Skipped)
	}
	var solved []string
	var problems []string
	for _, f := range run.Files {
		res, ps := f.Evaluate()
		if res != nil {
			solved = append(solved, res.Recipe.ID.Value)
		}
		for _, p := range ps {
			problems = append(problems, p.Error())
		}
	}
	if strings.Join(solved, ",") != "beta" {
		t.Errorf("solved %v, want only beta (alpha is used twice)", solved)
	}
	all := strings.Join(problems, "\n")
	for _, want := range []string{"broken.yaml:", "a.yaml:1:9: recipe id \"alpha\" is also used by", "dup.yaml:1:9: recipe id \"alpha\" is also used by", "dangling.yaml"} {
		if !strings.Contains(all, want) {
			t.Errorf("problems\n%s\ndo not mention %q", all, want)
		}
	}
}

func TestEmptyFolderAndMissingPath(t *testing.T) {
	run := Discover([]string{t.TempDir()})
	if len(run.Files) != 0 {
		t.Errorf("files in an empty folder: %d", len(run.Files))
	}
	run = Discover([]string{filepath.Join(t.TempDir(), "nope.yaml")})
	if len(run.Files) != 1 || len(run.Files[0].Problems) == 0 {
		t.Fatalf("missing path not reported")
	}
}

func TestStockCycle(t *testing.T) {
	dir := t.TempDir()
	write(t, dir, "a.yaml", []byte("recipe: a\nbasis: 1 L\ningredients:\n  - from: b\n    amount: 10 mL\n"))
	write(t, dir, "b.yaml", []byte("recipe: b\nbasis: 1 L\ningredients:\n  - from: a\n    amount: 10 mL\n"))
	run := DiscoverWith([]string{dir}, Options{Lazy: true})
	for _, f := range run.Files {
		_, ps := f.Evaluate()
		if !strings.Contains(ps.Error(), "cycle") {
			t.Errorf("%s: problems %q do not name the cycle", f.Path, ps.Error())
		}
	}
}

func TestScanID(t *testing.T) {
	cases := []struct {
		name, src string
		id        string
		pos       spec.Pos
		ok        bool
	}{
		{"plain", "# comment\nrecipe: wash-buffer-a\nbasis: 1 L\n", "wash-buffer-a", spec.Pos{Line: 2, Column: 9}, true},
		{"quoted with comment", "recipe: \"stock-0.5m\"   # the stock\r\n", "stock-0.5m", spec.Pos{Line: 1, Column: 9}, true},
		{"BOM", "\ufeffrecipe: a\n", "a", spec.Pos{Line: 1, Column: 9}, true},
		{"indented is not top level", "x:\n  recipe: a\n", "", spec.Pos{}, false},
		{"flow style falls back", "{recipe: a, ingredients: []}\n", "", spec.Pos{}, false},
		{"anchor falls back", "recipe: &r a\n", "", spec.Pos{}, false},
		{"upper case falls back to the full parse", "recipe: Wash\n", "", spec.Pos{}, false},
		{"empty", "recipe:\n", "", spec.Pos{}, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			id, pos, ok := scanID([]byte(tc.src))
			if id != tc.id || pos != tc.pos || ok != tc.ok {
				t.Errorf("scanID = %q %+v %v, want %q %+v %v", id, pos, ok, tc.id, tc.pos, tc.ok)
			}
		})
	}
}

// TestLazyMatchesParsed solves the example repository both ways and
// expects the same pH for every recipe.
func TestLazyMatchesParsed(t *testing.T) {
	ph := func(lazy bool) map[string]float64 {
		out := map[string]float64{}
		for _, f := range DiscoverWith([]string{"../../examples"}, Options{Lazy: lazy}).Files {
			res, ps := f.Evaluate()
			if len(ps) > 0 {
				t.Fatalf("%s: %v", f.Path, ps)
			}
			out[f.Path] = res.Equilibrium.PH
		}
		return out
	}
	a, b := ph(false), ph(true)
	if len(a) < 8 || len(a) != len(b) {
		t.Fatalf("parsed %d, lazy %d recipes", len(a), len(b))
	}
	for k, v := range a {
		if b[k] != v {
			t.Errorf("%s: pH %v parsed, %v lazy", k, v, b[k])
		}
	}
}

// TestPreferTargets: two versions of one recipe side by side are a
// duplicate for check, but the named one wins when the caller asks.
func TestPreferTargets(t *testing.T) {
	dir := t.TempDir()
	recipe := strings.ReplaceAll(goodRecipe, "%s", "twin")
	old := write(t, dir, "twin.yaml", []byte(recipe))
	write(t, dir, "twin-new.yaml", []byte(recipe))
	if _, ps := Discover([]string{old}).Files[0].Evaluate(); len(ps) == 0 {
		t.Errorf("a reused id is not reported without PreferTargets")
	}
	run := DiscoverWith([]string{old}, Options{PreferTargets: true})
	if len(run.Files) != 1 || run.Files[0].Path != old {
		t.Fatalf("files = %v", run.Files)
	}
	if _, ps := run.Files[0].Evaluate(); len(ps) > 0 {
		t.Errorf("the named twin is not checked: %v", ps)
	}
}
