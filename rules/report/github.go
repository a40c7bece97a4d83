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
func (g GitHub) Write(w io.Writer, rep *Report) error { return writeAll(g, w, rep) }

// WriteRecipe implements Streamer: the annotations of one recipe.
func (GitHub) WriteRecipe(w io.Writer, r *Recipe) error {
	return annotate(w, r.Findings)
}

// WriteEnd implements Streamer: project findings, problems, the tally.
func (GitHub) WriteEnd(w io.Writer, rep *Report) error {
	if err := annotate(w, rep.Findings); err != nil {
		return err
	}
	var b strings.Builder
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
	fmt.Fprintf(&b, "phgate: %s\n", strings.Join(rep.Summary.Tally(), ", "))
	_, err := io.WriteString(w, b.String())
	return err
}

// annotate writes one workflow command per finding that no waiver accepted.
func annotate(w io.Writer, fs []rules.Finding) error {
	var b strings.Builder
	for _, f := range fs {
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
