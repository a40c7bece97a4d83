package rules

import (
	"os"
	"path/filepath"
	"reflect"
	"regexp"
	"strings"
	"testing"

	"github.com/phgate/phgate/spec/project"
)

var kebab = regexp.MustCompile(`^[a-z][a-z0-9]*(-[a-z0-9]+)*$`)

// TestRegistry validates the rule metadata that phgate rules, SARIF and
// the README table are generated from.
func TestRegistry(t *testing.T) {
	seen := map[string]bool{}
	for _, r := range Registry {
		t.Run(r.Name, func(t *testing.T) {
			if !kebab.MatchString(r.Name) {
				t.Errorf("name %q is not kebab-case", r.Name)
			}
			if seen[r.Name] {
				t.Errorf("duplicate rule name %q", r.Name)
			}
			seen[r.Name] = true
			if r.Summary == "" || strings.Contains(r.Summary, "\n") || !strings.HasSuffix(r.Summary, ".") {
				t.Errorf("summary must be one sentence on one line: %q", r.Summary)
			}
			for _, part := range []string{"What it checks:", "How it is computed:", "Why it matters:", "How to fix:", "Thresholds:"} {
				if !strings.Contains(r.Doc, part) {
					t.Errorf("doc lacks %q", part)
				}
			}
			if r.Defaults != nil {
				if !sourceRe.MatchString(r.Doc) {
					t.Errorf("doc names no source for its default thresholds")
				}
				ty := reflect.TypeOf(r.Defaults)
				if ty.Kind() != reflect.Struct {
					t.Fatalf("Defaults must be a struct value, is %s", ty.Kind())
				}
				for i := 0; i < ty.NumField(); i++ {
					f := ty.Field(i)
					if f.Tag.Get("yaml") == "" || f.Tag.Get("doc") == "" {
						t.Errorf("setting %s lacks a yaml or doc tag", f.Name)
					}
				}
			}
			if r.Run == nil && r != staleWaiver {
				t.Errorf("rule has no Run")
			}
			for _, kind := range []string{"trigger-", "near-miss-"} {
				m, _ := filepath.Glob(filepath.Join("testdata", r.Name, kind+"*.yaml"))
				if len(m) == 0 {
					t.Errorf("no %s*.yaml fixture in testdata/%s", kind, r.Name)
				}
			}
		})
	}
	dirs, _ := os.ReadDir("testdata")
	for _, d := range dirs {
		if _, ok := Lookup(d.Name()); d.IsDir() && !ok {
			t.Errorf("testdata/%s is not a registered rule", d.Name())
		}
	}
}

// TestExamplesHaveNoErrors checks that the demo repository, a folder of
// good recipes, produces no unwaived error finding under its own config.
func TestExamplesHaveNoErrors(t *testing.T) {
	run := project.Discover([]string{filepath.Join("..", "examples")})
	if len(run.Files) == 0 {
		t.Fatal("no example recipes found")
	}
	for _, p := range run.Projects {
		if len(p.Problems) > 0 {
			t.Fatalf("example project problems: %v", p.Problems)
		}
	}
	pols := map[*project.Project]*Policy{}
	for _, p := range run.Projects {
		pol, ps := NewPolicy(p.Config.Rules, p.Config.Waivers, p.Config.Path, p.Config.DefaultTolerance)
		if len(ps) > 0 {
			t.Fatalf("example config: %v", ps)
		}
		pols[p] = pol
	}
	for _, f := range run.Files {
		res, ps := f.Evaluate()
		if len(ps) > 0 {
			t.Errorf("%s: %v", f.Path, ps)
			continue
		}
		fs, ps := pols[f.Project()].Check(res)
		if len(ps) > 0 {
			t.Errorf("%s: %v", f.Path, ps)
		}
		for _, x := range fs {
			if x.Severity == Error && x.Waived == "" {
				t.Errorf("%s:%d:%d: %s: %s", x.Path, x.Line, x.Column, x.Rule, x.Message)
			}
		}
	}
}

// sourceRe finds where a rule's doc names the source of its thresholds:
// "common practice", "from memory", or a citation with a year.
var sourceRe = regexp.MustCompile(`common\s+practice|from\s+memory|\b(19|20)\d\d\b`)
