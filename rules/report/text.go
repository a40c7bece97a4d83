package report

import (
	"fmt"
	"io"
	"strings"

	"github.com/fatih/color"
	"github.com/phgate/phgate/rules"
)

// Text writes a report for people: one block per recipe file with the
// key results and its findings, problems after, and a one-line tally.
// Colour is used only when Color is set (the caller decides from the
// terminal and NO_COLOR).
type Text struct {
	Color bool
}

func (t *Text) paint(attrs ...color.Attribute) func(a ...any) string {
	return Palette{On: t.Color}.Paint(attrs...)
}

// Palette paints parts of the output when On; it keeps colour state on
// the formatter value rather than in a package global.
type Palette struct {
	On bool
}

// Paint returns a function that renders its arguments with attrs, or
// plainly when the palette is off.
func (p Palette) Paint(attrs ...color.Attribute) func(a ...any) string {
	c := color.New(attrs...)
	if p.On {
		c.EnableColor()
	} else {
		c.DisableColor()
	}
	return c.SprintFunc()
}

// Severities returns the paint of each severity, the same in every
// text output.
func (p Palette) Severities() map[rules.Severity]func(a ...any) string {
	return map[rules.Severity]func(a ...any) string{
		rules.Error:   p.Paint(color.FgHiRed, color.Bold),
		rules.Warning: p.Paint(color.FgYellow),
		rules.Info:    p.Paint(color.FgCyan),
	}
}

// Write implements Formatter.
func (t *Text) Write(w io.Writer, rep *Report) error { return writeAll(t, w, rep) }

// WriteRecipe implements Streamer: the recipe's block.
func (t *Text) WriteRecipe(w io.Writer, r *Recipe) error {
	bold := t.paint(color.Bold)
	dim := t.paint(color.Faint)
	var b strings.Builder
	fmt.Fprintf(&b, "%s  %s\n", bold(r.Path), dim(r.Recipe))
	fmt.Fprintf(&b, "    %s\n", Headline(*r))
	for _, a := range r.Adjustments {
		fmt.Fprintf(&b, "    q.s. %s to pH %g: %s%s\n", a.Use, a.TargetPH, AdjustAmount(a, r.ConcentrationUnit), assumedBasis(r))
	}
	t.findings(&b, r.Findings)
	b.WriteString("\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteEnd implements Streamer: project findings, problems and the tally.
func (t *Text) WriteEnd(w io.Writer, rep *Report) error {
	bold := t.paint(color.Bold)
	dim := t.paint(color.Faint)
	sevPaint := Palette{On: t.Color}.Severities()
	var b strings.Builder
	for i := 0; i < len(rep.Findings); {
		j := i
		for j < len(rep.Findings) && rep.Findings[j].Path == rep.Findings[i].Path {
			j++
		}
		fmt.Fprintf(&b, "%s  %s\n", bold(rep.Findings[i].Path), dim("project settings"))
		t.findings(&b, rep.Findings[i:j])
		b.WriteString("\n")
		i = j
	}
	if len(rep.Problems) > 0 {
		fmt.Fprintf(&b, "%s\n", bold("could not check:"))
		for _, p := range rep.Problems {
			fmt.Fprintf(&b, "    %s\n", p.Error())
		}
		b.WriteString("\n")
	}
	s := rep.Summary
	parts := s.Tally()
	if s.Skipped > 0 {
		parts = append(parts, fmt.Sprintf("%d other YAML skipped", s.Skipped))
	}
	verdict := t.paint(color.FgGreen, color.Bold)("pass")
	if s.Errors > 0 || s.Problems > 0 {
		verdict = sevPaint[rules.Error]("fail")
	}
	fmt.Fprintf(&b, "%s  %s\n", verdict, strings.Join(parts, " · "))
	_, err := io.WriteString(w, b.String())
	return err
}

// findings writes findings aligned on their line:column, with the fix
// hint under each and waived findings dimmed with their reason.
func (t *Text) findings(b *strings.Builder, fs []rules.Finding) {
	bold := t.paint(color.Bold)
	dim := t.paint(color.Faint)
	sevPaint := Palette{On: t.Color}.Severities()
	width := 0
	for _, f := range fs {
		width = max(width, len(fmt.Sprintf("%d:%d", f.Line, f.Column)))
	}
	for _, f := range fs {
		pos := fmt.Sprintf("%d:%d", f.Line, f.Column)
		if f.Waived != "" {
			fmt.Fprintf(b, "    %-*s  %-7s  %s  %s %s\n", width, pos, "waived", f.Rule, f.Message, dim("(waived: "+f.Waived+")"))
			continue
		}
		fmt.Fprintf(b, "    %-*s  %s  %s  %s\n", width, pos, sevPaint[f.Severity](fmt.Sprintf("%-7s", f.Severity.String())), bold(f.Rule), f.Message)
		if f.Fix != "" {
			fmt.Fprintf(b, "    %-*s           %s\n", width, "", dim("→ "+f.Fix))
		}
	}
}

// Headline is the one-line summary of a recipe's chemistry.
func Headline(r Recipe) string {
	window := ""
	if w := r.PHWindow; w != nil {
		lo, hi := "…", "…"
		if w.Min != nil {
			lo = fmt.Sprintf("%.2f", *w.Min)
		}
		if w.Max != nil {
			hi = fmt.Sprintf("%.2f", *w.Max)
		}
		window = fmt.Sprintf(" (target %s–%s)", lo, hi)
	}
	osm := "mOsm/L"
	if r.ConcentrationUnit == "mol/kg" {
		osm = "mOsm/kg"
	}
	return fmt.Sprintf("pH %.2f%s at %g °C · ionic strength %.3g %s · buffer capacity %.3g m%s per pH · %.0f %s",
		r.PH, window, r.TemperatureC, r.IonicStrength, r.ConcentrationUnit, r.BufferCapacity*1000, r.ConcentrationUnit, r.Osmolarity, osm)
}

// AdjustAmount renders a q.s. amount in the units a formulator weighs.
func AdjustAmount(a Adjust, concUnit string) string {
	parts := []string{}
	if a.Mol != 0 {
		parts = append(parts, fmt.Sprintf("%.4g mmol", a.Mol*1000))
		if a.Grams != 0 {
			parts = append(parts, fmt.Sprintf("%.4g g pure", a.Grams))
		}
		if a.Millilitres != 0 {
			parts = append(parts, fmt.Sprintf("%.4g mL of stock", a.Millilitres))
		}
	} else {
		parts = append(parts, fmt.Sprintf("%.4g m%s", a.Conc*1000, concUnit))
	}
	return strings.Join(parts, " = ")
}

func plural(n int, word string) string {
	if n == 1 {
		return fmt.Sprintf("1 %s", word)
	}
	return fmt.Sprintf("%d %ss", n, word)
}

// Tally is the summary as short counted phrases ("3 recipes", "1 error").
func (s Summary) Tally() []string {
	parts := []string{plural(s.Recipes, "recipe"), plural(s.Errors, "error"), plural(s.Warnings, "warning")}
	if s.Infos > 0 {
		parts = append(parts, plural(s.Infos, "note"))
	}
	if s.Waived > 0 {
		parts = append(parts, fmt.Sprintf("%d waived", s.Waived))
	}
	return append(parts, plural(s.Problems, "problem"))
}

// assumedBasis notes when per-batch amounts are per litre only because
// the recipe gives no basis.
func assumedBasis(r *Recipe) string {
	if r.BasisAssumed {
		return " per litre (the recipe gives no basis)"
	}
	return ""
}
