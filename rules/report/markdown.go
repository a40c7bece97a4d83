package report

import (
	"fmt"
	"io"
	"strings"

	"github.com/phgate/phgate/rules"
)

// Markdown writes a compact summary for pull-request comments and CI job
// summaries: a verdict line, one table row per recipe, the findings, and
// the files that could not be checked.
type Markdown struct{}

// Write implements Formatter.
func (Markdown) Write(w io.Writer, rep *Report) error {
	var b strings.Builder
	s := rep.Summary
	verdict := "pass"
	if s.Errors > 0 || s.Problems > 0 {
		verdict = "fail"
	}
	fmt.Fprintf(&b, "### phgate: %s\n\n", verdict)
	parts := s.Tally()
	fmt.Fprintf(&b, "%s\n\n", strings.Join(parts, " · "))

	if len(rep.Recipes) > 0 {
		b.WriteString("| Recipe | pH | Window | β (mM per pH) | Findings |\n|---|---:|---|---:|---|\n")
		for _, r := range rep.Recipes {
			window := "–"
			if r.PHWindow != nil {
				window = windowText(r.PHWindow)
			}
			fmt.Fprintf(&b, "| `%s` %s | %.2f | %s | %.3g | %s |\n", mdCell(r.Recipe), mdCell(r.Path), r.PH, window, r.BufferCapacity*1000, findingCounts(r.Findings))
		}
		b.WriteString("\n")
	}
	all := rep.All()
	if len(all) > 0 {
		b.WriteString("| | Rule | Where | Message |\n|---|---|---|---|\n")
		for _, f := range all {
			sev := f.Severity.String()
			if f.Waived != "" {
				sev = "waived"
			}
			msg := mdCell(f.Message)
			if f.Waived != "" {
				msg += " _(waived: " + mdCell(f.Waived) + ")_"
			} else if f.Fix != "" {
				msg += "<br>→ " + mdCell(f.Fix)
			}
			fmt.Fprintf(&b, "| %s | `%s` | `%s:%d:%d` | %s |\n", sev, f.Rule, mdCell(f.Path), f.Line, f.Column, msg)
		}
		b.WriteString("\n")
	}
	if len(rep.Problems) > 0 {
		b.WriteString("**Could not check**\n\n")
		for _, p := range rep.Problems {
			fmt.Fprintf(&b, "- `%s`\n", strings.ReplaceAll(p.Error(), "`", "'"))
		}
		b.WriteString("\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// findingCounts is "2 errors, 1 warning", "1 waived" or "none".
func findingCounts(fs []rules.Finding) string {
	var e, wn, n, wv int
	for _, f := range fs {
		switch {
		case f.Waived != "":
			wv++
		case f.Severity == rules.Error:
			e++
		case f.Severity == rules.Warning:
			wn++
		default:
			n++
		}
	}
	var parts []string
	for _, c := range []struct {
		n    int
		word string
	}{{e, "error"}, {wn, "warning"}, {n, "note"}} {
		if c.n > 0 {
			parts = append(parts, plural(c.n, c.word))
		}
	}
	if wv > 0 {
		parts = append(parts, fmt.Sprintf("%d waived", wv))
	}
	if len(parts) == 0 {
		return "none"
	}
	return strings.Join(parts, ", ")
}

// mdCell makes text safe inside a Markdown table cell.
func mdCell(s string) string {
	s = strings.ReplaceAll(s, "|", "\\|")
	s = strings.ReplaceAll(s, "\r", "")
	return strings.ReplaceAll(s, "\n", "<br>")
}
