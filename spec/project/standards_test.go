package project

import (
	"math"
	"testing"
)

// TestPrimaryStandardsByMass solves the IUPAC primary pH standards written
// as ordinary mass-based recipes (testdata/standards) and compares the
// computed pH with the published pH(S) values.
func TestPrimaryStandardsByMass(t *testing.T) {
	want := map[string]struct {
		ph, tol float64
		source  string
	}{
		"iupac-phosphate-equimolal":     {6.865, 0.03, "IUPAC 2002 (Buck et al., Pure Appl. Chem. 74, 2169), 25 °C"},
		"iupac-khp":                     {4.005, 0.03, "IUPAC 2002 (Buck et al., Pure Appl. Chem. 74, 2169), 25 °C"},
		"iupac-borax":                   {9.180, 0.03, "IUPAC 2002 (Buck et al., Pure Appl. Chem. 74, 2169), 25 °C"},
		"iupac-phosphate-equimolal-37c": {6.839, 0.03, "IUPAC 2002 (Buck et al.), 37 °C (from memory)"},
	}
	run := Discover([]string{"../../testdata/standards"})
	seen := 0
	for _, f := range run.Files {
		res, ps := f.Evaluate()
		if len(ps) > 0 {
			t.Fatalf("%s: %v", f.Path, ps)
		}
		id := res.Recipe.ID.Value
		w, ok := want[id]
		if !ok {
			t.Errorf("unexpected standard %s", id)
			continue
		}
		seen++
		t.Run(id, func(t *testing.T) {
			if got := res.Equilibrium.PH; math.Abs(got-w.ph) > w.tol {
				t.Errorf("pH = %.4f, want %.3f ± %.2f (%s)", got, w.ph, w.tol, w.source)
			}
		})
	}
	if seen != len(want) {
		t.Errorf("solved %d standards, want %d", seen, len(want))
	}
}
