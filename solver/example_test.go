package solver_test

import (
	"fmt"

	"github.com/phgate/phgate/solver"
)

// The IUPAC equimolal phosphate primary standard (0.025 mol/kg KH2PO4 +
// 0.025 mol/kg Na2HPO4, certified pH 6.865 at 25 °C), with phosphoric acid
// constants from Goldberg et al. 2002.
func ExampleSolve() {
	m := solver.Mixture{
		Systems: []solver.System{{
			Name:  "phosphate",
			Total: 0.05,
			PKa:   []float64{2.148, 7.198, 12.35},
		}},
		Strong: []solver.StrongIon{
			{Name: "K+", Conc: 0.025, Charge: 1},
			{Name: "Na+", Conc: 0.05, Charge: 1},
		},
		TemperatureC: 25,
	}
	eq, err := solver.Solve(m)
	if err != nil {
		fmt.Println(err)
		return
	}
	p := eq.Systems[0]
	fmt.Printf("pH %.2f, I = %.3f mol/L, β = %.4f mol/L per pH\n", eq.PH, eq.IonicStrength, eq.BufferCapacity)
	fmt.Printf("%s %.3f, %s %.3f\n", p.Species[1], p.Fractions[1], p.Species[2], p.Fractions[2])
	// Output:
	// pH 6.88, I = 0.100 mol/L, β = 0.0288 mol/L per pH
	// H2A- 0.500, HA2- 0.500
}

// How much sodium hydroxide brings 50 mM Tris hydrochloride to pH 7.4 at
// 37 °C? Na+ is listed at zero so that the titrant has an entry to add to.
func ExampleTitrate() {
	m := solver.Mixture{
		Systems: []solver.System{{
			Name: "Tris", Total: 0.05, TopCharge: 1,
			PKa: []float64{8.072}, DeltaH: []float64{47450}, DeltaCp: []float64{-59},
		}},
		Strong: []solver.StrongIon{
			{Name: "Cl-", Conc: 0.05, Charge: -1},
			{Name: "Na+", Conc: 0, Charge: 1},
		},
		TemperatureC: 37,
	}
	naOH := solver.Component{Name: "NaOH", StrongPerUnit: []solver.Share{{Index: 1, Count: 1}}}
	tr, err := solver.Titrate(m, naOH, 7.4)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.2f mmol/L NaOH, pH %.3f\n", tr.Amount*1000, tr.Equilibrium.PH)

	_, err = solver.Titrate(m, naOH, 4)
	fmt.Println(err)
	// Output:
	// 13.31 mmol/L NaOH, pH 7.400
	// solver: NaOH cannot bring the mixture to pH 4.000: reachable range is pH 4.614 to 14.743 (0 to 5 mol/L)
}
