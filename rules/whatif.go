package rules

import (
	"math"

	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec/evaluate"
)

// Variation is a what-if change to the recipe's mixture as made (q.s.
// amount included and fixed): another temperature, and amounts of
// components added (negative amounts remove).
type Variation struct {
	// TemperatureC replaces the nominal temperature when AtTemperature is set.
	TemperatureC  float64
	AtTemperature bool
	// Add lists amounts (mol/L, or mol/kg on a molal basis) to add.
	Add []Addition
}

// Addition is an amount of a component.
type Addition struct {
	Component solver.Component
	Amount    float64
}

// At is a Variation that only changes the temperature.
func At(tempC float64) Variation { return Variation{TemperatureC: tempC, AtTemperature: true} }

// whatIf holds the recipe's mixture extended with the ions of a strong
// acid and a strong base (at zero concentration when the recipe has none),
// shared by every rule of one pass over a recipe.
type whatIf struct {
	res    *evaluate.Result
	base   *solver.Mixture
	acid   solver.Component
	alkali solver.Component
}

func (w *whatIf) mixture() solver.Mixture {
	if w.base != nil {
		return *w.base
	}
	m := w.res.Mixture
	m.Strong = append([]solver.StrongIon(nil), m.Strong...)
	slot := func(name string, charge int) int {
		for i, s := range m.Strong {
			if s.Name == name {
				return i
			}
		}
		m.Strong = append(m.Strong, solver.StrongIon{Name: name, Charge: charge})
		return len(m.Strong) - 1
	}
	// One unit of chloride (sodium) with the charge balance closing the
	// proton balance is one unit of HCl (NaOH).
	w.acid = solver.Component{Name: "strong acid", StrongPerUnit: []solver.Share{{Index: slot("Cl-", -1), Count: 1}}}
	w.alkali = solver.Component{Name: "strong base", StrongPerUnit: []solver.Share{{Index: slot("Na+", 1), Count: 1}}}
	w.base = &m
	return m
}

// SolveWith re-solves the recipe's mixture with a variation. Rules use
// it (never the solver directly) for temperature points, tolerance
// corners and titrations.
func (p *Pass) SolveWith(v Variation) (*solver.Equilibrium, error) {
	m := p.whatIf.mixture()
	if v.AtTemperature {
		m.TemperatureC = v.TemperatureC
	}
	for _, a := range v.Add {
		m = m.With(a.Component, a.Amount)
	}
	return solver.Solve(m)
}

// StrongAcid is a component adding one mol/L of a strong monoprotic acid
// (HCl) per unit, for "how much acid would …" questions.
func (p *Pass) StrongAcid() solver.Component {
	p.whatIf.mixture()
	return p.whatIf.acid
}

// StrongBase is a component adding one mol/L of a strong monobasic base
// (NaOH) per unit.
func (p *Pass) StrongBase() solver.Component {
	p.whatIf.mixture()
	return p.whatIf.alkali
}

// Titrate returns the amount (mol/L) of c that brings the recipe's mixture
// to targetPH.
func (p *Pass) Titrate(c solver.Component, targetPH float64) (float64, error) {
	t, err := solver.Titrate(p.whatIf.mixture(), c, targetPH)
	if err != nil {
		return 0, err
	}
	return t.Amount, nil
}

// Sensitivity returns dpH per mol/L of c at the recipe's equilibrium; c
// is one of the recipe's own line components.
func (p *Pass) Sensitivity(c solver.Component) (float64, error) {
	return solver.Sensitivity(p.Result.Mixture, p.Result.Equilibrium, c)
}

// bisectSteps bounds the search in firstAlong; each step is one Solve and
// 40 halvings of the amount resolve the pH far below what is printed.
const bisectSteps = 40

// firstAlong adds c to the mixture, from nothing up to the amount that
// reaches limitPH (or solver.MaxTitrant), and returns the equilibrium at
// the smallest amount where done becomes true, assuming done flips once
// along the way. ok is false when done never becomes true.
func (p *Pass) firstAlong(c solver.Component, limitPH float64, done func(*solver.Equilibrium) bool) (*solver.Equilibrium, bool) {
	hi, err := p.Titrate(c, limitPH)
	if err != nil || !(hi > 0) || math.IsInf(hi, 0) {
		hi = solver.MaxTitrant
	}
	eqHi, err := p.SolveWith(Variation{Add: []Addition{{c, hi}}})
	if err != nil || !done(eqHi) {
		return nil, false
	}
	lo := 0.0
	for i := 0; i < bisectSteps; i++ {
		mid := (lo + hi) / 2
		eq, err := p.SolveWith(Variation{Add: []Addition{{c, mid}}})
		if err != nil {
			return nil, false
		}
		if done(eq) {
			hi, eqHi = mid, eq
		} else {
			lo = mid
		}
	}
	return eqHi, true
}
