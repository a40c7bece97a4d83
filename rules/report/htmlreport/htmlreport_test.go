package htmlreport

import (
	"bytes"
	"encoding/xml"
	"io"
	"path/filepath"
	"strings"
	"testing"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/rules/report/chart"
	"github.com/phgate/phgate/spec/project"
)

func sections(t *testing.T, rels ...string) []Section {
	t.Helper()
	var out []Section
	for _, rel := range rels {
		path := filepath.Join("..", "..", "..", "examples", "recipes", rel)
		run := project.Discover([]string{path})
		res, ps := run.Files[0].Evaluate()
		if len(ps) > 0 {
			t.Fatalf("%s: %v", path, ps)
		}
		charts, err := chart.All(res, chart.Options{Points: 31})
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, Section{Recipe: report.Build(res, rules.Check(res)), Charts: charts})
	}
	return out
}

// element is a parsed element with its attributes and children.
type element struct {
	name     string
	attrs    map[string]string
	children []*element
	text     strings.Builder
}

// parse reads the document with encoding/xml in strict mode: the report
// promises well-formed output.
func parse(t *testing.T, doc []byte) *element {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(doc))
	root := &element{name: "#document"}
	stack := []*element{root}
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the report is not well-formed: %v", err)
		}
		top := stack[len(stack)-1]
		switch el := tok.(type) {
		case xml.StartElement:
			e := &element{name: el.Name.Local, attrs: map[string]string{}}
			for _, a := range el.Attr {
				e.attrs[a.Name.Local] = a.Value
			}
			top.children = append(top.children, e)
			stack = append(stack, e)
		case xml.EndElement:
			stack = stack[:len(stack)-1]
		case xml.CharData:
			for _, e := range stack {
				e.text.Write(el)
			}
		}
	}
	if len(stack) != 1 {
		t.Fatalf("%d elements left open", len(stack)-1)
	}
	return root
}

func (e *element) all(name string, out []*element) []*element {
	for _, c := range e.children {
		if c.name == name {
			out = append(out, c)
		}
		out = c.all(name, out)
	}
	return out
}

func hasClass(e *element, class string) bool {
	for _, c := range strings.Fields(e.attrs["class"]) {
		if c == class {
			return true
		}
	}
	return false
}

func TestReportStructure(t *testing.T) {
	secs := sections(t, "bioprocess/tris-wash-cold.yaml", "peptides/fh-p12-solution.yaml", "ophthalmic/eye-rinse.yaml")
	var buf bytes.Buffer
	if err := Write(&buf, secs, Options{Generator: "phgate test"}); err != nil {
		t.Fatal(err)
	}
	doc := parse(t, buf.Bytes())
	var recipes []*element
	for _, s := range doc.all("section", nil) {
		if hasClass(s, "recipe") {
			recipes = append(recipes, s)
		}
	}
	if len(recipes) != len(secs) {
		t.Fatalf("%d recipe sections, want %d", len(recipes), len(secs))
	}
	for i, s := range recipes {
		id := secs[i].Recipe.Recipe
		text := s.text.String()
		if !strings.Contains(text, id) {
			t.Errorf("section %d does not name %s", i, id)
		}
		figs := s.all("figure", nil)
		if len(figs) != 4 {
			t.Errorf("%s: %d figures, want 4", id, len(figs))
		}
		for k, f := range figs {
			// One drawing for wide screens and print, one for phones.
			for _, div := range f.all("div", nil) {
				svgs := div.all("svg", nil)
				if len(svgs) != 1 {
					t.Errorf("%s figure %d, %s: %d svg elements", id, k, div.attrs["class"], len(svgs))
					continue
				}
				if svgs[0].attrs["viewBox"] == "" || svgs[0].attrs["width"] != "" {
					t.Errorf("%s figure %d: svg attributes %v, want a viewBox and no fixed width", id, k, svgs[0].attrs)
				}
				if want := secs[i].Charts[k].Title; !strings.Contains(svgs[0].text.String(), want) {
					t.Errorf("%s figure %d: chart title %q missing", id, k, want)
				}
			}
			if n := len(f.all("div", nil)); n != 2 {
				t.Errorf("%s figure %d: %d drawings, want a wide and a narrow one", id, k, n)
			}
		}
		if !strings.Contains(text, report.Caution) {
			t.Errorf("%s: caution missing", id)
		}
		if len(s.all("table", nil)) < 2 {
			t.Errorf("%s: ingredient and system tables missing", id)
		}
	}
	// Self-contained: no scripts, no external resources, ids unique.
	if n := len(doc.all("script", nil)); n != 0 {
		t.Errorf("%d script elements", n)
	}
	ids := map[string]bool{}
	var walk func(e *element)
	walk = func(e *element) {
		for k, v := range e.attrs {
			if (k == "src" || k == "href") && !strings.HasPrefix(v, "#") {
				t.Errorf("<%s %s=%q> points outside the file", e.name, k, v)
			}
			if k == "id" {
				if ids[v] {
					t.Errorf("id %q used twice", v)
				}
				ids[v] = true
			}
		}
		for _, c := range e.children {
			walk(c)
		}
	}
	walk(doc)
	styles := doc.all("style", nil)
	if len(styles) != 1 || !strings.Contains(styles[0].text.String(), "@media print") ||
		!strings.Contains(styles[0].text.String(), "max-width: 760px") {
		t.Error("inline stylesheet with print and narrow-screen rules missing")
	}
	if strings.Contains(styles[0].text.String(), "@import") || strings.Contains(styles[0].text.String(), "url(") {
		t.Error("the stylesheet fetches something")
	}
}

func TestVerdict(t *testing.T) {
	tests := []struct {
		name     string
		findings []rules.Finding
		class    string
		counts   string
	}{
		{"clean", nil, "verdict-ok", "no findings"},
		{"error wins", []rules.Finding{{Severity: rules.Warning}, {Severity: rules.Error}, {Severity: rules.Error}}, "verdict-err", "2 errors · 1 warning"},
		{"waived only", []rules.Finding{{Severity: rules.Error, Waived: "agreed"}}, "verdict-ok", "1 waived"},
		{"notes", []rules.Finding{{Severity: rules.Info}}, "verdict-ok", "1 note"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, class, counts := verdict(report.Recipe{Findings: tc.findings})
			if class != tc.class || counts != tc.counts {
				t.Errorf("got %s %q, want %s %q", class, counts, tc.class, tc.counts)
			}
		})
	}
}

func TestInlineSVG(t *testing.T) {
	in := []byte("<?xml version=\"1.0\"?>\n<!-- gen -->\n<svg width=\"10pt\" height=\"5pt\" viewBox=\"0 0 10 5\"\n\txmlns=\"http://www.w3.org/2000/svg\">\n<g/></svg>\n")
	got, err := inlineSVG(in, `a "b" <c>`)
	if err != nil {
		t.Fatal(err)
	}
	s := string(got)
	if strings.Contains(s, "<?xml") || strings.Contains(s, "width=") || !strings.Contains(s, `viewBox="0 0 10 5"`) ||
		!strings.Contains(s, `aria-label="a &#34;b&#34; &lt;c&gt;"`) {
		t.Errorf("inlined: %s", s)
	}
	if _, err := inlineSVG([]byte(`<svg viewBox="0 0 1 1"><g id="x"/></svg>`), ""); err == nil {
		t.Error("an SVG with ids was accepted")
	}
}
