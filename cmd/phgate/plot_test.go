package main

import (
	"bytes"
	"encoding/xml"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const trisWash = "../../examples/recipes/bioprocess/tris-wash-cold.yaml"

func chartRun(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = New(strings.NewReader(""), &out, &errb).Run(args)
	return code, out.String(), errb.String()
}

func TestPlotSVG(t *testing.T) {
	dir := t.TempDir()
	tests := []struct {
		kind string
		want []string // legend and title texts
	}{
		{"titration", []string{"tris-wash-cold · titration curve", "pH with hydrochloric-acid", "as made: pH 7.50", "target pH 7.20–8.30", "pKa at 25 °C"}},
		{"species", []string{"TrisH+", "Tris", "recipe pH"}},
		{"capacity", []string{"buffer capacity", "minimum capacity (weak-buffer rule)"}},
		{"temperature", []string{"pH of the product as made", "temperature (°C)"}},
	}
	for _, tc := range tests {
		t.Run(tc.kind, func(t *testing.T) {
			out := filepath.Join(dir, tc.kind+".svg")
			code, stdout, stderr := chartRun("plot", trisWash, "--kind", tc.kind, "-o", out)
			if code != ExitOK || stdout != "" || stderr != "" {
				t.Fatalf("exit %d, stdout %q, stderr %q", code, stdout, stderr)
			}
			data, err := os.ReadFile(out)
			if err != nil {
				t.Fatal(err)
			}
			var texts []string
			d := xml.NewDecoder(bytes.NewReader(data))
			inText := false
			for {
				tok, err := d.Token()
				if err == io.EOF {
					break
				}
				if err != nil {
					t.Fatalf("SVG does not parse: %v", err)
				}
				switch el := tok.(type) {
				case xml.StartElement:
					inText = el.Name.Local == "text"
				case xml.CharData:
					if inText {
						texts = append(texts, string(el))
					}
				}
			}
			all := strings.Join(texts, "\n")
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("text %q missing from the SVG", w)
				}
			}
		})
	}
}

func TestPlotPNGSize(t *testing.T) {
	out := filepath.Join(t.TempDir(), "t.png")
	code, _, stderr := chartRun("plot", trisWash, "-o", out, "--width", "800px", "--height", "500px")
	if code != ExitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	f, err := os.Open(out)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sig := make([]byte, 8)
	if _, err := io.ReadFull(f, sig); err != nil || string(sig) != "\x89PNG\r\n\x1a\n" {
		t.Fatalf("no PNG signature: %q %v", sig, err)
	}
	f.Seek(0, io.SeekStart)
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	if b := img.Bounds(); b.Dx() != 800 || b.Dy() != 500 {
		t.Errorf("%d × %d pixels, want 800 × 500", b.Dx(), b.Dy())
	}
}

func TestPlotErrors(t *testing.T) {
	dir := t.TempDir()
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"no output", []string{trisWash}, "usage: phgate plot"},
		{"wrong extension", []string{trisWash, "-o", filepath.Join(dir, "c.pdf")}, "must end in .svg or .png"},
		{"unknown kind", []string{trisWash, "--kind", "pie", "-o", filepath.Join(dir, "c.svg")}, `unknown chart kind "pie"`},
		{"unknown titrant", []string{trisWash, "--titrant", "lemonade", "-o", filepath.Join(dir, "c.svg")}, `unknown ingredient "lemonade"`},
		{"bad size", []string{trisWash, "--width", "3", "-o", filepath.Join(dir, "c.svg")}, "--width: cannot read length"},
		{"too small", []string{trisWash, "--width", "1cm", "-o", filepath.Join(dir, "c.svg")}, "at least 4 cm"},
		{"folder missing", []string{trisWash, "-o", filepath.Join(dir, "no", "such", "c.svg")}, "cannot write " + filepath.Join(dir, "no", "such", "c.svg")},
		{"not a recipe", []string{"../../examples/phgate.yaml", "-o", filepath.Join(dir, "c.svg")}, "not a recipe"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := chartRun(append([]string{"plot"}, tc.args...)...)
			if code != ExitProblem {
				t.Errorf("exit %d, want %d", code, ExitProblem)
			}
			if stdout != "" || !strings.Contains(stderr, tc.want) {
				t.Errorf("stdout %q, stderr %q, want %q", stdout, stderr, tc.want)
			}
		})
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Errorf("failed runs left files: %v", entries)
	}
}

// TestCapacityChartUsesTheRecipesMinimum: the eye rinse sets its own
// weak-buffer minimum (2 mM per pH), and its capacity chart draws that
// line rather than the rule's default of 5.
func TestCapacityChartUsesTheRecipesMinimum(t *testing.T) {
	out := filepath.Join(t.TempDir(), "cap.svg")
	code, _, stderr := chartRun("plot", "../../examples/recipes/ophthalmic/eye-rinse.yaml", "--kind", "capacity", "-o", out)
	if code != ExitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	data, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(data, []byte("minimum 2 mmol/L per pH")) {
		t.Errorf("the chart does not draw the recipe's own minimum of 2 mmol/L per pH")
	}
}
