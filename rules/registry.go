package rules

import (
	"fmt"

	"github.com/phgate/phgate/solver"
	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/evaluate"
)

// Rule is one check with its documentation as data. The same metadata
// feeds `phgate rules`, the SARIF rule descriptors and the README table.
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
	// Defaults is the rule's settings struct (a value, not a pointer)
	// holding the default thresholds, or nil for a rule without settings.
	// Each field carries `yaml:"key"` and `doc:"…"` tags; see Settings.
	Defaults any
	// Run inspects one solved recipe; nil for rules whose findings are
	// produced by the framework itself (stale-waiver).
	Run func(*Pass)
}

// Pass is what a rule sees of one recipe: the solved result, its own
// settings, and helpers to re-solve variants of the mixture.
type Pass struct {
	Result *evaluate.Result
	Rule   *Rule
	// Severity is the rule's configured severity for this recipe.
	Severity Severity
	settings any
	findings *[]Finding
	whatIf   *whatIf
}

// Recipe is the recipe being checked.
func (p *Pass) Recipe() *spec.Recipe { return p.Result.Recipe }

// Equilibrium is the recipe's solved equilibrium at its nominal temperature.
func (p *Pass) Equilibrium() *solver.Equilibrium { return p.Result.Equilibrium }

// settingsOf returns the pass's settings as the rule's own struct type.
// A mismatch is a programmer error in the rule's definition.
func settingsOf[T any](p *Pass) *T {
	s, ok := p.settings.(*T)
	if !ok {
		panic(fmt.Sprintf("rules: %s reads settings of type %T, has %T", p.Rule.Name, s, p.settings))
	}
	return s
}

// Report records a finding at a recipe position with the rule's
// configured severity. fix is a one-line hint on how to resolve it.
func (p *Pass) Report(at spec.Pos, fix, format string, args ...any) {
	p.ReportAs(p.Rule.Default, at, fix, format, args...)
}

// ReportAs records a finding of a rule whose findings come in two
// strengths (such as an edge-margin warning beside an out-of-window
// error). sev is given relative to the rule's default severity; a
// configured severity shifts every strength of the rule by the same
// amount, clamped to info … error.
func (p *Pass) ReportAs(sev Severity, at spec.Pos, fix, format string, args ...any) {
	if at.Line == 0 {
		panic("rules: finding without a position from " + p.Rule.Name)
	}
	s := sev + (p.Severity - p.Rule.Default)
	s = max(Info, min(Error, s))
	*p.findings = append(*p.findings, Finding{Rule: p.Rule.Name, Severity: s, Message: fmt.Sprintf(format, args...),
		Path: p.Result.Recipe.Path, Line: at.Line, Column: at.Column, Fix: fix})
}

// Registry lists every rule, in the order they are documented.
var Registry = []*Rule{
	phWindow,
	weakBuffer,
	precipitation,
	nearIsoelectric,
	preservativeIonized,
	temperatureDrift,
	weighingTolerance,
	qsUnreachable,
	osmolarityWindow,
	ionicStrengthLimit,
	staleWaiver,
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

// Names returns the registered rule names in registry order.
func Names() []string {
	out := make([]string, len(Registry))
	for i, r := range Registry {
		out[i] = r.Name
	}
	return out
}

// Check runs every registered rule with its default settings and no
// waivers on a solved recipe and returns the findings sorted.
func Check(res *evaluate.Result) []Finding {
	return run(res, DefaultSettings())
}

// run runs the enabled rules of settings on one recipe.
func run(res *evaluate.Result, s *Settings) []Finding {
	var fs []Finding
	wi := &whatIf{res: res}
	for _, r := range Registry {
		c := s.rules[r.Name]
		if r.Run == nil || !c.Enabled {
			continue
		}
		p := &Pass{Result: res, Rule: r, Severity: c.Severity, settings: c.values, findings: &fs, whatIf: wi}
		r.Run(p)
	}
	return SortFindings(fs)
}
