package rules

// phWindowSettings are the thresholds of ph-window.
type phWindowSettings struct {
	Margin float64 `yaml:"margin" unit:"pH" doc:"warn when the computed pH is inside the window but this close to an edge"`
}

var phWindow = &Rule{
	Name:    "ph-window",
	Summary: "The computed pH lies outside the recipe's target window, or just inside an edge.",
	Doc: `What it checks: the pH computed at the recipe's nominal temperature
against the ph: {min, max} window. Outside the window is an error; inside
but within the margin of an edge is a warning (one strength below the
rule's severity).

How it is computed: the equilibrium solver's pH (activity scale, Davies
activity coefficients unless the recipe says otherwise), after the q.s.
adjustment if the recipe has one. A recipe without a ph: window is not
checked.

Why it matters: a product outside its pH window can fail release testing,
irritate skin or eyes, lose preservative efficacy or degrade its actives.
A computed pH that sits on the edge leaves no room for the spread of real
batches and of the pH meter.

How to fix: change the buffer ratio or the q.s. target, or widen the
window if the specification allows it.

Thresholds: the window is the recipe's own specification. The margin of
0.1 pH is common practice: about the combined uncertainty of a routine
calibrated pH measurement (±0.05) and of the model's constants.`,
	Default:  Error,
	Defaults: phWindowSettings{Margin: 0.1},
	Run: func(p *Pass) {
		w := p.Recipe().PH
		if w == nil {
			return
		}
		s := settingsOf[phWindowSettings](p)
		ph := p.Equilibrium().PH
		switch {
		case w.Min != nil && ph < w.Min.Value:
			p.Report(w.Min.Pos, "raise the pH: more base, less acid, or a higher q.s. target",
				"computed pH %.2f is below the window minimum %.2f", ph, w.Min.Value)
		case w.Max != nil && ph > w.Max.Value:
			p.Report(w.Max.Pos, "lower the pH: more acid, less base, or a lower q.s. target",
				"computed pH %.2f is above the window maximum %.2f", ph, w.Max.Value)
		case w.Min != nil && ph-w.Min.Value < s.Margin:
			p.ReportAs(Warning, w.Min.Pos, "aim nearer the middle of the window",
				"computed pH %.2f is within %.2f of the window minimum %.2f (margin %g)", ph, ph-w.Min.Value, w.Min.Value, s.Margin)
		case w.Max != nil && w.Max.Value-ph < s.Margin:
			p.ReportAs(Warning, w.Max.Pos, "aim nearer the middle of the window",
				"computed pH %.2f is within %.2f of the window maximum %.2f (margin %g)", ph, w.Max.Value-ph, w.Max.Value, s.Margin)
		}
	},
}
