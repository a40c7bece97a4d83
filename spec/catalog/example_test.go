package catalog_test

import (
	"fmt"

	"github.com/phgate/phgate/spec/catalog"
)

func ExampleDefault() {
	c := catalog.Default()
	ing, _ := c.Ingredient("disodium-hydrogen-phosphate-heptahydrate")
	fmt.Printf("%s: %.2f g/mol\n", ing.Formula, ing.MolarMass)
	for _, s := range ing.Systems {
		fmt.Printf("enters %s as %s\n", s.System, s.Species)
	}
	for _, s := range ing.Ions {
		fmt.Printf("releases %g %s\n", s.Count, s.Ion)
	}
	// Output:
	// Na2HPO4·7H2O: 268.06 g/mol
	// enters phosphate as HPO4-2
	// releases 2 Na+
}

func ExampleParse() {
	src := []byte(`
sources:
  coa:
    cite: "Supplier certificate of analysis"
    status: checked
ingredients:
  sodium-dihydrogen-citrate-x:
    name: Sodium dihydrogen citrate
    formula: NaH2C6H5O7
    ions: {Na+: 1}
    systems: [{system: citrate, species: H2Cit}]
    sources: [coa]
`)
	_, probs := catalog.Parse(src, "project.yaml")
	for _, p := range probs {
		fmt.Println(p)
	}
	// Output:
	// project.yaml:11:42: system "citrate" has no species "H2Cit" (it has H3Cit, H2Cit-, HCit-2, Cit-3); did you mean "H2Cit-"?
}
