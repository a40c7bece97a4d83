package yamldoc

import (
	"strings"
	"testing"
)

func TestKeyName(t *testing.T) {
	cases := map[string]string{
		"":                        "",
		"/ph/min":                 "ph.min",
		"/ingredients/2/amount":   "ingredients[3].amount",
		"/catalog/systems/a~1b/x": "catalog.systems.a/b.x",
	}
	for ptr, want := range cases {
		if got := keyName(ptr); got != want {
			t.Errorf("keyName(%q) = %q, want %q", ptr, got, want)
		}
	}
}

func TestKeysFromSchema(t *testing.T) {
	schema := map[string]any{
		"properties": map[string]any{
			"ingredients": map[string]any{"items": map[string]any{"$ref": "#/$defs/ing"}},
			"temperature": map[string]any{"oneOf": []any{
				map[string]any{"type": "string"},
				map[string]any{"properties": map[string]any{"nominal": map[string]any{}, "range": map[string]any{}}},
			}},
		},
		"$defs": map[string]any{"ing": map[string]any{"properties": map[string]any{"use": map[string]any{}, "amount": map[string]any{}}}},
	}
	cases := map[string]string{
		"":               "ingredients temperature",
		"/ingredients/0": "amount use",
		"/temperature":   "nominal range",
		"/nowhere":       "",
	}
	for ptr, want := range cases {
		if got := strings.Join(KeysFromSchema(schema, ptr), " "); got != want {
			t.Errorf("KeysFromSchema(%q) = %q, want %q", ptr, got, want)
		}
	}
}

func TestParsePositions(t *testing.T) {
	d, ps := Parse([]byte("recipe: a\ningredients:\n  - use: tris\n    amount: 5 mM\n"), "r.yaml")
	if ps != nil {
		t.Fatal(ps)
	}
	n := d.Node("/ingredients/0/amount")
	if n == nil || n.Line != 4 || n.Column != 13 {
		t.Fatalf("amount node = %+v", n)
	}
	if k := d.Key("/ingredients/0/amount"); k == nil || k.Column != 5 {
		t.Fatalf("amount key = %+v", k)
	}
	if p := d.ProblemAt("/ingredients/0/stock", "x"); p.Line != 3 || p.Column != 5 {
		t.Errorf("a missing key falls back to its parent: %+v", p)
	}
}
