package main

import (
	"fmt"
	"runtime"
	"strconv"
	"strings"

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
	shard := fs.String("shard", "", "check only shard I of N (e.g. 2/4), split by a hash of each file's path")
	maxSize := fs.String("max-file-size", "1MiB", "largest recipe file read (e.g. 512KiB, 2MiB)")
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
	// check parses each recipe when it solves it and keeps nothing but the
	// tally, so memory stays flat on large repositories.
	opts := project.Options{Lazy: true}
	if *shard != "" {
		if opts.Shard, opts.Shards, err = parseShard(*shard); err != nil {
			return a.fail("--shard: %v", err)
		}
	}
	if opts.MaxFileSize, err = parseSize(*maxSize); err != nil {
		return a.fail("--max-file-size: %v", err)
	}
	rep, err := a.runCheck(paths, opts, *jobs, f)
	if err != nil {
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
	// The summary counts findings no waiver accepted, streamed recipes
	// included.
	s := rep.Summary
	if (threshold <= rules.Error && s.Errors > 0) || (threshold <= rules.Warning && s.Warnings > 0) || (threshold <= rules.Info && s.Infos > 0) {
		return ExitFindings
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

// runCheck discovers, solves and checks recipes on jobs workers and
// writes the report with f. The output order is deterministic (by path)
// whatever the scheduling. A format that streams gets each recipe as soon
// as it and every recipe before it are done, and the recipe is then
// dropped, so memory does not grow with the repository; other formats
// get the whole report at the end.
func (a *App) runCheck(paths []string, opts project.Options, jobs int, f report.Formatter) (*report.Report, error) {
	run := project.DiscoverWith(paths, opts)
	rep := &report.Report{}
	pols, ps := policies(run)
	rep.Problems = append(rep.Problems, ps...)
	if len(run.Files) == 0 && opts.Shards <= 1 {
		// A check that found nothing to check is almost always a wrong
		// path or glob; CI should not pass it silently.
		where := strings.Join(paths, ", ")
		if where == "" {
			where = "."
		}
		rep.Problems = append(rep.Problems, diag.Problem{Path: where, Message: "no recipe files found (a recipe is a YAML file with a top-level recipe: key)"})
	}
	stream, streaming := f.(report.Streamer)

	type outcome struct {
		recipe   *report.Recipe
		problems diag.Problems
		done     chan struct{}
	}
	outcomes := make([]outcome, len(run.Files))
	for i := range outcomes {
		outcomes[i].done = make(chan struct{})
	}
	next := make(chan int)
	for w := 0; w < jobs; w++ {
		go func() {
			for i := range next {
				o := &outcomes[i]
				file := run.Files[i]
				if res, ps := file.Evaluate(); len(ps) > 0 {
					o.problems = ps
				} else if fs, ps := pols[file.Project()].Check(res); len(ps) > 0 {
					o.problems = ps
				} else {
					r := report.Build(res, fs)
					o.recipe = &r
				}
				close(o.done)
			}
		}()
	}
	go func() {
		for i := range run.Files {
			next <- i
		}
		close(next)
	}()
	var werr error
	for i := range outcomes {
		o := &outcomes[i]
		<-o.done
		rep.Problems = append(rep.Problems, o.problems...)
		switch {
		case o.recipe == nil:
		case streaming:
			if werr == nil {
				werr = stream.WriteRecipe(a.Stdout, o.recipe)
			}
			rep.Streamed(o.recipe)
		default:
			rep.Recipes = append(rep.Recipes, *o.recipe)
		}
		o.recipe = nil
	}
	for _, p := range run.Projects {
		rep.Findings = append(rep.Findings, pols[p].Stale(p.IDs())...)
	}
	rep.Finish(run.Skipped)
	if werr != nil {
		return rep, werr
	}
	if streaming {
		return rep, stream.WriteEnd(a.Stdout, rep)
	}
	return rep, f.Write(a.Stdout, rep)
}

// parseShard reads "I/N" with 1 ≤ I ≤ N.
func parseShard(s string) (i, n int, err error) {
	a, b, ok := strings.Cut(s, "/")
	if ok {
		i, err = strconv.Atoi(strings.TrimSpace(a))
		if err == nil {
			n, err = strconv.Atoi(strings.TrimSpace(b))
		}
	}
	if !ok || err != nil || n < 1 || i < 1 || i > n {
		return 0, 0, fmt.Errorf("want I/N with 1 ≤ I ≤ N, such as 2/4, not %q", s)
	}
	return i, n, nil
}

// parseSize reads a byte count with an optional KB, KiB, MB or MiB suffix.
func parseSize(s string) (int64, error) {
	t := strings.TrimSpace(s)
	mult := int64(1)
	for _, u := range []struct {
		suffix string
		mult   int64
	}{{"KiB", 1 << 10}, {"MiB", 1 << 20}, {"KB", 1000}, {"MB", 1000 * 1000}, {"B", 1}} {
		if strings.HasSuffix(t, u.suffix) {
			t, mult = strings.TrimSpace(strings.TrimSuffix(t, u.suffix)), u.mult
			break
		}
	}
	n, err := strconv.ParseInt(t, 10, 64)
	if err != nil || n < 1 || n > (1<<40)/mult {
		return 0, fmt.Errorf("want a size such as 512KiB or 2MiB, not %q", s)
	}
	return n * mult, nil
}
