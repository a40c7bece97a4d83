package units_test

import (
	"errors"
	"fmt"

	"github.com/phgate/phgate/spec/units"
)

func ExampleParse() {
	q, err := units.Parse("50 mM")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(q.Value, "mol/L as", q.Kind, "written", q)
	// Output: 0.05 mol/L as MolarConcentration written 50 mM
}

func ExampleParseKind() {
	_, err := units.ParseKind("37 mg", units.Temperature)
	fmt.Println(err)
	// Output: expected a temperature such as 25 C, but "mg" is a unit of mass in "37 mg"
}

func ExampleError() {
	_, err := units.Parse("5 mgs")
	var e *units.Error
	if errors.As(err, &e) {
		fmt.Printf("offset %d, suggestion %q\n", e.Offset, e.Suggestion)
		fmt.Println(e)
	}
	// Output:
	// offset 2, suggestion "mg"
	// unknown unit "mgs" in "5 mgs"; did you mean "mg"?
}

func ExampleParseRange() {
	lo, hi, err := units.ParseRange("2..8 C", units.Temperature)
	fmt.Println(lo, hi, err)
	_, _, err = units.ParseRange("2-8 C", units.Temperature)
	fmt.Println(err)
	// Output:
	// 2 °C 8 °C <nil>
	// write a range with "..", not a dash; expected a range such as 4..25 C in "2-8 C"; did you mean ".."?
}
