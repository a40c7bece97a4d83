package main

import (
	"bytes"
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestReportHTML(t *testing.T) {
	out := filepath.Join(t.TempDir(), "r.html")
	recipes := []string{trisWash, "../../examples/recipes/lab/phosphate-stock-0.5m.yaml", "../../examples/recipes/lab/qc-phosphate-saline.yaml"}
	code, stdout, stderr := chartRun(append([]string{"report", "-o", out}, recipes...)...)
	if code != ExitOK || stdout != "" || stderr != "" {
		t.Fatalf("exit %d, stdout %q, stderr %q", code, stdout, stderr)
	}
	data, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	d := xml.NewDecoder(bytes.NewReader(data))
	sections, figures := 0, 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the report does not parse: %v", err)
		}
		if el, ok := tok.(xml.StartElement); ok {
			switch el.Name.Local {
			case "section":
				sections++
			case "figure":
				figures++
			}
		}
	}
	if sections != 3 || figures != 12 {
		t.Errorf("%d sections and %d charts, want 3 and 12", sections, figures)
	}
	for _, id := range []string{"tris-wash-cold", "phosphate-stock-0.5m", "qc-phosphate-saline"} {
		if !strings.Contains(string(data), "<h2>"+id) {
			t.Errorf("recipe %s missing", id)
		}
	}
}

func TestReportErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.yaml")
	if err := os.WriteFile(bad, []byte("recipe: broken\nbasis: 1 L\ningredients:\n  - use: unobtainium\n    amount: 1 g\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"no output", []string{trisWash}, "usage: phgate report"},
		{"no recipes", []string{"-o", filepath.Join(dir, "r.html")}, "usage: phgate report"},
		{"wrong extension", []string{trisWash, "-o", filepath.Join(dir, "r.pdf")}, "must end in .html"},
		{"recipe problem", []string{trisWash, bad, "-o", filepath.Join(dir, "r.html")}, `unknown ingredient "unobtainium"`},
		{"folder missing", []string{trisWash, "-o", filepath.Join(dir, "no", "r.html")}, "cannot write"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := chartRun(append([]string{"report"}, tc.args...)...)
			if code != ExitProblem || stdout != "" || !strings.Contains(stderr, tc.want) {
				t.Errorf("exit %d, stdout %q, stderr %q, want exit 2 and %q", code, stdout, stderr, tc.want)
			}
		})
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("failed runs left files: %v", entries)
	}
}
