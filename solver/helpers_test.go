package solver

import (
	"math"
	"testing"
)

// within fails the test when got is not within tol of want (absolute).
func within(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if !(math.Abs(got-want) <= tol) {
		t.Errorf("%s = %.6g, want %.6g ± %.3g (off by %.3g)", what, got, want, tol, got-want)
	}
}

// withinRel fails the test when got is not within rel·|want| of want.
func withinRel(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if !(math.Abs(got-want) <= rel*math.Abs(want)) {
		t.Errorf("%s = %.12g, want %.12g (relative error %.3g > %.3g)", what, got, want, math.Abs(got-want)/math.Abs(want), rel)
	}
}

// Catalog-like systems at 25 °C, Goldberg, Kishore & Lennen 2002 values
// as listed in the shared reference file (from memory, status M there).
func phosphate(total float64) System {
	return System{Name: "phosphate", Total: total, PKa: []float64{2.148, 7.198, 12.35},
		DeltaH: []float64{-8000, 3600, 16000}, DeltaCp: []float64{-141, -230, -242}}
}

func acetate(total float64) System {
	return System{Name: "acetate", Total: total, PKa: []float64{4.756}, DeltaH: []float64{-410}, DeltaCp: []float64{-142}}
}

func citrate(total float64) System {
	return System{Name: "citrate", Total: total, PKa: []float64{3.128, 4.761, 6.396},
		DeltaH: []float64{4070, 2230, -3380}, DeltaCp: []float64{-131, -178, -254}}
}

func tris(total float64) System {
	return System{Name: "Tris", Total: total, TopCharge: 1, PKa: []float64{8.072}, DeltaH: []float64{47450}, DeltaCp: []float64{-59}}
}

func borate(total float64) System {
	return System{Name: "borate", Total: total, PKa: []float64{9.237}, DeltaH: []float64{13800}, DeltaCp: []float64{-240}}
}

func phthalate(total float64) System {
	return System{Name: "phthalate", Total: total, PKa: []float64{2.950, 5.408}, DeltaH: []float64{2700, -2170}, DeltaCp: []float64{-88, -295}}
}

func hepes(total float64) System {
	return System{Name: "HEPES", Total: total, PKa: []float64{7.564}, DeltaH: []float64{20400}, DeltaCp: []float64{47}}
}

func carbonate(total float64) System {
	return System{Name: "carbonate", Total: total, PKa: []float64{6.351, 10.329}, DeltaH: []float64{9150, 14700}, DeltaCp: []float64{-371, -249}}
}

func ion(name string, conc float64, z int) StrongIon {
	return StrongIon{Name: name, Conc: conc, Charge: z}
}

// chargeResidual recomputes the charge balance from eq and returns it
// with the sum of |z|·c, its natural scale.
func chargeResidual(m *Mixture, eq *Equilibrium) (res, scale float64) {
	add := func(z int, c float64) {
		res += float64(z) * c
		scale += math.Abs(float64(z)) * c
	}
	for i, s := range eq.Strong {
		add(m.Strong[i].Charge, s.Free)
	}
	for _, s := range eq.Systems {
		for k, c := range s.Conc {
			add(s.Charges[k], c)
		}
	}
	for j, c := range eq.Complexes {
		cx := m.Complexes[j]
		add(m.Strong[cx.Metal].Charge+m.Systems[cx.Ligand.Index].TopCharge-cx.Ligand.Species, c.Conc)
	}
	add(1, eq.H)
	add(-1, eq.OH)
	return res, scale
}

// solveAtIonicStrength solves m with activity coefficients held at ionic
// strength I instead of iterating them; used where γ is held fixed.
func solveAtIonicStrength(m *Mixture, ionic float64) (*model, float64, error) {
	if err := validate(m); err != nil {
		return nil, 0, err
	}
	md := newModel(m)
	md.setIonicStrength(ionic)
	x, _, err := md.solveCharge(md.xOfPH(startPH))
	return md, x, err
}
