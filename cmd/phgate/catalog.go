package main

import (
	"encoding/json"
	"fmt"
	"strings"
	"text/tabwriter"

	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/project"
)

// catalogEntry is the JSON shape of one ingredient in `phgate catalog`.
type catalogEntry struct {
	*catalog.Ingredient
	SystemsData []*catalog.System `json:"system_data,omitempty"`
}

func (a *App) catalog(args []string) int {
	fs := a.flags("catalog", "[QUERY]")
	format := fs.String("format", "text", "output format: text or json")
	dir := fs.String("project", ".", "folder whose phgate.yaml adds project catalogs")
	qs, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	cat, ps := projectCatalog(*dir)
	if len(ps) > 0 {
		return a.problems(ps)
	}
	query := strings.ToLower(strings.Join(qs, " "))
	var hits []*catalog.Ingredient
	if e, ok := cat.Ingredient(query); ok {
		hits = []*catalog.Ingredient{e}
	} else {
		for _, id := range cat.IDs() {
			e, _ := cat.Ingredient(id)
			if query == "" || strings.Contains(id, query) || strings.Contains(strings.ToLower(e.Name), query) || strings.Contains(strings.ToLower(e.Formula), query) || releases(e, query) {
				hits = append(hits, e)
			}
		}
	}
	if len(hits) == 0 {
		msg := fmt.Sprintf("no catalog ingredient matches %q", query)
		if s := cat.Suggest(query, 3); len(s) > 0 {
			msg += "; nearest: " + strings.Join(s, ", ")
		}
		return a.fail("%s", msg)
	}
	switch *format {
	case "json":
		out := make([]catalogEntry, 0, len(hits))
		for _, e := range hits {
			ce := catalogEntry{Ingredient: e}
			for _, s := range e.Systems {
				ce.SystemsData = append(ce.SystemsData, cat.Systems[s.System])
			}
			out = append(out, ce)
		}
		enc := json.NewEncoder(a.Stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(out); err != nil {
			return a.fail("%v", err)
		}
	case "text":
		if len(hits) == 1 {
			a.explainIngredient(cat, hits[0])
			return ExitOK
		}
		tw := tabwriter.NewWriter(a.Stdout, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "id\tname\tformula\tg/mol")
		for _, e := range hits {
			fmt.Fprintf(tw, "%s\t%s\t%s\t%.2f\n", e.ID, e.Name, e.Formula, e.MolarMass)
		}
		tw.Flush()
		fmt.Fprintf(a.Stdout, "\n%d ingredients; 'phgate catalog ID' explains one with its sources.\n", len(hits))
	default:
		return a.fail("unknown format %q (use text or json)", *format)
	}
	return ExitOK
}

func (a *App) explainIngredient(cat *catalog.Catalog, e *catalog.Ingredient) {
	w := a.Stdout
	fmt.Fprintf(w, "%s — %s\n", e.ID, e.Name)
	if e.Formula != "" {
		fmt.Fprintf(w, "  formula      %s\n", e.Formula)
	}
	if e.MolarMass > 0 {
		fmt.Fprintf(w, "  molar mass   %.3f g/mol (from the formula, IUPAC standard atomic weights)\n", e.MolarMass)
	}
	var rel []string
	for _, s := range e.Systems {
		rel = append(rel, fmt.Sprintf("%g %s (as %s)", s.Count, s.System, s.Species))
	}
	for _, s := range e.Ions {
		rel = append(rel, fmt.Sprintf("%g %s", s.Count, s.Ion))
	}
	if e.Neutrals > 0 {
		rel = append(rel, fmt.Sprintf("%g neutral particle(s)", e.Neutrals))
	}
	if len(rel) > 0 {
		fmt.Fprintf(w, "  releases     %s per mole\n", strings.Join(rel, ", "))
	}
	for _, s := range e.Systems {
		sys := cat.Systems[s.System]
		if sys == nil {
			continue
		}
		fmt.Fprintf(w, "  system %s: %s\n", sys.ID, strings.Join(sys.Species, " ⇌ "))
		for i, st := range sys.Steps {
			line := fmt.Sprintf("    pKa%d %.3f [%s]", i+1, st.PKa.V, sourceText(st.PKa.Source))
			if st.DeltaH != nil {
				line += fmt.Sprintf("; ΔH %.2f kJ/mol [%s]", st.DeltaH.V, sourceText(st.DeltaH.Source))
			}
			if st.DeltaCp != nil {
				line += fmt.Sprintf("; ΔCp %.0f J/(K·mol)", st.DeltaCp.V)
			}
			fmt.Fprintln(w, line)
		}
	}
	opt := func(label string, v *catalog.Value, unit string) {
		if v != nil {
			fmt.Fprintf(w, "  %-12s %g%s [%s]\n", label, v.V, unit, sourceText(v.Source))
		}
	}
	opt("density", e.Density, " g/mL")
	opt("solubility", e.IntrinsicSolubility, " mol/L (neutral form)")
	opt("pI", e.PI, "")
	opt("preservative", e.Preservative, " minimum un-ionized fraction")
	if e.Notes != "" {
		fmt.Fprintf(w, "  notes        %s\n", e.Notes)
	}
	if len(e.Sources) > 0 {
		fmt.Fprintln(w, "  sources:")
		for _, s := range e.Sources {
			fmt.Fprintf(w, "    - %s\n", sourceText(s))
		}
	}
}

func sourceText(s catalog.Source) string {
	if s.Status != "" && s.Status != "checked" {
		return s.Cite + " (" + s.Status + ")"
	}
	return s.Cite
}

// projectCatalog is the built-in catalog plus the catalogs named by the
// phgate.yaml governing dir.
func projectCatalog(dir string) (*catalog.Catalog, diag.Problems) {
	cfgPath := project.FindConfig(dir)
	if cfgPath == "" {
		return catalog.Default(), nil
	}
	cfg, ps := project.LoadConfig(cfgPath)
	if len(ps) > 0 {
		return nil, ps
	}
	cat, ps := project.CatalogFor(cfg)
	if len(ps) > 0 {
		return nil, ps
	}
	return cat, nil
}

// releases reports whether an ingredient releases an acid–base system
// whose id contains query ("citrate" finds citric acid too).
func releases(e *catalog.Ingredient, query string) bool {
	for _, s := range e.Systems {
		if strings.Contains(s.System, query) {
			return true
		}
	}
	return false
}
