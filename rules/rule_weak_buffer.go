package rules

import (
	"fmt"
	"math"

	"github.com/phgate/phgate/spec"
)

// weakBufferSettings are the thresholds of weak-buffer.
type weakBufferSettings struct {
	Minimum     float64 `yaml:"minimum" unit:"mM per pH" doc:"lowest acceptable buffer capacity β"`
	PKaDistance float64 `yaml:"pka-distance" unit:"pH" doc:"largest acceptable distance between the pH and the nearest pKa of a buffering system"`
}

// bufferSystemMin is the smallest total (mol/L) for an acid–base system to
// count as one of the recipe's buffering systems; traces of a preservative
// or a counter-ion do not make a buffer (common practice).
const bufferSystemMin = 1e-3

var weakBuffer = &Rule{
	Name:    "weak-buffer",
	Summary: "The recipe holds its pH weakly: low buffer capacity, or no buffering system near the pH.",
	Doc: `What it checks: on a recipe with a ph: window, (1) the buffer capacity
β at the computed pH against a minimum, and (2) whether the pH lies within
pka-distance of a pKa of at least one buffering system (a system present
at 1 mM or more). Below pH 3 or above pH 11 water's own ions can supply the
capacity; condition (2) is then skipped when they do.

How it is computed: β = dC_base/dpH from the solver's analytic derivative
of the charge balance (mM of strong base or acid per pH unit). The message
says how much strong acid or base (HCl or NaOH, in mM of product) would
take the pH out of the window, found by titrating the solved mixture with
the solver, toward whichever edge is reached with less.

Why it matters: a weakly buffered product drifts with carbon dioxide
uptake, leaching from glass or plastic, an active that is itself an acid
or a base, and small weighing errors; its measured pH also wanders during
filling.

How to fix: raise the buffer concentration, or choose a buffer whose pKa
lies within one unit of the target pH (e.g. phosphate near 7.2, citrate
near 3.1, 4.8 and 6.4, acetate near 4.8, tris near 8.1).

Thresholds: minimum 5 mM per pH is common practice for products that must
hold their pH on storage (ophthalmic and nasal products are often kept
lower on purpose; waive or lower the minimum for them). The one-unit pKa
distance is the textbook useful range of a buffer, pKa ± 1, where β is at
least a third of its maximum (Henderson–Hasselbalch; common practice).`,
	Default:  Warning,
	Defaults: weakBufferSettings{Minimum: 5, PKaDistance: 1},
	Run: func(p *Pass) {
		w := p.Recipe().PH
		if w == nil {
			return
		}
		s := settingsOf[weakBufferSettings](p)
		eq := p.Equilibrium()
		res := p.Result
		beta := eq.BufferCapacity * 1000
		weak := beta < s.Minimum

		// Nearest pKa of a buffering system.
		nearest, nearestSys, nearestPKa := math.Inf(1), "", 0.0
		for i, st := range eq.Systems {
			if res.Mixture.Systems[i].Total < bufferSystemMin {
				continue
			}
			for _, pk := range st.PKa {
				if d := math.Abs(eq.PH - pk); d < nearest {
					nearest, nearestSys, nearestPKa = d, st.Name, pk
				}
			}
		}
		waterBeta := math.Ln10 * (eq.H + eq.OH) * 1000
		far := nearestSys != "" && nearest > s.PKaDistance && waterBeta < s.Minimum
		if !weak && !far {
			return
		}
		u := concUnit(res)
		msg := fmt.Sprintf("β = %.3g %s per pH (minimum %g)", beta, u, s.Minimum)
		if far {
			pkaText := fmt.Sprintf("pH %.2f is %.2f units from the nearest pKa (%s %.2f; limit %g)", eq.PH, nearest, nearestSys, nearestPKa, s.PKaDistance)
			if weak {
				msg += "; " + pkaText
			} else {
				msg = pkaText + "; " + msg
			}
		}
		if move := escapeText(p, w); move != "" {
			msg += ": " + move
		}
		p.Report(phPos(p.Recipe()), "raise the buffer concentration, or use a buffer with a pKa within one unit of the target pH", "%s", msg)
	},
}

// escapeText says how much strong acid or strong base (whichever is
// less) would take the pH across a window edge, or "" when the pH is
// already outside or the titration fails.
func escapeText(p *Pass, w *spec.Window) string {
	ph := p.Equilibrium().PH
	if (w.Min != nil && ph < w.Min.Value) || (w.Max != nil && ph > w.Max.Value) {
		return ""
	}
	best, bestAmt := "", math.Inf(1)
	try := func(edge *spec.Num, acid bool) {
		if edge == nil {
			return
		}
		c, word, dir := p.StrongBase(), "base", "above"
		if acid {
			c, word, dir = p.StrongAcid(), "acid", "below"
		}
		amt, err := p.Titrate(c, edge.Value)
		if err != nil || amt >= bestAmt {
			return
		}
		best, bestAmt = fmt.Sprintf("%s of strong %s would take the pH %s %.2f", milli(p.Result, amt), word, dir, edge.Value), amt
	}
	try(w.Min, true)
	try(w.Max, false)
	return best
}
