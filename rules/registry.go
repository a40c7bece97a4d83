package rules

import (
	"fmt"

	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/evaluate"
)

// Rule is one check with its documentation as data.
type Rule struct {
	// Name is the stable kebab-case id used in config, waivers and output.
	Name string
	// Summary is one line.
	Summary string
	// Doc explains what it checks, how it is computed, why it matters,
	// how to fix, and the source of its default thresholds.
	Doc string
	// Default is the severity of its findings unless configured.
	Default Severity
	// Run inspects one solved recipe.
	Run func(*Pass)
}

// Pass is what a rule sees of one recipe.
type Pass struct {
	Result   *evaluate.Result
	Rule     *Rule
	Severity Severity
	findings *[]Finding
}

// Recipe is the recipe being checked.
func (p *Pass) Recipe() *spec.Recipe { return p.Result.Recipe }

// Report records a finding at a recipe position with the rule's severity.
func (p *Pass) Report(at spec.Pos, fix, format string, args ...any) {
	p.ReportAs(p.Severity, at, fix, format, args...)
}

// ReportAs records a finding with an explicit severity (for rules whose
// findings come in two strengths, such as an edge margin warning).
func (p *Pass) ReportAs(sev Severity, at spec.Pos, fix, format string, args ...any) {
	if at.Line == 0 {
		panic("rules: finding without a position from " + p.Rule.Name)
	}
	if sev > p.Severity {
		sev = p.Severity
	}
	*p.findings = append(*p.findings, Finding{Rule: p.Rule.Name, Severity: sev, Message: fmt.Sprintf(format, args...),
		Path: p.Result.Recipe.Path, Line: at.Line, Column: at.Column, Fix: fix})
}

// Registry lists every rule, in the order they are documented.
var Registry = []*Rule{
	phWindow,
}

// Lookup returns the registered rule with the given name.
func Lookup(name string) (*Rule, bool) {
	for _, r := range Registry {
		if r.Name == name {
			return r, true
		}
	}
	return nil, false
}

// Check runs every registered rule on a solved recipe and returns the
// findings sorted.
func Check(res *evaluate.Result) []Finding {
	var fs []Finding
	for _, r := range Registry {
		p := &Pass{Result: res, Rule: r, Severity: r.Default, findings: &fs}
		r.Run(p)
	}
	return SortFindings(fs)
}
