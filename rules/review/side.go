package review

import (
	"crypto/sha256"
	"encoding/json"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/evaluate"
	"github.com/phgate/phgate/spec/project"
)

// Rules checks the solved recipes of one project (a *rules.Policy does).
type Rules interface {
	Check(res *evaluate.Result) ([]rules.Finding, diag.Problems)
}

// RulesFor builds the rule policy of a project from its phgate.yaml;
// problems are positioned in that file. The command line passes its own,
// so how rules are configured is decided in one place.
type RulesFor func(p *project.Project) (Rules, diag.Problems)

// Side is one evaluated version of a set of recipes.
type Side struct {
	// Label names the side for people ("base 1a2b3c4d5e (main)", a folder).
	Label string
	// Root is the folder paths are shown relative to.
	Root string
	// Recipes are the target recipe files, in path order.
	Recipes []*Recipe
	// Problems are project-level problems: phgate.yaml and catalog files.
	Problems []diag.Problem
	// Inputs maps the relative path of each phgate.yaml and project
	// catalog file to a digest of its bytes.
	Inputs map[string]Digest
}

// Digest is the SHA-256 of a file's bytes.
type Digest [sha256.Size]byte

// Recipe is one recipe file of a side, solved or with its problems.
type Recipe struct {
	// ID is the recipe id, or "" when the file could not be loaded.
	ID string
	// Path is slash-separated, relative to the side's root.
	Path string
	// Sum is the digest of the file's bytes.
	Sum Digest
	// Report is the solved recipe with its findings, or nil.
	Report *report.Recipe
	// Result is the raw evaluation, or nil.
	Result *evaluate.Result
	// Problems that kept it from being solved.
	Problems []diag.Problem
	// Stocks maps the id of every stock recipe reached through from:
	// (directly or through other stocks) to its relative path and digest.
	Stocks map[string]Input
	// Catalog maps each catalog entry the recipe depends on (its
	// ingredients, their systems and strong ions, the salts and
	// complexes those take part in) to where it is defined and a digest.
	Catalog map[string]Input
	// Config is the relative path of the governing phgate.yaml ("" if none)
	// and ConfigSum the digest of its bytes.
	Config    string
	ConfigSum Digest
}

// Input is something a result depends on: where it is defined and a
// digest of its content.
type Input struct {
	Path string
	Sum  Digest
}

// Load discovers, solves and checks the recipes under paths (files or
// folders, inside root; none gives an empty side) and records, for each, the
// inputs its result depends on.
func Load(label, root string, paths []string, rulesFor RulesFor) *Side {
	absRoot, err := filepath.Abs(root)
	if err != nil {
		absRoot = root
	}
	s := &Side{Label: label, Root: absRoot, Inputs: map[string]Digest{}}
	if len(paths) == 0 {
		return s
	}
	// Two versions of one recipe may sit side by side in one project: the
	// file named on this side wins over its twin.
	run := project.DiscoverWith(paths, project.Options{PreferTargets: true})
	policies := map[*project.Project]Rules{}
	for _, p := range run.Projects {
		s.Problems = append(s.Problems, s.relProblems(p.Problems)...)
		pol, ps := rulesFor(p)
		s.Problems = append(s.Problems, s.relProblems(ps)...)
		policies[p] = pol
		if p.Config != nil && p.Config.Path != "" {
			s.Inputs[s.rel(p.Config.Path)] = fileSum(p.Config.Path)
			for _, c := range p.Config.Catalogs {
				cp := filepath.Join(p.Config.Dir, filepath.FromSlash(c.Value))
				s.Inputs[s.rel(cp)] = fileSum(cp)
			}
		}
	}
	for _, f := range run.Files {
		s.Recipes = append(s.Recipes, s.load(f, policies[f.Project()]))
	}
	sort.SliceStable(s.Recipes, func(i, j int) bool { return s.Recipes[i].Path < s.Recipes[j].Path })
	return s
}

func (s *Side) load(f *project.File, pol Rules) *Recipe {
	r := &Recipe{Path: s.rel(f.Path), Sum: fileSum(f.Path)}
	// The governing config is recorded even for a file that cannot be
	// loaded, so a config that did not change is never named as a cause.
	if p := f.Project(); p != nil && p.Config != nil && p.Config.Path != "" {
		r.Config = s.rel(p.Config.Path)
		r.ConfigSum = fileSum(p.Config.Path)
	}
	if f.Recipe == nil {
		r.Problems = s.relProblems(f.Problems)
		return r
	}
	r.ID = f.Recipe.ID.Value
	res, ps := f.Evaluate()
	if len(ps) > 0 {
		r.Problems = s.relProblems(ps)
		return r
	}
	if pol == nil {
		// A file outside every discovered project cannot happen with
		// project.Discover; report it rather than skip its rules.
		r.Problems = []diag.Problem{{Path: r.Path, Message: "internal error: no rule policy for this recipe's project"}}
		return r
	}
	findings, ps := pol.Check(res)
	if len(ps) > 0 {
		r.Problems = s.relProblems(ps)
		return r
	}
	rep := report.Build(res, findings)
	rep.Path = r.Path
	for i := range rep.Findings {
		rep.Findings[i].Path = s.rel(rep.Findings[i].Path)
	}
	r.Report, r.Result = &rep, res
	r.Stocks = map[string]Input{}
	r.Catalog = map[string]Input{}
	s.inputs(res, r, map[*evaluate.Result]bool{})
	return r
}

// inputs walks a result and its stock results, recording stock files and
// the catalog entries they use.
func (s *Side) inputs(res *evaluate.Result, r *Recipe, seen map[*evaluate.Result]bool) {
	if seen[res] {
		return
	}
	seen[res] = true
	cat := res.Catalog
	systems, ions := map[string]bool{}, map[string]bool{}
	peptides := false
	for _, l := range res.Lines {
		switch {
		case l.Stock != nil:
			sr := l.Stock.Recipe
			r.Stocks[sr.ID.Value] = Input{Path: s.rel(sr.Path), Sum: fileSum(sr.Path)}
			s.inputs(l.Stock, r, seen)
		case l.Entry != nil:
			e := l.Entry
			r.Catalog["ingredient "+e.ID] = s.entry(cat, catalog.SectionIngredients, e.ID, e)
			for _, sh := range e.Systems {
				systems[sh.System] = true
			}
			for _, sh := range e.Ions {
				ions[sh.Ion] = true
			}
		case l.Peptide != nil:
			peptides = true
		}
	}
	for id := range systems {
		if sys, ok := cat.Systems[id]; ok {
			r.Catalog["system "+id] = s.entry(cat, catalog.SectionSystems, id, sys)
		}
	}
	for id := range ions {
		if ion, ok := cat.Ions[id]; ok {
			r.Catalog["ion "+id] = s.entry(cat, catalog.SectionIons, id, ion)
		}
	}
	present := func(ref catalog.SpeciesRef) bool { return systems[ref.System] || ions[ref.Ion] }
	for _, salt := range cat.Salts {
		for _, t := range salt.Terms {
			if present(t.Ref) {
				r.Catalog["salt "+salt.ID] = s.entry(cat, catalog.SectionSalts, salt.ID, salt)
				break
			}
		}
	}
	for _, c := range cat.Complexes {
		if ions[c.Metal] || present(c.Ligand) {
			r.Catalog["complex "+c.ID] = s.entry(cat, catalog.SectionComplexes, c.ID, c)
		}
	}
	if peptides {
		r.Catalog[peptideKey] = Input{Sum: jsonSum(cat.Peptide)}
	}
}

// peptideKey names the catalog's peptide pKa set among a recipe's inputs.
const peptideKey = "peptide pKa set"

// entry digests a catalog entry and names the file that defines it
// (relative to the root when it is a project file).
func (s *Side) entry(cat *catalog.Catalog, section, id string, v any) Input {
	in := Input{Sum: jsonSum(v)}
	if pos, ok := cat.Position(section, id); ok {
		in.Path = s.rel(pos.Path)
	}
	return in
}

func jsonSum(v any) Digest {
	b, err := json.Marshal(v)
	if err != nil {
		// Catalog types are plain data; a marshalling failure would be a
		// broken invariant, and an all-zero digest still compares equal
		// only with itself.
		return Digest{}
	}
	return sha256.Sum256(b)
}

func fileSum(p string) Digest {
	b, err := os.ReadFile(p)
	if err != nil {
		return Digest{}
	}
	return sha256.Sum256(b)
}

// rel makes a path slash-separated and relative to the root when it lies
// inside it.
func (s *Side) rel(p string) string {
	if p == "" {
		return p
	}
	abs, err := filepath.Abs(p)
	if err != nil {
		return filepath.ToSlash(p)
	}
	r, err := filepath.Rel(s.Root, abs)
	if err != nil || r == ".." || strings.HasPrefix(r, ".."+string(filepath.Separator)) {
		return filepath.ToSlash(p)
	}
	return filepath.ToSlash(r)
}

// relProblems rewrites problem paths, and the root inside messages (a
// duplicate id names the other file), relative to the root.
func (s *Side) relProblems(ps diag.Problems) []diag.Problem {
	out := make([]diag.Problem, 0, len(ps))
	prefix := s.Root + string(filepath.Separator)
	for _, p := range ps {
		p.Path = s.rel(p.Path)
		p.Message = strings.ReplaceAll(p.Message, prefix, "")
		out = append(out, p)
	}
	return out
}
