package main

import (
	"fmt"
	"strings"
	"text/tabwriter"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/spec/suggest"
)

// rulesCmd lists the rules, or explains one: `phgate rules [NAME]`.
func (a *App) rulesCmd(args []string) int {
	fs := a.flags("rules", "[NAME]")
	format := fs.String("format", "text", "output format: text, or markdown (a table of every rule)")
	names, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	if *format != "text" && *format != "markdown" {
		return a.fail("unknown format %q (use text or markdown)", *format)
	}
	if len(names) > 1 {
		fs.Usage()
		return ExitProblem
	}
	if len(names) == 1 {
		r, ok := rules.Lookup(names[0])
		if !ok {
			msg := fmt.Sprintf("unknown rule %q", names[0])
			if near := suggest.Nearest(names[0], rules.Names()); near != "" {
				msg += fmt.Sprintf("; did you mean %q?", near)
			}
			return a.fail("%s (run 'phgate rules' for the list)", msg)
		}
		if *format == "markdown" {
			fmt.Fprint(a.Stdout, ruleMarkdown(r))
			return ExitOK
		}
		fmt.Fprint(a.Stdout, r.Explain())
		return ExitOK
	}
	if *format == "markdown" {
		fmt.Fprint(a.Stdout, rulesTable())
		return ExitOK
	}
	tw := tabwriter.NewWriter(a.Stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "rule\tseverity\tsummary")
	for _, r := range rules.Registry {
		fmt.Fprintf(tw, "%s\t%s\t%s\n", r.Name, r.Default, r.Summary)
	}
	tw.Flush()
	fmt.Fprintln(a.Stdout, "\nRun 'phgate rules NAME' for what a rule checks, why, how to fix it and its settings.")
	return ExitOK
}

// rulesTable renders the registry as a Markdown table for the README.
func rulesTable() string {
	var b strings.Builder
	b.WriteString("| Rule | Default severity | Checks | Default thresholds |\n|---|---|---|---|\n")
	for _, r := range rules.Registry {
		th := r.DefaultsText()
		if th == "" {
			th = "–"
		}
		fmt.Fprintf(&b, "| `%s` | %s | %s | %s |\n", r.Name, r.Default, r.Summary, th)
	}
	return b.String()
}

// ruleMarkdown renders one rule's documentation as Markdown.
func ruleMarkdown(r *rules.Rule) string {
	return fmt.Sprintf("#### `%s` (%s)\n\n%s\n\n```\n%s```\n\n%s", r.Name, r.Default, r.Summary, r.SettingsText(), r.Doc+"\n")
}
