package rules

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/evaluate"
)

// fixtureToday is the date the fixtures' waiver expiry is judged on.
var fixtureToday = time.Date(2026, 1, 15, 0, 0, 0, 0, time.UTC)

// wantRe matches an expectation written as a YAML comment on the line a
// finding must point at: "# want: ph-window error" (several separated by
// ";", "waived" after the severity for a waived finding).
var wantRe = regexp.MustCompile(`#\s*want:\s*(.+)$`)

// evaluateFixture loads and solves a fixture recipe with the built-in
// catalog (merged with the recipe's inline catalog:).
func evaluateFixture(t *testing.T, path string) *evaluate.Result {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	r, ps := spec.LoadRecipe(data, path)
	if len(ps) > 0 {
		t.Fatalf("fixture does not load:\n%v", ps)
	}
	cat := catalog.Default()
	noStocks := func(id string, at spec.Pos) (*evaluate.Result, *diag.Problem) {
		return nil, &diag.Problem{Path: path, Line: at.Line, Column: at.Column, Message: "fixtures have no stocks"}
	}
	res, ps := evaluate.Evaluate(r, cat, noStocks)
	if len(ps) > 0 {
		t.Fatalf("fixture does not solve:\n%v", ps)
	}
	return res
}

// wants reads the expectations of a fixture as "line rule severity[ waived]".
func wants(t *testing.T, path string) []string {
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for i, line := range strings.Split(string(data), "\n") {
		m := wantRe.FindStringSubmatch(line)
		if m == nil {
			continue
		}
		for _, w := range strings.Split(m[1], ";") {
			out = append(out, fmt.Sprintf("%d %s", i+1, strings.Join(strings.Fields(w), " ")))
		}
	}
	sort.Strings(out)
	return out
}

func describe(f Finding) string {
	s := fmt.Sprintf("%d %s %s", f.Line, f.Rule, f.Severity)
	if f.Waived != "" {
		s += " waived"
	}
	return s
}

// TestFixtures runs every rule on rules/testdata/<rule>/*.yaml and
// compares the findings with the "# want:" comments: a missing finding
// and an unexpected one both fail. Trigger fixtures must want at least one
// finding of their rule; near-miss fixtures none of it.
func TestFixtures(t *testing.T) {
	paths, err := filepath.Glob("testdata/*/*.yaml")
	if err != nil || len(paths) == 0 {
		t.Fatalf("no fixtures: %v", err)
	}
	for _, path := range paths {
		t.Run(filepath.ToSlash(path), func(t *testing.T) {
			rule := filepath.Base(filepath.Dir(path))
			res := evaluateFixture(t, path)
			pol := DefaultPolicy()
			pol.Today = fixtureToday
			fs, ps := pol.Check(res)
			if len(ps) > 0 {
				t.Fatalf("policy problems:\n%v", ps)
			}
			var got []string
			for _, f := range fs {
				got = append(got, describe(f))
			}
			sort.Strings(got)
			want := wants(t, path)
			if strings.Join(got, "\n") != strings.Join(want, "\n") {
				var detail strings.Builder
				for _, f := range fs {
					fmt.Fprintf(&detail, "  %d:%d %s %s: %s\n", f.Line, f.Column, f.Severity, f.Rule, f.Message)
				}
				t.Errorf("findings differ\n got: %q\nwant: %q\n%s", got, want, detail.String())
			}
			mentions := strings.Contains(" "+strings.Join(want, " | ")+" ", " "+rule+" ")
			switch base := filepath.Base(path); {
			case strings.HasPrefix(base, "trigger-") && !mentions:
				t.Errorf("trigger fixture wants no %s finding", rule)
			case strings.HasPrefix(base, "near-miss-") && mentions:
				t.Errorf("near-miss fixture wants a %s finding", rule)
			}
		})
	}
}
