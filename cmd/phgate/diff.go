package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/review"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/gitrev"
	"github.com/phgate/phgate/spec/project"
)

// diffRules builds a project's rule policy, exactly as check does: the
// single place where the diff command meets rule configuration.
func diffRules(p *project.Project) (review.Rules, diag.Problems) {
	c := p.Config
	return rules.NewPolicy(c.Rules, c.Waivers, c.Path, c.DefaultTolerance)
}

func (a *App) diff(args []string) int {
	fs := a.flags("diff", "OLD NEW | --base REV [--head REV] [PATH...]")
	base := fs.String("base", "", "git revision `REV` for the old side (compare inside a git repository)")
	head := fs.String("head", "", "git revision `REV` for the new side (default: the working tree)")
	repo := fs.String("repo", ".", "with --base: work from `DIR`, a folder inside the git repository; PATH arguments are relative to it")
	format := fs.String("format", "text", "output `format`: text, json or markdown")
	all := fs.Bool("all", false, "list unchanged recipes too")
	var maxShift *float64
	fs.Func("max-ph-shift", "exit 1 when any recipe's |ΔpH| exceeds `X`", func(s string) error {
		x, err := strconv.ParseFloat(s, 64)
		if err != nil || x < 0 || x != x {
			return fmt.Errorf("want a pH difference of 0 or more, not %q", s)
		}
		maxShift = &x
		return nil
	})
	failOnNew := fs.String("fail-on-new", "never", "exit 1 when a finding of this `severity` or worse appears: error, warning or never")
	paths, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	gates := review.Gates{MaxPHShift: maxShift}
	switch *failOnNew {
	case "never":
	case "error", "warning":
		sev, _ := rules.ParseSeverity(*failOnNew)
		gates.FailOnNew = &sev
	default:
		return a.fail("--fail-on-new must be error, warning or never, not %q", *failOnNew)
	}
	f, err := review.ByName(*format, a.Color)
	if err != nil {
		return a.fail("%v", err)
	}
	var old, new *review.Side
	pairFiles := false
	if *base == "" {
		if *head != "" {
			return a.fail("--head needs --base")
		}
		if len(paths) != 2 {
			fs.Usage()
			return ExitProblem
		}
		var status int
		old, new, pairFiles, status = a.diffPaths(paths[0], paths[1])
		if status != ExitOK {
			return status
		}
	} else {
		var cleanup func()
		var status int
		old, new, cleanup, status = a.diffGit(*repo, *base, *head, paths)
		if cleanup != nil {
			defer cleanup()
		}
		if status != ExitOK {
			return status
		}
	}
	d := review.Compare(old, new, review.Options{Pair: pairFiles, All: *all})
	crossed := d.Apply(gates)
	if err := f.Write(a.Stdout, d); err != nil {
		return a.fail("writing the comparison: %v", err)
	}
	switch {
	case len(d.Problems.New) > 0 || newSideUnsolved(d):
		return ExitProblem
	case crossed:
		return ExitFindings
	}
	return ExitOK
}

// newSideUnsolved reports a recipe the change touches that cannot be
// solved in the new version: like `check`, that is a problem, not a
// finding. A recipe broken the same way on both sides is listed with
// --all but does not fail the comparison.
func newSideUnsolved(d *review.Diff) bool {
	for _, c := range d.Changes {
		if c.Status != review.Unchanged && c.After != nil && len(c.After.Problems) > 0 {
			return true
		}
	}
	return false
}

// diffPaths evaluates two files or two folders.
func (a *App) diffPaths(oldPath, newPath string) (old, new *review.Side, pair bool, status int) {
	var dirs [2]bool
	for i, p := range []string{oldPath, newPath} {
		st, err := os.Stat(p)
		if err != nil {
			return nil, nil, false, a.fail("%s: cannot read: %v", p, unwrap(err))
		}
		dirs[i] = st.IsDir()
	}
	if dirs[0] != dirs[1] {
		return nil, nil, false, a.fail("compare two files or two folders, not a file with a folder")
	}
	side := func(p string) *review.Side {
		if dirs[0] {
			return review.Load(p, p, []string{p}, diffRules)
		}
		return review.Load(p, filepath.Dir(p), []string{p}, diffRules)
	}
	return side(oldPath), side(newPath), !dirs[0], ExitOK
}

// diffGit evaluates the old side from a git revision and the new side
// from another revision or the working tree. Revisions are checked before
// anything else runs.
func (a *App) diffGit(dir, baseRev, headRev string, paths []string) (old, new *review.Side, cleanup func(), status int) {
	revs := []string{baseRev}
	if headRev != "" {
		revs = append(revs, headRev)
	}
	for _, rev := range revs {
		if err := gitrev.CheckRev(rev); err != nil {
			return nil, nil, nil, a.fail("%v", err)
		}
	}
	repo, err := gitrev.Open(dir)
	if err != nil {
		return nil, nil, nil, a.fail("%v", err)
	}
	baseC, err := repo.Resolve(baseRev)
	if err != nil {
		return nil, nil, nil, a.fail("%v", err)
	}
	var headC gitrev.Commit
	if headRev != "" {
		if headC, err = repo.Resolve(headRev); err != nil {
			return nil, nil, nil, a.fail("%v", err)
		}
	}
	rels, err := repoPaths(repo, dir, paths)
	if err != nil {
		return nil, nil, nil, a.fail("%v", err)
	}
	tmp, err := os.MkdirTemp("", "phgate-diff-")
	if err != nil {
		return nil, nil, nil, a.fail("%v", err)
	}
	cleanup = func() { _ = os.RemoveAll(tmp) }
	materialise := func(c gitrev.Commit, name string) (string, error) {
		root := filepath.Join(tmp, name)
		if err := os.Mkdir(root, 0o755); err != nil {
			return "", err
		}
		_, err := repo.Extract(c, root, isYAML)
		return root, err
	}
	oldRoot, err := materialise(baseC, "old")
	if err != nil {
		return nil, nil, cleanup, a.fail("reading %s from git: %v", baseRev, err)
	}
	newRoot, newLabel := repo.Top, "working tree"
	if headRev != "" {
		if newRoot, err = materialise(headC, "new"); err != nil {
			return nil, nil, cleanup, a.fail("reading %s from git: %v", headRev, err)
		}
		newLabel = fmt.Sprintf("%s (%s)", headC.Short(), headRev)
	}
	oldTargets, newTargets := existing(oldRoot, rels), existing(newRoot, rels)
	if len(oldTargets) == 0 && len(newTargets) == 0 {
		return nil, nil, cleanup, a.fail("%s: not found in %s nor in the %s", strings.Join(rels, ", "), baseRev, newLabel)
	}
	old = review.Load(fmt.Sprintf("%s (%s)", baseC.Short(), baseRev), oldRoot, oldTargets, diffRules)
	new = review.Load(newLabel, newRoot, newTargets, diffRules)
	return old, new, cleanup, ExitOK
}

// repoPaths turns PATH arguments (relative to dir) into slash-separated
// paths relative to the repository's top folder.
func repoPaths(repo *gitrev.Repo, dir string, paths []string) ([]string, error) {
	if len(paths) == 0 {
		return []string{"."}, nil
	}
	top := repo.Top
	var out []string
	for _, p := range paths {
		abs := p
		if !filepath.IsAbs(p) {
			abs = filepath.Join(dir, p)
		}
		abs, err := filepath.Abs(abs)
		if err != nil {
			return nil, err
		}
		rel, err := filepath.Rel(top, resolveExisting(abs))
		if err != nil || rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
			return nil, fmt.Errorf("%s is outside the repository %s", p, top)
		}
		out = append(out, filepath.ToSlash(rel))
	}
	return out, nil
}

// resolveExisting resolves symbolic links in the longest existing prefix
// of p (git reports the top folder with links resolved, and a PATH may
// exist only in the old revision).
func resolveExisting(p string) string {
	rest := ""
	for {
		if r, err := filepath.EvalSymlinks(p); err == nil {
			return filepath.Join(r, rest)
		}
		parent := filepath.Dir(p)
		if parent == p {
			return filepath.Join(p, rest)
		}
		rest = filepath.Join(filepath.Base(p), rest)
		p = parent
	}
}

// existing returns the repository-relative paths that exist under root,
// joined to it.
func existing(root string, rels []string) []string {
	var out []string
	for _, r := range rels {
		p := filepath.Join(root, filepath.FromSlash(r))
		if _, err := os.Stat(p); err == nil {
			out = append(out, p)
		}
	}
	return out
}

// isYAML keeps the files phgate reads: recipes, catalogs and phgate.yaml.
func isYAML(p string) bool {
	ext := strings.ToLower(filepath.Ext(p))
	return ext == ".yaml" || ext == ".yml"
}

func unwrap(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}
