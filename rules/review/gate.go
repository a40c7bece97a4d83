package review

import (
	"fmt"
	"math"

	"github.com/phgate/phgate/rules"
)

// Gates are the limits a change must stay within.
type Gates struct {
	// MaxPHShift, when set, is the largest allowed |ΔpH|.
	MaxPHShift *float64
	// FailOnNew, when set, is the lowest severity of a newly appeared
	// (unwaived) finding that fails the change.
	FailOnNew *rules.Severity
}

// Apply records in d.GatesCrossed every gate the change crosses and
// reports whether any was.
func (d *Diff) Apply(g Gates) bool {
	for _, c := range d.Changes {
		if g.MaxPHShift != nil && c.DeltaPH != nil && math.Abs(c.rawDeltaPH) > *g.MaxPHShift {
			d.GatesCrossed = append(d.GatesCrossed, fmt.Sprintf("%s: pH moved by %+.4g, more than the allowed %g",
				c.Recipe, c.rawDeltaPH, *g.MaxPHShift))
		}
		if g.FailOnNew != nil {
			n := 0
			for _, f := range c.NewFindings {
				if f.Waived == "" && f.Severity >= *g.FailOnNew {
					n++
				}
			}
			if n > 0 {
				d.GatesCrossed = append(d.GatesCrossed, fmt.Sprintf("%s: %d new %s finding%s (--fail-on-new %s)",
					c.Recipe, n, orWorse(*g.FailOnNew), plural(n), *g.FailOnNew))
			}
		}
	}
	return len(d.GatesCrossed) > 0
}

func orWorse(s rules.Severity) string {
	if s >= rules.Error {
		return "error"
	}
	return s.String() + "-or-worse"
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
