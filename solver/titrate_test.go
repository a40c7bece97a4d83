package solver

import (
	"errors"
	"math"
	"strings"
	"testing"
)

var (
	naOHAt0 = Component{Name: "NaOH", StrongPerUnit: []Share{{Index: 0, Count: 1}}}
	hClAt1  = Component{Name: "HCl", StrongPerUnit: []Share{{Index: 1, Count: 1}}}
)

func phosphateWithCounterIons() Mixture {
	// 50 mM KH2PO4-like buffer: Na+ (index 0) and Cl− (index 1) are the
	// titrant ions, present at zero so a component can add them.
	return Mixture{Systems: []System{phosphate(0.05)},
		Strong: []StrongIon{ion("Na+", 0, 1), ion("Cl-", 0, -1), ion("K+", 0.05, 1)}, TemperatureC: 25}
}

func TestTitrate(t *testing.T) {
	cacit := calciumCitrate(4.85)
	cacit.Strong = append(cacit.Strong, ion("H+ counter (Cl-)", 0, -1))
	cases := []struct {
		name   string
		m      Mixture
		c      Component
		target float64
		// want is the expected amount when known in closed form (NaN: only
		// the pH is checked).
		want, tol float64
	}{
		{"NaOH to pKa2' (half neutralised)", phosphateWithCounterIons(), naOHAt0, 6.88, math.NaN(), 0},
		{"NaOH to 7.4", phosphateWithCounterIons(), naOHAt0, 7.4, math.NaN(), 0},
		{"HCl to 3", phosphateWithCounterIons(), hClAt1, 3, math.NaN(), 0},
		{"HCl into water to pH 3, ideal", Mixture{Strong: []StrongIon{ion("Na+", 0, 1), ion("Cl-", 0, -1)}, TemperatureC: 25, Activity: Ideal},
			// Charge balance at h = 1e-3: c = h − Kw/h (textbook).
			hClAt1, 3, 1e-3 - math.Pow(10, -PKw(25))/1e-3, 1e-15},
		{"Tris with HCl at 37 °C", Mixture{Systems: []System{tris(0.05)}, Strong: []StrongIon{ion("Na+", 0, 1), ion("Cl-", 0, -1)}, TemperatureC: 37}, hClAt1, 7.4, math.NaN(), 0},
		{"Na2HPO4 into KH2PO4", phosphateWithCounterIons(),
			Component{Name: "Na2HPO4", StrongPerUnit: []Share{{Index: 0, Count: 2}}, SystemPerUnit: []Share{{Index: 0, Count: 1}}}, 6.8, math.NaN(), 0},
		{"HCl into calcium citrate (complexes elsewhere)", cacit, Component{Name: "HCl", StrongPerUnit: []Share{{Index: 3, Count: 1}}}, 6, math.NaN(), 0},
		{"CaCl2 into citrate (titrant complexes)", cacit, Component{Name: "CaCl2", StrongPerUnit: []Share{{Index: 0, Count: 1}, {Index: 1, Count: 2}}}, 8, math.NaN(), 0},
		{"citric acid into calcium citrate", cacit, Component{Name: "citric acid", SystemPerUnit: []Share{{Index: 0, Count: 1}}}, 5, math.NaN(), 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tr, err := Titrate(c.m, c.c, c.target)
			if err != nil {
				t.Fatal(err)
			}
			// Contract of Titrate.
			within(t, "pH", tr.Equilibrium.PH, c.target, 1e-6)
			if tr.Amount < 0 {
				t.Errorf("amount %g < 0", tr.Amount)
			}
			if !math.IsNaN(c.want) {
				within(t, "amount", tr.Amount, c.want, c.tol)
			}
			// The returned equilibrium is that of the returned amount.
			eq, err := Solve(c.m.With(c.c, tr.Amount))
			if err != nil {
				t.Fatal(err)
			}
			within(t, "re-solved pH", eq.PH, tr.Equilibrium.PH, 1e-12)
		})
	}
}

func TestTitrateToOwnPH(t *testing.T) {
	// Common practice: no titrant is needed to reach the pH one has.
	for _, m := range []Mixture{phosphateWithCounterIons(), calciumCitrate(4.85)} {
		eq, err := Solve(m)
		if err != nil {
			t.Fatal(err)
		}
		tr, err := Titrate(m, naOHAt0, eq.PH)
		if err != nil {
			t.Fatal(err)
		}
		within(t, "amount", tr.Amount, 0, 1e-12)
	}
}

func TestTitrateUnreachable(t *testing.T) {
	m := phosphateWithCounterIons()
	eq0, err := Solve(m)
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name   string
		c      Component
		target float64
	}{
		{"base cannot lower pH", naOHAt0, 3},
		{"acid cannot raise pH", hClAt1, 9},
		{"5 mol/L of base stops below pH 16", naOHAt0, 16},
		{"inert salt", Component{Name: "KCl", StrongPerUnit: []Share{{Index: 2, Count: 1}, {Index: 1, Count: 1}}}, 2},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Titrate(m, c.c, c.target)
			var ue *UnreachableError
			if !errors.As(err, &ue) {
				t.Fatalf("error %v, want *UnreachableError", err)
			}
			if !(ue.MinPH <= ue.MaxPH) || (c.target >= ue.MinPH && c.target <= ue.MaxPH) {
				t.Errorf("range %.3f–%.3f should exclude the target %.3f", ue.MinPH, ue.MaxPH, c.target)
			}
			if math.Abs(ue.MinPH-eq0.PH) > 1e-9 && math.Abs(ue.MaxPH-eq0.PH) > 1e-9 && c.c.Name != "KCl" {
				t.Errorf("range %.3f–%.3f should start at the mixture's pH %.3f", ue.MinPH, ue.MaxPH, eq0.PH)
			}
			if !strings.Contains(ue.Error(), c.c.Name) || !strings.Contains(ue.Error(), "reachable") {
				t.Errorf("message %q", ue.Error())
			}
		})
	}
}

func TestTitrateInvalid(t *testing.T) {
	m := phosphateWithCounterIons()
	var ie *InputError
	if _, err := Titrate(m, Component{SystemPerUnit: []Share{{Index: 5, Count: 1}}}, 7); !errors.As(err, &ie) || ie.Field != "SystemPerUnit" {
		t.Errorf("bad share: %v", err)
	}
	if _, err := Titrate(m, naOHAt0, math.NaN()); !errors.As(err, &ie) || ie.Field != "Target" {
		t.Errorf("NaN target: %v", err)
	}
}

func TestWithDoesNotModify(t *testing.T) {
	m := phosphateWithCounterIons()
	c := Component{Name: "Na2HPO4", StrongPerUnit: []Share{{Index: 0, Count: 2}}, SystemPerUnit: []Share{{Index: 0, Count: 1}}}
	n := m.With(c, 0.01)
	within(t, "original Na+", m.Strong[0].Conc, 0, 1e-15)
	within(t, "original phosphate", m.Systems[0].Total, 0.05, 1e-15)
	within(t, "new Na+", n.Strong[0].Conc, 0.02, 1e-17)
	within(t, "new phosphate", n.Systems[0].Total, 0.06, 1e-17)
	// Out-of-range shares are skipped (documented behaviour of With).
	bad := m.With(Component{StrongPerUnit: []Share{{Index: 9, Count: 1}}, SystemPerUnit: []Share{{Index: -1, Count: 1}}}, 1)
	within(t, "unchanged Na+", bad.Strong[0].Conc, 0, 1e-15)
}

func TestCurves(t *testing.T) {
	m := phosphateWithCounterIons()
	t.Run("titration curve rises with base", func(t *testing.T) {
		phs, err := TitrationCurve(m, naOHAt0, []float64{0, 0.01, 0.02, 0.05, 0.1})
		if err != nil {
			t.Fatal(err)
		}
		for i := 1; i < len(phs); i++ {
			if !(phs[i] > phs[i-1]) {
				t.Errorf("pH %g at step %d not above %g", phs[i], i, phs[i-1])
			}
		}
	})
	t.Run("species curve", func(t *testing.T) {
		// At pH = pKa the two adjacent states are equal (Henderson–Hasselbalch).
		f := SpeciesCurve(phosphate(1), 25, []float64{7.198, 2.148, 0, 14})
		within(t, "H2PO4- at pKa2", f[0][1], f[0][2], 1e-12)
		within(t, "H3PO4 at pKa1", f[1][0], f[1][1], 1e-12)
		for _, row := range f {
			sum := 0.0
			for _, v := range row {
				sum += v
			}
			within(t, "Σ", sum, 1, 1e-12)
		}
		if SpeciesCurve(System{PKa: []float64{5, 3}}, 25, []float64{7}) != nil {
			t.Error("invalid system should give nil")
		}
	})
	t.Run("temperature curve of Tris falls about 0.028 per K", func(t *testing.T) {
		// Lange's Handbook of Chemistry, Tris buffer entry (edition not
		// recorded): |dpH/dT| 0.028 K⁻¹.
		mt := Mixture{Systems: []System{tris(0.1)}, Strong: []StrongIon{ion("Cl-", 0.05, -1)}}
		phs, err := TemperatureCurve(mt, []float64{20, 30})
		if err != nil {
			t.Fatal(err)
		}
		within(t, "dpH/dT", (phs[1]-phs[0])/10, -0.028, 0.002)
		if _, err := TemperatureCurve(mt, []float64{25, 120}); err == nil {
			t.Error("120 °C accepted")
		}
	})
}
