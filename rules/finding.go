package rules

import (
	"fmt"
	"sort"
	"strings"
)

// Severity orders how serious a finding is.
type Severity int

const (
	// Info is worth knowing; never fails a build.
	Info Severity = iota
	// Warning deserves a look; fails with --fail-on warning.
	Warning
	// Error is a broken recipe; fails by default.
	Error
)

// String returns "info", "warning" or "error".
func (s Severity) String() string {
	switch s {
	case Info:
		return "info"
	case Warning:
		return "warning"
	case Error:
		return "error"
	}
	return "unknown"
}

// MarshalText writes the severity as its name (for JSON).
func (s Severity) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// ParseSeverity reads "info", "warning" or "error".
func ParseSeverity(s string) (Severity, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "info":
		return Info, nil
	case "warning", "warn":
		return Warning, nil
	case "error":
		return Error, nil
	}
	return Info, fmt.Errorf("unknown severity %q (use info, warning or error)", s)
}

// Finding is one thing a rule found in a recipe, at a position.
type Finding struct {
	Rule     string   `json:"rule"`
	Severity Severity `json:"severity"`
	Message  string   `json:"message"`
	Path     string   `json:"path"`
	Line     int      `json:"line"`
	Column   int      `json:"column"`
	// Fix is a hint on how to resolve it.
	Fix string `json:"fix,omitempty"`
	// Waived holds the waiver's reason when a waiver accepted the finding.
	Waived string `json:"waived,omitempty"`
	// WaivedIn is the file that holds the waiver (the recipe itself, or
	// the project's phgate.yaml).
	WaivedIn string `json:"waived_in,omitempty"`
}

// SortFindings orders findings by path, line, column, rule and message,
// and drops exact duplicates.
func SortFindings(fs []Finding) []Finding {
	sort.SliceStable(fs, func(i, j int) bool {
		a, b := fs[i], fs[j]
		if a.Path != b.Path {
			return a.Path < b.Path
		}
		if a.Line != b.Line {
			return a.Line < b.Line
		}
		if a.Column != b.Column {
			return a.Column < b.Column
		}
		if a.Rule != b.Rule {
			return a.Rule < b.Rule
		}
		return a.Message < b.Message
	})
	out := fs[:0]
	for i, f := range fs {
		if i > 0 && f == fs[i-1] {
			continue
		}
		out = append(out, f)
	}
	return out
}
