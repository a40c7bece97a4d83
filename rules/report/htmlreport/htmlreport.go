package htmlreport

import (
	"bytes"
	"fmt"
	"html"
	"html/template"
	"io"
	"regexp"
	"slices"
	"sort"
	"strings"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/rules/report/chart"
	"gonum.org/v1/plot/vg"
)

// Section is one recipe of the report: its report model and its charts.
type Section struct {
	Recipe report.Recipe
	Charts []*chart.Chart
}

// Options adjusts the document.
type Options struct {
	// Title heads the document (default "phgate recipe report").
	Title string
	// Generator names the program and version in the footer.
	Generator string
}

// Write renders the report to w. Charts scale to the width of the page.
func Write(w io.Writer, sections []Section, opt Options) error {
	p := page{Title: opt.Title, Generator: opt.Generator, Caution: report.Caution}
	if p.Title == "" {
		p.Title = "phgate recipe report"
	}
	for i, s := range sections {
		v, err := newSectionView(i, s)
		if err != nil {
			return err
		}
		p.Recipes = append(p.Recipes, v)
	}
	var buf bytes.Buffer
	if err := pageTemplate.Execute(&buf, p); err != nil {
		return err
	}
	_, err := w.Write(buf.Bytes())
	return err
}

type page struct {
	Title, Generator, Caution string
	Recipes                   []sectionView
}

type fact struct {
	Label, Value, Note string
}

type ingredientRow struct {
	Name, Written, InProduct, PerBatch string
}

type systemRow struct {
	Name, Total, PKa, Dominant, Charge, States string
}

type findingView struct {
	Where, Severity, Class, Rule, Message, Fix, Waived string
}

// Each chart is drawn twice: WideSize for screens and print, NarrowSize
// (taller, so its text is larger once scaled to a phone's width) for
// narrow screens; the stylesheet shows one of them.
var (
	WideSize   = chart.DefaultSize
	NarrowSize = chart.Size{Width: 9.5 * vg.Centimeter, Height: 9 * vg.Centimeter, DPI: chart.DefaultSize.DPI}
)

// manyPanels: a chart with more panels than this (a peptide's many
// groups) is drawn taller, so each panel keeps a readable height.
const manyPanels = 4

// sizesFor returns the wide and narrow sizes of c.
func sizesFor(c *chart.Chart) (wide, narrow chart.Size) {
	wide, narrow = WideSize, NarrowSize
	if len(c.Panels) > manyPanels {
		wide.Height = wide.Height * 1.3
		narrow.Height = narrow.Height * 1.6
	}
	return wide, narrow
}

type chartView struct {
	Caption      string
	Wide, Narrow template.HTML
}

type sectionView struct {
	Anchor, Heading, Path string
	// Verdict is the one-line state of the recipe; VerdictClass styles it.
	Verdict, VerdictClass string
	PH, Window            string
	Counts                string
	Facts                 []fact
	Ingredients           []ingredientRow
	Adjustments           []string
	Systems               []systemRow
	PKaHeading            string
	Salts                 []fact
	Peptides              []string
	Warnings              []string
	Findings              []findingView
	Charts                []chartView
}

var anchorUnsafe = regexp.MustCompile(`[^a-z0-9-]+`)

func newSectionView(i int, s Section) (sectionView, error) {
	r := s.Recipe
	v := sectionView{
		Anchor:  fmt.Sprintf("r%d-%s", i+1, strings.Trim(anchorUnsafe.ReplaceAllString(strings.ToLower(r.Recipe), "-"), "-")),
		Heading: r.Recipe,
		Path:    r.Path,
		PH:      fmt.Sprintf("%.2f", r.PH),
		Window:  windowText(r.PHWindow),
	}
	if r.Title != "" {
		v.Heading += " — " + r.Title
	}
	v.Verdict, v.VerdictClass, v.Counts = verdict(r)
	unit := strings.TrimPrefix(r.ConcentrationUnit, "mol")
	basis := r.Basis
	if basis == "" {
		basis = "none (amounts are concentrations)"
	}
	// pH and its window head the section; the facts are the rest.
	v.Facts = []fact{
		{"temperature", fmt.Sprintf("%g °C", r.TemperatureC), r.ActivityTitle() + " activity model"},
		{"basis", basis, "concentrations in " + r.ConcentrationUnit},
		{"ionic strength", fmt.Sprintf("%.4g mol%s", r.IonicStrength, unit), ""},
		{"buffer capacity", fmt.Sprintf("%.4g mmol%s per pH", r.BufferCapacity*1000, unit), "acid or base that moves the pH by 1"},
		{"osmolarity", fmt.Sprintf("%.0f mOsm/L", r.Osmolarity), "ideal estimate"},
	}
	for _, l := range r.Ingredients {
		row := ingredientRow{Name: l.Ingredient, Written: l.Amount, InProduct: fmt.Sprintf("%.4g mmol%s", l.Conc*1000, unit),
			PerBatch: report.BatchText(l.Mol, l.Grams, l.Millilitres)}
		if strings.HasPrefix(l.Ingredient, "from ") {
			row.InProduct = fmt.Sprintf("%.4g %% v/v", l.Conc*100)
		}
		if l.QS {
			row.Written, row.InProduct = "q.s.", "to basis"
		}
		if row.Written == "" {
			row.Written = "q.s. to pH"
		}
		v.Ingredients = append(v.Ingredients, row)
	}
	for _, a := range r.Adjustments {
		v.Adjustments = append(v.Adjustments, fmt.Sprintf("q.s. %s to pH %g: %s", a.Use, a.TargetPH, report.AdjustAmount(a, r.ConcentrationUnit)))
	}
	v.PKaHeading = fmt.Sprintf("pKa at %g °C", r.TemperatureC)
	for _, s := range r.Systems {
		var pk, fr []string
		for _, p := range s.PKa {
			pk = append(pk, fmt.Sprintf("%.2f", p))
		}
		for _, sp := range s.Order {
			if f := s.Fractions[sp]; f >= 0.0005 {
				fr = append(fr, fmt.Sprintf("%s %.1f %%", sp, f*100))
			}
		}
		v.Systems = append(v.Systems, systemRow{Name: s.Name, Total: fmt.Sprintf("%.4g mmol%s", s.Total*1000, unit),
			PKa: strings.Join(pk, ", "), Dominant: s.Dominant, Charge: signed(s.MeanCharge), States: strings.Join(fr, ", ")})
	}
	// Closest to precipitating first, as phgate show lists them.
	salts := slices.Clone(r.Salts)
	sort.SliceStable(salts, func(i, j int) bool { return salts[i].SaturationIndex > salts[j].SaturationIndex })
	for _, s := range salts {
		note := "undersaturated"
		if s.SaturationIndex > 0 {
			note = "supersaturated: can precipitate"
		}
		v.Salts = append(v.Salts, fact{s.Name, signed(s.SaturationIndex), note})
	}
	for _, p := range r.Peptides {
		v.Peptides = append(v.Peptides, fmt.Sprintf("%s: net charge %+.2f per molecule, pI %.2f", p.Name, p.NetCharge, p.PI))
	}
	v.Warnings = r.Warnings
	for _, f := range r.Findings {
		fv := findingView{Where: fmt.Sprintf("line %d:%d", f.Line, f.Column), Severity: f.Severity.String(),
			Class: "sev-" + f.Severity.String(), Rule: f.Rule, Message: f.Message, Fix: f.Fix, Waived: f.Waived}
		if f.Waived != "" {
			fv.Severity, fv.Class = "waived", "sev-waived"
		}
		v.Findings = append(v.Findings, fv)
	}
	for _, c := range s.Charts {
		cv := chartView{Caption: captions[c.Kind]}
		wide, narrow := sizesFor(c)
		for _, d := range []struct {
			size chart.Size
			out  *template.HTML
		}{{wide, &cv.Wide}, {narrow, &cv.Narrow}} {
			var buf bytes.Buffer
			if err := c.Render(&buf, chart.SVG, d.size); err != nil {
				return sectionView{}, fmt.Errorf("%s: drawing the %s chart: %w", r.Recipe, c.Kind, err)
			}
			svg, err := inlineSVG(buf.Bytes(), c.Title)
			if err != nil {
				return sectionView{}, fmt.Errorf("%s: %s chart: %w", r.Recipe, c.Kind, err)
			}
			*d.out = svg
		}
		v.Charts = append(v.Charts, cv)
	}
	return v, nil
}

// captions say in a sentence what each chart is for.
var captions = map[chart.Kind]string{
	chart.Titration:   "Titration: where the recipe sits on its curve, and how steep the curve is around the target window.",
	chart.Species:     "Protonation states: which form of each acid–base system dominates at the recipe pH.",
	chart.Capacity:    "Buffer capacity against pH, with the minimum line: how fast the buffering falls off either side.",
	chart.Temperature: "pH against temperature, amounts as made: how far the pH drifts over the temperature range.",
}

// verdict sums the findings up in one line.
func verdict(r report.Recipe) (text, class, counts string) {
	var errs, warns, infos, waived int
	for _, f := range r.Findings {
		switch {
		case f.Waived != "":
			waived++
		case f.Severity == rules.Error:
			errs++
		case f.Severity == rules.Warning:
			warns++
		default:
			infos++
		}
	}
	var parts []string
	for _, c := range []struct {
		n    int
		word string
	}{{errs, "error"}, {warns, "warning"}, {infos, "note"}, {waived, "waived"}} {
		if c.n == 0 {
			continue
		}
		w := c.word
		if c.n > 1 && w != "waived" {
			w += "s"
		}
		parts = append(parts, fmt.Sprintf("%d %s", c.n, w))
	}
	counts = strings.Join(parts, " · ")
	switch {
	case errs > 0:
		return "needs attention", "verdict-err", counts
	case warns > 0:
		return "has warnings", "verdict-warn", counts
	}
	if counts == "" {
		counts = "no findings"
	}
	return "clean", "verdict-ok", counts
}

func windowText(w *report.Window) string {
	if w == nil || (w.Min == nil && w.Max == nil) {
		return "none set"
	}
	switch {
	case w.Min == nil:
		return fmt.Sprintf("≤ %.2f", *w.Max)
	case w.Max == nil:
		return fmt.Sprintf("≥ %.2f", *w.Min)
	}
	return fmt.Sprintf("%.2f – %.2f", *w.Min, *w.Max)
}

// signed writes x with two decimals, a sign, and a true minus.
func signed(x float64) string {
	return strings.Replace(fmt.Sprintf("%+.2f", x), "-", "−", 1)
}

var viewBoxRE = regexp.MustCompile(`viewBox="([0-9. ]+)"`)

// inlineSVG turns a standalone SVG document from chart.Render into an
// element for the page: the XML declaration and comment go, and the fixed
// width and height give way to the viewBox so the chart scales with its
// box. gonum/plot's SVG declares no id attributes, so several charts on
// one page cannot clash.
func inlineSVG(b []byte, label string) (template.HTML, error) {
	s := string(b)
	start := strings.Index(s, "<svg")
	if start < 0 {
		return "", fmt.Errorf("no <svg> element in the drawing")
	}
	s = s[start:]
	end := strings.IndexByte(s, '>')
	m := viewBoxRE.FindStringSubmatch(s[:max(end, 0)])
	if end < 0 || m == nil {
		return "", fmt.Errorf("the drawing's <svg> element has no viewBox")
	}
	if strings.Contains(s, " id=") {
		return "", fmt.Errorf("the drawing declares ids, which could clash between charts")
	}
	head := fmt.Sprintf(`<svg viewBox="%s" xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" role="img" aria-label="%s"`,
		m[1], html.EscapeString(label))
	return template.HTML(head + s[end:]), nil
}
