package main

import (
	"bytes"
	"path/filepath"
	"strings"

	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/rules/report/chart"
	"github.com/phgate/phgate/rules/report/htmlreport"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/project"
)

func (a *App) report(args []string) int {
	fs := a.flags("report", "RECIPE... -o FILE.html")
	out := fs.String("o", "", "output file, ending in .html (required)")
	title := fs.String("title", "", "document title (default \"phgate recipe report\")")
	paths, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	if len(paths) == 0 || *out == "" {
		fs.Usage()
		return ExitProblem
	}
	if ext := strings.ToLower(filepath.Ext(*out)); ext != ".html" && ext != ".htm" {
		return a.fail("%s: the report file must end in .html", *out)
	}
	run := project.Discover(paths)
	pols, problems := policies(run)
	var sections []htmlreport.Section
	for _, file := range run.Files {
		res, ps := file.Evaluate()
		if len(ps) > 0 {
			problems = append(problems, ps...)
			continue
		}
		findings, ps := pols[file.Project()].Check(res)
		if len(ps) > 0 {
			problems = append(problems, ps...)
			continue
		}
		charts, err := chart.All(res, chart.Options{MinCapacity: pols[file.Project()].BufferCapacityMinimum(res.Recipe)})
		if err != nil {
			problems = append(problems, diag.Problem{Path: file.Path, Message: "cannot compute the charts: " + err.Error()})
			continue
		}
		sections = append(sections, htmlreport.Section{Recipe: report.Build(res, findings), Charts: charts})
	}
	// A report with recipes missing would pass for a complete one: any
	// problem stops it.
	if len(problems) > 0 {
		return a.problems(problems)
	}
	if len(sections) == 0 {
		return a.fail("no recipes found in %s", strings.Join(paths, ", "))
	}
	var buf bytes.Buffer
	if err := htmlreport.Write(&buf, sections, htmlreport.Options{Title: *title, Generator: "phgate " + version}); err != nil {
		return a.fail("writing the report: %v", err)
	}
	return a.writeOutput(*out, buf.Bytes())
}
