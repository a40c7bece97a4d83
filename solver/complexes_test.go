package solver

import (
	"fmt"
	"math"
	"testing"
)

func calciumCitrate(logK float64) Mixture {
	return Mixture{
		Systems:      []System{citrate(0.01)},
		Strong:       []StrongIon{ion("Ca2+", 0.01, 2), ion("Cl-", 0.02, -1), ion("Na+", 0.03, 1)},
		Complexes:    []Complex{{Name: "CaCit-", Metal: 0, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: logK}},
		TemperatureC: 25,
	}
}

func TestCalciumCitrate(t *testing.T) {
	// log K = 4.85 at I = 0 (Singh et al. 1991, J. Chem. Eng. Data 36, 52,
	// cited in the reference file, status C).
	m := calciumCitrate(4.85)
	eq, err := Solve(m)
	if err != nil {
		t.Fatal(err)
	}
	free := eq.Strong[0].Free
	if free > 0.5*0.01 {
		t.Errorf("free Ca2+ %.3g mol/L: complexation should bind most of 10 mM (log K 4.85)", free)
	}
	cx := eq.Complexes[0].Conc
	// Mass balances (definition), 1e-10 relative.
	withinRel(t, "Ca balance", free+cx, 0.01, 1e-10)
	sumCit := cx
	for _, c := range eq.Systems[0].Conc {
		sumCit += c
	}
	withinRel(t, "citrate balance", sumCit, 0.01, 1e-10)
	// Mass action with activities: a(CaCit−)/(a(Ca²+)·a(Cit³−)) = 10^4.85.
	s := eq.Systems[0]
	k := eq.GammaH * cx / (eq.Strong[0].Gamma * free * s.Gamma[3] * s.Conc[3])
	withinRel(t, "K", k, math.Pow(10, 4.85), 1e-9)
	sum := 0.0
	for _, f := range s.Fractions {
		sum += f
	}
	within(t, "Σ fractions of free citrate", sum, 1, 1e-12)
	within(t, "LogK at 25 °C", eq.Complexes[0].LogK, 4.85, 1e-12)

	// Without the complex, free calcium is the total.
	m.Complexes = nil
	eq0, err := Solve(m)
	if err != nil {
		t.Fatal(err)
	}
	within(t, "free Ca without complex", eq0.Strong[0].Free, 0.01, 1e-15)
	if eq.Osmolarity >= eq0.Osmolarity {
		t.Errorf("complexation must lower the particle count: %g vs %g", eq.Osmolarity, eq0.Osmolarity)
	}
}

func TestComplexStrength(t *testing.T) {
	// From no binding to essentially quantitative binding at equivalence
	// (the hardest case for the mass balances): balances must still close.
	for _, logK := range []float64{-5, 0, 2, 4.85, 8, 12, 16} {
		t.Run(fmt.Sprintf("logK %g", logK), func(t *testing.T) {
			m := calciumCitrate(logK)
			m.TemperatureC = 37
			m.Complexes[0].DeltaH = 2000
			eq, err := Solve(m)
			if err != nil {
				t.Fatal(err)
			}
			cx := eq.Complexes[0].Conc
			withinRel(t, "Ca balance", eq.Strong[0].Free+cx, 0.01, 1e-10)
			sum := cx
			for _, c := range eq.Systems[0].Conc {
				sum += c
			}
			withinRel(t, "citrate balance", sum, 0.01, 1e-10)
			res, scale := chargeResidual(&m, eq)
			within(t, "charge residual / scale", res/scale, 0, 1e-10)
		})
	}
}

func TestComplexAbsentPartner(t *testing.T) {
	// A complex whose metal is absent must not form and not disturb the
	// ligand (definition).
	m := calciumCitrate(4.85)
	m.Strong[0].Conc = 0
	eq, err := Solve(m)
	if err != nil {
		t.Fatal(err)
	}
	within(t, "complex", eq.Complexes[0].Conc, 0, 1e-15)
	sum := 0.0
	for _, c := range eq.Systems[0].Conc {
		sum += c
	}
	withinRel(t, "citrate", sum, 0.01, 1e-12)
}
