package rules

import (
	"fmt"
	"github.com/phgate/phgate/spec/suggest"
	"math"
	"reflect"
	"strings"

	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/yamldoc"
	"gopkg.in/yaml.v3"
)

// Setting describes one typed setting of a rule, read from the tags of
// the rule's settings struct: `yaml:"key"`, `doc:"what it means"` and
// `unit:"mM per pH"`.
type Setting struct {
	Key, Doc, Unit string
	// Default is the default value (float64, int or bool).
	Default any
}

// Settings lists the rule's settings with their defaults, in field order.
func (r *Rule) Settings() []Setting {
	if r.Defaults == nil {
		return nil
	}
	v := reflect.ValueOf(r.Defaults)
	t := v.Type()
	out := make([]Setting, 0, t.NumField())
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		out = append(out, Setting{Key: f.Tag.Get("yaml"), Doc: f.Tag.Get("doc"), Unit: f.Tag.Get("unit"), Default: v.Field(i).Interface()})
	}
	return out
}

// RuleConfig is one rule's configuration for a recipe.
type RuleConfig struct {
	Enabled  bool
	Severity Severity
	// values points at a copy of the rule's settings struct.
	values any
}

// Settings is the configuration of every registered rule: built-in
// defaults, overridden by phgate.yaml, overridden by the recipe.
type Settings struct {
	rules map[string]*RuleConfig
}

// DefaultSettings returns every rule enabled at its default severity with
// its default thresholds.
func DefaultSettings() *Settings {
	s := &Settings{rules: map[string]*RuleConfig{}}
	for _, r := range Registry {
		c := &RuleConfig{Enabled: true, Severity: r.Default}
		if r.Defaults != nil {
			p := reflect.New(reflect.TypeOf(r.Defaults))
			p.Elem().Set(reflect.ValueOf(r.Defaults))
			c.values = p.Interface()
		}
		s.rules[r.Name] = c
	}
	return s
}

// Rule returns the configuration of a registered rule.
func (s *Settings) Rule(name string) *RuleConfig { return s.rules[name] }

func (s *Settings) clone() *Settings {
	out := &Settings{rules: map[string]*RuleConfig{}}
	for name, c := range s.rules {
		cc := *c
		if c.values != nil {
			v := reflect.ValueOf(c.values).Elem()
			p := reflect.New(v.Type())
			p.Elem().Set(v)
			cc.values = p.Interface()
		}
		out.rules[name] = &cc
	}
	return out
}

// setFloat sets a numeric setting by key; it reports whether the key exists.
func (s *Settings) setFloat(rule, key string, x float64) bool {
	c := s.rules[rule]
	if c == nil || c.values == nil {
		return false
	}
	v := reflect.ValueOf(c.values).Elem()
	for i := 0; i < v.NumField(); i++ {
		if v.Type().Field(i).Tag.Get("yaml") == key && v.Field(i).Kind() == reflect.Float64 {
			v.Field(i).SetFloat(x)
			return true
		}
	}
	return false
}

// Apply returns a copy of s with the overrides of a `rules:` node (from
// phgate.yaml or a recipe) applied. Each key is a rule name; its value is
// a mapping of `enabled`, `severity` and the rule's own settings, or a
// bare true/false to switch the rule on or off. Unknown rule names and
// setting keys, and values of the wrong type, are problems at their
// position with a suggestion. n may be nil.
func (s *Settings) Apply(n *yaml.Node, path string) (*Settings, diag.Problems) {
	out := s.clone()
	n = yamldoc.Deref(n)
	if n == nil {
		return out, nil
	}
	var ps diag.Problems
	at := func(x *yaml.Node, format string, args ...any) {
		ps = append(ps, diag.Problem{Path: path, Line: x.Line, Column: x.Column, Message: fmt.Sprintf(format, args...)})
	}
	if n.Kind != yaml.MappingNode {
		at(n, "rules must be a mapping of rule names to settings")
		return out, ps
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		key, val := n.Content[i], yamldoc.Deref(n.Content[i+1])
		r, ok := Lookup(key.Value)
		if !ok {
			at(key, "unknown rule %q%s", key.Value, didYouMean(key.Value, Names()))
			continue
		}
		c := out.rules[r.Name]
		if val.Kind == yaml.ScalarNode {
			var on bool
			if err := val.Decode(&on); err != nil {
				at(val, "%s: give true, false or a mapping of settings (enabled, severity, …)", r.Name)
				continue
			}
			c.Enabled = on
			continue
		}
		if val.Kind != yaml.MappingNode {
			at(val, "%s: give a mapping of settings (enabled, severity, …)", r.Name)
			continue
		}
		for j := 0; j+1 < len(val.Content); j += 2 {
			k, v := val.Content[j], yamldoc.Deref(val.Content[j+1])
			switch k.Value {
			case "enabled":
				if err := v.Decode(&c.Enabled); err != nil {
					at(v, "%s.enabled must be true or false", r.Name)
				}
			case "severity":
				sev, err := ParseSeverity(v.Value)
				if err != nil || v.Kind != yaml.ScalarNode {
					at(v, "%s.severity must be error, warning or info", r.Name)
					continue
				}
				c.Severity = sev
			default:
				if msg := setValue(c.values, k.Value, v); msg != "" {
					keys := []string{"enabled", "severity"}
					for _, st := range r.Settings() {
						keys = append(keys, st.Key)
					}
					if msg == "unknown" {
						at(k, "rule %s has no setting %q%s (settings: %s)", r.Name, k.Value, didYouMean(k.Value, keys), strings.Join(keys, ", "))
						continue
					}
					at(v, "%s.%s %s", r.Name, k.Value, msg)
				}
			}
		}
	}
	return out, ps
}

// setValue decodes node into the field of the settings struct tagged
// key. It returns "" on success, "unknown" when there is no such field,
// or a description of what is wrong with the value.
func setValue(values any, key string, node *yaml.Node) string {
	if values == nil {
		return "unknown"
	}
	v := reflect.ValueOf(values).Elem()
	for i := 0; i < v.NumField(); i++ {
		f := v.Type().Field(i)
		if f.Tag.Get("yaml") != key {
			continue
		}
		fv := v.Field(i)
		switch fv.Kind() {
		case reflect.Float64:
			var x float64
			if node.Kind != yaml.ScalarNode || node.Decode(&x) != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return fmt.Sprintf("must be a number, not %q", node.Value)
			}
			if x < 0 {
				return fmt.Sprintf("must not be negative (got %g)", x)
			}
			fv.SetFloat(x)
		case reflect.Int:
			var x int
			if node.Kind != yaml.ScalarNode || node.Decode(&x) != nil || x < 0 {
				return fmt.Sprintf("must be a whole number of 0 or more, not %q", node.Value)
			}
			fv.SetInt(int64(x))
		case reflect.Bool:
			var x bool
			if node.Kind != yaml.ScalarNode || node.Decode(&x) != nil {
				return fmt.Sprintf("must be true or false, not %q", node.Value)
			}
			fv.SetBool(x)
		default:
			panic("rules: unsupported setting type " + fv.Kind().String())
		}
		return ""
	}
	return "unknown"
}

func didYouMean(s string, candidates []string) string {
	if near := suggest.Nearest(s, candidates); near != "" {
		return fmt.Sprintf("; did you mean %q?", near)
	}
	return ""
}
