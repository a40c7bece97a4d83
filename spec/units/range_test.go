package units

import "testing"

func TestParseRange(t *testing.T) {
	tests := []struct {
		name           string
		in             string
		kind           Kind
		lo, hi         float64 // canonical values
		loUnit, hiUnit string
	}{
		{"unit after upper bound", "4..25 C", Temperature, 4, 25, "°C", "°C"},
		{"unit on both", "4 C..25 C", Temperature, 4, 25, "°C", "°C"},
		{"spaces around dots", "4 °C .. 25 °C", Temperature, 4, 25, "°C", "°C"},
		// 298.15 K is 25 °C (SI Brochure, 2.3.1).
		{"mixed units", "4 C..298.15 K", Temperature, 4, 25, "°C", "K"},
		{"kelvin implied", "277.15..298.15 K", Temperature, 4, 25, "K", "K"},
		{"negative bounds", "-5..-2 C", Temperature, -5, -2, "°C", "°C"},
		{"equal bounds", "25..25 C", Temperature, 25, 25, "°C", "°C"},
		{"exponent bounds", "1e-3..2e-3 M", MolarConcentration, 1e-3, 2e-3, "M", "M"},
		{"concentration", "10..50 mM", MolarConcentration, 0.01, 0.05, "mM", "mM"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			lo, hi, err := ParseRange(tt.in, tt.kind)
			if err != nil {
				t.Fatalf("ParseRange(%q): %v", tt.in, err)
			}
			if !approx(lo.Value, tt.lo) || !approx(hi.Value, tt.hi) || lo.Unit != tt.loUnit || hi.Unit != tt.hiUnit {
				t.Errorf("ParseRange(%q) = %v, %v; want %v %s, %v %s", tt.in, lo, hi, tt.lo, tt.loUnit, tt.hi, tt.hiUnit)
			}
			if lo.Kind != tt.kind || hi.Kind != tt.kind {
				t.Errorf("kinds %v, %v; want %v", lo.Kind, hi.Kind, tt.kind)
			}
		})
	}
}

func TestParseRangeErrors(t *testing.T) {
	tests := []struct {
		name       string
		in         string
		offset     int
		message    string
		suggestion string
	}{
		{"single value", "25 C", 0, "expected a range such as 4..25 C", ""},
		{"exponent is not a dash", "1e-3 C", 0, "expected a range", ""},
		{"hyphen", "2-8 °C", 1, "not a dash", ".."},
		{"en dash", "2–8 °C", 1, "not a dash", ".."},
		{"hyphen after unit", "2 C - 8 C", 4, "not a dash", ".."},
		{"negative bounds with hyphen", "-5--2 C", 2, "not a dash", ".."},
		{"three dots", "4...5 C", 1, "two dots", ".."},
		{"two ranges", "1..2..3 C", 4, `one ".."`, ""},
		{"missing lower", "..25 C", 0, "missing lower bound", ""},
		{"missing upper", "4.. ", 4, "missing upper bound", ""},
		{"upper without unit", "4..25", 5, "missing unit", ""},
		{"reversed", "25..4 C", 0, "reversed", ""},
		{"reversed across units", "30 C..300 K", 0, "reversed", ""},
		{"wrong kind upper", "4..25 mg", 6, "expected a temperature", ""},
		{"wrong kind lower", "4 g..25 C", 2, "expected a temperature", ""},
		{"bad unit upper offset", "4..25 Cs", 6, `unknown unit "Cs"`, "°C"},
		{"offset counts runes", "4 °C..25 °D", 9, `unknown unit "°D"`, "°C"},
		{"below absolute zero lower", "-300..25 C", 0, "absolute zero", ""},
		{"negative concentration", "-1..5 mM", 0, "must not be negative", ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			kind := Temperature
			if tt.name == "negative concentration" {
				kind = MolarConcentration
			}
			lo, hi, err := ParseRange(tt.in, kind)
			if err == nil {
				t.Fatalf("ParseRange(%q) = %v, %v; want an error", tt.in, lo, hi)
			}
			checkError(t, err, tt.in, tt.offset, tt.message, tt.suggestion)
		})
	}
}
