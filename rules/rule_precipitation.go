package rules

import (
	"fmt"
	"math"

	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec"
)

// precipitationSettings are the thresholds of precipitation.
type precipitationSettings struct {
	Margin   float64 `yaml:"margin" unit:"log units" doc:"warn when a declared salt's saturation index is above minus this margin"`
	Fraction float64 `yaml:"solubility-fraction" doc:"warn when a weak acid or base is above this fraction of its solubility at the computed pH"`
}

// clearAcidPH and clearBasePH bound the search for the pH at which a
// salt's risk goes away: titrating further than pH 1 or 13 is no advice.
const (
	clearAcidPH = 1.0
	clearBasePH = 13.0
)

var precipitation = &Rule{
	Name:    "precipitation",
	Summary: "Something in the recipe can come out of solution at the computed pH.",
	Doc: `What it checks: (a) every weak acid or base whose neutral form has an
intrinsic solubility in the catalog (benzoic, sorbic and salicylic acid,
parabens, …): its total concentration against its solubility at the
computed pH; (b) every sparingly soluble salt the catalog declares whose
ions are all in the recipe (calcium and magnesium phosphates, citrates,
carbonates, oxalates, hydroxides, zinc hydroxide, …): its saturation index.

How it is computed: (a) S = S0 / α0, where S0 is the intrinsic solubility
of the uncharged form and α0 its fraction at the solved pH; for a
monoprotic acid this is S0·(1 + 10^(pH − pKa)), for a base
S0·(1 + 10^(pKa − pH)), and for a zwitterion or a polyprotic system the
same with every protonation state counted. Above S is an error; above
solubility-fraction of S a warning. (b) SI = log10(IAP/Ksp) from the
solver, with free-ion activities after complexation (citrate and
phosphate complexes of calcium and magnesium take ions out) and Ksp at
the recipe's temperature. SI above 0 is an error; above −margin a warning.
The message names the species, the computed solubility or SI, and the pH
at which the risk goes away: for (a) from the speciation of the system,
for (b) by titrating the solved mixture with strong acid (or base) until
the saturation index falls below −margin.

Why it matters: a solid that forms on storage or in the cold is a failed
batch — haze, sediment, lost preservative or active, blocked filters.
Supersaturated solutions can stay clear for weeks and then nucleate.

How to fix: lower the concentration, move the pH toward the value the
message gives, add a complexing agent (citrate, EDTA) for metal salts,
or use a more soluble form.

Thresholds: SI 0 is the thermodynamic limit. The 0.5 log-unit margin is
common practice: published Ksp values for one solid disagree by 0.3–0.5
log units (see the notes of the catalog's salts) and the Davies model adds
its own error at higher ionic strength. The solubility fraction of 0.8 is
common practice (solubility falls with temperature and with other
solutes; keep a fifth in hand).`,
	Default:  Error,
	Defaults: precipitationSettings{Margin: 0.5, Fraction: 0.8},
	Run: func(p *Pass) {
		s := settingsOf[precipitationSettings](p)
		weakSolubility(p, s)
		saltSaturation(p, s)
	},
}

// intrinsic maps a system id to the intrinsic solubility (mol/L) of its
// neutral form, from the first catalog ingredient (by id) that gives one.
func intrinsic(p *Pass) map[string]float64 {
	out := map[string]float64{}
	cat := p.Result.Catalog
	for _, id := range cat.IDs() {
		e, _ := cat.Ingredient(id)
		if e.IntrinsicSolubility == nil || len(e.Systems) == 0 {
			continue
		}
		if _, ok := out[e.Systems[0].System]; !ok {
			out[e.Systems[0].System] = e.IntrinsicSolubility.V
		}
	}
	return out
}

func weakSolubility(p *Pass, s *precipitationSettings) {
	res, eq := p.Result, p.Equilibrium()
	s0s := intrinsic(p)
	for i, sys := range res.Mixture.Systems {
		s0, ok := s0s[sys.Name]
		total := sys.Total
		n := neutralState(sys.TopCharge, len(sys.PKa))
		if !ok || total <= 0 || n < 0 {
			continue
		}
		st := eq.Systems[i]
		alpha := st.Fractions[n]
		sol := math.Inf(1)
		if alpha > 0 {
			sol = s0 / alpha
		}
		ratio := total / sol
		if ratio <= s.Fraction {
			continue
		}
		li := lineBringing(res, i, true)
		if li < 0 {
			continue
		}
		l := &res.Lines[li]
		need := total / s.Fraction
		dissolves := func(ph float64) bool {
			a := idealFractions(st.PKa, ph)[n]
			return a == 0 || s0/a >= need
		}
		clear := clearText(st.PKa, n, eq.PH, dissolves)
		species := st.Species[n]
		if ratio > 1 {
			p.Report(amountPos(l), "lower the concentration or move the pH as the message says",
				"%s (%s) at %s exceeds its solubility at pH %.2f, %s (intrinsic solubility of %s %s)%s",
				l.Label(), sys.Name, milli(res, total), eq.PH, milli(res, sol), species, milli(res, s0), clear)
			continue
		}
		p.ReportAs(Warning, amountPos(l), "keep a margin below the solubility: lower the concentration or move the pH",
			"%s (%s) at %s is %.0f%% of its solubility at pH %.2f, %s (limit %.0f%%)%s",
			l.Label(), sys.Name, milli(res, total), ratio*100, eq.PH, milli(res, sol), s.Fraction*100, clear)
	}
}

// clearText finds the nearest pH at which dissolves becomes true, moving
// toward more ionization of the neutral state n, and phrases it.
func clearText(pka []float64, n int, ph float64, dissolves func(float64) bool) string {
	up, okUp := math.NaN(), false
	down, okDown := math.NaN(), false
	if n < len(pka) {
		up, okUp = crossing(ph, +1, dissolves)
	}
	if n > 0 {
		down, okDown = crossing(ph, -1, dissolves)
	}
	switch {
	case okUp && (!okDown || up-ph <= ph-down):
		return fmt.Sprintf("; it stays dissolved above pH %.2f", up)
	case okDown:
		return fmt.Sprintf("; it stays dissolved below pH %.2f", down)
	}
	return "; no pH between 0 and 14 dissolves it at this concentration"
}

func saltSaturation(p *Pass, s *precipitationSettings) {
	res, eq := p.Result, p.Equilibrium()
	for i, st := range eq.Salts {
		if st.SaturationIndex <= -s.Margin {
			continue
		}
		salt := res.Mixture.Salts[i]
		pos := saltPos(p, salt)
		name := salt.Name
		if cs, ok := res.Catalog.Salt(salt.Name); ok {
			name = fmt.Sprintf("%s (%s)", cs.Name, cs.Formula)
		}
		below := func(e *solver.Equilibrium) bool { return e.Salts[i].SaturationIndex <= -s.Margin }
		clear := ""
		if e, ok := p.firstAlong(p.StrongAcid(), clearAcidPH, below); ok {
			clear = fmt.Sprintf("; below pH %.2f its saturation index stays under −%g", e.PH, s.Margin)
		} else if e, ok := p.firstAlong(p.StrongBase(), clearBasePH, below); ok {
			clear = fmt.Sprintf("; above pH %.2f its saturation index stays under −%g", e.PH, s.Margin)
		} else {
			clear = "; no pH between 1 and 13 brings it under the margin"
		}
		if st.SaturationIndex > 0 {
			p.Report(pos, "lower the metal or the anion, lower the pH, or add a complexing agent such as citrate",
				"%s is supersaturated: saturation index %+.2f at pH %.2f (above 0 can precipitate)%s", name, st.SaturationIndex, eq.PH, clear)
			continue
		}
		p.ReportAs(Warning, pos, "keep a margin below saturation: lower the metal or the anion, or the pH",
			"%s is close to saturation: saturation index %+.2f at pH %.2f (margin −%g)%s", name, st.SaturationIndex, eq.PH, s.Margin, clear)
	}
}

// saltPos is the amount of the ingredient that brings most of the salt's
// first strong ion (the metal), else of its first acid–base system.
func saltPos(p *Pass, salt solver.Salt) spec.Pos {
	for _, kind := range []solver.RefKind{solver.RefStrong, solver.RefSpecies} {
		for _, t := range salt.Terms {
			if t.Ion.Kind != kind {
				continue
			}
			if li := lineBringing(p.Result, t.Ion.Index, kind == solver.RefSpecies); li >= 0 {
				return amountPos(&p.Result.Lines[li])
			}
		}
	}
	return phPos(p.Recipe())
}
