package main

import (
	"runtime"
	"strings"
	"sync"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/project"
)

func (a *App) check(args []string) int {
	fs := a.flags("check", "[PATH...]")
	format := fs.String("format", "text", "output format: "+strings.Join(report.Names(), ", "))
	failOn := fs.String("fail-on", "error", "lowest severity that makes the exit status 1: error, warning or never")
	jobs := fs.Int("jobs", runtime.NumCPU(), "recipes solved in parallel")
	paths, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	threshold, ok := failThreshold(*failOn)
	if !ok {
		return a.fail("--fail-on must be error, warning or never, not %q", *failOn)
	}
	f, err := report.ByName(*format, a.Color)
	if err != nil {
		return a.fail("%v", err)
	}
	if *jobs < 1 {
		return a.fail("--jobs must be at least 1")
	}
	rep := a.runCheck(paths, *jobs)
	if err := f.Write(a.Stdout, rep); err != nil {
		return a.fail("writing the report: %v", err)
	}
	return exitStatus(rep, threshold)
}

// failThreshold maps --fail-on to the lowest failing severity; never
// returns a severity above Error.
func failThreshold(s string) (rules.Severity, bool) {
	switch s {
	case "never":
		return rules.Error + 1, true
	case "error", "warning":
		sev, _ := rules.ParseSeverity(s)
		return sev, true
	}
	return 0, false
}

// exitStatus is the maximum over stages: problems → 2, findings at or
// above the threshold that no waiver accepted → 1.
func exitStatus(rep *report.Report, threshold rules.Severity) int {
	if len(rep.Problems) > 0 {
		return ExitProblem
	}
	for _, f := range rep.All() {
		if f.Waived == "" && f.Severity >= threshold {
			return ExitFindings
		}
	}
	return ExitOK
}

// policies builds the rule policy of every project of a run; problems in
// a project's rules: or waivers: are reported at their config lines.
func policies(run *project.Run) (map[*project.Project]*rules.Policy, diag.Problems) {
	out := map[*project.Project]*rules.Policy{}
	var ps diag.Problems
	for _, p := range run.Projects {
		ps = append(ps, p.Problems...)
		c := p.Config
		pol, cps := rules.NewPolicy(c.Rules, c.Waivers, c.Path, c.DefaultTolerance)
		ps = append(ps, cps...)
		out[p] = pol
	}
	return out, ps
}

// runCheck discovers, solves and checks recipes on jobs workers; the
// report order is deterministic (by path) whatever the scheduling.
func (a *App) runCheck(paths []string, jobs int) *report.Report {
	run := project.Discover(paths)
	rep := &report.Report{}
	pols, ps := policies(run)
	rep.Problems = append(rep.Problems, ps...)
	results := make([]*report.Recipe, len(run.Files))
	problems := make([]diag.Problems, len(run.Files))
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < jobs; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				file := run.Files[i]
				res, ps := file.Evaluate()
				if len(ps) > 0 {
					problems[i] = ps
					continue
				}
				fs, ps := pols[file.Project()].Check(res)
				if len(ps) > 0 {
					problems[i] = ps
					continue
				}
				r := report.Build(res, fs)
				results[i] = &r
			}
		}()
	}
	for i := range run.Files {
		next <- i
	}
	close(next)
	wg.Wait()
	for i := range run.Files {
		if results[i] != nil {
			rep.Recipes = append(rep.Recipes, *results[i])
		}
		rep.Problems = append(rep.Problems, problems[i]...)
	}
	for _, p := range run.Projects {
		rep.Findings = append(rep.Findings, pols[p].Stale(p.IDs())...)
	}
	rep.Finish(run.Skipped)
	return rep
}
