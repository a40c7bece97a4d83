package solver

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// randomMixture draws a mixture over the documented operating range:
// up to 30 systems with pKa −10…20, totals and strong ions 1e-12…5 mol/L
// (log-uniform), complexes with log K −2…12, 0–100 °C.
func randomMixture(r *rand.Rand) Mixture {
	logConc := func(lo, hi float64) float64 { return math.Pow(10, lo+(hi-lo)*r.Float64()) }
	m := Mixture{TemperatureC: 100 * r.Float64()}
	if r.IntN(4) == 0 {
		m.Activity = Ideal
	}
	for i, n := 0, 1+r.IntN(30); i < n; i++ {
		steps := r.IntN(4)
		pk := make([]float64, steps)
		dh := make([]float64, steps)
		p := -10 + 30*r.Float64()
		for k := range pk {
			pk[k] = math.Min(p, 20)
			dh[k] = 60000 * (r.Float64() - 0.3)
			p += 4 * r.Float64()
		}
		m.Systems = append(m.Systems, System{Name: fmt.Sprint("s", i), Total: logConc(-12, 0.7), TopCharge: r.IntN(3) - 1, PKa: pk, DeltaH: dh})
	}
	for i, n := 0, r.IntN(6); i < n; i++ {
		m.Strong = append(m.Strong, ion(fmt.Sprint("ion", i), logConc(-12, 0.7), []int{-2, -1, 1, 2, 3}[r.IntN(5)]))
	}
	if len(m.Strong) > 0 {
		for i, n := 0, r.IntN(4); i < n; i++ {
			s := r.IntN(len(m.Systems))
			m.Complexes = append(m.Complexes, Complex{Name: fmt.Sprint("c", i), Metal: r.IntN(len(m.Strong)),
				Ligand: Ref{Kind: RefSpecies, Index: s, Species: r.IntN(len(m.Systems[s].PKa) + 1)}, LogK: -2 + 14*r.Float64()})
		}
	}
	return m
}

// TestRandomMixtures checks the invariants on reproducible random
// mixtures (fixed generator state): no error other than a *RangeError (I > 20 mol/L),
// balances closed, strong acid lowers pH, own-pH titration gives 0, and a
// titration with strong base hits its target or reports a range that
// excludes it.
func TestRandomMixtures(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	n := 400
	if testing.Short() {
		n = 50
	}
	for i := 0; i < n; i++ {
		m := randomMixture(r)
		t.Run(fmt.Sprint(i), func(t *testing.T) {
			eq, err := Solve(m)
			if err != nil {
				var re *RangeError
				if errors.As(err, &re) {
					return // a legitimately extreme draw
				}
				t.Fatalf("%v\n%+v", err, m)
			}
			checkEquilibrium(t, &m, eq)
			for j, c := range eq.Complexes {
				// Mass balance of each metal (definition).
				cx := m.Complexes[j]
				total := eq.Strong[cx.Metal].Free
				for k, d := range eq.Complexes {
					if m.Complexes[k].Metal == cx.Metal {
						total += d.Conc
					}
				}
				withinRel(t, fmt.Sprint("metal balance ", c.Name), total, m.Strong[cx.Metal].Conc, 1e-10)
			}
			m.Strong = append(m.Strong, ion("Cl-", 0, -1), ion("Na+", 0, 1))
			cl := Component{Name: "HCl", StrongPerUnit: []Share{{Index: len(m.Strong) - 2, Count: 1}}}
			na := Component{Name: "NaOH", StrongPerUnit: []Share{{Index: len(m.Strong) - 1, Count: 1}}}
			acid, err := Solve(m.With(cl, 1e-3))
			if err == nil && acid.PH > eq.PH+1e-9 {
				t.Errorf("1 mM HCl raised pH %.6f → %.6f", eq.PH, acid.PH)
			}
			if tr, err := Titrate(m, na, eq.PH); err != nil || tr.Amount != 0 {
				t.Errorf("own pH: %v %+v", err, tr)
			}
			target := eq.PH + 0.5
			tr, err := Titrate(m, na, target)
			var ue *UnreachableError
			switch {
			case errors.As(err, &ue):
				if target >= ue.MinPH && target <= ue.MaxPH {
					t.Errorf("target %.3f inside reported range %.3f–%.3f", target, ue.MinPH, ue.MaxPH)
				}
			case errors.As(err, new(*RangeError)):
				// Legitimate: the titration passes through I > 20 mol/L.
			case err != nil:
				t.Errorf("titrate: %v", err)
			default:
				within(t, "titrated pH", tr.Equilibrium.PH, target, 1e-6)
			}
		})
	}
}

// TestConcurrentSolves solves random mixtures from several goroutines at
// once (models are recycled through a pool) and requires the results of
// the sequential run, bit for bit (the solver is deterministic).
func TestConcurrentSolves(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	ms := make([]Mixture, 64)
	want := make([]float64, len(ms))
	for i := range ms {
		ms[i] = randomMixture(r)
		if eq, err := Solve(ms[i]); err == nil {
			want[i] = eq.PH
		}
	}
	done := make(chan error)
	for g := 0; g < 4; g++ {
		go func() {
			for k := range ms {
				i := (k*7 + g) % len(ms)
				eq, err := Solve(ms[i])
				if err == nil && math.Float64bits(eq.PH) != math.Float64bits(want[i]) {
					done <- fmt.Errorf("mixture %d: pH %v, sequential %v", i, eq.PH, want[i])
					return
				}
			}
			done <- nil
		}()
	}
	for g := 0; g < 4; g++ {
		if err := <-done; err != nil {
			t.Error(err)
		}
	}
}
