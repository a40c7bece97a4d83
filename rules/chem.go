package rules

import (
	"fmt"
	"math"

	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/evaluate"
)

// neutralState returns the index of the uncharged protonation state of a
// system with the given top charge and number of steps, or -1.
func neutralState(top, steps int) int {
	if top < 0 || top > steps {
		return -1
	}
	return top
}

// idealFractions is the Henderson–Hasselbalch speciation of a system at
// pH (activity coefficients 1): α_k ∝ 10^(k·pH − pKa_1 − … − pKa_k).
func idealFractions(pka []float64, ph float64) []float64 {
	logs := make([]float64, len(pka)+1)
	top := 0.0
	for k := 1; k <= len(pka); k++ {
		logs[k] = logs[k-1] + ph - pka[k-1]
		top = math.Max(top, logs[k])
	}
	sum := 0.0
	out := make([]float64, len(logs))
	for k, l := range logs {
		out[k] = math.Pow(10, l-top)
		sum += out[k]
	}
	for k := range out {
		out[k] /= sum
	}
	return out
}

// phScanStep is the pH step of crossing's coarse scan; fine enough not
// to step over a crossing of the smooth fraction curves it is used on.
const phScanStep = 0.05

// crossing walks from pH `from` in direction dir (+1 or −1) to the end
// of 0–14 and returns the first pH where ok(pH) becomes true, refined by
// bisection to 0.001. found is false when it never does.
func crossing(from float64, dir int, ok func(ph float64) bool) (ph float64, found bool) {
	prev := from
	for x := from; x >= 0 && x <= 14; x += float64(dir) * phScanStep {
		if ok(x) {
			lo, hi := prev, x
			for math.Abs(hi-lo) > 0.001 {
				mid := (lo + hi) / 2
				if ok(mid) {
					hi = mid
				} else {
					lo = mid
				}
			}
			return hi, true
		}
		prev = x
	}
	return 0, false
}

// concUnit is "mM" on a volume basis and "mmol/kg" on a water-mass basis.
func concUnit(res *evaluate.Result) string {
	if res.Molal {
		return "mmol/kg"
	}
	return "mM"
}

// milli formats a mol/L (mol/kg) amount in the recipe's milli unit.
func milli(res *evaluate.Result, x float64) string {
	return fmt.Sprintf("%.3g %s", x*1000, concUnit(res))
}

// amountPos is where a line's amount is written (or the line itself).
func amountPos(l *evaluate.Line) spec.Pos {
	in := l.Ingredient
	switch {
	case in.Amount != nil:
		return in.Amount.Pos
	case in.AdjustToPH != nil:
		return in.AdjustToPH.Pos
	}
	return in.Pos
}

// lineBringing returns the index of the recipe line that brings the
// most of mixture system sys (isSystem) or strong ion sys, or -1.
func lineBringing(res *evaluate.Result, index int, isSystem bool) int {
	best, bestAmt := -1, 0.0
	for i := range res.Lines {
		l := &res.Lines[i]
		shares := l.Component.StrongPerUnit
		if isSystem {
			shares = l.Component.SystemPerUnit
		}
		for _, s := range shares {
			if s.Index == index {
				if amt := s.Count * l.Conc; amt > bestAmt {
					best, bestAmt = i, amt
				}
			}
		}
	}
	return best
}

// phPos is the position findings about the pH attach to: the `ph`
// key, or the recipe id when there is no window.
func phPos(r *spec.Recipe) spec.Pos { return r.PosOf("ph") }

// linePos is the ingredient's identifying value (use:, from: or
// sequence:), or the list item.
func linePos(l *evaluate.Line) spec.Pos {
	in := l.Ingredient
	for _, t := range []spec.Text{in.Use, in.From, in.Sequence} {
		if t.Pos.Line > 0 {
			return t.Pos
		}
	}
	return in.Pos
}

// concLabel is "mol/L", or "mol/kg" on a water-mass basis.
func concLabel(res *evaluate.Result) string {
	if res.Molal {
		return "mol/kg"
	}
	return "mol/L"
}
