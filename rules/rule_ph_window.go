package rules

var phWindow = &Rule{
	Name:    "ph-window",
	Summary: "The computed pH lies outside the recipe's target window.",
	Doc: `What it checks: the pH computed at the recipe's nominal temperature
against the ph: {min, max} window.

How it is computed: the equilibrium solver's pH (activity scale, Davies
activity coefficients unless the recipe says otherwise), after the q.s.
adjustment if the recipe has one.

Why it matters: a product outside its pH window can fail release testing,
irritate skin or eyes, lose preservative efficacy or degrade its actives.

How to fix: change the buffer ratio or the q.s. target, or widen the
window if the specification allows it.

Thresholds: the window is the recipe's own specification.`,
	Default: Error,
	Run: func(p *Pass) {
		w := p.Recipe().PH
		if w == nil {
			return
		}
		ph := p.Result.Equilibrium.PH
		if w.Min != nil && ph < w.Min.Value {
			p.Report(w.Min.Pos, "raise the pH: more base, less acid, or a higher q.s. target",
				"computed pH %.2f is below the window minimum %.2f", ph, w.Min.Value)
		}
		if w.Max != nil && ph > w.Max.Value {
			p.Report(w.Max.Pos, "lower the pH: more acid, less base, or a lower q.s. target",
				"computed pH %.2f is above the window maximum %.2f", ph, w.Max.Value)
		}
	},
}
