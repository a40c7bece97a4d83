package solver

import (
	"errors"
	"math"
	"testing"
)

// FuzzSolve builds a mixture of two acid–base systems, three strong ions
// and one complex from raw numbers and checks the properties every
// solution must have. Its corpus (testdata/fuzz/FuzzSolve) runs as
// part of the ordinary tests.
func FuzzSolve(f *testing.F) {
	f.Add(0.05, 7.198, 5.0, int8(0), 0.075, 0.0, 0.0, 25.0, false, 4.85)
	f.Add(1e-12, -10.0, 30.0, int8(1), 5.0, 5.0, 1e-12, 0.0, false, 0.0)
	f.Add(5.0, 20.0, 0.0, int8(-2), 0.0, 5.0, 2.0, 100.0, true, 12.0)
	f.Fuzz(func(t *testing.T, total, pka, spread float64, top int8, na, cl, ca, tempC float64, ideal bool, logK float64) {
		m := Mixture{
			Systems: []System{
				{Name: "A", Total: total, TopCharge: int(top), PKa: []float64{pka, pka + math.Abs(spread)}},
				citrate(0.01),
			},
			Strong:       []StrongIon{ion("Na+", na, 1), ion("Cl-", cl, -1), ion("Ca2+", ca, 2)},
			Complexes:    []Complex{{Name: "CaA", Metal: 2, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 2}, LogK: logK}},
			TemperatureC: tempC,
		}
		if ideal {
			m.Activity = Ideal
		}
		eq, err := Solve(m)
		if err != nil {
			var ie *InputError
			var ce *ConvergenceError
			var re *RangeError
			if !errors.As(err, &ie) && !errors.As(err, &ce) && !errors.As(err, &re) {
				t.Fatalf("untyped error %v", err)
			}
			return
		}
		checkEquilibrium(t, &m, eq)
		// Adding strong acid never raises the pH (a 10 % or 1 mM step).
		step := math.Max(0.1*(na+cl+ca+total), 1e-3)
		more := m.With(Component{StrongPerUnit: []Share{{Index: 1, Count: 1}}}, step)
		if eq2, err := Solve(more); err == nil && eq2.PH > eq.PH+1e-9 {
			t.Errorf("adding %g mol/L Cl- raised pH %.6f → %.6f", step, eq.PH, eq2.PH)
		}
		// Titrating to the current pH needs nothing.
		if tr, err := Titrate(m, Component{Name: "NaOH", StrongPerUnit: []Share{{Index: 0, Count: 1}}}, eq.PH); err == nil {
			within(t, "amount to own pH", tr.Amount, 0, 1e-12)
		}
	})
}

// checkEquilibrium verifies the invariants of a solution.
func checkEquilibrium(t *testing.T, m *Mixture, eq *Equilibrium) {
	t.Helper()
	if !eq.finite() {
		t.Fatalf("non-finite result %+v", eq)
	}
	for i, s := range eq.Systems {
		sum := 0.0
		for _, f := range s.Fractions {
			sum += f
			if f < 0 {
				t.Errorf("system %d: negative fraction", i)
			}
		}
		within(t, "Σ fractions", sum, 1, 1e-12)
	}
	res, scale := chargeResidual(m, eq)
	if math.Abs(res) > 1e-9*scale {
		t.Errorf("charge residual %.3g against ionic total %.3g", res, scale)
	}
	if !(eq.BufferCapacity > 0) || !(eq.IonicStrength >= 0) || !(eq.Osmolarity > 0) {
		t.Errorf("β %g, I %g, osmolarity %g", eq.BufferCapacity, eq.IonicStrength, eq.Osmolarity)
	}
}

// TestProperties runs the invariants over a table of ordinary and extreme
// mixtures (pH −1…15, totals 1e-12…5 mol/L, pKa −10…20, 30 systems).
func TestProperties(t *testing.T) {
	many := Mixture{TemperatureC: 37}
	for i := 0; i < 30; i++ {
		pk := -10 + float64(i)
		many.Systems = append(many.Systems, System{Name: "s", Total: 1e-3 * float64(i%5+1), TopCharge: i % 3, PKa: []float64{pk, pk + 0.5, pk + 3}})
	}
	many.Strong = []StrongIon{ion("Na+", 0.05, 1)}
	cases := []struct {
		name string
		m    Mixture
	}{
		{"30 systems", many},
		{"5 M HCl", Mixture{Strong: []StrongIon{ion("Cl-", 5, -1)}, TemperatureC: 25}},
		{"5 M NaOH", Mixture{Strong: []StrongIon{ion("Na+", 5, 1)}, TemperatureC: 25}},
		{"1e-12 acid", Mixture{Systems: []System{acetate(1e-12)}, TemperatureC: 25}},
		{"5 M acetate", Mixture{Systems: []System{acetate(5)}, Strong: []StrongIon{ion("Na+", 2.5, 1)}, TemperatureC: 25}},
		{"superacid and superbase", Mixture{Systems: []System{{Name: "x", Total: 0.1, PKa: []float64{-10, 20}}}, TemperatureC: 25}},
		{"phosphate 0 °C", Mixture{Systems: []System{phosphate(0.05)}, Strong: []StrongIon{ion("Na+", 0.075, 1)}, TemperatureC: 0}},
		{"carbonate 100 °C", Mixture{Systems: []System{carbonate(0.02)}, Strong: []StrongIon{ion("Na+", 0.03, 1)}, TemperatureC: 100}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			eq, err := Solve(c.m)
			if err != nil {
				t.Fatal(err)
			}
			checkEquilibrium(t, &c.m, eq)
			if eq.PH < -2 || eq.PH > 16 {
				t.Errorf("pH %g", eq.PH)
			}
		})
	}
}
