package rules

import "github.com/phgate/phgate/solver"

var qsUnreachable = &Rule{
	Name:    "qs-unreachable",
	Summary: "The adjust-to-ph target cannot be reached with the chosen titrant.",
	Doc: `What it checks: a recipe whose q.s. ingredient (adjust-to-ph) cannot
bring the mixture to its target pH.

How it is computed: the solver titrates the rest of the recipe with the
titrant from nothing up to 5 mol/L of product; the reachable range runs
from the pH without titrant to the pH with the most. When the target lies
outside it, the recipe is solved without the titrant (so the other rules
still see a result) and this rule reports the range.

Why it matters: in the plant the operator would add titrant without ever
reaching the target — or reach for the wrong bottle. A target on the far
side of the starting pH needs an acid where a base was chosen, or the
reverse.

How to fix: use a titrant of the other kind (an acid to lower the pH, a
base to raise it), change the target, or change the other ingredients so
the target lies in the reachable range.

Thresholds: none; the 5 mol/L ceiling is the solver's MaxTitrant, far
beyond any practical q.s. addition.`,
	Default: Error,
	Run: func(p *Pass) {
		u := p.Result.Unreachable
		t := p.Recipe().Titrant()
		if u == nil || t == nil {
			return
		}
		start := p.Equilibrium().PH
		var fix string
		switch {
		case u.Target > u.MaxPH && start >= u.MaxPH-1e-9:
			fix = "the titrant lowers the pH: use a base to raise it to the target"
		case u.Target < u.MinPH && start <= u.MinPH+1e-9:
			fix = "the titrant raises the pH: use an acid to lower it to the target"
		default:
			fix = "the target needs more titrant than can dissolve: use a stronger titrant or change the target"
		}
		p.Report(t.AdjustToPH.Pos, fix,
			"%s cannot bring the pH to %.2f: the reachable range is pH %.2f to %.2f (0 to %g mol/L of titrant); without it the pH is %.2f",
			t.Label(), u.Target, u.MinPH, u.MaxPH, solver.MaxTitrant, start)
	},
}
