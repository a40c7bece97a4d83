package rules

import "math"

// weighingSettings are the thresholds of weighing-tolerance.
type weighingSettings struct {
	DefaultTolerance float64 `yaml:"default-tolerance" unit:"%" doc:"weighing tolerance of ingredients that declare none (phgate.yaml defaults.tolerance sets it for a project)"`
}

var weighingTolerance = &Rule{
	Name:    "weighing-tolerance",
	Summary: "Within the weighing tolerances, a batch can come out with its pH outside the window.",
	Doc: `What it checks: on a recipe with a ph: window and no q.s. titrant, the
worst-case pH when every ingredient is weighed at the edge of its
tolerance (the ingredient's tolerance:, else the default) in the direction
that pushes the pH furthest, up and down.

How it is computed: the solver's sensitivity dpH/dc of each ingredient
(implicit differentiation of the charge balance) times its tolerance
gives each ingredient's share; their absolute sum is the linear worst
case, and the corner it points at is confirmed by re-solving the mixture
with every amount moved to that corner. The finding is raised only when
the re-solved corner leaves the window; the message names the ingredient
with the largest share.

Why it matters: a recipe whose nominal pH passes can still produce
out-of-specification batches when a strong acid or base, or a buffer
component far from its pKa, is weighed a little off.

How to fix: tighten the tolerance of the dominating ingredient, increase
the buffer capacity, or make that ingredient a q.s. titrant
(adjust-to-ph), which makes the pH independent of weighing errors.

Thresholds: the window is the recipe's own. A default tolerance of 1 % of
the amount is common practice for production weighing of minor
ingredients; recipes with a q.s. titrant are skipped because the titrant
is added until the target pH is reached, which absorbs weighing errors.`,
	Default:  Warning,
	Defaults: weighingSettings{DefaultTolerance: 1},
	Run: func(p *Pass) {
		r := p.Recipe()
		w := r.PH
		if w == nil || r.Titrant() != nil {
			return
		}
		res := p.Result
		def := settingsOf[weighingSettings](p).DefaultTolerance
		var up []Addition
		spread, dom, domShare, domTol := 0.0, -1, 0.0, 0.0
		for i := range res.Lines {
			l := &res.Lines[i]
			if l.Conc <= 0 || (len(l.Component.StrongPerUnit) == 0 && len(l.Component.SystemPerUnit) == 0) {
				continue
			}
			tol := def
			if l.Ingredient.Tolerance != nil {
				tol = l.Ingredient.Tolerance.Value
			}
			d := tol / 100 * l.Conc
			sens, err := p.Sensitivity(l.Component)
			if err != nil || sens == 0 || d == 0 {
				continue
			}
			share := math.Abs(sens * d)
			spread += share
			if share > domShare {
				dom, domShare, domTol = i, share, tol
			}
			up = append(up, Addition{Component: l.Component, Amount: math.Copysign(d, sens)})
		}
		if dom < 0 {
			return
		}
		down := make([]Addition, len(up))
		for i, a := range up {
			down[i] = Addition{Component: a.Component, Amount: -a.Amount}
		}
		ph := p.Equilibrium().PH
		l := &res.Lines[dom]
		fix := "tighten the tolerance of " + l.Label() + ", raise the buffer capacity, or titrate to the target pH (adjust-to-ph)"
		if eq, err := p.SolveWith(Variation{Add: up}); err == nil && w.Max != nil && ph <= w.Max.Value && eq.PH > w.Max.Value {
			p.Report(amountPos(l), fix,
				"within the weighing tolerances the pH can reach %.2f, above the window maximum %.2f (%.2f nominal, ±%.2f from sensitivities); %s dominates with ±%.2f pH for ±%g %%",
				eq.PH, w.Max.Value, ph, spread, l.Label(), domShare, domTol)
		}
		if eq, err := p.SolveWith(Variation{Add: down}); err == nil && w.Min != nil && ph >= w.Min.Value && eq.PH < w.Min.Value {
			p.Report(amountPos(l), fix,
				"within the weighing tolerances the pH can fall to %.2f, below the window minimum %.2f (%.2f nominal, ±%.2f from sensitivities); %s dominates with ±%.2f pH for ±%g %%",
				eq.PH, w.Min.Value, ph, spread, l.Label(), domShare, domTol)
		}
	},
}
