package main

import (
	"encoding/json"
	"fmt"

	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/project"
)

func (a *App) show(args []string) int {
	fs := a.flags("show", "RECIPE")
	format := fs.String("format", "text", "output format: text or json")
	paths, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	if len(paths) != 1 {
		fs.Usage()
		return ExitProblem
	}
	run := project.Discover(paths)
	if len(run.Files) != 1 {
		return a.fail("%s: not a recipe file", paths[0])
	}
	pols, ps := policies(run)
	if len(ps) > 0 {
		return a.problems(ps)
	}
	file := run.Files[0]
	res, ps := file.Evaluate()
	if len(ps) > 0 {
		return a.problems(ps)
	}
	findings, ps := pols[file.Project()].Check(res)
	if len(ps) > 0 {
		return a.problems(ps)
	}
	r := report.Build(res, findings)
	switch *format {
	case "json":
		enc := json.NewEncoder(a.Stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(struct {
			report.Recipe
			Caution string `json:"caution"`
		}{r, report.Caution}); err != nil {
			return a.fail("%v", err)
		}
	case "text":
		if err := (&report.Detail{Color: a.Color}).Write(a.Stdout, r); err != nil {
			return a.fail("%v", err)
		}
	default:
		return a.fail("unknown format %q (use text or json)", *format)
	}
	return ExitOK
}

// problems prints positioned problems to stderr and returns ExitProblem.
func (a *App) problems(ps diag.Problems) int {
	for _, p := range ps {
		fmt.Fprintln(a.Stderr, p.Error())
	}
	return ExitProblem
}
