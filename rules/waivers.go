package rules

import (
	"fmt"
	"strings"
	"sync"
	"time"

	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/evaluate"
	"gopkg.in/yaml.v3"
)

// Policy is the rule configuration of one project: the settings of its
// phgate.yaml and its project-wide waivers. Check may be called from
// several goroutines; Stale is called once, after every Check.
type Policy struct {
	// Today is the date waiver expiry is judged on (zero: the current date).
	Today      time.Time
	settings   *Settings
	waivers    []spec.Waiver
	configPath string

	mu      sync.Mutex
	used    []bool
	checked map[string]bool
}

// NewPolicy builds a project's policy from the `rules:` node and the
// waivers of its phgate.yaml (at path; "" when there is none). A non-nil
// defaultTolerance (the config's defaults.tolerance, in percent) replaces
// the weighing-tolerance rule's built-in default before the rules: node
// is applied. Problems are positioned in the config file.
func NewPolicy(rulesNode *yaml.Node, waivers []spec.Waiver, path string, defaultTolerance *float64) (*Policy, diag.Problems) {
	base := DefaultSettings()
	if defaultTolerance != nil {
		base.setFloat(weighingTolerance.Name, "default-tolerance", *defaultTolerance)
	}
	s, ps := base.Apply(rulesNode, path)
	ps = append(ps, checkWaivers(waivers)...)
	return &Policy{settings: s, waivers: waivers, configPath: path, used: make([]bool, len(waivers)), checked: map[string]bool{}}, ps
}

// DefaultPolicy is the policy of a project without phgate.yaml.
func DefaultPolicy() *Policy {
	p, _ := NewPolicy(nil, nil, "", nil)
	return p
}

// Settings returns the project's rule settings (before recipe overrides).
func (p *Policy) Settings() *Settings { return p.settings }

func (p *Policy) today() string {
	t := p.Today
	if t.IsZero() {
		t = time.Now()
	}
	return t.Format(time.DateOnly)
}

// checkWaivers reports waivers that name no rule, the stale-waiver rule
// itself, an empty reason or an impossible date.
func checkWaivers(ws []spec.Waiver) diag.Problems {
	var ps diag.Problems
	at := func(w spec.Waiver, pos spec.Pos, format string, args ...any) {
		if pos.Line == 0 {
			pos = w.Pos
		}
		ps = append(ps, diag.Problem{Path: w.Path, Line: pos.Line, Column: pos.Column, Message: fmt.Sprintf(format, args...)})
	}
	for _, w := range ws {
		switch _, ok := Lookup(w.Rule.Value); {
		case !ok:
			at(w, w.Rule.Pos, "waiver names unknown rule %q%s", w.Rule.Value, didYouMean(w.Rule.Value, Names()))
		case w.Rule.Value == staleWaiver.Name:
			at(w, w.Rule.Pos, "%s findings cannot be waived: remove or renew the waiver they point at", staleWaiver.Name)
		}
		if len([]rune(strings.TrimSpace(w.Reason.Value))) < 3 {
			at(w, w.Reason.Pos, "a waiver needs a reason saying why the finding is accepted")
		}
		if w.Expires.Value != "" {
			if _, err := time.Parse(time.DateOnly, w.Expires.Value); err != nil {
				at(w, w.Expires.Pos, "expires %q is not a calendar date (write YYYY-MM-DD)", w.Expires.Value)
			}
		}
	}
	return ps
}

// Check runs the rules on one solved recipe with the project's settings,
// the recipe's own `rules:` overrides and both levels of waivers. A
// waived finding stays in the list with Waived set to the reason; a
// recipe waiver that expired or matched nothing is reported as a
// stale-waiver finding. Problems (unknown rules or settings in the
// recipe, bad waivers) mean the recipe could not be checked.
func (p *Policy) Check(res *evaluate.Result) ([]Finding, diag.Problems) {
	r := res.Recipe
	s, ps := p.settings.Apply(r.Rules, r.Path)
	ps = append(ps, checkWaivers(r.Waivers)...)
	if len(ps) > 0 {
		return nil, ps
	}
	fs := run(res, s)
	today := p.today()
	recipeUsed := make([]bool, len(r.Waivers))
	for i := range fs {
		f := &fs[i]
		for k, w := range r.Waivers {
			if w.Rule.Value == f.Rule && !expired(w, today) {
				f.Waived, f.WaivedIn, recipeUsed[k] = strings.TrimSpace(w.Reason.Value), w.Path, true
				break
			}
		}
		if f.Waived != "" {
			continue
		}
		for k, w := range p.waivers {
			if w.Rule.Value == f.Rule && !expired(w, today) && covers(w, r.ID.Value) {
				f.Waived, f.WaivedIn = strings.TrimSpace(w.Reason.Value), w.Path
				p.mu.Lock()
				p.used[k] = true
				p.mu.Unlock()
				break
			}
		}
	}
	for k, w := range r.Waivers {
		switch {
		case expired(w, today):
			fs = staleFinding(fs, s, w, w.Pos, fmt.Sprintf("waiver for %s expired on %s; its findings are reported again", w.Rule.Value, w.Expires.Value),
				"fix what the rule found, or renew the waiver with a new expires date and reason")
		case !recipeUsed[k]:
			fs = staleFinding(fs, s, w, w.Pos, unusedMessage(w, s), "remove the waiver")
		}
	}
	p.mu.Lock()
	p.checked[r.ID.Value] = true
	p.mu.Unlock()
	return SortFindings(fs), nil
}

// Stale reports the project-wide waivers that expired, name recipes the
// project does not have, or matched no finding. A waiver counts as unused
// only when every recipe it covers was checked in this run (ids lists
// the project's recipe ids), so checking one file does not flag the
// waivers meant for the others.
func (p *Policy) Stale(ids []string) []Finding {
	var fs []Finding
	known := map[string]bool{}
	for _, id := range ids {
		known[id] = true
	}
	today := p.today()
	for k, w := range p.waivers {
		if expired(w, today) {
			fs = staleFinding(fs, p.settings, w, w.Pos, fmt.Sprintf("waiver for %s expired on %s; its findings are reported again", w.Rule.Value, w.Expires.Value),
				"fix what the rule found, or renew the waiver with a new expires date and reason")
			continue
		}
		for _, id := range w.Recipes {
			if !known[id.Value] {
				fs = staleFinding(fs, p.settings, w, id.Pos, fmt.Sprintf("waiver for %s names recipe %q, which this project does not have%s", w.Rule.Value, id.Value, didYouMean(id.Value, ids)),
					"correct the recipe id or remove it from the list")
			}
		}
		if p.used[k] || !p.coveredAllChecked(w, ids) {
			continue
		}
		fs = staleFinding(fs, p.settings, w, w.Pos, unusedMessage(w, p.settings), "remove the waiver")
	}
	return SortFindings(fs)
}

func (p *Policy) coveredAllChecked(w spec.Waiver, ids []string) bool {
	if len(w.Recipes) > 0 {
		for _, id := range w.Recipes {
			if !p.checked[id.Value] && contains(ids, id.Value) {
				return false
			}
		}
		return true
	}
	for _, id := range ids {
		if !p.checked[id] {
			return false
		}
	}
	return true
}

func contains(ss []string, s string) bool {
	for _, x := range ss {
		if x == s {
			return true
		}
	}
	return false
}

func unusedMessage(w spec.Waiver, s *Settings) string {
	if c := s.Rule(w.Rule.Value); c != nil && !c.Enabled {
		return fmt.Sprintf("waiver for %s is unused: the rule is disabled", w.Rule.Value)
	}
	return fmt.Sprintf("waiver for %s matched no finding; the recipe now passes that rule", w.Rule.Value)
}

// expired reports whether the waiver's expires date is before today.
func expired(w spec.Waiver, today string) bool {
	return w.Expires.Value != "" && today > w.Expires.Value
}

// covers reports whether a project waiver applies to the recipe id.
func covers(w spec.Waiver, id string) bool {
	if len(w.Recipes) == 0 {
		return true
	}
	for _, r := range w.Recipes {
		if r.Value == id {
			return true
		}
	}
	return false
}

// staleFinding appends a stale-waiver finding at the waiver, unless the
// rule is disabled.
func staleFinding(fs []Finding, s *Settings, w spec.Waiver, pos spec.Pos, msg, fix string) []Finding {
	c := s.Rule(staleWaiver.Name)
	if !c.Enabled {
		return fs
	}
	return append(fs, Finding{Rule: staleWaiver.Name, Severity: c.Severity, Message: msg, Path: w.Path, Line: pos.Line, Column: pos.Column, Fix: fix})
}

// BufferCapacityMinimum is the weak-buffer rule's minimum for recipe r,
// with the project's and the recipe's own settings applied, in mol/L per
// pH (charts draw it as the minimum line).
func (p *Policy) BufferCapacityMinimum(r *spec.Recipe) float64 {
	s, ps := p.settings.Apply(r.Rules, r.Path)
	if len(ps) > 0 {
		s = p.settings
	}
	if c := s.Rule(weakBuffer.Name); c != nil {
		if v, ok := c.values.(*weakBufferSettings); ok {
			return v.Minimum / 1000
		}
	}
	return weakBuffer.Defaults.(weakBufferSettings).Minimum / 1000
}
