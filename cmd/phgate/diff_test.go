package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"flag"
	"os"
	"os/exec"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// The -update flag rewrites golden files; other tests of this package may
// declare it too, so it is looked up rather than owned.
func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files")
	}
}

func updateGolden() bool {
	f := flag.Lookup("update")
	return f != nil && f.Value.String() == "true"
}

// gitEnv pins identity and dates so commit hashes (and the labels in the
// golden files) are the same on every run, and keeps the user's git
// configuration out of the test's own commits.
func pinnedGitEnv(date string) []string {
	return append(os.Environ(),
		"GIT_CONFIG_GLOBAL="+os.DevNull, "GIT_CONFIG_NOSYSTEM=1",
		"GIT_AUTHOR_NAME=t", "GIT_AUTHOR_EMAIL=t@example.invalid", "GIT_AUTHOR_DATE="+date,
		"GIT_COMMITTER_NAME=t", "GIT_COMMITTER_EMAIL=t@example.invalid", "GIT_COMMITTER_DATE="+date)
}

func repoGit(t *testing.T, dir string, args ...string) string {
	t.Helper()
	cmd := exec.Command("git", append([]string{"-c", "init.defaultBranch=main", "-c", "commit.gpgsign=false"}, args...)...)
	cmd.Dir = dir
	cmd.Env = pinnedGitEnv("2026-01-02T03:04:05Z")
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("git %s: %v\n%s", strings.Join(args, " "), err, out)
	}
	return string(out)
}

func putFile(t *testing.T, dir, name, content string) {
	t.Helper()
	p := filepath.Join(dir, filepath.FromSlash(name))
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(p, []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
}

const houseCatalog = `title: House catalog
sources:
  house-bench:
    cite: "House bench titration, 2025"
    status: checked
systems:
  house-acid:
    name: House acid
    top-charge: 0
    species: [HA, A-]
    source: house-bench
    steps:
      - {pka: PKA}
ingredients:
  house-acid-salt:
    name: House acid sodium salt
    molar-mass: {value: 100, source: house-bench}
    ions: {Na+: 1}
    systems: [{system: house-acid, species: A-}]
    sources: [house-bench]
`

func recipeYAML(id, body string) string {
	return "recipe: " + id + "\nbasis: 1 L\ntemperature: 25 C\n" + body
}

// diffRepo builds a repository with two commits: the second edits a stock
// recipe (and so moves a recipe that uses it), edits a catalog entry,
// renames a recipe, deletes one, adds one, and edits one so that a new
// finding appears. One recipe never changes.
func diffRepo(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	repoGit(t, dir, "init", "-q")
	putFile(t, dir, "phgate.yaml", "project: diff test\ncatalogs: [catalog/house.yaml]\n")
	putFile(t, dir, "catalog/house.yaml", strings.Replace(houseCatalog, "PKA", "4.5", 1))
	putFile(t, dir, "recipes/stock.yaml", recipeYAML("phos-stock", `ingredients:
  - use: dipotassium-hydrogen-phosphate
    amount: 52.3 g
  - use: potassium-dihydrogen-phosphate
    amount: 27.2 g
  - use: purified-water
    amount: q.s.
`))
	putFile(t, dir, "recipes/working.yaml", recipeYAML("working-buffer", `ingredients:
  - from: phos-stock
    amount: 20 mL
  - use: sodium-chloride
    amount: 8.5 g
  - use: purified-water
    amount: q.s.
`))
	putFile(t, dir, "recipes/house.yaml", recipeYAML("house-rinse", `ingredients:
  - use: house-acid-salt
    amount: 1 g
  - use: acetic-acid
    amount: 1 g
  - use: purified-water
    amount: q.s.
`))
	citrate := `ingredients:
  - use: citric-acid-monohydrate
    amount: 3.0 g
  - use: trisodium-citrate-dihydrate
    amount: 1.2 g
  - use: purified-water
    amount: q.s.
`
	putFile(t, dir, "recipes/old-name.yaml", recipeYAML("moved-one", citrate))
	putFile(t, dir, "recipes/gone.yaml", recipeYAML("gone-one", citrate))
	putFile(t, dir, "recipes/steady.yaml", recipeYAML("steady-one", strings.Replace(citrate, "3.0 g", "2.0 g", 1)))
	putFile(t, dir, "recipes/edited.yaml", recipeYAML("edited-one", "ph: {min: 6.5, max: 7.5}\n"+strings.Replace(citrate, "3.0 g", "0.05 g", 1)))
	repoGit(t, dir, "add", "-A")
	repoGit(t, dir, "commit", "-q", "-m", "base")

	putFile(t, dir, "recipes/stock.yaml", recipeYAML("phos-stock", `ingredients:
  - use: dipotassium-hydrogen-phosphate
    amount: 60 g
  - use: potassium-dihydrogen-phosphate
    amount: 27.2 g
  - use: purified-water
    amount: q.s.
`))
	putFile(t, dir, "catalog/house.yaml", strings.Replace(houseCatalog, "PKA", "4.8", 1))
	if err := os.Mkdir(filepath.Join(dir, "recipes", "renamed"), 0o755); err != nil {
		t.Fatal(err)
	}
	repoGit(t, dir, "mv", "recipes/old-name.yaml", "recipes/renamed/new-name.yaml")
	repoGit(t, dir, "rm", "-q", "recipes/gone.yaml")
	putFile(t, dir, "recipes/edited.yaml", recipeYAML("edited-one", "ph: {min: 6.5, max: 7.5}\n"+strings.Replace(citrate, "3.0 g", "2.5 g", 1)))
	putFile(t, dir, "recipes/added.yaml", recipeYAML("added-one", citrate))
	repoGit(t, dir, "add", "-A")
	repoGit(t, dir, "commit", "-q", "-m", "change")
	return dir
}

// run runs phgate in process and returns the exit status and outputs.
func runDiff(args ...string) (int, string, string) {
	var out, errb bytes.Buffer
	code := New(strings.NewReader(""), &out, &errb).Run(args)
	return code, out.String(), errb.String()
}

type jsonDiff struct {
	Changes []struct {
		Recipe       string   `json:"recipe"`
		Status       string   `json:"status"`
		OldPath      string   `json:"old_path"`
		NewPath      string   `json:"new_path"`
		DeltaPH      *float64 `json:"delta_ph"`
		RecipeEdited bool     `json:"recipe_edited"`
		Before       *struct {
			PH *float64 `json:"ph"`
		} `json:"before"`
		After *struct {
			PH *float64 `json:"ph"`
		} `json:"after"`
		Causes []struct {
			Kind, Name, Path, Note string
		} `json:"causes"`
		NewFindings []struct {
			Rule, Severity string
		} `json:"new_findings"`
		Ingredients []struct {
			Ingredient string `json:"ingredient"`
		} `json:"ingredient_changes"`
	} `json:"changes"`
	Unchanged     int      `json:"unchanged"`
	InputsChanged []string `json:"inputs_changed"`
	GatesCrossed  []string `json:"gates_crossed"`
}

func decodeDiff(t *testing.T, out string) jsonDiff {
	t.Helper()
	var d jsonDiff
	if err := json.Unmarshal([]byte(out), &d); err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, out)
	}
	return d
}

func TestDiffGitRevisions(t *testing.T) {
	dir := diffRepo(t)
	code, out, errs := runDiff("diff", "--repo", dir, "--base", "HEAD~1", "--head", "HEAD", "--all", "--format", "json")
	if code != ExitOK {
		t.Fatalf("exit %d, want %d\n%s%s", code, ExitOK, out, errs)
	}
	d := decodeDiff(t, out)
	byID := map[string]int{}
	for i, c := range d.Changes {
		byID[c.Recipe] = i
	}
	want := map[string]string{
		"phos-stock": "modified", "working-buffer": "modified", "house-rinse": "modified",
		"moved-one": "renamed", "gone-one": "removed", "added-one": "added",
		"edited-one": "modified", "steady-one": "unchanged",
	}
	for id, status := range want {
		i, ok := byID[id]
		if !ok {
			t.Errorf("%s: missing from the changes", id)
			continue
		}
		if got := d.Changes[i].Status; got != status {
			t.Errorf("%s: status %q, want %q", id, got, status)
		}
	}
	if len(d.Changes) != len(want) {
		t.Errorf("%d changes, want %d: %s", len(d.Changes), len(want), out)
	}
	get := func(id string) int {
		i, ok := byID[id]
		if !ok {
			t.Fatalf("%s missing", id)
		}
		return i
	}

	// The working buffer's file did not change; its stock did.
	wb := d.Changes[get("working-buffer")]
	if wb.RecipeEdited || len(wb.Causes) != 1 || wb.Causes[0].Kind != "stock" || wb.Causes[0].Name != "phos-stock" ||
		wb.Causes[0].Path != "recipes/stock.yaml" {
		t.Errorf("working-buffer: edited %v, causes %+v; want unedited, moved by stock phos-stock", wb.RecipeEdited, wb.Causes)
	}
	// More hydrogen phosphate in the stock raises the pH (common practice:
	// a higher base-to-acid ratio in a phosphate buffer gives a higher pH).
	if wb.DeltaPH == nil || *wb.DeltaPH <= 0 {
		t.Errorf("working-buffer: ΔpH %v, want > 0", wb.DeltaPH)
	}

	// The house rinse moved because a project catalog entry changed.
	hr := d.Changes[get("house-rinse")]
	if hr.RecipeEdited || len(hr.Causes) != 1 || hr.Causes[0].Kind != "catalog" || hr.Causes[0].Name != "system house-acid" ||
		hr.Causes[0].Path != "catalog/house.yaml" {
		t.Errorf("house-rinse: edited %v, causes %+v; want unedited, moved by catalog system house-acid", hr.RecipeEdited, hr.Causes)
	}
	// A weaker acid (pKa 4.5 → 4.8) in the buffer raises the pH.
	if hr.DeltaPH == nil || *hr.DeltaPH <= 0 {
		t.Errorf("house-rinse: ΔpH %v, want > 0", hr.DeltaPH)
	}

	// Renamed without an edit, and never touched: ΔpH exactly 0.
	for _, id := range []string{"moved-one", "steady-one"} {
		c := d.Changes[get(id)]
		if c.DeltaPH == nil || *c.DeltaPH != 0 || c.RecipeEdited {
			t.Errorf("%s: ΔpH %v, edited %v; want exactly 0, unedited", id, c.DeltaPH, c.RecipeEdited)
		}
	}
	if c := d.Changes[get("moved-one")]; c.OldPath != "recipes/old-name.yaml" || c.NewPath != "recipes/renamed/new-name.yaml" {
		t.Errorf("moved-one: paths %q → %q", c.OldPath, c.NewPath)
	}
	if !strings.Contains(out, `"delta_ph": 0,`) || strings.Contains(out, "-0,") {
		t.Errorf("an unchanged recipe's ΔpH must print as 0:\n%s", out)
	}

	// More citric acid pushes the edited recipe below its window (pH 6.78
	// → 3.49, computed by phgate check on the same recipes).
	ed := d.Changes[get("edited-one")]
	if !ed.RecipeEdited || len(ed.NewFindings) != 1 || ed.NewFindings[0].Rule != "ph-window" || ed.NewFindings[0].Severity != "error" {
		t.Errorf("edited-one: edited %v, new findings %+v; want one ph-window error", ed.RecipeEdited, ed.NewFindings)
	}
	if len(ed.Ingredients) != 1 || ed.Ingredients[0].Ingredient != "citric-acid-monohydrate" {
		t.Errorf("edited-one: ingredient changes %+v", ed.Ingredients)
	}
	if c := d.Changes[get("gone-one")]; c.Before == nil || c.Before.PH == nil || c.After != nil || c.DeltaPH != nil {
		t.Errorf("gone-one: want a before state only, got %+v", c)
	}
	if !reflect.DeepEqual(d.InputsChanged, []string{"catalog/house.yaml"}) {
		t.Errorf("inputs changed %v, want [catalog/house.yaml]", d.InputsChanged)
	}
}

func TestDiffGates(t *testing.T) {
	dir := diffRepo(t)
	tests := []struct {
		name  string
		args  []string
		want  int
		gates int
	}{
		{"no gate", nil, ExitOK, 0},
		{"shift within limit", []string{"--max-ph-shift", "5"}, ExitOK, 0},
		{"shift beyond limit", []string{"--max-ph-shift", "0.001"}, ExitFindings, 4},
		{"new error", []string{"--fail-on-new", "error"}, ExitFindings, 1},
		{"new warning or worse", []string{"--fail-on-new", "warning"}, ExitFindings, 1},
		{"bad severity", []string{"--fail-on-new", "sometimes"}, ExitProblem, -1},
		{"negative shift", []string{"--max-ph-shift", "-1"}, ExitProblem, -1},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			args := append([]string{"diff", "--repo", dir, "--base", "HEAD~1", "--head", "HEAD", "--format", "json"}, tc.args...)
			code, out, errs := runDiff(args...)
			if code != tc.want {
				t.Fatalf("exit %d, want %d\n%s", code, tc.want, errs)
			}
			if tc.gates < 0 {
				return
			}
			if d := decodeDiff(t, out); len(d.GatesCrossed) != tc.gates {
				t.Errorf("gates crossed %q, want %d", d.GatesCrossed, tc.gates)
			}
		})
	}
}

// repoSnapshot records what the diff must leave alone: the working tree
// status, the index file and every ref. Its own git calls take no
// optional locks, so they do not refresh the index themselves.
func repoSnapshot(t *testing.T, dir string) string {
	t.Helper()
	index, err := os.ReadFile(filepath.Join(dir, ".git", "index"))
	if err != nil {
		t.Fatal(err)
	}
	st, err := os.Stat(filepath.Join(dir, ".git", "index"))
	if err != nil {
		t.Fatal(err)
	}
	sum := sha256.Sum256(index)
	return repoGit(t, dir, "--no-optional-locks", "status", "--porcelain=v1", "--untracked-files=all") +
		repoGit(t, dir, "for-each-ref") + repoGit(t, dir, "rev-parse", "HEAD") +
		hex.EncodeToString(sum[:]) + " " + st.ModTime().String()
}

func TestDiffWorkingTreeUntouched(t *testing.T) {
	dir := diffRepo(t)
	putFile(t, dir, "recipes/steady.yaml", recipeYAML("steady-one", `ingredients:
  - use: citric-acid-monohydrate
    amount: 2.2 g
  - use: trisodium-citrate-dihydrate
    amount: 1.2 g
  - use: purified-water
    amount: q.s.
`))
	repoGit(t, dir, "status") // settle the index's cached file times first
	before := repoSnapshot(t, dir)
	code, out, errs := runDiff("diff", "--repo", dir, "--base", "HEAD", "--format", "json")
	if code != ExitOK {
		t.Fatalf("exit %d\n%s%s", code, out, errs)
	}
	d := decodeDiff(t, out)
	if len(d.Changes) != 1 || d.Changes[0].Recipe != "steady-one" || d.Changes[0].Status != "modified" {
		t.Errorf("want only steady-one modified against HEAD, got %s", out)
	}
	if after := repoSnapshot(t, dir); after != before {
		t.Errorf("the diff changed the working tree, index or refs:\nbefore %s\nafter %s", before, after)
	}
}

func TestDiffGitPaths(t *testing.T) {
	dir := diffRepo(t)
	tests := []struct {
		name string
		args []string
		want []string
	}{
		{"one file", []string{"recipes/working.yaml"}, []string{"working-buffer"}},
		{"folder that exists only in the new revision", []string{"recipes/renamed"}, []string{"moved-one"}},
		{"deleted file", []string{"recipes/gone.yaml"}, []string{"gone-one"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			args := append([]string{"diff", "--repo", dir, "--base", "HEAD~1", "--head", "HEAD", "--format", "json"}, tc.args...)
			code, out, errs := runDiff(args...)
			if code != ExitOK {
				t.Fatalf("exit %d\n%s", code, errs)
			}
			var got []string
			for _, c := range decodeDiff(t, out).Changes {
				got = append(got, c.Recipe)
			}
			if !reflect.DeepEqual(got, tc.want) {
				t.Errorf("changes %v, want %v", got, tc.want)
			}
		})
	}
	if code, _, _ := runDiff("diff", "--repo", dir, "--base", "HEAD~1", "--head", "HEAD", "no/such/place"); code != ExitProblem {
		t.Errorf("a path in neither revision: exit %d, want %d", code, ExitProblem)
	}
	if code, _, _ := runDiff("diff", "--repo", dir, "--base", "HEAD~1", "../outside"); code != ExitProblem {
		t.Errorf("a path outside the repository: exit %d, want %d", code, ExitProblem)
	}
}

// TestDiffConfigCause moves the house acid into a second catalog file
// named by an edited phgate.yaml: the unedited recipe that uses it names
// both causes.
func TestDiffConfigCause(t *testing.T) {
	dir := diffRepo(t)
	putFile(t, dir, "phgate.yaml", "project: diff test\ncatalogs: [catalog/acids.yaml]\n")
	putFile(t, dir, "catalog/acids.yaml", strings.Replace(houseCatalog, "PKA", "5.1", 1))
	code, out, errs := runDiff("diff", "--repo", dir, "--base", "HEAD", "--format", "json", "recipes/house.yaml")
	if code != ExitOK {
		t.Fatalf("exit %d\n%s%s", code, out, errs)
	}
	d := decodeDiff(t, out)
	if len(d.Changes) != 1 {
		t.Fatalf("want one change, got %s", out)
	}
	var kinds []string
	for _, c := range d.Changes[0].Causes {
		kinds = append(kinds, c.Kind+" "+c.Name+" "+c.Path)
	}
	want := []string{"catalog system house-acid catalog/acids.yaml", "config phgate.yaml phgate.yaml"}
	if !reflect.DeepEqual(kinds, want) {
		t.Errorf("causes %q, want %q", kinds, want)
	}
	if !reflect.DeepEqual(d.InputsChanged, []string{"catalog/acids.yaml", "catalog/house.yaml", "phgate.yaml"}) {
		t.Errorf("inputs changed %v", d.InputsChanged)
	}
}

// fakeGit puts a git on PATH that logs each call and hands it to the real
// git, and returns the log file.
func recordingGit(t *testing.T) string {
	t.Helper()
	real, err := exec.LookPath("git")
	if err != nil {
		t.Skip("git not installed")
	}
	bin := t.TempDir()
	log := filepath.Join(bin, "calls.log")
	script := "#!/bin/sh\nprintf '%s\\n' \"$*\" >> '" + log + "'\nexec '" + real + "' \"$@\"\n"
	if err := os.WriteFile(filepath.Join(bin, "git"), []byte(script), 0o755); err != nil {
		t.Fatal(err)
	}
	t.Setenv("PATH", bin+string(os.PathListSeparator)+os.Getenv("PATH"))
	return log
}

func TestDiffRefusesMaliciousRevisions(t *testing.T) {
	dir := diffRepo(t)
	log := recordingGit(t)
	trap := t.TempDir()
	tests := []struct {
		name string
		args []string
		// verified: the revision reaches `git rev-parse --verify`, which
		// refuses it; otherwise no git command runs at all.
		verified bool
	}{
		{"option as base", []string{"--base=--output=" + filepath.Join(trap, "x")}, false},
		{"short option", []string{"--base", "-x"}, false},
		{"option as head", []string{"--base", "HEAD", "--head", "--upload-pack=touch " + filepath.Join(trap, "y")}, false},
		{"shell separator", []string{"--base", "HEAD;touch " + filepath.Join(trap, "z")}, true},
		{"command substitution", []string{"--base", "$(touch " + filepath.Join(trap, "pwned") + ")"}, true},
		{"newline", []string{"--base", "HEAD\n--output=" + filepath.Join(trap, "n")}, false},
		{"no such revision", []string{"--base", "no-such-branch"}, true},
		{"not a commit", []string{"--base", "HEAD:phgate.yaml"}, true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if err := os.WriteFile(log, nil, 0o644); err != nil {
				t.Fatal(err)
			}
			code, out, errs := runDiff(append([]string{"diff", "--repo", dir}, tc.args...)...)
			if code != ExitProblem {
				t.Errorf("exit %d, want %d\n%s%s", code, ExitProblem, out, errs)
			}
			calls, _ := os.ReadFile(log)
			lines := strings.Split(strings.TrimSpace(string(calls)), "\n")
			if !tc.verified {
				if len(calls) != 0 {
					t.Errorf("git ran for a refused revision: %q", calls)
				}
			} else {
				last := lines[len(lines)-1]
				if !strings.Contains(last, "rev-parse --verify --quiet --end-of-options") {
					t.Errorf("last git call %q, want the verification", last)
				}
				for _, l := range lines {
					if !strings.Contains(l, "rev-parse") {
						t.Errorf("git ran more than the verification: %q", l)
					}
				}
			}
			if left, _ := os.ReadDir(trap); len(left) > 0 {
				t.Errorf("a refused revision created %s", left[0].Name())
			}
		})
	}
	if left, _ := os.ReadDir(dir); len(left) != 4 {
		var names []string
		for _, e := range left {
			names = append(names, e.Name())
		}
		t.Errorf("the repository's top folder holds %v, want .git, catalog, phgate.yaml and recipes only", names)
	}
}

// TestDiffGolden compares whole outputs with the files under
// testdata/golden/diff (JSON structurally); -update rewrites them.
func TestDiffGolden(t *testing.T) {
	dir := diffRepo(t)
	for _, format := range []string{"text", "json", "markdown"} {
		t.Run(format, func(t *testing.T) {
			code, out, errs := runDiff("diff", "--repo", dir, "--base", "HEAD~1", "--head", "HEAD", "--format", format,
				"--max-ph-shift", "0.5", "--fail-on-new", "error")
			if code != ExitFindings {
				t.Fatalf("exit %d, want %d (the edited recipe crosses both gates)\n%s", code, ExitFindings, errs)
			}
			ext := map[string]string{"text": ".txt", "json": ".json", "markdown": ".md"}[format]
			golden := filepath.Join("..", "..", "testdata", "golden", "diff", "revisions"+ext)
			if updateGolden() {
				if err := os.MkdirAll(filepath.Dir(golden), 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(golden, []byte(out), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("%v (run go test -run TestDiffGolden -update)", err)
			}
			if format == "json" {
				var got, exp any
				if err := json.Unmarshal([]byte(out), &got); err != nil {
					t.Fatal(err)
				}
				if err := json.Unmarshal(want, &exp); err != nil {
					t.Fatal(err)
				}
				if !reflect.DeepEqual(got, exp) {
					t.Errorf("JSON differs from %s:\n%s", golden, out)
				}
				return
			}
			if out != string(want) {
				t.Errorf("output differs from %s:\n%s", golden, out)
			}
		})
	}
}

func TestDiffFilesAndFolders(t *testing.T) {
	dir := t.TempDir()
	oldDir, newDir := filepath.Join(dir, "old"), filepath.Join(dir, "new")
	body := `ingredients:
  - use: citric-acid-monohydrate
    amount: 3.0 g
  - use: trisodium-citrate-dihydrate
    amount: 1.2 g
  - use: purified-water
    amount: q.s.
`
	putFile(t, oldDir, "a.yaml", recipeYAML("drink-a", body))
	putFile(t, oldDir, "b.yaml", recipeYAML("drink-b", body))
	putFile(t, newDir, "sub/a-moved.yaml", recipeYAML("drink-a", body))
	putFile(t, newDir, "b.yaml", recipeYAML("drink-b", strings.Replace(body, "3.0 g", "2.0 g", 1)))
	putFile(t, newDir, "c.yaml", recipeYAML("drink-c", body))
	putFile(t, newDir, "broken.yaml", recipeYAML("drink-d", strings.Replace(body, "citric-acid-monohydrate", "citric-acid-monohydrat", 1)))

	code, out, errs := runDiff("diff", "--format", "json", oldDir, newDir)
	if code != ExitProblem {
		t.Errorf("a recipe the new side cannot solve: exit %d, want %d\n%s", code, ExitProblem, errs)
	}
	got := map[string]string{}
	for _, c := range decodeDiff(t, out).Changes {
		got[c.Recipe] = c.Status + " " + c.OldPath + " " + c.NewPath
	}
	want := map[string]string{
		"drink-a": "renamed a.yaml sub/a-moved.yaml",
		"drink-b": "modified b.yaml b.yaml",
		"drink-c": "added  c.yaml",
		"drink-d": "added  broken.yaml",
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("changes %v, want %v", got, want)
	}

	t.Run("broken the same way on both sides", func(t *testing.T) {
		a, b := filepath.Join(dir, "same-a"), filepath.Join(dir, "same-b")
		for _, d := range []string{a, b} {
			putFile(t, d, "broken.yaml", recipeYAML("drink-d", strings.Replace(body, "citric-acid-monohydrate", "citric-acid-monohydrat", 1)))
			putFile(t, d, "fine.yaml", recipeYAML("drink-e", body))
		}
		code, out, errs := runDiff("diff", "--format", "json", a, b)
		if d := decodeDiff(t, out); code != ExitOK || len(d.Changes) != 0 || d.Unchanged != 2 {
			t.Errorf("exit %d, %d changes, %d unchanged; want 0, 0, 2\n%s%s", code, len(d.Changes), d.Unchanged, out, errs)
		}
	})

	tests := []struct {
		name string
		args []string
		want int
	}{
		{"two files with different ids pair up", []string{filepath.Join(oldDir, "a.yaml"), filepath.Join(newDir, "b.yaml")}, ExitOK},
		{"file against folder", []string{filepath.Join(oldDir, "a.yaml"), newDir}, ExitProblem},
		{"missing file", []string{filepath.Join(oldDir, "zz.yaml"), filepath.Join(newDir, "b.yaml")}, ExitProblem},
		{"one argument", []string{oldDir}, ExitProblem},
		{"head without base", []string{"--head", "HEAD", oldDir, newDir}, ExitProblem},
		{"unknown format", []string{"--format", "yaml", oldDir, newDir}, ExitProblem},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, out, errs := runDiff(append([]string{"diff", "--format", "json"}, tc.args...)...)
			if code != tc.want {
				t.Fatalf("exit %d, want %d\n%s%s", code, tc.want, out, errs)
			}
			if tc.want == ExitOK {
				d := decodeDiff(t, out)
				if len(d.Changes) != 1 || d.Changes[0].Recipe != "drink-b" || d.Changes[0].DeltaPH == nil || *d.Changes[0].DeltaPH == 0 {
					t.Errorf("want drink-a paired with drink-b and a pH shift, got %s", out)
				}
			}
		})
	}
}

// TestDiffBinary builds phgate and runs it inside the repository, from a
// sub-folder, as a user or a CI job would: PATH arguments are relative to
// the current folder and the repository is found from it.
func TestDiffBinary(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the binary")
	}
	dir := diffRepo(t)
	bin := filepath.Join(t.TempDir(), "phgate")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	tests := []struct {
		name, dir string
		args      []string
		code      int
		want      []string
	}{
		// The pH figures below are regression values from phgate's own
		// output for this fixture repository, not chemistry checks (those
		// live in solver and testdata/standards).
		{"from a sub-folder", "recipes", []string{"diff", "--base", "HEAD~1", "--head", "HEAD", "--format", "markdown", "working.yaml"}, ExitOK,
			[]string{"| `working-buffer` | modified | 7.01 | 7.07 | +0.0584 |", "moved by a change to stock recipe `phos-stock`"}},
		{"whole repository with a gate", ".", []string{"diff", "--base", "HEAD~1", "--max-ph-shift", "0.1"}, ExitFindings,
			[]string{"gate crossed: edited-one: pH moved by -3.291", "house-rinse"}},
		{"refused revision", ".", []string{"diff", "--base", "-p"}, ExitProblem, nil},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			cmd := exec.Command(bin, tc.args...)
			cmd.Dir = filepath.Join(dir, tc.dir)
			var out, errb bytes.Buffer
			cmd.Stdout, cmd.Stderr = &out, &errb
			err := cmd.Run()
			code := 0
			var ee *exec.ExitError
			if errors.As(err, &ee) {
				code = ee.ExitCode()
			} else if err != nil {
				t.Fatal(err)
			}
			if code != tc.code {
				t.Fatalf("exit %d, want %d\n%s%s", code, tc.code, out.String(), errb.String())
			}
			for _, w := range tc.want {
				if !strings.Contains(out.String(), w) {
					t.Errorf("output lacks %q:\n%s", w, out.String())
				}
			}
		})
	}
}
