package report

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/spec/project"
	"github.com/santhosh-tekuri/jsonschema/v5"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// goldenToday fixes the date waiver expiry is judged on.
var goldenToday = time.Date(2026, 1, 15, 0, 0, 0, 0, time.UTC)

// goldenReport checks testdata/golden/project the way `phgate check`
// does (sequentially here; the CLI's parallel pool is tested for order in
// cmd/phgate), from the repository root so paths are repository-relative.
func goldenReport(t *testing.T) *Report {
	t.Helper()
	t.Chdir(filepath.Join("..", ".."))
	run := project.Discover([]string{"testdata/golden/project"})
	rep := &Report{}
	pols := map[*project.Project]*rules.Policy{}
	for _, p := range run.Projects {
		rep.Problems = append(rep.Problems, p.Problems...)
		pol, ps := rules.NewPolicy(p.Config.Rules, p.Config.Waivers, p.Config.Path, p.Config.DefaultTolerance)
		rep.Problems = append(rep.Problems, ps...)
		pol.Today = goldenToday
		pols[p] = pol
	}
	for _, f := range run.Files {
		res, ps := f.Evaluate()
		if len(ps) > 0 {
			rep.Problems = append(rep.Problems, ps...)
			continue
		}
		fs, ps := pols[f.Project()].Check(res)
		if len(ps) > 0 {
			rep.Problems = append(rep.Problems, ps...)
			continue
		}
		rep.Recipes = append(rep.Recipes, Build(res, fs))
	}
	for _, p := range run.Projects {
		rep.Findings = append(rep.Findings, pols[p].Stale(p.IDs())...)
	}
	rep.Finish(run.Skipped)
	return rep
}

// TestGolden renders the fixture project in every format and compares
// with testdata/golden/check.*: JSON and SARIF structurally, the others
// byte for byte. Run with -update to rewrite them.
func TestGolden(t *testing.T) {
	rep := goldenReport(t)
	if rep.Summary.Errors == 0 || rep.Summary.Waived == 0 || len(rep.Findings) == 0 || len(rep.Problems) == 0 {
		t.Fatalf("the fixture project must show errors, waivers, project findings and problems: %+v", rep.Summary)
	}
	for _, name := range Names() {
		t.Run(name, func(t *testing.T) {
			f, err := ByName(name, false)
			if err != nil {
				t.Fatal(err)
			}
			var buf bytes.Buffer
			if err := f.Write(&buf, rep); err != nil {
				t.Fatal(err)
			}
			path := filepath.Join("testdata", "golden", "check."+name)
			if *update {
				if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./rules/report -update)", err)
			}
			switch name {
			case "json", "sarif":
				var g, w any
				if err := json.Unmarshal(buf.Bytes(), &g); err != nil {
					t.Fatalf("output is not JSON: %v", err)
				}
				if err := json.Unmarshal(want, &w); err != nil {
					t.Fatal(err)
				}
				if !reflect.DeepEqual(g, w) {
					t.Errorf("%s differs structurally from %s; output:\n%s", name, path, buf.String())
				}
			default:
				if buf.String() != string(want) {
					t.Errorf("%s differs from %s; output:\n%s", name, path, buf.String())
				}
			}
		})
	}
}

// TestSARIFSchema validates the SARIF output against the official SARIF
// 2.1.0 schema kept in testdata/sarif (see its README for the origin).
func TestSARIFSchema(t *testing.T) {
	rep := goldenReport(t)
	var buf bytes.Buffer
	if err := (SARIF{}).Write(&buf, rep); err != nil {
		t.Fatal(err)
	}
	c := jsonschema.NewCompiler()
	c.Draft = jsonschema.Draft7
	schema, err := os.ReadFile(filepath.Join("testdata", "sarif", "sarif-schema-2.1.0.json"))
	if err != nil {
		t.Fatal(err)
	}
	if err := c.AddResource("sarif.json", bytes.NewReader(schema)); err != nil {
		t.Fatal(err)
	}
	s, err := c.Compile("sarif.json")
	if err != nil {
		t.Fatal(err)
	}
	var doc any
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if err := s.Validate(doc); err != nil {
		t.Errorf("SARIF output is not valid SARIF 2.1.0: %#v", err)
	}
	// A broken document must fail, or the check above proves nothing.
	bad := strings.Replace(buf.String(), `"level": "error"`, `"level": "fatal"`, 1)
	var badDoc any
	if err := json.Unmarshal([]byte(bad), &badDoc); err != nil {
		t.Fatal(err)
	}
	if s.Validate(badDoc) == nil {
		t.Error("the schema accepted an invalid level; the validation is not working")
	}
}

func TestGitHubEscaping(t *testing.T) {
	tests := []struct{ name, in, data, prop string }{
		{"plain", "pH 7.2", "pH 7.2", "pH 7.2"},
		{"newline and percent", "50 %\nnext", "50 %25%0Anext", "50 %25%0Anext"},
		{"colon and comma", "a:b,c", "a:b,c", "a%3Ab%2Cc"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := ghData(tt.in); got != tt.data {
				t.Errorf("ghData = %q, want %q", got, tt.data)
			}
			if got := ghProperty(tt.in); got != tt.prop {
				t.Errorf("ghProperty = %q, want %q", got, tt.prop)
			}
		})
	}
}
