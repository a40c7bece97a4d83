package report

import (
	"fmt"
	"io"
	"strings"

	"github.com/phgate/phgate/rules"
)

// GitHub writes workflow-command annotations (::error, ::warning,
// ::notice) so findings appear on the recipe lines of a pull request,
// then one plain summary line. Waived findings are not annotated.
type GitHub struct{}

// Write implements Formatter.
func (GitHub) Write(w io.Writer, rep *Report) error {
	var b strings.Builder
	for _, f := range rep.All() {
		if f.Waived != "" {
			continue
		}
		cmd := "notice"
		switch f.Severity {
		case rules.Error:
			cmd = "error"
		case rules.Warning:
			cmd = "warning"
		}
		msg := f.Message
		if f.Fix != "" {
			msg += "\nFix: " + f.Fix
		}
		fmt.Fprintf(&b, "::%s file=%s,line=%d,col=%d,title=%s::%s\n", cmd, ghProperty(f.Path), f.Line, f.Column,
			ghProperty("phgate "+f.Rule), ghData(msg))
	}
	for _, p := range rep.Problems {
		props := "file=" + ghProperty(p.Path)
		if p.Line > 0 {
			props += fmt.Sprintf(",line=%d", p.Line)
			if p.Column > 0 {
				props += fmt.Sprintf(",col=%d", p.Column)
			}
		}
		fmt.Fprintf(&b, "::error %s,title=%s::%s\n", props, ghProperty("phgate could not check"), ghData(p.Message))
	}
	s := rep.Summary
	fmt.Fprintf(&b, "phgate: %s, %s, %s, %d waived, %s\n", plural(s.Recipes, "recipe"), plural(s.Errors, "error"),
		plural(s.Warnings, "warning"), s.Waived, plural(s.Problems, "problem"))
	_, err := io.WriteString(w, b.String())
	return err
}

// ghData escapes the message part of a workflow command.
func ghData(s string) string {
	return strings.NewReplacer("%", "%25", "\r", "%0D", "\n", "%0A").Replace(s)
}

// ghProperty escapes a property value of a workflow command.
func ghProperty(s string) string {
	return strings.NewReplacer("%", "%25", "\r", "%0D", "\n", "%0A", ":", "%3A", ",", "%2C").Replace(s)
}
