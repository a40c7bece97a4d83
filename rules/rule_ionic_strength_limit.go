package rules

import (
	"math"

	"github.com/phgate/phgate/solver"
)

// ionicStrengthSettings are the thresholds of ionic-strength-limit.
type ionicStrengthSettings struct {
	Maximum float64 `yaml:"maximum" unit:"mol/L" doc:"ionic strength above which computed activities, and so the pH, are not trusted"`
}

var ionicStrengthLimit = &Rule{
	Name:    "ionic-strength-limit",
	Summary: "The ionic strength is beyond the range where the activity model holds.",
	Doc: `What it checks: the solved ionic strength I = ½ Σ c z² against the
validity limit of the activity model.

How it is computed: the solver iterates the ionic strength to
self-consistency with the speciation. The finding points at the
ingredient that contributes most to it.

Why it matters: above the limit the Davies equation mis-states activity
coefficients; the computed pH, buffer capacity and saturation indices can
be off by several tenths of a pH unit. The numbers are then a guide, not a
prediction: measure.

How to fix: nothing may need fixing: confirm the pH by measurement and
waive the finding with that reason, or dilute (e.g. check the working
dilution of a concentrate as its own recipe).

Thresholds: 0.5 mol/L, the usual upper limit quoted for the Davies
equation (Davies 1962, Ion Association; Stumm & Morgan, Aquatic
Chemistry, from memory), the solver's IonicStrengthLimit. The rule also
applies under the ideal model, which is worse at every ionic strength.`,
	Default:  Warning,
	Defaults: ionicStrengthSettings{Maximum: solver.IonicStrengthLimit},
	Run: func(p *Pass) {
		max := settingsOf[ionicStrengthSettings](p).Maximum
		eq, res := p.Equilibrium(), p.Result
		if eq.IonicStrength <= max {
			return
		}
		best, bestI := -1, 0.0
		for i := range res.Lines {
			l := &res.Lines[i]
			contrib := 0.0
			for _, s := range l.Component.StrongPerUnit {
				z := float64(res.Mixture.Strong[s.Index].Charge)
				contrib += s.Count * z * z / 2
			}
			for _, s := range l.Component.SystemPerUnit {
				st := eq.Systems[s.Index]
				for k, f := range st.Fractions {
					z := float64(st.Charges[k])
					contrib += s.Count * f * z * z / 2
				}
			}
			if c := math.Abs(contrib * l.Conc); c > bestI {
				best, bestI = i, c
			}
		}
		pos := phPos(p.Recipe())
		label := "the recipe"
		if best >= 0 {
			pos, label = amountPos(&res.Lines[best]), res.Lines[best].Label()
		}
		p.Report(pos, "confirm the pH by measurement, or check the diluted product as its own recipe",
			"ionic strength %.3g %s is above %g %s, where the %s activity model is no longer reliable; %s contributes the most (about %.2g %s)",
			eq.IonicStrength, concLabel(res), max, concLabel(res), res.Mixture.Activity.Title(), label, bestI, concLabel(res))
	},
}
