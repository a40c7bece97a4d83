package rules

import "fmt"

// preservativeSettings are the thresholds of preservative-ionized.
type preservativeSettings struct {
	Minimum float64 `yaml:"minimum" unit:"fraction (0: each preservative's catalog value)" doc:"un-ionized fraction every weak-acid preservative needs; 0 uses each catalog entry's own value"`
}

var preservativeIonized = &Rule{
	Name:    "preservative-ionized",
	Summary: "A weak-acid preservative is too ionized at the computed pH to work.",
	Doc: `What it checks: every ingredient the catalog marks as a weak-acid
preservative (benzoic acid and sodium benzoate, sorbic acid and potassium
sorbate, dehydroacetic acid, …): the fraction of its acid–base system in
the un-ionized form at the computed pH against the fraction it needs.

How it is computed: the un-ionized fraction is the solver's speciation of
the preservative's system (activity corrected), e.g. 1/(1 + 10^(pH − pKa))
for a monoprotic acid. The message gives the pH at or below which the
needed fraction is reached (from the same pKa, ideal speciation).

Why it matters: only the un-ionized acid crosses microbial cell membranes;
the anion is all but inactive. A benzoate-preserved product at pH 6 is in
practice unpreserved and fails a challenge test.

How to fix: lower the pH, or change to a preservative that works at the
product's pH (parabens and many non-acid preservatives are pH independent
over the usual range).

Thresholds: each catalog entry carries its minimum un-ionized fraction,
derived from the usual upper pH of use given in supplier literature
(benzoic acid pH 4.5, sorbic acid 6.0, dehydroacetic acid 6.5) with the
catalog's pKa (source "preservative-practice", recalled; common
practice). The minimum setting overrides it for every preservative.`,
	Default:  Warning,
	Defaults: preservativeSettings{Minimum: 0},
	Run: func(p *Pass) {
		s := settingsOf[preservativeSettings](p)
		res, eq := p.Result, p.Equilibrium()
		for li := range res.Lines {
			l := &res.Lines[li]
			e := l.Entry
			if e == nil || e.Preservative == nil || len(e.Systems) == 0 || l.Conc <= 0 {
				continue
			}
			need := e.Preservative.V
			if s.Minimum > 0 {
				need = s.Minimum
			}
			for i, sys := range res.Mixture.Systems {
				if sys.Name != e.Systems[0].System {
					continue
				}
				n := neutralState(sys.TopCharge, len(sys.PKa))
				if n < 0 {
					break
				}
				st := eq.Systems[i]
				frac := st.Fractions[n]
				if frac >= need {
					break
				}
				ok := func(ph float64) bool { return idealFractions(st.PKa, ph)[n] >= need }
				limit := ""
				down, okDown := crossing(eq.PH, -1, ok)
				up, okUp := crossing(eq.PH, +1, ok)
				switch {
				case okDown && (!okUp || eq.PH-down <= up-eq.PH):
					limit = fmt.Sprintf(", reached at pH %.2f or below", down)
				case okUp:
					limit = fmt.Sprintf(", reached at pH %.2f or above", up)
				}
				p.Report(linePos(l), "lower the pH, or use a preservative that works at this pH",
					"%s: %.1f%% of %s is un-ionized (%s) at pH %.2f; it needs at least %.1f%%%s",
					l.Label(), frac*100, sys.Name, st.Species[n], eq.PH, need*100, limit)
				break
			}
		}
	},
}
