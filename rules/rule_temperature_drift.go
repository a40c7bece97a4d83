package rules

import (
	"fmt"
	"math"
)

// temperatureDriftSettings are the thresholds of temperature-drift.
type temperatureDriftSettings struct {
	Points int `yaml:"points" unit:"temperatures" doc:"temperatures solved across the declared range, ends included"`
}

var temperatureDrift = &Rule{
	Name:    "temperature-drift",
	Summary: "The pH leaves the window somewhere in the recipe's declared temperature range.",
	Doc: `What it checks: on a recipe with a temperature range (temperature:
{nominal: 25 C, range: 4..25 C}) and a ph: window, the pH of the product as
made — every amount, the q.s. amount included, fixed at the nominal
temperature — at evenly spaced temperatures across the range.

How it is computed: the solver re-solves the same mixture at each
temperature, moving every pKa with its ionization enthalpy (van 't Hoff
with ΔCp, Goldberg et al. 2002), Kw and the Debye–Hückel constant. The
message names the temperature where the pH is furthest outside the window.

Why it matters: amine buffers move a lot with temperature (tris by about
−0.03 pH per °C): a buffer adjusted to pH 7.5 at 25 °C reads about 8.1 in
the cold room. Carboxylate and phosphate buffers move little.

How to fix: adjust the pH at the temperature of use, choose a buffer with
a small ionization enthalpy (phosphate, acetate, MES, HEPES move less
than tris), or narrow the declared range.

Thresholds: the window is the recipe's own. Seven points is common
practice for a smooth monotonic curve; the pH of these systems changes
monotonically with temperature, so the ends dominate.`,
	Default:  Error,
	Defaults: temperatureDriftSettings{Points: 7},
	Run: func(p *Pass) {
		r := p.Recipe()
		t := r.Temperature
		w := r.PH
		if !t.HasRange || w == nil || t.Max-t.Min <= 0 {
			return
		}
		n := max(settingsOf[temperatureDriftSettings](p).Points, 2)
		nominal := p.Equilibrium().PH
		var lowT, highT, lowPH, highPH float64
		lowBy, highBy := 0.0, 0.0
		for k := 0; k < n; k++ {
			tc := t.Min + (t.Max-t.Min)*float64(k)/float64(n-1)
			eq, err := p.SolveWith(At(tc))
			if err != nil {
				continue
			}
			if w.Min != nil && nominal >= w.Min.Value {
				if by := w.Min.Value - eq.PH; by > lowBy {
					lowBy, lowT, lowPH = by, tc, eq.PH
				}
			}
			if w.Max != nil && nominal <= w.Max.Value {
				if by := eq.PH - w.Max.Value; by > highBy {
					highBy, highT, highPH = by, tc, eq.PH
				}
			}
		}
		at := r.PosOf("temperature")
		if lowBy > 0 {
			p.Report(at, "adjust the pH at the temperature of use, or use a buffer that moves less with temperature",
				"at %s the pH is %.2f, below the window minimum %.2f (%.2f at %s)", degrees(lowT), lowPH, w.Min.Value, nominal, degrees(t.Nominal))
		}
		if highBy > 0 {
			p.Report(at, "adjust the pH at the temperature of use, or use a buffer that moves less with temperature",
				"at %s the pH is %.2f, above the window maximum %.2f (%.2f at %s)", degrees(highT), highPH, w.Max.Value, nominal, degrees(t.Nominal))
		}
	},
}

// degrees formats a temperature in °C without trailing noise.
func degrees(c float64) string {
	return fmt.Sprintf("%g °C", math.Round(c*10)/10)
}
