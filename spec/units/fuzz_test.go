package units

import (
	"errors"
	"math"
	"testing"
	"unicode/utf8"
)

// FuzzParse checks, for any input, that Parse does not panic, returns either
// a finite Quantity that obeys the package's rules or an *Error pointing
// inside the input, and that a Quantity prints to a string that parses back
// to itself. The starting corpus is in testdata/fuzz/FuzzParse; every unit
// spelling is added here too.
func FuzzParse(f *testing.F) {
	for _, sp := range spellings {
		f.Add("12.5 " + sp.text)
	}
	f.Fuzz(func(t *testing.T, s string) {
		q, err := Parse(s)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("Parse(%q) error %v is %T, want *Error", s, err, err)
			}
			if e.Input != s || e.Offset < 0 || e.Offset > utf8.RuneCountInString(s) || e.Message == "" {
				t.Fatalf("Parse(%q) bad error %#v", s, e)
			}
			if e.Error() == "" {
				t.Fatalf("Parse(%q) empty error text", s)
			}
			return
		}
		checkQuantity(t, s, q)
		printed := q.String()
		back, err := Parse(printed)
		if err != nil {
			t.Fatalf("Parse(%q) = %v; reparsing %q: %v", s, q, printed, err)
		}
		if back.Kind != q.Kind || back.Unit != q.Unit || !roundTripClose(q, back) {
			t.Fatalf("Parse(%q) = %#v; reparsing %q gave %#v", s, q, printed, back)
		}
	})
}

func checkQuantity(t *testing.T, s string, q Quantity) {
	t.Helper()
	if math.IsNaN(q.Value) || math.IsInf(q.Value, 0) {
		t.Fatalf("Parse(%q) value %v is not finite", s, q.Value)
	}
	if !q.Kind.valid() {
		t.Fatalf("Parse(%q) kind %v", s, q.Kind)
	}
	if u, ok := byCanon[q.Unit]; !ok || u.canon != q.Unit || u.kind != q.Kind {
		t.Fatalf("Parse(%q) unit %q is not a canonical unit of %v", s, q.Unit, q.Kind)
	}
	if q.Kind == Temperature {
		if q.Value < -zeroCelsiusInKelvin {
			t.Fatalf("Parse(%q) = %v, below absolute zero", s, q.Value)
		}
	} else if q.Value < 0 || math.Signbit(q.Value) {
		t.Fatalf("Parse(%q) = %v, negative", s, q.Value)
	}
}

// roundTripClose allows for the 15 significant digits String prints and for
// rounding in the conversion both ways; temperatures get an absolute slack
// too because the kelvin offset cancels digits near absolute zero.
func roundTripClose(a, b Quantity) bool {
	tol := 1e-13*math.Max(math.Abs(a.Value), math.Abs(b.Value)) + 1e-300
	if a.Kind == Temperature {
		tol += 1e-12
	}
	return math.Abs(a.Value-b.Value) <= tol
}

// FuzzParseRange checks that ParseRange does not panic and returns either
// two quantities of the requested kind in order or an *Error inside the input.
func FuzzParseRange(f *testing.F) {
	for _, s := range []string{"4..25 C", "4 C..298.15 K", "2-8 °C", "-5..-2 C", "10..50 mM", "4...5 C", "..", "1..2..3 C"} {
		f.Add(s, int(Temperature))
	}
	f.Add("10..50 mM", int(MolarConcentration))
	f.Fuzz(func(t *testing.T, s string, k int) {
		kind := Kind(k)
		lo, hi, err := ParseRange(s, kind)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) || e.Input != s || e.Offset < 0 || e.Offset > utf8.RuneCountInString(s) || e.Message == "" {
				t.Fatalf("ParseRange(%q, %v) bad error %#v", s, kind, err)
			}
			return
		}
		checkQuantity(t, s, lo)
		checkQuantity(t, s, hi)
		if lo.Kind != kind || hi.Kind != kind || lo.Value > hi.Value {
			t.Fatalf("ParseRange(%q, %v) = %#v, %#v", s, kind, lo, hi)
		}
	})
}
