package rules

import "math"

// nearIsoelectricSettings are the thresholds of near-isoelectric.
type nearIsoelectricSettings struct {
	Margin float64 `yaml:"margin" unit:"pH" doc:"smallest acceptable distance between the pH and the isoelectric point"`
}

var nearIsoelectric = &Rule{
	Name:    "near-isoelectric",
	Summary: "A protein, peptide or zwitterion sits close to its isoelectric point.",
	Doc: `What it checks: every peptide or protein given by its sequence, and every
catalog ingredient with an isoelectric point (amino acids and other
zwitterions), against the computed pH.

How it is computed: for sequences, the pI is the pH of zero net charge from
the catalog's peptide pKa set (termini and D, E, C, Y, H, K, R side
chains, Henderson–Hasselbalch per group), and the message gives the net
charge per molecule at the recipe's pH; for catalog ingredients, the pI is
the catalog value (the mean of the two pKa around the neutral form).

Why it matters: at its pI a molecule carries no net charge, so nothing
keeps molecules apart: proteins and peptides aggregate, gel or
precipitate, and amino acids such as aspartic and glutamic acid are at
their least soluble.

How to fix: move the pH at least the margin away from the pI (usually to
the side where the active is most stable), or lower the concentration.

Thresholds: a margin of 1 pH unit is common practice in protein and
peptide formulation (a net charge of a few units per molecule is needed
for colloidal stability).`,
	Default:  Warning,
	Defaults: nearIsoelectricSettings{Margin: 1},
	Run: func(p *Pass) {
		s := settingsOf[nearIsoelectricSettings](p)
		res := p.Result
		ph := p.Equilibrium().PH
		pep := 0
		for i := range res.Lines {
			l := &res.Lines[i]
			var pi float64
			switch {
			case l.Peptide != nil && pep < len(res.Peptides):
				st := res.Peptides[pep]
				pep++
				pi = st.PI
				if d := math.Abs(ph - pi); d < s.Margin {
					p.Report(linePos(l), "move the pH further from the pI, to the side where the peptide is stable",
						"%s is %.2f pH units from its isoelectric point %.2f at pH %.2f (margin %g); net charge %+.2f per molecule",
						l.Label(), d, pi, ph, s.Margin, st.NetCharge)
				}
				continue
			case l.Entry != nil && l.Entry.PI != nil && l.Conc > 0:
				pi = l.Entry.PI.V
			default:
				continue
			}
			if d := math.Abs(ph - pi); d < s.Margin {
				p.Report(linePos(l), "move the pH further from the pI, or lower the concentration",
					"%s is %.2f pH units from its isoelectric point %.2f at pH %.2f (margin %g)", l.Label(), d, pi, ph, s.Margin)
			}
		}
	},
}
