package rules

import (
	"strings"
	"testing"

	"github.com/phgate/phgate/spec"
	"gopkg.in/yaml.v3"
)

func node(t *testing.T, src string) *yaml.Node {
	t.Helper()
	var doc yaml.Node
	if err := yaml.Unmarshal([]byte(src), &doc); err != nil {
		t.Fatal(err)
	}
	return doc.Content[0]
}

func TestSettingsApply(t *testing.T) {
	tests := []struct {
		name string
		src  string
		// problem is a fragment of the single expected problem, "" for none.
		problem string
		line    int
		column  int
	}{
		{name: "threshold", src: "ph-window: {margin: 0.2}"},
		{name: "switch off", src: "weak-buffer: false"},
		{name: "severity", src: "precipitation: {severity: warning}"},
		{name: "unknown rule", src: "ph-windw: {margin: 0.2}", problem: `unknown rule "ph-windw"; did you mean "ph-window"?`, line: 1, column: 1},
		{name: "unknown key", src: "weak-buffer:\n  minimun: 3", problem: `has no setting "minimun"; did you mean "minimum"?`, line: 2, column: 3},
		{name: "wrong type", src: "weak-buffer:\n  minimum: lots", problem: `must be a number`, line: 2, column: 12},
		{name: "negative", src: "ph-window: {margin: -1}", problem: "must not be negative", line: 1, column: 21},
		{name: "bad severity", src: "ph-window: {severity: fatal}", problem: "must be error, warning or info", line: 1, column: 23},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, ps := DefaultSettings().Apply(node(t, tt.src), "phgate.yaml")
			if tt.problem == "" {
				if len(ps) > 0 {
					t.Fatalf("unexpected problems: %v", ps)
				}
				return
			}
			if len(ps) != 1 || !strings.Contains(ps[0].Message, tt.problem) || ps[0].Line != tt.line || ps[0].Column != tt.column {
				t.Fatalf("got %v, want one problem at %d:%d containing %q", ps, tt.line, tt.column, tt.problem)
			}
		})
	}
}

func TestSettingsLayering(t *testing.T) {
	project, ps := DefaultSettings().Apply(node(t, "ph-window: {margin: 0.2}\nweak-buffer: {minimum: 2, severity: error}"), "phgate.yaml")
	if len(ps) > 0 {
		t.Fatal(ps)
	}
	recipe, ps := project.Apply(node(t, "weak-buffer: {minimum: 8}"), "r.yaml")
	if len(ps) > 0 {
		t.Fatal(ps)
	}
	// The recipe overrides one threshold and inherits the rest.
	if got := recipe.Rule("weak-buffer").values.(*weakBufferSettings).Minimum; got != 8 {
		t.Errorf("recipe minimum = %g, want 8", got)
	}
	if got := recipe.Rule("weak-buffer").Severity; got != Error {
		t.Errorf("recipe severity = %s, want the project's error", got)
	}
	if got := recipe.Rule("ph-window").values.(*phWindowSettings).Margin; got != 0.2 {
		t.Errorf("ph-window margin = %g, want the project's 0.2", got)
	}
	// Applying never changes the settings it started from.
	if got := project.Rule("weak-buffer").values.(*weakBufferSettings).Minimum; got != 2 {
		t.Errorf("project minimum changed to %g", got)
	}
	if got := DefaultSettings().Rule("weak-buffer").values.(*weakBufferSettings).Minimum; got != 5 {
		t.Errorf("default minimum = %g, want 5 (common practice)", got)
	}
}

func TestSeverityShift(t *testing.T) {
	tests := []struct {
		name              string
		configured, asked Severity
		want              Severity
	}{
		{"default", Error, Warning, Warning},
		{"lowered", Warning, Warning, Info},
		{"lowered to the floor", Info, Warning, Info},
		{"primary lowered", Warning, Error, Warning},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var fs []Finding
			p := &Pass{Result: evaluateFixture(t, "testdata/ph-window/trigger-edge.yaml"), Rule: phWindow, Severity: tt.configured, findings: &fs}
			p.ReportAs(tt.asked, spec.Pos{Line: 1, Column: 1}, "", "x")
			if fs[0].Severity != tt.want {
				t.Errorf("got %s, want %s", fs[0].Severity, tt.want)
			}
		})
	}
}

func TestReportWithoutPositionPanics(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("a finding without a position must panic")
		}
	}()
	var fs []Finding
	p := &Pass{Result: evaluateFixture(t, "testdata/ph-window/trigger-edge.yaml"), Rule: phWindow, Severity: Error, findings: &fs}
	p.Report(spec.Pos{}, "", "no position")
}
