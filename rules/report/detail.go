package report

import (
	"fmt"
	"github.com/phgate/phgate/solver"
	"io"
	"sort"
	"strings"
	"text/tabwriter"

	"github.com/fatih/color"
)

// Detail writes the detailed report of one recipe (phgate show).
type Detail struct {
	Color bool
}

func (d *Detail) paint(attrs ...color.Attribute) func(a ...any) string {
	return (&Text{Color: d.Color}).paint(attrs...)
}

// Write renders r.
func (d *Detail) Write(w io.Writer, r Recipe) error {
	bold := d.paint(color.Bold)
	head := func(s string) string { return bold(s) }
	var b strings.Builder
	title := r.Recipe
	if r.Title != "" {
		title += " — " + r.Title
	}
	fmt.Fprintf(&b, "%s\n%s\n\n", bold(title), r.Path)

	basis := r.Basis
	if basis == "" {
		basis = "none (amounts are concentrations)"
	}
	fmt.Fprintf(&b, "%s\n", head("Result"))
	tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "  pH\t%.2f\t(activity scale, %s activity model)\n", r.PH, r.ActivityTitle())
	if w := r.PHWindow; w != nil {
		fmt.Fprintf(tw, "  target window\t%s\t\n", windowText(w))
	}
	unit := strings.TrimPrefix(r.ConcentrationUnit, "mol")
	fmt.Fprintf(tw, "  temperature\t%g °C\t\n", r.TemperatureC)
	fmt.Fprintf(tw, "  basis\t%s\t(concentrations in %s)\n", basis, r.ConcentrationUnit)
	fmt.Fprintf(tw, "  ionic strength\t%.4g mol%s\t\n", r.IonicStrength, unit)
	fmt.Fprintf(tw, "  buffer capacity\t%.4g mmol%s per pH\t(acid or base that moves the pH by 1)\n", r.BufferCapacity*1000, unit)
	fmt.Fprintf(tw, "  osmolarity\t%.0f mOsm/L\t(ideal estimate, no osmotic coefficient)\n", r.Osmolarity)
	tw.Flush()

	fmt.Fprintf(&b, "\n%s\n", head("Ingredients"))
	tw = tabwriter.NewWriter(&b, 0, 0, 2, ' ', tabwriter.AlignRight)
	// Names read left-aligned, numbers right-aligned: pad the names to one
	// width so the right-aligning writer leaves them as they are.
	nameWidth := len([]rune("ingredient"))
	for _, l := range r.Ingredients {
		nameWidth = max(nameWidth, len([]rune(l.Ingredient)))
	}
	pad := func(s string) string { return s + strings.Repeat(" ", nameWidth-len([]rune(s))) }
	fmt.Fprintf(tw, "  %s\tas written\tin product\tper batch\t\n", pad("ingredient"))
	for _, l := range r.Ingredients {
		amount := l.Amount
		if l.QS {
			amount = "q.s."
		}
		inProduct := fmt.Sprintf("%.4g mmol%s", l.Conc*1000, unit)
		if strings.HasPrefix(l.Ingredient, "from ") {
			inProduct = fmt.Sprintf("%.4g %% v/v", l.Conc*100)
		}
		if l.QS {
			inProduct = "to basis"
		}
		batch := BatchText(l.Mol, l.Grams, l.Millilitres)
		fmt.Fprintf(tw, "  %s\t%s\t%s\t%s\t\n", pad(l.Ingredient), amount, inProduct, batch)
	}
	tw.Flush()
	for _, a := range r.Adjustments {
		fmt.Fprintf(&b, "  q.s. %s to pH %g: %s%s\n", a.Use, a.TargetPH, AdjustAmount(a, r.ConcentrationUnit), assumedBasis(&r))
	}

	fmt.Fprintf(&b, "\n%s\n", head("Acid–base systems"))
	tw = tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "  system\ttotal\tpKa at %g °C\tdominant\tmean charge\tprotonation states\n", r.TemperatureC)
	for _, s := range r.Systems {
		var pk []string
		for _, p := range s.PKa {
			pk = append(pk, fmt.Sprintf("%.2f", p))
		}
		var fr []string
		for _, sp := range s.Order {
			if f := s.Fractions[sp]; f >= 0.0005 {
				fr = append(fr, fmt.Sprintf("%s %.1f%%", sp, f*100))
			}
		}
		fmt.Fprintf(tw, "  %s\t%.4g m%s\t%s\t%s\t%+.2f\t%s\n", s.Name, s.Total*1000, r.ConcentrationUnit, strings.Join(pk, ", "), s.Dominant, s.MeanCharge, strings.Join(fr, ", "))
	}
	tw.Flush()

	if len(r.Salts) > 0 {
		fmt.Fprintf(&b, "\n%s\n", head("Sparingly soluble salts (saturation index log IAP/Ksp; above 0 can precipitate)"))
		salts := append([]Salt(nil), r.Salts...)
		sort.SliceStable(salts, func(i, j int) bool { return salts[i].SaturationIndex > salts[j].SaturationIndex })
		tw = tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
		for _, s := range salts {
			fmt.Fprintf(tw, "  %s\t%+.2f\n", s.Name, s.SaturationIndex)
		}
		tw.Flush()
	}
	if len(r.Peptides) > 0 {
		fmt.Fprintf(&b, "\n%s\n", head("Peptides"))
		for _, p := range r.Peptides {
			fmt.Fprintf(&b, "  %s: net charge %+.2f per molecule, pI %.2f\n", p.Name, p.NetCharge, p.PI)
		}
	}
	if len(r.Warnings) > 0 {
		fmt.Fprintf(&b, "\n%s\n", head("Model warnings"))
		for _, w := range r.Warnings {
			fmt.Fprintf(&b, "  %s\n", w)
		}
	}
	fmt.Fprintf(&b, "\n%s\n", head("Findings"))
	if len(r.Findings) == 0 {
		b.WriteString("  none\n")
	}
	for _, f := range r.Findings {
		state := f.Severity.String()
		if f.Waived != "" {
			state = "waived (" + f.Waived + ")"
		}
		fmt.Fprintf(&b, "  %d:%d %s %s: %s\n", f.Line, f.Column, state, f.Rule, f.Message)
		if f.Fix != "" {
			fmt.Fprintf(&b, "      → %s\n", f.Fix)
		}
	}
	fmt.Fprintf(&b, "\n%s %s\n", bold("Caution:"), Caution)
	_, err := io.WriteString(w, b.String())
	return err
}

func windowText(w *Window) string {
	lo, hi := "no minimum", "no maximum"
	if w.Min != nil {
		lo = fmt.Sprintf("%.2f", *w.Min)
	}
	if w.Max != nil {
		hi = fmt.Sprintf("%.2f", *w.Max)
	}
	return lo + " – " + hi
}

// BatchText renders per-batch amounts: grams, mmol and mL where known.
func BatchText(mol, grams, ml float64) string {
	var parts []string
	if grams != 0 {
		parts = append(parts, fmt.Sprintf("%.4g g", grams))
	}
	if mol != 0 {
		parts = append(parts, fmt.Sprintf("%.4g mmol", mol*1000))
	}
	if ml != 0 {
		parts = append(parts, fmt.Sprintf("%.4g mL", ml))
	}
	if len(parts) == 0 {
		return "–"
	}
	return strings.Join(parts, ", ")
}

// ActivityTitle names the recipe's activity model as written in prose
// ("Davies", "ideal").
func (r Recipe) ActivityTitle() string {
	if r.ActivityModel == solver.Davies.String() {
		return solver.Davies.Title()
	}
	return r.ActivityModel
}
