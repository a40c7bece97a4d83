package solver

import "testing"

// benchMixture is a six-system cell-culture-like medium at 37 °C (Davies).
func benchMixture() Mixture {
	return Mixture{
		Systems: []System{phosphate(0.01), carbonate(0.024), hepes(0.025), citrate(0.002), acetate(0.005), tris(0.01)},
		Strong: []StrongIon{ion("Na+", 0.14, 1), ion("K+", 0.005, 1), ion("Cl-", 0.12, -1), ion("Ca2+", 0.0018, 2),
			ion("Mg2+", 0.0008, 2)},
		TemperatureC: 37,
	}
}

func BenchmarkSolve(b *testing.B) {
	m := benchMixture()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Solve(m); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSolveComplexes(b *testing.B) {
	m := benchMixture()
	m.Complexes = []Complex{
		{Name: "CaCit-", Metal: 3, Ligand: Ref{Kind: RefSpecies, Index: 3, Species: 3}, LogK: 4.85},
		{Name: "MgCit-", Metal: 4, Ligand: Ref{Kind: RefSpecies, Index: 3, Species: 3}, LogK: 4.8},
		{Name: "CaHPO4", Metal: 3, Ligand: Ref{Kind: RefSpecies, Index: 0, Species: 2}, LogK: 2.7},
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Solve(m); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkTitrate(b *testing.B) {
	m := benchMixture()
	naOH := Component{Name: "NaOH", StrongPerUnit: []Share{{Index: 0, Count: 1}}}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Titrate(m, naOH, 7.4); err != nil {
			b.Fatal(err)
		}
	}
}

// TestEvalChargeAllocatesNothing guards the performance rule that the
// inner loop (one charge-balance evaluation, complexation included)
// allocates nothing.
func TestEvalChargeAllocatesNothing(t *testing.T) {
	m := benchMixture()
	m.Complexes = []Complex{{Name: "CaCit-", Metal: 3, Ligand: Ref{Kind: RefSpecies, Index: 3, Species: 3}, LogK: 4.85}}
	md := newModel(&m)
	md.setIonicStrength(0.15)
	x := md.xOfPH(7.2)
	if n := testing.AllocsPerRun(100, func() { _, _, _ = md.evalCharge(x) }); n != 0 {
		t.Errorf("evalCharge allocates %g times per call", n)
	}
}
