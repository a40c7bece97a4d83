package rules

import (
	"fmt"
	"strings"
)

// Explain renders a rule's full documentation for people: summary,
// default severity, the long doc and its settings with defaults. It is
// what `phgate rules NAME` prints and the help of SARIF rule descriptors.
func (r *Rule) Explain() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%s — %s\n\nDefault severity: %s\n\n%s\n", r.Name, r.Summary, r.Default, r.Doc)
	b.WriteString("\n" + r.SettingsText())
	return b.String()
}

// SettingsText lists the keys a rules: entry accepts for this rule.
func (r *Rule) SettingsText() string {
	var b strings.Builder
	b.WriteString("Settings (phgate.yaml or a recipe, under rules: " + r.Name + ":):\n")
	fmt.Fprintf(&b, "  enabled: true\n      false turns the rule off\n")
	fmt.Fprintf(&b, "  severity: %s\n      error, warning or info\n", r.Default)
	for _, s := range r.Settings() {
		unit := ""
		if s.Unit != "" {
			unit = "  (" + s.Unit + ")"
		}
		fmt.Fprintf(&b, "  %s: %v%s\n      %s\n", s.Key, s.Default, unit, s.Doc)
	}
	return b.String()
}

// DefaultsText is a one-line summary of the rule's default thresholds,
// e.g. "margin 0.1 pH", or "" for a rule without settings.
func (r *Rule) DefaultsText() string {
	var parts []string
	for _, s := range r.Settings() {
		v := fmt.Sprint(s.Default)
		if s.Unit != "" {
			v += " " + s.Unit
		}
		parts = append(parts, s.Key+" "+v)
	}
	return strings.Join(parts, ", ")
}
