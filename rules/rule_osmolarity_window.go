package rules

var osmolarityWindow = &Rule{
	Name:    "osmolarity-window",
	Summary: "The computed osmolarity lies outside the recipe's declared range.",
	Doc: `What it checks: the ideal osmolarity estimate against the recipe's
osmolarity: {min, max} window in mOsm/L (tonicity of eye, nasal and
parenteral products, osmolality of drinks).

How it is computed: Σ c over every free dissolved particle at equilibrium
— strong ions after complexation, each protonation state of every
acid–base system, complexes and neutral solutes — in mOsm per litre (per
kg of water on a water-mass basis). No osmotic coefficient is applied, so
the estimate runs a few per cent high for saline-like solutions (NaCl
φ ≈ 0.93, from memory).

Why it matters: hypo- and hypertonic products sting or damage tissue
(eye drops, nasal sprays, injections) and change how drinks are absorbed.

How to fix: add or remove a tonicity agent (sodium chloride, glycerol,
mannitol, dextrose), or adjust the window.

Thresholds: the window is the recipe's own specification (isotonic is
about 290 mOsm/L; 270–330 is a common ophthalmic range, common practice).`,
	Default: Error,
	Run: func(p *Pass) {
		w := p.Recipe().Osmolarity
		if w == nil {
			return
		}
		osm := p.Equilibrium().Osmolarity * 1000
		if w.Min != nil && osm < w.Min.Value {
			p.Report(w.Min.Pos, "add a tonicity agent (sodium chloride, glycerol, mannitol) or lower the minimum",
				"computed osmolarity %.0f mOsm/L is below the minimum %g mOsm/L", osm, w.Min.Value)
		}
		if w.Max != nil && osm > w.Max.Value {
			p.Report(w.Max.Pos, "remove some tonicity agent or dilute, or raise the maximum",
				"computed osmolarity %.0f mOsm/L is above the maximum %g mOsm/L", osm, w.Max.Value)
		}
	},
}
