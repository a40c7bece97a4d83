package solver

import (
	"errors"
	"strings"
	"testing"
)

func TestSensitivity(t *testing.T) {
	naOH := Component{Name: "NaOH", StrongPerUnit: []Share{{Index: 0, Count: 1}}}
	cases := []struct {
		name string
		m    Mixture
		c    Component
	}{
		{"NaOH into phosphate, ideal",
			Mixture{Systems: []System{phosphate(0.05)}, Strong: []StrongIon{ion("Na+", 0.06, 1)}, TemperatureC: 25, Activity: Ideal}, naOH},
		{"NaOH into phosphate, Davies",
			Mixture{Systems: []System{phosphate(0.05)}, Strong: []StrongIon{ion("Na+", 0.06, 1)}, TemperatureC: 25}, naOH},
		{"Na2HPO4 into phosphate, Davies 37 °C",
			Mixture{Systems: []System{phosphate(0.05)}, Strong: []StrongIon{ion("Na+", 0.06, 1)}, TemperatureC: 37},
			Component{Name: "Na2HPO4", StrongPerUnit: []Share{{Index: 0, Count: 2}}, SystemPerUnit: []Share{{Index: 0, Count: 1}}}},
		{"Tris base into Tris-HCl",
			Mixture{Systems: []System{tris(0.05)}, Strong: []StrongIon{ion("Cl-", 0.03, -1)}, TemperatureC: 37},
			Component{Name: "Tris", SystemPerUnit: []Share{{Index: 0, Count: 1}}}},
		{"CaCl2 into citrate (complexed metal)",
			Mixture{Systems: []System{citrate(0.01)}, Strong: []StrongIon{ion("Na+", 0.025, 1), ion("Ca2+", 0.004, 2), ion("Cl-", 0.008, -1)},
				Complexes: []Complex{{Name: "CaCit-", Metal: 1, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: 4.85}}, TemperatureC: 25},
			Component{Name: "CaCl2", StrongPerUnit: []Share{{Index: 1, Count: 1}, {Index: 2, Count: 2}}}},
		{"citric acid into calcium citrate (complexed ligand)",
			Mixture{Systems: []System{citrate(0.01)}, Strong: []StrongIon{ion("Na+", 0.025, 1), ion("Ca2+", 0.004, 2), ion("Cl-", 0.008, -1)},
				Complexes: []Complex{{Name: "CaCit-", Metal: 1, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: 4.85}}, TemperatureC: 25},
			Component{Name: "citric acid", SystemPerUnit: []Share{{Index: 0, Count: 1}}}},
		{"CaCl2 into citrate without calcium (absent partner)",
			Mixture{Systems: []System{citrate(0.01)}, Strong: []StrongIon{ion("Na+", 0.025, 1), ion("Ca2+", 0, 2), ion("Cl-", 0, -1)},
				Complexes: []Complex{{Name: "CaCit-", Metal: 1, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: 4.85}}, TemperatureC: 25},
			Component{Name: "CaCl2", StrongPerUnit: []Share{{Index: 1, Count: 1}, {Index: 2, Count: 2}}}},
		{"citric acid into calcium chloride (absent ligand)",
			Mixture{Systems: []System{citrate(0)}, Strong: []StrongIon{ion("Na+", 0.02, 1), ion("Ca2+", 0.004, 2), ion("Cl-", 0.008, -1)},
				Complexes: []Complex{{Name: "CaCit-", Metal: 1, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: 4.85}}, TemperatureC: 25},
			Component{Name: "citric acid", SystemPerUnit: []Share{{Index: 0, Count: 1}}}},
		{"MgCl2 into calcium citrate (absent metal, complexed partner)",
			Mixture{Systems: []System{citrate(0.01)}, Strong: []StrongIon{ion("Na+", 0.025, 1), ion("Ca2+", 0.004, 2), ion("Cl-", 0.008, -1), ion("Mg2+", 0, 2)},
				Complexes: []Complex{{Name: "CaCit-", Metal: 1, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: 4.85},
					{Name: "MgCit-", Metal: 3, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 3}, LogK: 4.8}}, TemperatureC: 25},
			Component{Name: "MgCl2", StrongPerUnit: []Share{{Index: 3, Count: 1}, {Index: 2, Count: 2}}}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			eq, err := Solve(c.m)
			if err != nil {
				t.Fatal(err)
			}
			got, err := Sensitivity(c.m, eq, c.c)
			if err != nil {
				t.Fatal(err)
			}
			// Central finite difference of two solves at the ionic strength
			// of eq (the derivative's own assumption: γ held fixed).
			const delta = 1e-7
			ph := func(a float64) float64 {
				m := c.m.With(c.c, a)
				md, x, err := solveAtIonicStrength(&m, eq.IonicStrength)
				if err != nil {
					t.Fatal(err)
				}
				return md.phOfX(x)
			}
			if strings.Contains(c.name, "absent") {
				// Cannot remove what is not there: one-sided difference,
				// whose O(delta) error needs the looser tolerance.
				withinRel(t, "dpH/da", got, (ph(delta)-ph(0))/delta, 1e-3)
				return
			}
			fd := (ph(delta) - ph(-delta)) / (2 * delta)
			withinRel(t, "dpH/da", got, fd, 1e-4)
		})
	}
}

func TestSensitivityFullSolve(t *testing.T) {
	// Against two full Solves (γ re-iterated), ideal model: no γ to hold,
	// so the implicit-function derivative is exact.
	m := Mixture{Systems: []System{acetate(0.1)}, Strong: []StrongIon{ion("Na+", 0.03, 1)}, TemperatureC: 25, Activity: Ideal}
	c := Component{Name: "NaOH", StrongPerUnit: []Share{{Index: 0, Count: 1}}}
	eq, err := Solve(m)
	if err != nil {
		t.Fatal(err)
	}
	got, err := Sensitivity(m, eq, c)
	if err != nil {
		t.Fatal(err)
	}
	const delta = 1e-7
	up, err := Solve(m.With(c, delta))
	if err != nil {
		t.Fatal(err)
	}
	down, err := Solve(m.With(c, -delta))
	if err != nil {
		t.Fatal(err)
	}
	withinRel(t, "dpH/da", got, (up.PH-down.PH)/(2*delta), 1e-4)
	// Strong base: dpH/da = 1/β (definition of β).
	withinRel(t, "1/β", got, 1/eq.BufferCapacity, 1e-12)
}

func TestSensitivityInvalid(t *testing.T) {
	m := Mixture{Systems: []System{acetate(0.1)}, Strong: []StrongIon{ion("Na+", 0.03, 1)}, TemperatureC: 25}
	eq, err := Solve(m)
	if err != nil {
		t.Fatal(err)
	}
	var ie *InputError
	if _, err := Sensitivity(m, eq, Component{StrongPerUnit: []Share{{Index: 3, Count: 1}}}); !errors.As(err, &ie) || ie.Field != "StrongPerUnit" {
		t.Errorf("bad share: %v", err)
	}
	if _, err := Sensitivity(m, nil, Component{}); !errors.As(err, &ie) || ie.Field != "Equilibrium" {
		t.Errorf("nil equilibrium: %v", err)
	}
}
