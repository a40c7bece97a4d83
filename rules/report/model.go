// Package report turns solved recipes, findings and problems into the
// outputs people and CI read: a typed report model, and formatters for
// text and JSON behind one small interface.
package report

import (
	"math"
	"sort"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/evaluate"
)

// Caution is printed with every detailed report and in the README.
const Caution = "Computed values are estimates from an equilibrium model; confirm every batch with a calibrated pH meter. " +
	"Local regulations, pharmacopoeias and licensed practice decide what is acceptable for a product."

// Report is the whole output of a check run.
type Report struct {
	Recipes []Recipe `json:"recipes"`
	// Findings are those outside any recipe file, such as a stale
	// project-wide waiver in phgate.yaml.
	Findings []rules.Finding `json:"project_findings"`
	Problems []diag.Problem  `json:"problems"`
	Summary  Summary         `json:"summary"`
	// streamed counts the recipes a Streamer already wrote out instead of
	// keeping them in Recipes.
	streamed Summary
}

// Streamed counts a recipe that a Streamer has already written, instead
// of keeping it in Recipes.
func (rep *Report) Streamed(r *Recipe) {
	rep.streamed.Recipes++
	rep.streamed.count(r.Findings)
}

// count adds findings to the tally by severity, waived ones apart.
func (s *Summary) count(fs []rules.Finding) {
	for _, f := range fs {
		switch {
		case f.Waived != "":
			s.Waived++
		case f.Severity == rules.Error:
			s.Errors++
		case f.Severity == rules.Warning:
			s.Warnings++
		default:
			s.Infos++
		}
	}
}

// Summary counts what the run saw.
type Summary struct {
	Recipes  int `json:"recipes"`
	Skipped  int `json:"skipped"`
	Problems int `json:"problems"`
	Errors   int `json:"errors"`
	Warnings int `json:"warnings"`
	Infos    int `json:"infos"`
	Waived   int `json:"waived"`
}

// Recipe is one solved recipe in the report.
type Recipe struct {
	Path   string `json:"path"`
	Recipe string `json:"recipe"`
	Title  string `json:"title,omitempty"`
	// Basis is the batch size as written ("1 L"), or "" for none.
	Basis string `json:"basis,omitempty"`
	// BasisAssumed: the recipe gives no basis; per-batch amounts are per litre.
	BasisAssumed bool `json:"basis_assumed,omitempty"`
	// ConcentrationUnit is "mol/L", or "mol/kg" on a water-mass basis.
	ConcentrationUnit string          `json:"concentration_unit"`
	TemperatureC      float64         `json:"temperature_c"`
	ActivityModel     string          `json:"activity_model"`
	PH                float64         `json:"ph"`
	PHWindow          *Window         `json:"ph_window,omitempty"`
	IonicStrength     float64         `json:"ionic_strength"`
	BufferCapacity    float64         `json:"buffer_capacity"`
	Osmolarity        float64         `json:"osmolarity_mosm_l"`
	Ingredients       []Line          `json:"ingredients"`
	Adjustments       []Adjust        `json:"adjustments"`
	Systems           []System        `json:"systems"`
	Salts             []Salt          `json:"salts,omitempty"`
	Peptides          []Pep           `json:"peptides,omitempty"`
	Warnings          []string        `json:"warnings,omitempty"`
	Findings          []rules.Finding `json:"findings"`
}

// Window is a target interval; absent ends are omitted.
type Window struct {
	Min *float64 `json:"min,omitempty"`
	Max *float64 `json:"max,omitempty"`
}

// Line is one ingredient's contribution.
type Line struct {
	Ingredient string `json:"ingredient"`
	Amount     string `json:"amount,omitempty"`
	// Conc is mol/L (mol/kg) of the ingredient in the product; for a
	// stock recipe, litres of stock per litre of product.
	Conc        float64 `json:"concentration"`
	Mol         float64 `json:"mol,omitempty"`
	Grams       float64 `json:"grams,omitempty"`
	Millilitres float64 `json:"ml,omitempty"`
	QS          bool    `json:"qs,omitempty"`
}

// Adjust is a solved q.s. amount.
type Adjust struct {
	Use         string  `json:"use"`
	TargetPH    float64 `json:"target_ph"`
	Conc        float64 `json:"concentration"`
	Mol         float64 `json:"mol"`
	Grams       float64 `json:"grams"`
	Millilitres float64 `json:"ml,omitempty"`
}

// System is the speciation of one acid–base system.
type System struct {
	Name       string             `json:"name"`
	Total      float64            `json:"total"`
	PKa        []float64          `json:"pka"`
	Dominant   string             `json:"dominant"`
	MeanCharge float64            `json:"mean_charge"`
	Fractions  map[string]float64 `json:"fractions"`
	// Order lists the species most protonated first (JSON maps are unordered).
	Order []string `json:"species"`
}

// Salt is the saturation state of one sparingly soluble salt.
type Salt struct {
	Name            string  `json:"name"`
	SaturationIndex float64 `json:"saturation_index"`
}

// Pep is a peptide's charge state.
type Pep struct {
	Name      string  `json:"name"`
	NetCharge float64 `json:"net_charge"`
	PI        float64 `json:"pi"`
}

// Build converts a solved recipe and its findings to the report model.
func Build(res *evaluate.Result, findings []rules.Finding) Recipe {
	r := res.Recipe
	eq := res.Equilibrium
	out := Recipe{
		Path: r.Path, Recipe: r.ID.Value, Title: r.Title.Value,
		ConcentrationUnit: "mol/L",
		TemperatureC:      r.Temperature.Nominal,
		ActivityModel:     res.Mixture.Activity.String(),
		PH:                round(eq.PH, 4),
		IonicStrength:     sig(eq.IonicStrength),
		BufferCapacity:    sig(eq.BufferCapacity),
		Osmolarity:        round(eq.Osmolarity*1000, 1),
		Findings:          findings,
		Adjustments:       []Adjust{},
	}
	if res.Molal {
		out.ConcentrationUnit = "mol/kg"
	}
	if r.Basis.Raw != "" {
		out.Basis = r.Basis.Raw
	}
	out.BasisAssumed = r.Basis.Assumed
	if w := r.PH; w != nil {
		out.PHWindow = &Window{}
		if w.Min != nil {
			v := w.Min.Value
			out.PHWindow.Min = &v
		}
		if w.Max != nil {
			v := w.Max.Value
			out.PHWindow.Max = &v
		}
	}
	for _, l := range res.Lines {
		ln := Line{Ingredient: l.Label(), Conc: sig(l.Conc), Mol: sig(l.Moles), Grams: sig(l.Grams), Millilitres: sig(l.Millilitres), QS: l.Ingredient.QS}
		if a := l.Ingredient.Amount; a != nil {
			ln.Amount = a.Raw
		}
		out.Ingredients = append(out.Ingredients, ln)
	}
	if a := res.Adjustment; a != nil {
		out.Adjustments = append(out.Adjustments, Adjust{Use: res.Lines[a.Line].Label(), TargetPH: a.TargetPH,
			Conc: sig(a.Conc), Mol: sig(a.Moles), Grams: sig(a.Grams), Millilitres: sig(a.Millilitres)})
	}
	for i, s := range eq.Systems {
		sys := System{Name: s.Name, Total: sig(res.Mixture.Systems[i].Total), MeanCharge: round(s.MeanCharge, 4),
			Fractions: map[string]float64{}, Order: s.Species}
		for k, f := range s.Fractions {
			sys.Fractions[s.Species[k]] = round(f, 6)
		}
		for _, p := range s.PKa {
			sys.PKa = append(sys.PKa, round(p, 3))
		}
		if s.Dominant >= 0 && s.Dominant < len(s.Species) {
			sys.Dominant = s.Species[s.Dominant]
		}
		out.Systems = append(out.Systems, sys)
	}
	for _, s := range eq.Salts {
		out.Salts = append(out.Salts, Salt{Name: s.Name, SaturationIndex: round(s.SaturationIndex, 3)})
	}
	for _, p := range res.Peptides {
		out.Peptides = append(out.Peptides, Pep{Name: p.Label, NetCharge: round(p.NetCharge, 3), PI: round(p.PI, 2)})
	}
	for _, w := range eq.Warnings {
		out.Warnings = append(out.Warnings, w.Message)
	}
	if out.Findings == nil {
		out.Findings = []rules.Finding{}
	}
	return out
}

// Finish sorts recipes and problems and fills the summary counts.
func (rep *Report) Finish(skipped int) {
	sort.SliceStable(rep.Recipes, func(i, j int) bool { return rep.Recipes[i].Path < rep.Recipes[j].Path })
	diag.Problems(rep.Problems).Sort()
	rep.Findings = rules.SortFindings(rep.Findings)
	rep.Summary = rep.streamed
	rep.Summary.Recipes += len(rep.Recipes)
	rep.Summary.Skipped = skipped
	rep.Summary.Problems = len(rep.Problems)
	rep.Summary.count(rep.All())
	if rep.Recipes == nil {
		rep.Recipes = []Recipe{}
	}
	if rep.Findings == nil {
		rep.Findings = []rules.Finding{}
	}
	if rep.Problems == nil {
		rep.Problems = []diag.Problem{}
	}
}

// All returns every finding of the report: each recipe's in path order,
// then the project findings.
func (rep *Report) All() []rules.Finding {
	var out []rules.Finding
	for _, r := range rep.Recipes {
		out = append(out, r.Findings...)
	}
	return append(out, rep.Findings...)
}

// round keeps n decimals so JSON output is stable across platforms.
func round(x float64, n int) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	p := math.Pow(10, float64(n))
	return math.Round(x*p) / p
}

// sig keeps 6 significant digits.
func sig(x float64) float64 {
	if x == 0 || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	e := math.Floor(math.Log10(math.Abs(x)))
	p := math.Pow(10, 5-e)
	return math.Round(x*p) / p
}
