package chart

import (
	"bytes"
	"encoding/xml"
	"image/png"
	"io"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec/evaluate"
	"github.com/phgate/phgate/spec/project"
	"gonum.org/v1/plot/vg"
)

// solve loads and solves a recipe of the demo repository.
func solve(t *testing.T, rel string) *evaluate.Result {
	t.Helper()
	path := filepath.Join("..", "..", "..", "examples", "recipes", rel)
	run := project.Discover([]string{path})
	if len(run.Files) != 1 {
		t.Fatalf("%s: found %d files", path, len(run.Files))
	}
	res, ps := run.Files[0].Evaluate()
	if len(ps) > 0 {
		t.Fatalf("%s: %v", path, ps)
	}
	return res
}

// The titration chart's points are the engine's own solutions: every
// plotted pH equals solver.Solve of the starting mixture with that amount
// of titrant added (the same computation, so 1e-9 is plenty).
func TestTitrationAgreesWithSolve(t *testing.T) {
	tests := []struct {
		name, recipe, titrant string
		sweeps                int
	}{
		{"q.s. titrant", "bioprocess/tris-wash-cold.yaml", "", 1},
		{"q.s. titrant on a molal basis", "cosmetics/aha-lotion.yaml", "", 1},
		{"other titrant", "bioprocess/tris-wash-cold.yaml", "sodium-hydroxide", 1},
		{"no titrant: acid and base", "ophthalmic/eye-rinse.yaml", "", 2},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			res := solve(t, tc.recipe)
			c, err := Build(res, Titration, Options{Titrant: tc.titrant, Points: 41})
			if err != nil {
				t.Fatal(err)
			}
			if got := len(c.Titration.Sweeps); got != tc.sweeps {
				t.Fatalf("%d sweeps, want %d", got, tc.sweeps)
			}
			for si, s := range c.Titration.Sweeps {
				series := c.Panels[0].Series[si]
				for i, a := range s.Amounts {
					eq, err := solver.Solve(s.Base.With(s.Component, a))
					if err != nil {
						t.Fatal(err)
					}
					if math.Abs(eq.PH-s.PH[i]) > 1e-9 || math.Abs(series.Y[i]-eq.PH) > 1e-9 {
						t.Errorf("%s at %g mol/L: chart pH %g, solver %g", s.Titrant, a, series.Y[i], eq.PH)
					}
					wantX := s.Sign * a * c.Titration.PerBatch * 1000
					if math.Abs(series.X[i]-wantX) > 1e-9*math.Max(1, math.Abs(wantX)) {
						t.Errorf("x %g, want %g mmol per batch", series.X[i], wantX)
					}
				}
			}
		})
	}
}

// The q.s. sweep starts from the recipe before adjustment, so adding the
// q.s. amount back gives the recipe's own pH, and the recipe point lies on
// the curve.
func TestTitrationStartsBeforeQS(t *testing.T) {
	res := solve(t, "bioprocess/tris-wash-cold.yaml")
	c, err := Build(res, Titration, Options{})
	if err != nil {
		t.Fatal(err)
	}
	s := c.Titration.Sweeps[0]
	a := res.Adjustment.Conc
	eq, err := solver.Solve(s.Base.With(s.Component, a))
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(eq.PH-res.Equilibrium.PH) > 1e-9 {
		t.Errorf("base + q.s. amount: pH %g, recipe %g", eq.PH, res.Equilibrium.PH)
	}
	if last := s.Amounts[len(s.Amounts)-1]; math.Abs(last-2*a) > 1e-15 {
		t.Errorf("sweep ends at %g, want twice the q.s. amount %g", last, 2*a)
	}
	m := c.Panels[0].Marks[0]
	if want := a * 10 * 1000; math.Abs(m.X-want) > 1e-9 { // 10 L batch
		t.Errorf("recipe point at %g mmol, want %g", m.X, want)
	}
	// 1 M stock: 1 mmol is 1 mL.
	if alt := c.Panels[0].X.Alt; alt == nil || math.Abs(alt.Factor-1) > 1e-9 {
		t.Errorf("mL scale %+v, want 1 mL per mmol", alt)
	}
}

func TestTitrantUnknown(t *testing.T) {
	res := solve(t, "bioprocess/tris-wash-cold.yaml")
	_, err := Build(res, Titration, Options{Titrant: "sodium-hydroxyde"})
	if err == nil || !strings.Contains(err.Error(), "sodium-hydroxide") {
		t.Fatalf("error %v, want a suggestion of sodium-hydroxide", err)
	}
}

func TestSpeciesFractions(t *testing.T) {
	res := solve(t, "beverages/calcium-drink.yaml")
	c, err := Build(res, Species, Options{Points: 29})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Panels) != len(res.Mixture.Systems) {
		t.Fatalf("%d panels for %d systems", len(c.Panels), len(res.Mixture.Systems))
	}
	for _, p := range c.Panels {
		if len(p.Series) == 0 || len(p.Series[0].X) != 29 {
			t.Fatalf("panel %q: want series of 29 points", p.Title)
		}
		for i := range p.Series[0].X {
			sum := 0.0
			for _, s := range p.Series {
				sum += s.Y[i]
			}
			if math.Abs(sum-1) > 1e-12 {
				t.Errorf("%s at pH %g: fractions sum to %g", p.Title, p.Series[0].X[i], sum)
			}
		}
	}
}

// At the recipe's own pH the capacity curve is Equilibrium.BufferCapacity
// (solver.CapacityCurve's documented contract), shown in mM per pH.
func TestCapacityInMillimolar(t *testing.T) {
	res := solve(t, "ophthalmic/eye-rinse.yaml")
	c, err := Build(res, Capacity, Options{})
	if err != nil {
		t.Fatal(err)
	}
	want, err := solver.CapacityCurve(res.Mixture, []float64{res.Equilibrium.PH})
	if err != nil {
		t.Fatal(err)
	}
	if m := c.Panels[0].Marks[0]; math.IsNaN(m.Y) || math.Abs(m.Y-want[0]*1000) > 1e-9*math.Abs(want[0]*1000) {
		t.Errorf("recipe point %g mM per pH, curve %g", m.Y, want[0]*1000)
	}
	if r := c.Panels[0].Refs[0]; math.Abs(r.At-5) > 1e-12 { // 5 mM per pH, common practice
		t.Errorf("minimum line at %g, want 5", r.At)
	}
}

func TestTemperatureRange(t *testing.T) {
	tests := []struct {
		name, recipe string
		lo, hi       float64
	}{
		{"declared range", "bioprocess/tris-wash-cold.yaml", 4, 25},
		{"nominal ± 10 °C", "ophthalmic/eye-rinse.yaml", 15, 35},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			c, err := Build(solve(t, tc.recipe), Temperature, Options{})
			if err != nil {
				t.Fatal(err)
			}
			x := c.Panels[0].Series[0].X
			if x[0] != tc.lo || x[len(x)-1] != tc.hi {
				t.Errorf("temperatures %g–%g, want %g–%g", x[0], x[len(x)-1], tc.lo, tc.hi)
			}
		})
	}
}

// svgTexts parses an SVG with encoding/xml and returns its text elements.
func svgTexts(t *testing.T, b []byte) (texts []string, paths int) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(b))
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
			if el.Name.Local == "path" {
				paths++
			}
		case xml.CharData:
			if inText {
				texts = append(texts, string(el))
			}
		case xml.EndElement:
			inText = false
		}
	}
	return texts, paths
}

func TestRenderSVG(t *testing.T) {
	res := solve(t, "beverages/lemon-syrup.yaml")
	charts, err := All(res, Options{Points: 41})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range charts {
		t.Run(c.Kind.String(), func(t *testing.T) {
			var buf bytes.Buffer
			if err := c.Render(&buf, SVG, DefaultSize); err != nil {
				t.Fatal(err)
			}
			texts, paths := svgTexts(t, buf.Bytes())
			all := strings.Join(texts, "\n")
			if !strings.Contains(all, c.Title) {
				t.Errorf("title %q missing", c.Title)
			}
			n := 0
			for _, p := range c.Panels {
				for _, s := range p.Series {
					n++
					if !strings.Contains(all, s.Label) {
						t.Errorf("legend entry %q missing", s.Label)
					}
				}
			}
			if paths < n {
				t.Errorf("%d paths for %d series", paths, n)
			}
			if strings.Contains(buf.String(), "font-family:Liberation Sans;") {
				t.Error("font family without fallbacks")
			}
		})
	}
}

func TestRenderPNGSize(t *testing.T) {
	res := solve(t, "bioprocess/tris-wash-cold.yaml")
	c, err := Build(res, Temperature, Options{Points: 11})
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		size Size
		w, h int
	}{
		{"default 16 × 10 cm at 96 dpi", DefaultSize, 605, 378},
		{"pixels", Size{Width: 800 * vg.Inch / 96, Height: 500 * vg.Inch / 96, DPI: 96}, 800, 500},
		{"print resolution", Size{Width: 4 * vg.Inch, Height: 3 * vg.Inch, DPI: 300}, 1200, 900},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var buf bytes.Buffer
			if err := c.Render(&buf, PNG, tc.size); err != nil {
				t.Fatal(err)
			}
			if !bytes.HasPrefix(buf.Bytes(), []byte("\x89PNG\r\n\x1a\n")) {
				t.Fatal("no PNG signature")
			}
			img, err := png.Decode(&buf)
			if err != nil {
				t.Fatal(err)
			}
			if b := img.Bounds(); b.Dx() != tc.w || b.Dy() != tc.h {
				t.Errorf("%d × %d pixels, want %d × %d", b.Dx(), b.Dy(), tc.w, tc.h)
			}
		})
	}
}

func TestParseLength(t *testing.T) {
	tests := []struct {
		in   string
		want vg.Length
		ok   bool
	}{
		{"16cm", 16 * vg.Centimeter, true},
		{"120 mm", 120 * vg.Millimeter, true},
		{"4in", 4 * vg.Inch, true},
		{"300pt", 300, true},
		{"96px", vg.Inch, true},
		{"16", 0, false},
		{"-3cm", 0, false},
		{"NaNcm", 0, false},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			got, err := ParseLength(tc.in, 96)
			if (err == nil) != tc.ok {
				t.Fatalf("error %v, want ok=%v", err, tc.ok)
			}
			if tc.ok && math.Abs(float64(got-tc.want)) > 1e-9 {
				t.Errorf("%g pt, want %g", got, tc.want)
			}
		})
	}
}

func TestParseKindAndFormat(t *testing.T) {
	for _, k := range Kinds {
		got, err := ParseKind(strings.ToUpper(k.String()))
		if err != nil || got != k {
			t.Errorf("ParseKind(%q) = %v, %v", k, got, err)
		}
	}
	if _, err := ParseKind("histogram"); err == nil {
		t.Error("unknown kind accepted")
	}
	if f, err := FormatOf("a/b.PNG"); err != nil || f != PNG {
		t.Errorf("FormatOf .PNG = %v, %v", f, err)
	}
	if _, err := FormatOf("chart.pdf"); err == nil {
		t.Error(".pdf accepted")
	}
}
