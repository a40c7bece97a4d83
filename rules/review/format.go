package review

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"github.com/fatih/color"
	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/spec/diag"
)

// Formatter writes a finished comparison.
type Formatter interface {
	Write(w io.Writer, d *Diff) error
}

// ByName returns the formatter for a --format value: text, json or
// markdown. Colour applies to text only.
func ByName(name string, color bool) (Formatter, error) {
	switch name {
	case "text", "":
		return &Text{Color: color}, nil
	case "json":
		return JSON{}, nil
	case "markdown", "md":
		return Markdown{}, nil
	}
	return nil, fmt.Errorf("unknown format %q (use text, json or markdown)", name)
}

// JSON writes the comparison as indented JSON.
type JSON struct{}

// Write implements Formatter.
func (JSON) Write(w io.Writer, d *Diff) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(d)
}

// Text writes the comparison for people at a terminal: one block per
// changed recipe, then problems, changed inputs, a tally and the gates.
type Text struct {
	// Color turns on colour (the caller decides from the terminal and
	// NO_COLOR).
	Color bool
}

func (t *Text) paint(attrs ...color.Attribute) func(a ...any) string {
	return report.Palette{On: t.Color}.Paint(attrs...)
}

// Write implements Formatter.
func (t *Text) Write(w io.Writer, d *Diff) error {
	bold, dim := t.paint(color.Bold), t.paint(color.Faint)
	statusPaint := map[Status]func(a ...any) string{
		Modified:  t.paint(color.FgYellow, color.Bold),
		Renamed:   t.paint(color.FgCyan, color.Bold),
		Added:     t.paint(color.FgGreen, color.Bold),
		Removed:   t.paint(color.FgRed, color.Bold),
		Unchanged: t.paint(color.Faint),
	}
	sevPaint := report.Palette{On: t.Color}.Severities()
	var b strings.Builder
	fmt.Fprintf(&b, "%s %s → %s\n\n", bold("comparing"), d.Old.Label, d.New.Label)
	for _, c := range d.Changes {
		where := c.path()
		if c.Status == Renamed {
			where = c.OldPath + " → " + c.NewPath
		}
		fmt.Fprintf(&b, "%s %s  %s\n", statusPaint[c.Status](fmt.Sprintf("%-9s", c.Status)), bold(where), dim(c.Recipe))
		for _, line := range changeLines(c) {
			fmt.Fprintf(&b, "    %s\n", line)
		}
		for _, f := range c.NewFindings {
			fmt.Fprintf(&b, "    %s %s  %s  %s\n", sevPaint[rules.Error]("new "), sevPaint[f.Severity](fmt.Sprintf("%-7s", f.Severity)), f.Rule, f.Message)
		}
		for _, f := range c.GoneFindings {
			fmt.Fprintf(&b, "    %s %-7s  %s  %s\n", t.paint(color.FgGreen)("gone"), f.Severity, f.Rule, f.Message)
		}
		b.WriteString("\n")
	}
	for _, side := range []struct {
		name string
		ps   []string
	}{{"old", problemTexts(d.Problems.Old)}, {"new", problemTexts(d.Problems.New)}} {
		if len(side.ps) == 0 {
			continue
		}
		fmt.Fprintf(&b, "%s\n", bold("problems on the "+side.name+" side:"))
		for _, p := range side.ps {
			fmt.Fprintf(&b, "    %s\n", p)
		}
		b.WriteString("\n")
	}
	if len(d.InputsChanged) > 0 {
		fmt.Fprintf(&b, "%s %s\n\n", bold("config and catalog files changed:"), strings.Join(d.InputsChanged, ", "))
	}
	fmt.Fprintf(&b, "%s\n", tally(d))
	for _, g := range d.GatesCrossed {
		fmt.Fprintf(&b, "%s %s\n", sevPaint[rules.Error]("gate crossed:"), g)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// changeLines renders what moved in one change, one fact a line.
func changeLines(c Change) []string {
	var out []string
	switch {
	case c.Before != nil && c.After != nil && c.Before.PH != nil && c.After.PH != nil:
		unit := c.After.ConcentrationUnit
		out = append(out, fmt.Sprintf("pH %.2f → %.2f (ΔpH %s) · buffer capacity %.3g → %.3g m%s per pH (%s) · ionic strength %.3g → %.3g %s (%s)",
			*c.Before.PH, *c.After.PH, signed(*c.DeltaPH),
			*c.Before.BufferCapacity*1000, *c.After.BufferCapacity*1000, unit, signed(*c.DeltaBufferCapacity*1000),
			*c.Before.IonicStrength, *c.After.IonicStrength, unit, signed(*c.DeltaIonicStrength)))
	default:
		for _, s := range []struct {
			side string
			st   *State
		}{{"before", c.Before}, {"after", c.After}} {
			switch {
			case s.st == nil:
			case s.st.PH != nil:
				out = append(out, fmt.Sprintf("%s: pH %.2f · buffer capacity %.3g m%s per pH · ionic strength %.3g %s",
					s.side, *s.st.PH, *s.st.BufferCapacity*1000, s.st.ConcentrationUnit, *s.st.IonicStrength, s.st.ConcentrationUnit))
			default:
				for _, p := range problemTexts(s.st.Problems) {
					out = append(out, fmt.Sprintf("%s: cannot solve: %s", s.side, p))
				}
			}
		}
	}
	if why := causeText(c, false); why != "" {
		out = append(out, why)
	}
	for _, q := range c.QS {
		out = append(out, fmt.Sprintf("q.s. %s: %s", q.Use, fromTo(adjustText(q.Before), adjustText(q.After))))
	}
	for _, dc := range c.Dominant {
		out = append(out, fmt.Sprintf("dominant %s species: %s", dc.System, fromTo(dc.Before, dc.After)))
	}
	for _, ic := range c.Ingredients {
		out = append(out, fmt.Sprintf("%s: %s", ic.Ingredient, ingredientText(ic)))
	}
	return out
}

// causeText says why a paired recipe moved; md selects markdown quoting.
func causeText(c Change, md bool) string {
	if c.Status == Added || c.Status == Removed || c.Status == Unchanged && len(c.Causes) == 0 {
		return ""
	}
	q := func(s string) string { return s }
	if md {
		q = code
	}
	var parts []string
	for _, k := range c.Causes {
		var s string
		switch k.Kind {
		case CauseStock:
			s = "stock recipe " + q(k.Name)
		case CauseCatalog:
			s = "catalog " + k.Name
			if section, id, ok := strings.Cut(k.Name, " "); ok && k.Name != peptideKey {
				s = "catalog " + section + " " + q(id)
			}
		case CauseConfig:
			s = q(k.Name)
		}
		var extra []string
		if k.Path != "" && k.Kind != CauseConfig && !strings.HasPrefix(k.Path, "data/") {
			extra = append(extra, q(k.Path))
		}
		if k.Note != "" {
			extra = append(extra, k.Note)
		}
		if len(extra) > 0 {
			s += " (" + strings.Join(extra, ", ") + ")"
		}
		parts = append(parts, s)
	}
	switch {
	case c.RecipeEdited && len(parts) > 0:
		return "recipe edited; also changed: " + strings.Join(parts, ", ")
	case c.RecipeEdited:
		return "recipe edited"
	case len(parts) > 0:
		return "recipe file unchanged; moved by a change to " + strings.Join(parts, ", ")
	}
	return ""
}

func signed(x float64) string {
	if x == 0 {
		return "0"
	}
	return fmt.Sprintf("%+.3g", x)
}

func fromTo(a, b string) string {
	if a == "" {
		a = "none"
	}
	if b == "" {
		b = "none"
	}
	return a + " → " + b
}

func adjustText(a *report.Adjust) string {
	if a == nil {
		return ""
	}
	return report.AdjustAmount(*a, "mol/L")
}

func ingredientText(ic IngredientChange) string {
	b, a := ic.Before, ic.After
	switch {
	case b == nil:
		return "added, " + lineAmount(a)
	case a == nil:
		return "removed (was " + lineAmount(b) + ")"
	case b.Amount != a.Amount:
		return fromTo(lineAmount(b), lineAmount(a))
	}
	return fmt.Sprintf("%s, %.4g → %.4g mol/L in the product", lineAmount(a), b.Conc, a.Conc)
}

func lineAmount(l *report.Line) string {
	switch {
	case l.QS:
		return "q.s."
	case l.Amount != "":
		return l.Amount
	}
	return fmt.Sprintf("%.4g mol/L", l.Conc)
}

func problemTexts(ps []diag.Problem) []string {
	out := make([]string, 0, len(ps))
	for _, p := range ps {
		out = append(out, p.Error())
	}
	return out
}

// tally is the closing line: counts and the largest pH shift.
func tally(d *Diff) string {
	n := map[Status]int{}
	var top *Change
	for i, c := range d.Changes {
		n[c.Status]++
		if c.DeltaPH != nil && (top == nil || math.Abs(c.rawDeltaPH) > math.Abs(top.rawDeltaPH)) {
			top = &d.Changes[i]
		}
	}
	parts := []string{fmt.Sprintf("%d modified", n[Modified]), fmt.Sprintf("%d renamed", n[Renamed]),
		fmt.Sprintf("%d added", n[Added]), fmt.Sprintf("%d removed", n[Removed]), fmt.Sprintf("%d unchanged", d.Unchanged)}
	if top != nil && top.rawDeltaPH != 0 {
		parts = append(parts, fmt.Sprintf("largest |ΔpH| %.3g (%s)", math.Abs(*top.DeltaPH), top.Recipe))
	}
	return strings.Join(parts, " · ")
}

// Markdown writes a comment for a pull request: a table of the changed
// recipes sorted by |ΔpH|, largest first, then gates and problems.
type Markdown struct{}

// Write implements Formatter.
func (Markdown) Write(w io.Writer, d *Diff) error {
	var b strings.Builder
	b.WriteString("### phgate: computed chemistry of changed recipes\n\n")
	fmt.Fprintf(&b, "%s → %s\n\n", cell(d.Old.Label), cell(d.New.Label))
	rows := append([]Change(nil), d.Changes...)
	sort.SliceStable(rows, func(i, j int) bool {
		a, c := rows[i], rows[j]
		if (a.DeltaPH == nil) != (c.DeltaPH == nil) {
			return a.DeltaPH != nil
		}
		if x, y := math.Abs(a.rawDeltaPH), math.Abs(c.rawDeltaPH); x != y {
			return x > y
		}
		return a.path() < c.path()
	})
	if len(rows) == 0 {
		b.WriteString("No recipe's computed results moved.\n\n")
	} else {
		b.WriteString("| Recipe | Change | pH before | pH after | ΔpH | Δ buffer capacity | Δ ionic strength | Notes |\n")
		b.WriteString("|---|---|--:|--:|--:|--:|--:|---|\n")
		for _, c := range rows {
			fmt.Fprintf(&b, "| %s | %s | %s | %s | %s | %s | %s | %s |\n", code(c.Recipe), c.Status,
				statePH(c.Before), statePH(c.After), deltaCell(c.DeltaPH, 1, ""),
				deltaCell(c.DeltaBufferCapacity, 1000, " m"+unitOf(c)+"/pH"), deltaCell(c.DeltaIonicStrength, 1, " "+unitOf(c)),
				notes(c))
		}
		b.WriteString("\n")
	}
	fmt.Fprintf(&b, "%s.", tally(d))
	if len(d.InputsChanged) > 0 {
		quoted := make([]string, len(d.InputsChanged))
		for i, p := range d.InputsChanged {
			quoted[i] = code(p)
		}
		fmt.Fprintf(&b, " Config and catalog files changed: %s.", strings.Join(quoted, ", "))
	}
	b.WriteString("\n\n")
	if len(d.GatesCrossed) > 0 {
		b.WriteString("**Gates crossed**\n\n")
		for _, g := range d.GatesCrossed {
			fmt.Fprintf(&b, "- %s\n", cell(g))
		}
		b.WriteString("\n")
	}
	for _, side := range []struct {
		name string
		ps   []diag.Problem
	}{{"old", d.Problems.Old}, {"new", d.Problems.New}} {
		if len(side.ps) == 0 {
			continue
		}
		fmt.Fprintf(&b, "**Problems on the %s side**\n\n", side.name)
		for _, p := range side.ps {
			fmt.Fprintf(&b, "- %s\n", cell(p.Error()))
		}
		b.WriteString("\n")
	}
	fmt.Fprintf(&b, "<sub>%s</sub>\n", report.Caution)
	_, err := io.WriteString(w, b.String())
	return err
}

func unitOf(c Change) string {
	if c.After != nil && c.After.ConcentrationUnit != "" {
		return c.After.ConcentrationUnit
	}
	if c.Before != nil && c.Before.ConcentrationUnit != "" {
		return c.Before.ConcentrationUnit
	}
	return "mol/L"
}

func statePH(s *State) string {
	switch {
	case s == nil:
		return "–"
	case s.PH == nil:
		return "unsolved"
	}
	return fmt.Sprintf("%.2f", *s.PH)
}

func deltaCell(x *float64, scale float64, unit string) string {
	if x == nil {
		return "–"
	}
	return signed(*x*scale) + unit
}

// notes sums up a change in one table cell.
func notes(c Change) string {
	var parts []string
	if c.Status == Renamed {
		parts = append(parts, code(c.OldPath)+" → "+code(c.NewPath))
	} else if p := c.path(); p != "" {
		parts = append(parts, code(p))
	}
	if why := causeText(c, true); why != "" {
		parts = append(parts, why)
	}
	for _, q := range c.QS {
		parts = append(parts, fmt.Sprintf("q.s. %s %s", code(q.Use), fromTo(adjustText(q.Before), adjustText(q.After))))
	}
	for _, dc := range c.Dominant {
		parts = append(parts, fmt.Sprintf("%s dominant %s", dc.System, fromTo(dc.Before, dc.After)))
	}
	for _, ic := range c.Ingredients {
		parts = append(parts, code(ic.Ingredient)+" "+ingredientText(ic))
	}
	for _, st := range []*State{c.Before, c.After} {
		if st != nil && len(st.Problems) > 0 {
			side := "after"
			if st == c.Before {
				side = "before"
			}
			parts = append(parts, fmt.Sprintf("cannot solve %s: %s", side, st.Problems[0].Message))
		}
	}
	for _, f := range c.NewFindings {
		parts = append(parts, fmt.Sprintf("**new %s** %s: %s", f.Severity, code(f.Rule), f.Message))
	}
	for _, f := range c.GoneFindings {
		parts = append(parts, fmt.Sprintf("gone %s %s", f.Severity, code(f.Rule)))
	}
	return cell(strings.Join(parts, "; "))
}

// cell makes text safe inside a markdown table cell.
func cell(s string) string {
	s = strings.ReplaceAll(s, "\r", " ")
	s = strings.ReplaceAll(s, "\n", " ")
	s = strings.ReplaceAll(s, "|", "\\|")
	s = strings.ReplaceAll(s, "<", "&lt;")
	return s
}

// code quotes s as inline code, with a fence longer than any backtick
// run inside.
func code(s string) string {
	fence := "`"
	for strings.Contains(s, fence) {
		fence += "`"
	}
	if strings.HasPrefix(s, "`") || strings.HasSuffix(s, "`") {
		return fence + " " + s + " " + fence
	}
	return fence + s + fence
}
