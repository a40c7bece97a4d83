package rules

import (
	"strings"
	"testing"

	"github.com/phgate/phgate/spec"
)

func waiver(rule, reason, expires string, recipes ...string) spec.Waiver {
	w := spec.Waiver{Rule: spec.Text{Value: rule, Pos: spec.Pos{Line: 3, Column: 11}}, Reason: spec.Text{Value: reason, Pos: spec.Pos{Line: 4, Column: 13}},
		Expires: spec.Text{Value: expires, Pos: spec.Pos{Line: 5, Column: 14}}, Path: "phgate.yaml", Pos: spec.Pos{Line: 3, Column: 5}}
	for _, r := range recipes {
		w.Recipes = append(w.Recipes, spec.Text{Value: r, Pos: spec.Pos{Line: 6, Column: 16}})
	}
	return w
}

func TestWaiverProblems(t *testing.T) {
	tests := []struct {
		name string
		w    spec.Waiver
		want string
	}{
		{"unknown rule", waiver("weak-bufer", "accepted", ""), `unknown rule "weak-bufer"; did you mean "weak-buffer"?`},
		{"stale-waiver itself", waiver("stale-waiver", "accepted", ""), "cannot be waived"},
		{"blank reason", waiver("ph-window", "   ", ""), "needs a reason"},
		{"impossible date", waiver("ph-window", "accepted", "2026-02-30"), "not a calendar date"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, ps := NewPolicy(nil, []spec.Waiver{tt.w}, "phgate.yaml", nil)
			if len(ps) != 1 || !strings.Contains(ps[0].Message, tt.want) {
				t.Fatalf("got %v, want one problem containing %q", ps, tt.want)
			}
		})
	}
}

// TestProjectWaivers runs one recipe with a ph-window error (the
// trigger-below-min fixture) under project-wide waivers.
func TestProjectWaivers(t *testing.T) {
	res := evaluateFixture(t, "testdata/ph-window/trigger-below-min.yaml")
	id := res.Recipe.ID.Value
	tests := []struct {
		name    string
		w       spec.Waiver
		ids     []string
		waived  bool
		stale   string
		staleAt int
	}{
		{name: "applies to every recipe", w: waiver("ph-window", "customer agreement", ""), ids: []string{id}, waived: true},
		{name: "limited to this recipe", w: waiver("ph-window", "customer agreement", "", id), ids: []string{id}, waived: true},
		{name: "limited to another recipe", w: waiver("ph-window", "customer agreement", "", "other"), ids: []string{id, "other"}},
		{name: "expired", w: waiver("ph-window", "customer agreement", "2025-12-31"), ids: []string{id}, stale: "expired on 2025-12-31", staleAt: 3},
		{name: "still valid on its last day", w: waiver("ph-window", "customer agreement", "2026-01-15"), ids: []string{id}, waived: true},
		{name: "unused", w: waiver("weak-buffer", "customer agreement", ""), ids: []string{id}, stale: "matched no finding", staleAt: 3},
		{name: "unused but not every recipe checked", w: waiver("weak-buffer", "customer agreement", ""), ids: []string{id, "unchecked"}},
		{name: "unknown recipe id", w: waiver("ph-window", "customer agreement", "", id, "fx-ph-belw"), ids: []string{id}, waived: true,
			stale: `names recipe "fx-ph-belw", which this project does not have; did you mean "fx-ph-below"?`, staleAt: 6},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			pol, ps := NewPolicy(nil, []spec.Waiver{tt.w}, "phgate.yaml", nil)
			if len(ps) > 0 {
				t.Fatal(ps)
			}
			pol.Today = fixtureToday
			fs, ps := pol.Check(res)
			if len(ps) > 0 {
				t.Fatal(ps)
			}
			if len(fs) != 1 || fs[0].Rule != "ph-window" {
				t.Fatalf("want the one ph-window finding, got %v", fs)
			}
			if got := fs[0].Waived != ""; got != tt.waived {
				t.Errorf("waived = %v, want %v", got, tt.waived)
			}
			if tt.waived && fs[0].WaivedIn != "phgate.yaml" {
				t.Errorf("WaivedIn = %q", fs[0].WaivedIn)
			}
			stale := pol.Stale(tt.ids)
			if tt.stale == "" {
				if len(stale) > 0 {
					t.Errorf("unexpected stale findings: %v", stale)
				}
				return
			}
			if len(stale) != 1 || !strings.Contains(stale[0].Message, tt.stale) || stale[0].Line != tt.staleAt || stale[0].Path != "phgate.yaml" {
				t.Errorf("got %v, want one stale-waiver at phgate.yaml:%d containing %q", stale, tt.staleAt, tt.stale)
			}
		})
	}
}
