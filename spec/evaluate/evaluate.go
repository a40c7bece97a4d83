// Package evaluate turns a loaded recipe into a solver mixture (every
// amount converted once to mol/L of final solution, or mol/kg of water),
// solves for the q.s. amount of the adjust-to-ph ingredient, and solves
// the equilibrium. It is the one place where recipe units meet numbers.
package evaluate

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/units"
)

// LineKind says where an ingredient line's composition comes from.
type LineKind int

const (
	// FromCatalog: a catalog ingredient (use:).
	FromCatalog LineKind = iota
	// FromStock: another recipe of the project (from:).
	FromStock
	// FromSequence: a peptide given by its sequence.
	FromSequence
	// Water: purified water, made up to the basis.
	Water
)

// Line is one resolved ingredient.
type Line struct {
	Ingredient *spec.Ingredient
	Kind       LineKind
	// Entry is the catalog entry (FromCatalog), else nil.
	Entry *catalog.Ingredient
	// Stock is the solved stock recipe (FromStock), else nil.
	Stock *Result
	// Peptide is the derived peptide (FromSequence), else nil.
	Peptide *Peptide
	// Conc is the concentration in the final solution: mol/L (mol/kg on a
	// water-mass basis) of the ingredient; for a stock, litres of stock per
	// litre (or kg) of product.
	Conc float64
	// Moles and Grams per batch (0 when there is no basis).
	Moles, Grams float64
	// Millilitres of stock per batch, when the amount was a volume or the
	// q.s. ingredient has a stock concentration; else 0.
	Millilitres float64
	// Component is what one unit of Conc adds to the mixture.
	Component solver.Component
	// neutrals is what one unit of Conc adds to Mixture.Neutrals; kept
	// apart because neutral solutes do not enter the charge balance.
	neutrals []neutralShare
}

// Label names the line in messages.
func (l *Line) Label() string { return l.Ingredient.Label() }

// Adjustment is the solved q.s. amount of the adjust-to-ph ingredient.
type Adjustment struct {
	Line     int
	TargetPH float64
	// Conc is in mol/L (mol/kg) of final solution.
	Conc, Moles, Grams, Millilitres float64
}

// Result is a solved recipe.
type Result struct {
	Recipe  *spec.Recipe
	Catalog *catalog.Catalog
	Lines   []Line
	// Mixture is the final composition, q.s. amount included.
	Mixture solver.Mixture
	// Equilibrium is its solution at the nominal temperature.
	Equilibrium *solver.Equilibrium
	// Adjustment is the q.s. result, or nil.
	Adjustment *Adjustment
	// Unreachable is set when the q.s. target cannot be reached with the
	// chosen titrant; the recipe is then solved without it.
	Unreachable *solver.UnreachableError
	// Peptides are the recipe's peptide lines, with net charge and pI.
	Peptides []PeptideState
	// Molal reports a water-mass basis (concentrations in mol/kg).
	Molal bool
}

// StockLookup returns the solved recipe with the given id, or a problem.
type StockLookup func(id string, at spec.Pos) (*Result, *diag.Problem)

// Evaluate resolves and solves a recipe against a catalog (the project's:
// built-in plus its catalog files) merged with the recipe's own inline
// `catalog:`, and a stock lookup.
func Evaluate(r *spec.Recipe, cat *catalog.Catalog, stocks StockLookup) (*Result, diag.Problems) {
	cat, ps := withInline(r, cat)
	if len(ps) > 0 {
		return nil, ps
	}
	b := builder{r: r, cat: cat, res: &Result{Recipe: r, Catalog: cat, Molal: r.Basis.Kind == spec.WaterMassBasis},
		sysIndex: map[string]int{}, ionIndex: map[string]int{}, neutralIndex: map[string]int{}}
	b.res.Mixture.TemperatureC = r.Temperature.Nominal
	b.res.Mixture.Activity = r.Activity
	for i := range r.Ingredients {
		b.line(&r.Ingredients[i], stocks)
	}
	if len(b.problems) > 0 {
		return nil, b.problems
	}
	b.addSaltsAndComplexes()
	if ps := b.solve(); len(ps) > 0 {
		return nil, ps
	}
	return b.res, nil
}

type builder struct {
	r            *spec.Recipe
	cat          *catalog.Catalog
	res          *Result
	sysIndex     map[string]int
	ionIndex     map[string]int
	neutralIndex map[string]int
	problems     diag.Problems
}

func (b *builder) add(p spec.Pos, msg string) {
	b.problems = append(b.problems, diag.Problem{Path: b.r.Path, Line: p.Line, Column: p.Column, Message: msg})
}

// per is the batch size the per-batch amounts divide by: litres of product
// or kilograms of water (0 without a basis).
func (b *builder) per() float64 {
	switch b.r.Basis.Kind {
	case spec.VolumeBasis:
		return b.r.Basis.Litres
	case spec.WaterMassBasis:
		return b.r.Basis.Kilograms
	}
	return 0
}

func (b *builder) line(in *spec.Ingredient, stocks StockLookup) {
	l := Line{Ingredient: in}
	switch {
	case in.Use.Value == "purified-water":
		l.Kind = Water
		b.res.Lines = append(b.res.Lines, l)
		return
	case in.Use.Value != "":
		e, ok := b.cat.Ingredient(in.Use.Value)
		if !ok {
			msg := fmt.Sprintf("unknown ingredient %q", in.Use.Value)
			if s := b.cat.Suggest(in.Use.Value, 3); len(s) > 0 {
				msg += fmt.Sprintf("; did you mean %s?", quoteList(s))
			}
			b.add(in.Use.Pos, msg)
			return
		}
		l.Entry = e
		l.Component, l.neutrals = b.catalogComponent(e)
		if in.AdjustToPH == nil {
			l.Conc = b.concentration(in, e.MolarMass, e.Density)
		}
	case in.From.Value != "":
		l.Kind = FromStock
		st, p := stocks(in.From.Value, in.From.Pos)
		if p != nil {
			b.problems = append(b.problems, *p)
			return
		}
		l.Stock = st
		l.Component, l.neutrals = b.stockComponent(st)
		l.Conc = b.stockFraction(in, st)
	case in.Sequence.Value != "":
		l.Kind = FromSequence
		pep, err := NewPeptide(in.Sequence.Value, b.cat)
		if err != nil {
			b.add(in.Sequence.Pos, err.Error())
			return
		}
		l.Peptide = pep
		l.Component = b.peptideComponent(in, pep)
		l.Conc = b.concentration(in, pep.MolarMass, nil)
	}
	if math.IsNaN(l.Conc) || math.IsInf(l.Conc, 0) {
		l.Conc = 0
	}
	if l.Conc > spec.MaxMolarity && l.Kind != FromStock {
		b.add(in.Amount.Pos, fmt.Sprintf("%s of %s is %.3g mol/L in the product, more than can dissolve (limit %g mol/L)", in.Amount.Raw, in.Label(), l.Conc, spec.MaxMolarity))
	}
	if l.Kind == FromStock && l.Conc > 1+1e-9 && !b.res.Molal {
		b.add(in.Amount.Pos, fmt.Sprintf("%s of %s is more than the whole batch (%s)", in.Amount.Raw, in.Label(), b.r.Basis.Raw))
	}
	b.perBatch(&l)
	b.res.Lines = append(b.res.Lines, l)
	b.apply(&l)
}

func (b *builder) perBatch(l *Line) {
	per := b.per()
	l.Moles = l.Conc * per
	switch {
	case l.Entry != nil:
		l.Grams = l.Moles * l.Entry.MolarMass
	case l.Peptide != nil:
		l.Grams = l.Moles * l.Peptide.MolarMass
	}
	if a := l.Ingredient.Amount; a != nil && a.Kind == units.Volume {
		l.Millilitres = a.Value * 1000
	}
	if l.Kind == FromStock {
		l.Moles = 0
		l.Millilitres = l.Conc * per * 1000
	}
}

// concentration converts an amount to mol per litre of product (or per kg
// of water on a molal basis).
func (b *builder) concentration(in *spec.Ingredient, molarMass float64, density *catalog.Value) float64 {
	a := in.Amount
	if a == nil {
		return 0
	}
	per := b.per()
	needMass := func() bool {
		if molarMass > 0 {
			return true
		}
		b.add(a.Pos, fmt.Sprintf("%s has no molar mass in the catalog; give its amount in moles or mol/L", in.Label()))
		return false
	}
	switch a.Kind {
	case units.Substance:
		return a.Value / per
	case units.MolarConcentration, units.Molality:
		// Molarity and molality are taken as equal in dilute solution
		// (1 L of product ≈ 1 kg of water); documented in the README.
		return a.Value
	case units.Mass:
		if needMass() {
			return a.Value / molarMass / per
		}
	case units.MassConcentration:
		if needMass() {
			return a.Value / molarMass
		}
	case units.MassFraction:
		if needMass() {
			if b.res.Molal {
				return a.Value / (1 - a.Value) * 1000 / molarMass
			}
			return a.Value * b.r.Density * 1000 / molarMass
		}
	case units.Volume:
		return b.fromStockVolume(in, molarMass, density) / per
	}
	return 0
}

// fromStockVolume returns the moles of ingredient in a volume of its stock.
func (b *builder) fromStockVolume(in *spec.Ingredient, molarMass float64, density *catalog.Value) float64 {
	a, s := in.Amount, in.Stock
	if s == nil {
		return 0
	}
	switch s.Kind {
	case units.MolarConcentration, units.Molality:
		return a.Value * s.Value
	case units.MassConcentration:
		if molarMass <= 0 {
			b.add(s.Pos, fmt.Sprintf("%s has no molar mass; give the stock in mol/L", in.Label()))
			return 0
		}
		return a.Value * s.Value / molarMass
	case units.MassFraction:
		// The density of a solution depends on its strength; a catalog
		// density belongs to one commercial strength only, so it is never
		// applied silently to another.
		if in.StockDensity == nil {
			b.add(s.Pos, stockDensityHint(in, s, density))
			return 0
		}
		rho := in.StockDensity.Value / 1000
		if molarMass <= 0 {
			b.add(s.Pos, fmt.Sprintf("%s has no molar mass; give the stock in mol/L", in.Label()))
			return 0
		}
		return a.Value * 1000 * rho * s.Value / molarMass
	}
	return 0
}

// stockFraction is litres of stock per litre (kg) of product.
func (b *builder) stockFraction(in *spec.Ingredient, st *Result) float64 {
	a := in.Amount
	if a == nil {
		return 0
	}
	per := b.per()
	switch a.Kind {
	case units.Volume:
		return a.Value / per
	case units.Mass:
		return a.Value / (st.Recipe.Density * 1000) / per
	}
	return 0
}

func (b *builder) system(id string) int {
	if i, ok := b.sysIndex[id]; ok {
		return i
	}
	s := b.cat.Systems[id]
	if s == nil {
		// The catalog loader rejects references to unknown systems, so
		// this only guards hand-built catalogs in tests.
		s = &catalog.System{ID: id}
	}
	sys := solver.System{Name: id, TopCharge: s.TopCharge, Species: append([]string(nil), s.Species...)}
	hasCp := false
	for _, st := range s.Steps {
		if st.DeltaCp != nil {
			hasCp = true
		}
	}
	for _, st := range s.Steps {
		sys.PKa = append(sys.PKa, st.PKa.V)
		dh := 0.0
		if st.DeltaH != nil {
			dh = st.DeltaH.V * 1000
		}
		sys.DeltaH = append(sys.DeltaH, dh)
		if hasCp {
			cp := 0.0
			if st.DeltaCp != nil {
				cp = st.DeltaCp.V
			}
			sys.DeltaCp = append(sys.DeltaCp, cp)
		}
	}
	b.res.Mixture.Systems = append(b.res.Mixture.Systems, sys)
	b.sysIndex[id] = len(b.res.Mixture.Systems) - 1
	return b.sysIndex[id]
}

func (b *builder) ion(id string) int {
	if i, ok := b.ionIndex[id]; ok {
		return i
	}
	charge := 0
	if ion := b.cat.Ions[id]; ion != nil {
		charge = ion.Charge
	}
	b.res.Mixture.Strong = append(b.res.Mixture.Strong, solver.StrongIon{Name: id, Charge: charge})
	b.ionIndex[id] = len(b.res.Mixture.Strong) - 1
	return b.ionIndex[id]
}

func (b *builder) neutral(id string) int {
	if i, ok := b.neutralIndex[id]; ok {
		return i
	}
	b.res.Mixture.Neutrals = append(b.res.Mixture.Neutrals, solver.Neutral{Name: id})
	b.neutralIndex[id] = len(b.res.Mixture.Neutrals) - 1
	return b.neutralIndex[id]
}

// neutralShare is an amount of one Mixture.Neutrals entry per unit of a line.
type neutralShare struct {
	index int
	count float64
}

func (b *builder) catalogComponent(e *catalog.Ingredient) (solver.Component, []neutralShare) {
	c := solver.Component{Name: e.ID}
	var ns []neutralShare
	for _, s := range e.Systems {
		c.SystemPerUnit = append(c.SystemPerUnit, solver.Share{Index: b.system(s.System), Count: s.Count})
	}
	for _, s := range e.Ions {
		c.StrongPerUnit = append(c.StrongPerUnit, solver.Share{Index: b.ion(s.Ion), Count: s.Count})
	}
	if e.Neutrals > 0 {
		ns = append(ns, neutralShare{b.neutral(e.ID), e.Neutrals})
	}
	return c, ns
}

func (b *builder) stockComponent(st *Result) (solver.Component, []neutralShare) {
	c := solver.Component{Name: st.Recipe.ID.Value}
	var ns []neutralShare
	for _, s := range st.Mixture.Systems {
		idx, ok := b.sysIndex[s.Name]
		if !ok {
			b.res.Mixture.Systems = append(b.res.Mixture.Systems, solver.System{Name: s.Name, TopCharge: s.TopCharge,
				PKa: s.PKa, DeltaH: s.DeltaH, DeltaCp: s.DeltaCp, Species: s.Species})
			idx = len(b.res.Mixture.Systems) - 1
			b.sysIndex[s.Name] = idx
		}
		c.SystemPerUnit = append(c.SystemPerUnit, solver.Share{Index: idx, Count: s.Total})
	}
	for _, s := range st.Mixture.Strong {
		idx, ok := b.ionIndex[s.Name]
		if !ok {
			b.res.Mixture.Strong = append(b.res.Mixture.Strong, solver.StrongIon{Name: s.Name, Charge: s.Charge})
			idx = len(b.res.Mixture.Strong) - 1
			b.ionIndex[s.Name] = idx
		}
		c.StrongPerUnit = append(c.StrongPerUnit, solver.Share{Index: idx, Count: s.Conc})
	}
	for _, n := range st.Mixture.Neutrals {
		ns = append(ns, neutralShare{b.neutral(n.Name), n.Conc})
	}
	return c, ns
}

func (b *builder) peptideComponent(in *spec.Ingredient, p *Peptide) solver.Component {
	label := in.Label()
	c := solver.Component{Name: label}
	for _, g := range p.Groups {
		id := fmt.Sprintf("%s:%s", label, g.Code)
		idx, ok := b.sysIndex[id]
		if !ok {
			top := 0
			species := []string{g.Code + "H", g.Code + "-"}
			if g.Basic {
				top = 1
				species = []string{g.Code + "H+", g.Code}
			}
			b.res.Mixture.Systems = append(b.res.Mixture.Systems, solver.System{Name: id, TopCharge: top,
				PKa: []float64{g.PKa}, Species: species})
			idx = len(b.res.Mixture.Systems) - 1
			b.sysIndex[id] = idx
		}
		c.SystemPerUnit = append(c.SystemPerUnit, solver.Share{Index: idx, Count: float64(g.Count)})
	}
	return c
}

// apply adds a line's amount to the mixture.
func (b *builder) apply(l *Line) {
	for _, s := range l.Component.SystemPerUnit {
		b.res.Mixture.Systems[s.Index].Total += s.Count * l.Conc
	}
	for _, s := range l.Component.StrongPerUnit {
		b.res.Mixture.Strong[s.Index].Conc += s.Count * l.Conc
	}
	for _, n := range l.neutrals {
		b.res.Mixture.Neutrals[n.index].Conc += n.count * l.Conc
	}
}

func quoteList(s []string) string {
	out := ""
	for i, x := range s {
		switch {
		case i == 0:
		case i == len(s)-1:
			out += " or "
		default:
			out += ", "
		}
		out += fmt.Sprintf("%q", x)
	}
	return out
}

// solve runs the q.s. titration (if any) and the final equilibrium.
func (b *builder) solve() diag.Problems {
	r := b.r
	m := b.res.Mixture
	for ti := range b.res.Lines {
		l := &b.res.Lines[ti]
		if l.Ingredient.AdjustToPH == nil {
			continue
		}
		target := l.Ingredient.AdjustToPH.Value
		t, err := solver.Titrate(m, l.Component, target)
		var ue *solver.UnreachableError
		if errors.As(err, &ue) {
			b.res.Unreachable = ue
			break
		}
		if err != nil {
			return diag.Problems{{Path: r.Path, Line: l.Ingredient.AdjustToPH.Pos.Line, Column: l.Ingredient.AdjustToPH.Pos.Column,
				Message: fmt.Sprintf("cannot solve the q.s. of %s to pH %g: %v", l.Label(), target, err)}}
		}
		l.Conc = t.Amount
		b.perBatch(l)
		if s := l.Ingredient.Stock; s != nil && l.Moles > 0 {
			switch s.Kind {
			case units.MolarConcentration, units.Molality:
				l.Millilitres = l.Moles / s.Value * 1000
			case units.MassConcentration:
				l.Millilitres = l.Grams / s.Value * 1000
			case units.MassFraction:
				rho := b.stockDensity(l)
				if rho <= 0 {
					var d *catalog.Value
					if l.Entry != nil {
						d = l.Entry.Density
					}
					return diag.Problems{{Path: r.Path, Line: s.Pos.Line, Column: s.Pos.Column, Message: stockDensityHint(l.Ingredient, s, d)}}
				}
				l.Millilitres = l.Grams / (s.Value * rho)
			}
		}
		b.res.Adjustment = &Adjustment{Line: ti, TargetPH: target, Conc: l.Conc, Moles: l.Moles, Grams: l.Grams, Millilitres: l.Millilitres}
		m = m.With(l.Component, t.Amount)
	}
	b.res.Mixture = m
	eq, err := solver.Solve(m)
	if err != nil {
		return diag.Problems{b.solverProblem(err)}
	}
	b.res.Equilibrium = eq
	b.res.Peptides = b.peptideStates()
	return nil
}

func (b *builder) stockDensity(l *Line) float64 {
	if l.Ingredient.StockDensity != nil {
		return l.Ingredient.StockDensity.Value / 1000
	}
	return 0
}

// stockDensityHint asks for the density of a % w/w stock, quoting the
// catalog's density and the strength it belongs to when there is one.
func stockDensityHint(in *spec.Ingredient, s *spec.Amount, density *catalog.Value) string {
	msg := fmt.Sprintf("a %s stock of %s needs its density: add stock-density (e.g. stock-density: 1.11 g/mL)", s.Raw, in.Label())
	if density != nil {
		msg += fmt.Sprintf("; the catalog's %g g/mL is for %s", density.V, densityNote(density))
	}
	return msg
}

func densityNote(v *catalog.Value) string {
	if v.Notes != "" {
		return v.Notes
	}
	return "one commercial strength"
}

// solverProblem maps a solver error back to the recipe line that caused it.
func (b *builder) solverProblem(err error) diag.Problem {
	p := b.r.ID.Pos
	var ie *solver.InputError
	if errors.As(err, &ie) && ie.Index >= 0 {
		name := ""
		switch ie.Field {
		case "Systems":
			if ie.Index < len(b.res.Mixture.Systems) {
				name = b.res.Mixture.Systems[ie.Index].Name
			}
		case "Strong":
			if ie.Index < len(b.res.Mixture.Strong) {
				name = b.res.Mixture.Strong[ie.Index].Name
			}
		}
		if ln := b.lineReleasing(name); ln != nil {
			p = ln.Ingredient.Pos
		}
	}
	var re *solver.RangeError
	if errors.As(err, &re) {
		// The mixture as a whole is beyond the model: point at the line
		// that contributes most to the ionic strength.
		if ln := b.strongestLine(); ln != nil {
			p = ln.Ingredient.Pos
		}
	}
	return diag.Problem{Path: b.r.Path, Line: p.Line, Column: p.Column, Message: "cannot solve the equilibrium: " + err.Error()}
}

// strongestLine is the ingredient line whose strong ions add most to the
// ionic strength (½ Σ c z²), or nil.
func (b *builder) strongestLine() *Line {
	var best *Line
	bestI := 0.0
	for i := range b.res.Lines {
		l := &b.res.Lines[i]
		ionic := 0.0
		for _, s := range l.Component.StrongPerUnit {
			z := float64(b.res.Mixture.Strong[s.Index].Charge)
			ionic += s.Count * l.Conc * z * z / 2
		}
		if ionic > bestI {
			best, bestI = l, ionic
		}
	}
	return best
}

func (b *builder) lineReleasing(name string) *Line {
	if name == "" {
		return nil
	}
	for i := range b.res.Lines {
		l := &b.res.Lines[i]
		for _, s := range l.Component.SystemPerUnit {
			if b.res.Mixture.Systems[s.Index].Name == name {
				return l
			}
		}
		for _, s := range l.Component.StrongPerUnit {
			if b.res.Mixture.Strong[s.Index].Name == name {
				return l
			}
		}
	}
	return nil
}

// addSaltsAndComplexes declares every catalog salt and complex whose ions
// are all present in the mixture.
func (b *builder) addSaltsAndComplexes() {
	m := &b.res.Mixture
	for _, s := range b.cat.Salts {
		var terms []solver.SaltTerm
		ok := true
		for _, t := range s.Terms {
			ref, found := b.ref(t.Ref)
			if !found {
				ok = false
				break
			}
			terms = append(terms, solver.SaltTerm{Ion: ref, Count: t.Count})
		}
		if !ok {
			continue
		}
		dh := 0.0
		if s.DeltaH != nil {
			dh = s.DeltaH.V * 1000
		}
		m.Salts = append(m.Salts, solver.Salt{Name: s.ID, Terms: terms, PKsp: s.PKsp.V, DeltaH: dh})
	}
	for _, c := range b.cat.Complexes {
		mi, ok := b.ionIndex[c.Metal]
		if !ok || m.Strong[mi].Conc <= 0 {
			continue
		}
		lig, found := b.ref(c.Ligand)
		if !found || lig.Kind != solver.RefSpecies {
			continue
		}
		dh := 0.0
		if c.DeltaH != nil {
			dh = c.DeltaH.V * 1000
		}
		m.Complexes = append(m.Complexes, solver.Complex{Name: c.ID, Metal: mi, Ligand: lig, LogK: c.LogK.V, DeltaH: dh})
	}
	sort.SliceStable(m.Salts, func(i, j int) bool { return m.Salts[i].Name < m.Salts[j].Name })
}

// ref maps a catalog species reference to a mixture reference when the
// species is present (non-zero total, or the q.s. titrant brings it).
func (b *builder) ref(r catalog.SpeciesRef) (solver.Ref, bool) {
	switch {
	case r.Ion == "H+":
		return solver.Ref{Kind: solver.RefHydrogen}, true
	case r.Ion == "OH-":
		return solver.Ref{Kind: solver.RefHydroxide}, true
	case r.Ion != "":
		i, ok := b.ionIndex[r.Ion]
		return solver.Ref{Kind: solver.RefStrong, Index: i}, ok
	case r.System != "":
		i, ok := b.sysIndex[r.System]
		if !ok {
			return solver.Ref{}, false
		}
		for k, sp := range b.res.Mixture.Systems[i].Species {
			if sp == r.Species {
				return solver.Ref{Kind: solver.RefSpecies, Index: i, Species: k}, true
			}
		}
	}
	return solver.Ref{}, false
}

// withInline returns cat merged with the recipe's inline catalog, whose
// entries may refer to cat's.
func withInline(r *spec.Recipe, cat *catalog.Catalog) (*catalog.Catalog, diag.Problems) {
	if r.Catalog == nil {
		return cat, nil
	}
	inline, ps := catalog.FromNodeWithBase(r.Catalog, r.Path, cat)
	if len(ps) > 0 {
		return nil, ps
	}
	merged, err := cat.Merge(inline)
	if err != nil {
		return nil, diag.Problems{{Path: r.Path, Line: r.Catalog.Line, Column: r.Catalog.Column, Message: err.Error()}}
	}
	return merged, nil
}
