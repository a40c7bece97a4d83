package chart

import (
	"fmt"
	"math"

	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/evaluate"
)

// DefaultPoints is the number of points per curve when Options.Points is 0:
// fine enough that a titration curve's steep part shows as a smooth line
// at report size.
const DefaultPoints = 161

// Default titrants for a recipe that has no q.s. titrant: the product is
// titrated both ways, with strong acid (drawn to the left) and strong
// base (drawn to the right).
const (
	DefaultAcid = "hydrochloric-acid"
	DefaultBase = "sodium-hydroxide"
)

// defaultMinCapacity is the buffer capacity (mol/L per pH) drawn when the
// caller gives none: the weak-buffer rule's default of 5 mM per pH
// (common practice).
const defaultMinCapacity = 0.005

// minSweep is the smallest titration sweep (mol/L) for a titrant with no
// q.s. amount to scale from, so that even an unbuffered product shows its
// jump.
const minSweep = 0.01

// refShare: pKa lines are drawn for systems holding at least this share of
// the largest system's total, so that a peptide's many minor groups do not
// bury the buffer's own pKa.
const refShare = 0.1

// Options adjusts what the builders compute; the zero value gives the
// documented defaults.
type Options struct {
	// Titrant is a catalog ingredient id to titrate with instead of the
	// recipe's q.s. titrant.
	Titrant string
	// Points per curve (0: DefaultPoints).
	Points int
	// MinCapacity is the minimum buffer capacity line, mol/L per pH (0:
	// the weak-buffer rule's default); callers pass the rule's setting
	// for the recipe.
	MinCapacity float64
}

func (o Options) points() int {
	if o.Points >= 2 {
		return o.Points
	}
	return DefaultPoints
}

// TitrationData is the raw titration behind a Titration chart.
type TitrationData struct {
	// PerBatch is the batch size the x axis counts in: litres of product,
	// or kilograms of water on a water-mass basis (1 without a basis, when
	// the axis counts per litre).
	PerBatch float64
	// Sweeps are the curves: one for a single titrant, two (acid and base)
	// for a recipe without one.
	Sweeps []Sweep
}

// Sweep is one titrant added to one starting mixture in increasing amounts.
type Sweep struct {
	Titrant   string
	Component solver.Component
	// Base is the mixture titrated (the recipe before its q.s. amount, or
	// the product as made for any other titrant).
	Base solver.Mixture
	// Amounts are titrant concentrations added, in mol/L (mol/kg), from 0.
	Amounts []float64
	// PH is the solved pH at each amount.
	PH []float64
	// Sign is +1 for a sweep drawn rightwards from 0, −1 leftwards.
	Sign float64
}

// All builds the four charts of res in report order.
func All(res *evaluate.Result, opt Options) ([]*Chart, error) {
	var out []*Chart
	for _, k := range Kinds {
		c, err := Build(res, k, opt)
		if err != nil {
			return nil, err
		}
		out = append(out, c)
	}
	return out, nil
}

// Build computes the chart of one kind for a solved recipe.
func Build(res *evaluate.Result, k Kind, opt Options) (*Chart, error) {
	switch k {
	case Titration:
		return buildTitration(res, opt)
	case Species:
		return buildSpecies(res, opt)
	case Capacity:
		return buildCapacity(res, opt)
	case Temperature:
		return buildTemperature(res, opt)
	}
	return nil, fmt.Errorf("unknown chart kind %d", k)
}

func linspace(lo, hi float64, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = lo + (hi-lo)*float64(i)/float64(n-1)
	}
	out[n-1] = hi
	return out
}

// concUnit is the concentration unit of res ("L" or "kg" after "mmol/").
func concUnit(res *evaluate.Result) string {
	if res.Molal {
		return "kg"
	}
	return "L"
}

func conditions(res *evaluate.Result) string {
	return fmt.Sprintf("%g °C, %s activities", res.Recipe.Temperature.Nominal, res.Mixture.Activity.Title())
}

// perBatch returns the batch size per-batch amounts refer to and how the
// axis names it.
func perBatch(r *spec.Recipe) (float64, string) {
	switch r.Basis.Kind {
	case spec.VolumeBasis:
		return r.Basis.Litres, "mmol per " + r.Basis.Raw + " batch"
	case spec.WaterMassBasis:
		return r.Basis.Kilograms, "mmol per batch of " + r.Basis.Raw + " water"
	}
	return 1, "mmol per litre"
}

// windowBand returns the recipe's target pH window as a band.
func windowBand(r *spec.Recipe, onX bool) []Band {
	w := r.PH
	if w == nil || (w.Min == nil && w.Max == nil) {
		return nil
	}
	lo, hi := math.Inf(-1), math.Inf(1)
	if w.Min != nil {
		lo = w.Min.Value
	}
	if w.Max != nil {
		hi = w.Max.Value
	}
	return []Band{{Label: "target pH " + windowText(lo, hi), OnX: onX, Lo: lo, Hi: hi}}
}

func windowText(lo, hi float64) string {
	switch {
	case math.IsInf(lo, -1):
		return fmt.Sprintf("≤ %.2f", hi)
	case math.IsInf(hi, 1):
		return fmt.Sprintf("≥ %.2f", lo)
	}
	return fmt.Sprintf("%.2f–%.2f", lo, hi)
}

// phRange returns a pH axis range covering values and the window, on whole
// pH units within 0–14.
func phRange(r *spec.Recipe, values ...[]float64) (float64, float64) {
	lo, hi := phSpan(r, values...)
	lo, hi = math.Max(math.Floor(lo), 0), math.Min(math.Ceil(hi), 14)
	if hi-lo < 1 {
		lo, hi = math.Max(lo-0.5, 0), math.Min(hi+0.5, 14)
	}
	return lo, hi
}

// titrantLine returns the recipe's q.s. titrant line and the amount of it
// in the product (0 when the target was unreachable), or nil.
func titrantLine(res *evaluate.Result) (*evaluate.Line, float64) {
	if a := res.Adjustment; a != nil {
		return &res.Lines[a.Line], a.Conc
	}
	for i := range res.Lines {
		if res.Lines[i].Ingredient.AdjustToPH != nil {
			return &res.Lines[i], 0
		}
	}
	return nil, 0
}

// sweepSpan is how far a titrant with no q.s. amount to scale from is
// swept: one and a half times the protons the product's acid–base systems
// can take up or give off, at least minSweep, within the solver's limit.
func sweepSpan(m solver.Mixture) float64 {
	s := 0.0
	for _, sys := range m.Systems {
		s += sys.Total * float64(len(sys.PKa))
	}
	return math.Min(math.Max(1.5*s, minSweep), solver.MaxTitrant)
}

func sweep(name string, c solver.Component, base solver.Mixture, top, sign float64, n int) (Sweep, error) {
	amounts := linspace(0, top, n)
	ph, err := solver.TitrationCurve(base, c, amounts)
	if err != nil {
		return Sweep{}, fmt.Errorf("titration with %s: %w", name, err)
	}
	return Sweep{Titrant: name, Component: c, Base: base, Amounts: amounts, PH: ph, Sign: sign}, nil
}

// buildTitration sweeps the q.s. titrant from 0 to twice the q.s. amount on
// the mixture before titration (Result.Mixture less the q.s. amount, taken
// off with Mixture.With and a negative amount, which restores every entry
// to what it was before the titration added it). Another titrant, or the
// default acid and base when the recipe has none, titrates the product as
// made, whose point then sits at 0.
func buildTitration(res *evaluate.Result, opt Options) (*Chart, error) {
	r := res.Recipe
	n := opt.points()
	per, unit := perBatch(r)
	data := &TitrationData{PerBatch: per}
	qs, qsAmount := titrantLine(res)
	if qs != nil && opt.Titrant != "" && qs.Ingredient.Use.Value != opt.Titrant {
		qs = nil
	}
	recipeX := 0.0
	var alt *AltScale
	xLabel := ""
	subtitle := ""
	switch {
	case qs != nil:
		base := res.Mixture.With(qs.Component, -qsAmount)
		top := 2 * qsAmount
		if top <= 0 {
			top = sweepSpan(base)
		}
		s, err := sweep(qs.Label(), qs.Component, base, top, 1, n)
		if err != nil {
			return nil, err
		}
		data.Sweeps = append(data.Sweeps, s)
		recipeX = qsAmount * per * 1000
		if qs.Moles > 0 && qs.Millilitres > 0 {
			alt = &AltScale{Factor: qs.Millilitres / (qs.Moles * 1000), Unit: "mL"}
		}
		xLabel = fmt.Sprintf("%s added (%s)", qs.Label(), unit)
		subtitle = fmt.Sprintf("q.s. titrant added to the recipe before adjustment · %s", conditions(res))
		if alt != nil {
			xLabel = fmt.Sprintf("%s added (%s; mL of %s stock below)", qs.Label(), unit, qs.Ingredient.Stock.Raw)
		}
		if res.Unreachable != nil {
			subtitle = fmt.Sprintf("target pH %g is out of reach with %s · %s", res.Unreachable.Target, qs.Label(), conditions(res))
		}
	case opt.Titrant != "":
		c, m, err := res.ComponentFor(opt.Titrant)
		if err != nil {
			return nil, err
		}
		s, err := sweep(opt.Titrant, c, m, sweepSpan(m), 1, n)
		if err != nil {
			return nil, err
		}
		data.Sweeps = append(data.Sweeps, s)
		xLabel = fmt.Sprintf("%s added (%s)", opt.Titrant, unit)
		subtitle = "added to the product as made · " + conditions(res)
	default:
		for _, t := range []struct {
			id   string
			sign float64
		}{{DefaultAcid, -1}, {DefaultBase, 1}} {
			c, m, err := res.ComponentFor(t.id)
			if err != nil {
				return nil, err
			}
			s, err := sweep(t.id, c, m, sweepSpan(m), t.sign, n)
			if err != nil {
				return nil, err
			}
			data.Sweeps = append(data.Sweeps, s)
		}
		xLabel = fmt.Sprintf("← acid added · base added → (%s)", unit)
		subtitle = "no q.s. titrant: strong acid and base added to the product as made · " + conditions(res)
	}
	p := Panel{X: Axis{Label: xLabel, Alt: alt}, Y: Axis{Label: "pH"}}
	var phs [][]float64
	for _, s := range data.Sweeps {
		x := make([]float64, len(s.Amounts))
		for i, a := range s.Amounts {
			x[i] = s.Sign * a * per * 1000
		}
		p.Series = append(p.Series, Series{Label: "pH with " + s.Titrant, X: x, Y: s.PH})
		phs = append(phs, s.PH)
	}
	p.Y.Min, p.Y.Max = phRange(r, phs...)
	p.Bands = windowBand(r, false)
	p.Refs = pkaRefs(res, p.Y.Min, p.Y.Max)
	p.Marks = []Mark{{Label: fmt.Sprintf("as made: pH %.2f", res.Equilibrium.PH), X: recipeX, Y: res.Equilibrium.PH}}
	return &Chart{Kind: Titration, Recipe: r.ID.Value, Title: r.ID.Value + " · titration curve", Subtitle: subtitle,
		Panels: []Panel{p}, Titration: data}, nil
}

// pkaRefs returns horizontal lines at the pKa values (at the recipe
// temperature) of the main systems that fall within lo–hi.
func pkaRefs(res *evaluate.Result, lo, hi float64) []Ref {
	most := 0.0
	for _, s := range res.Mixture.Systems {
		most = math.Max(most, s.Total)
	}
	var out []Ref
	legend := fmt.Sprintf("pKa at %g °C", res.Recipe.Temperature.Nominal)
	for i, s := range res.Equilibrium.Systems {
		if res.Mixture.Systems[i].Total < refShare*most || most == 0 {
			continue
		}
		for _, pk := range s.PKa {
			if pk >= lo && pk <= hi {
				out = append(out, Ref{Text: fmt.Sprintf("pKa %.2f %s", pk, s.Name), Legend: legend, At: pk, Style: Guide})
			}
		}
	}
	return out
}

// maxLegendSpecies: a species chart with more curves than this names them
// only on the curves, so the legend does not crowd out the panels.
const maxLegendSpecies = 8

// buildSpecies draws one panel per acid–base system: the fraction of each
// protonation state from pH 0 to 14 (solver.SpeciesCurve: thermodynamic
// pKa at the nominal temperature, ideal solution).
func buildSpecies(res *evaluate.Result, opt Options) (*Chart, error) {
	r := res.Recipe
	phs := linspace(0, 14, opt.points())
	t := r.Temperature.Nominal
	ph := res.Equilibrium.PH
	var panels []Panel
	for i, sys := range res.Mixture.Systems {
		fr := solver.SpeciesCurve(sys, t, phs)
		if fr == nil {
			return nil, fmt.Errorf("species of %s: the system or temperature is not valid", sys.Name)
		}
		p := Panel{Title: fmt.Sprintf("%s · %.3g mmol/%s", sys.Name, sys.Total*1000, concUnit(res)),
			X: Axis{Label: "pH", Min: 0, Max: 14}, Y: Axis{Label: "fraction", Min: 0, Max: 1}, LabelCurves: true}
		names := res.Equilibrium.Systems[i].Species
		for k := range names {
			y := make([]float64, len(phs))
			for j := range phs {
				y[j] = fr[j][k]
			}
			p.Series = append(p.Series, Series{Label: names[k], X: phs, Y: y})
		}
		p.Bands = windowBand(r, true)
		p.Refs = []Ref{{Text: fmt.Sprintf("pH %.2f", ph), Legend: "recipe pH", OnX: true, At: ph, Style: Marker}}
		panels = append(panels, p)
	}
	if len(panels) == 0 {
		panels = []Panel{{X: Axis{Label: "pH", Min: 0, Max: 14}, Y: Axis{Label: "fraction", Min: 0, Max: 1},
			Note: "no acid–base systems in this recipe"}}
	}
	return &Chart{Kind: Species, Recipe: r.ID.Value, Title: r.ID.Value + " · protonation states", MaxLegendSeries: maxLegendSpecies,
		Subtitle: fmt.Sprintf("fraction of each system in each state · pKa at %g °C, ideal solution", t), Panels: panels}, nil
}

// buildCapacity draws the buffer capacity of the product's composition
// from pH 0 to 14 (solver.CapacityCurve) on a log scale, with the minimum
// line and the recipe's own point.
func buildCapacity(res *evaluate.Result, opt Options) (*Chart, error) {
	r := res.Recipe
	phs := linspace(0, 14, opt.points())
	beta, err := solver.CapacityCurve(res.Mixture, phs)
	if err != nil {
		return nil, fmt.Errorf("buffer capacity: %w", err)
	}
	y := make([]float64, len(beta))
	for i, b := range beta {
		y[i] = b * 1000
	}
	minCap := defaultMinCapacity * 1000
	if opt.MinCapacity > 0 {
		minCap = opt.MinCapacity * 1000
	}
	own := res.Equilibrium.BufferCapacity * 1000
	u := concUnit(res)
	lo := math.Min(own, minCap)
	hi := minCap
	for _, v := range y {
		hi = math.Max(hi, v)
	}
	p := Panel{
		X: Axis{Label: "pH", Min: 0, Max: 14},
		Y: Axis{Label: fmt.Sprintf("buffer capacity (mmol/%s per pH)", u), Log: true,
			Min: math.Pow(10, math.Floor(math.Log10(lo))-1), Max: math.Pow(10, math.Ceil(math.Log10(hi)))},
		Series: []Series{{Label: "buffer capacity", X: phs, Y: y}},
		Bands:  windowBand(r, true),
		Refs: []Ref{{Text: fmt.Sprintf("minimum %g mmol/%s per pH", minCap, u), Legend: "minimum capacity (weak-buffer rule)",
			At: minCap, Style: Limit}},
		Marks: []Mark{{Label: fmt.Sprintf("as made: %.3g mmol/%s per pH", own, u), X: res.Equilibrium.PH, Y: own}},
	}
	return &Chart{Kind: Capacity, Recipe: r.ID.Value, Title: r.ID.Value + " · buffer capacity",
		Subtitle: "acid or base that moves the pH by one unit, water included · log scale · " + conditions(res), Panels: []Panel{p}}, nil
}

// tempSpread is how far either side of the nominal temperature the
// temperature chart reaches when the recipe declares no range (°C).
const tempSpread = 10

// buildTemperature draws the pH of the product as made (q.s. amount fixed)
// over the recipe's temperature range (solver.TemperatureCurve), or
// nominal ± tempSpread within 0–100 °C without one.
func buildTemperature(res *evaluate.Result, opt Options) (*Chart, error) {
	r := res.Recipe
	tr := r.Temperature
	lo, hi := tr.Min, tr.Max
	note := "declared range"
	if !tr.HasRange || hi <= lo {
		lo, hi = math.Max(tr.Nominal-tempSpread, 0), math.Min(tr.Nominal+tempSpread, 100)
		note = fmt.Sprintf("no range declared: nominal ± %d °C", tempSpread)
	}
	temps := linspace(lo, hi, opt.points())
	ph, err := solver.TemperatureCurve(res.Mixture, temps)
	if err != nil {
		return nil, fmt.Errorf("temperature curve: %w", err)
	}
	p := Panel{X: Axis{Label: "temperature (°C)", Min: lo, Max: hi}, Y: Axis{Label: "pH"},
		Series: []Series{{Label: "pH of the product as made", X: temps, Y: ph}},
		Bands:  windowBand(r, false),
		Marks:  []Mark{{Label: fmt.Sprintf("as made: pH %.2f at %g °C", res.Equilibrium.PH, tr.Nominal), X: tr.Nominal, Y: res.Equilibrium.PH}},
	}
	p.Y.Min, p.Y.Max = tempPHRange(r, ph)
	return &Chart{Kind: Temperature, Recipe: r.ID.Value, Title: r.ID.Value + " · pH against temperature",
		Subtitle: note + " · amounts as made · " + res.Mixture.Activity.Title() + " activities", Panels: []Panel{p}}, nil
}

// tempPHRange covers the curve and the window on tenths of a pH unit, at
// least half a unit wide so a flat curve does not look steep.
func tempPHRange(r *spec.Recipe, ph []float64) (float64, float64) {
	lo, hi := phSpan(r, ph)
	lo, hi = math.Floor(lo*10-1)/10, math.Ceil(hi*10+1)/10
	if d := 0.5 - (hi - lo); d > 0 {
		lo, hi = lo-d/2, hi+d/2
	}
	return lo, hi
}

// phSpan is the smallest interval holding every value and both ends of
// the recipe's pH window.
func phSpan(r *spec.Recipe, values ...[]float64) (float64, float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, vs := range values {
		for _, v := range vs {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if w := r.PH; w != nil {
		for _, end := range []*spec.Num{w.Min, w.Max} {
			if end != nil {
				lo, hi = math.Min(lo, end.Value), math.Max(hi, end.Value)
			}
		}
	}
	return lo, hi
}
