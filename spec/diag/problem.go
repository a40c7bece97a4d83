// Package diag holds the positioned problem type shared by every loader
// in spec: a message tied to a file, a 1-based line and a 1-based column.
package diag

import (
	"fmt"
	"sort"
)

// Problem is something wrong with a user's file, at a position.
// Line and Column are 1-based; Column counts Unicode code points (runes),
// as the YAML parser does; 0 means "no position" (e.g. an unreadable file).
type Problem struct {
	Path    string `json:"path"`
	Line    int    `json:"line,omitempty"`
	Column  int    `json:"column,omitempty"`
	Message string `json:"message"`
}

// Error formats the problem as "path:line:col: message".
func (p Problem) Error() string {
	switch {
	case p.Line > 0 && p.Column > 0:
		return fmt.Sprintf("%s:%d:%d: %s", p.Path, p.Line, p.Column, p.Message)
	case p.Line > 0:
		return fmt.Sprintf("%s:%d: %s", p.Path, p.Line, p.Message)
	case p.Path != "":
		return fmt.Sprintf("%s: %s", p.Path, p.Message)
	}
	return p.Message
}

// Problems is a list of problems that is itself an error.
type Problems []Problem

// Error joins the problems one per line.
func (ps Problems) Error() string {
	s := ""
	for i, p := range ps {
		if i > 0 {
			s += "\n"
		}
		s += p.Error()
	}
	return s
}

// Sort orders problems by path, line, column and message, so output is
// the same whatever order they were found in.
func (ps Problems) Sort() {
	sort.SliceStable(ps, func(i, j int) bool {
		a, b := ps[i], ps[j]
		if a.Path != b.Path {
			return a.Path < b.Path
		}
		if a.Line != b.Line {
			return a.Line < b.Line
		}
		if a.Column != b.Column {
			return a.Column < b.Column
		}
		return a.Message < b.Message
	})
}
