// Package project finds recipe files, groups them by the phgate.yaml that
// governs them, builds each project's catalog (built-in plus the config's
// catalog files), indexes recipes by id (duplicates are problems), and
// evaluates recipes with their stock recipes (`from:`), with cycle
// detection.
package project

import (
	"fmt"
	"hash/fnv"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/evaluate"
	"github.com/phgate/phgate/spec/suggest"
	"github.com/phgate/phgate/spec/yamldoc"
)

// File is one YAML file considered by a run.
type File struct {
	Path string
	// Recipe is the loaded recipe (nil when the file had problems or is
	// not a recipe).
	Recipe *spec.Recipe
	// Problems found while reading, parsing or validating it.
	Problems diag.Problems
	// Skipped marks valid YAML that is not a recipe, met in a folder walk.
	Skipped bool
	// Target marks files the user asked about (named or found under a
	// named folder), as opposed to files read only to resolve stocks.
	Target  bool
	project *Project
	// lazy files were indexed from their id line only (Options.Lazy);
	// their recipe is parsed when evaluated and not kept.
	lazy bool
	// shadowed files share their id with a file the caller named
	// (Options.PreferTargets) and take no part in the run.
	shadowed bool
	id       string
	idPos    spec.Pos
	limit    int64
}

// Project is the set of recipes governed by one phgate.yaml (or, without
// one, by the folder the user named).
type Project struct {
	Root    string
	Config  *Config
	Catalog *catalog.Catalog
	// Problems in the config or its catalog files.
	Problems diag.Problems
	byID     map[string]*File
}

// Run is everything found for one invocation.
type Run struct {
	// Files are the target files in a deterministic order (by path).
	Files    []*File
	Projects []*Project
	// Skipped counts YAML files in folder walks that are not recipes.
	Skipped int
}

// Discover finds and loads the recipes under the given paths. A path that
// names a file must be a recipe; folders are walked recursively.
func Discover(paths []string) *Run { return DiscoverWith(paths, Options{}) }

// Options tune discovery; the zero value means the defaults.
type Options struct {
	// MaxFileSize is the largest recipe file read, in bytes
	// (0: DefaultMaxFileSize).
	MaxFileSize int64
	// Shard and Shards split the target files deterministically across
	// CI machines: with Shards = N > 1, only the files whose path hashes
	// to Shard (1..N) are targets. Every file is still read, so stocks and
	// duplicate ids resolve the same on every shard.
	Shard, Shards int
	// Lazy indexes recipe files by their top-level `recipe:` line only and
	// parses each recipe when it is evaluated, without keeping it: memory
	// stays flat however many recipes a run checks. File.Recipe is then
	// nil; problems in a file appear when it is evaluated.
	Lazy bool
	// PreferTargets resolves a recipe id used twice when exactly one of
	// the two files lies under a path the caller named: that one is used
	// and the other is left out of the index, without a problem. phgate
	// diff uses it to compare two versions of a recipe kept side by side
	// in one project.
	PreferTargets bool
}

// InShard reports whether a path belongs to shard i of n (1-based), by
// the FNV-1a hash of its slash-separated form: a file keeps its shard as
// others are added or removed.
func InShard(path string, i, n int) bool {
	if n <= 1 {
		return true
	}
	h := fnv.New32a()
	h.Write([]byte(filepath.ToSlash(filepath.Clean(path))))
	return int(h.Sum32()%uint32(n)) == i-1
}

// DiscoverWith is Discover with options.
func DiscoverWith(paths []string, opts Options) *Run {
	if len(paths) == 0 {
		paths = []string{"."}
	}
	if opts.MaxFileSize <= 0 {
		opts.MaxFileSize = DefaultMaxFileSize
	}
	d := &discovery{projects: map[string]*Project{}, files: map[string]*File{}, parsed: map[string]*File{}, opts: opts}
	for _, p := range paths {
		d.targets = append(d.targets, mustAbs(p))
	}
	for _, p := range paths {
		d.target(filepath.Clean(p))
	}
	run := &Run{Skipped: d.skipped}
	for _, f := range d.files {
		if f.Target && !f.shadowed && InShard(f.Path, opts.Shard, opts.Shards) {
			run.Files = append(run.Files, f)
		}
	}
	sort.Slice(run.Files, func(i, j int) bool { return run.Files[i].Path < run.Files[j].Path })
	for _, p := range d.projects {
		run.Projects = append(run.Projects, p)
	}
	sort.Slice(run.Projects, func(i, j int) bool { return run.Projects[i].Root < run.Projects[j].Root })
	return run
}

type discovery struct {
	projects map[string]*Project
	files    map[string]*File
	// parsed holds files parsed but not yet registered, by absolute path.
	parsed  map[string]*File
	skipped int
	opts    Options
	// targets are the absolute paths the caller named.
	targets []string
}

// targeted reports whether path is, or lies under, a path the caller named.
func (d *discovery) targeted(path string) bool {
	abs := mustAbs(path)
	for _, t := range d.targets {
		if abs == t || strings.HasPrefix(abs, t+string(filepath.Separator)) {
			return true
		}
	}
	return false
}

func (d *discovery) target(p string) {
	st, err := os.Stat(p)
	if err != nil {
		d.files[mustAbs(p)] = &File{Path: p, Target: true, Problems: diag.Problems{{Path: p, Message: "cannot read: " + unwrapPathErr(err).Error()}}}
		return
	}
	if !st.IsDir() {
		f := d.load(p, true, d.projectFor(filepath.Dir(p)))
		f.Target = true
		if f.Skipped {
			f.Skipped = false
			f.Problems = append(f.Problems, diag.Problem{Path: p, Message: "not a recipe (no top-level recipe: key)"})
		}
		return
	}
	proj := d.projectFor(p)
	for _, f := range d.walk(p, proj, true) {
		f.Target = true
	}
}

// projectFor returns the project governing folder dir, loading its config,
// catalogs and the full recipe index on first use.
func (d *discovery) projectFor(dir string) *Project {
	cfgPath := FindConfig(dir)
	root := dir
	if cfgPath != "" {
		root = filepath.Dir(cfgPath)
	}
	key := root
	if abs, err := filepath.Abs(root); err == nil {
		key = abs
	}
	if p, ok := d.projects[key]; ok {
		return p
	}
	p := &Project{Root: root, byID: map[string]*File{}}
	d.projects[key] = p
	p.Config = &Config{Dir: root}
	if cfgPath != "" {
		c, ps := LoadConfig(cfgPath)
		p.Problems = append(p.Problems, ps...)
		if c != nil {
			p.Config = c
		}
	}
	cat, ps := CatalogFor(p.Config)
	p.Catalog = cat
	p.Problems = append(p.Problems, ps...)
	// Index every recipe of the project so stocks resolve even when the
	// user names a single file.
	// Without a phgate.yaml there is no project boundary: only the
	// folder's own files are indexed (a folder named on the command line
	// is still walked in full), so checking one file never reads a whole
	// home directory.
	d.walk(root, p, cfgPath != "")
	return p
}

// walk loads every YAML file under dir that the project's include and
// exclude globs let through. Files are parsed in parallel and registered
// in path order, so duplicate-id problems are deterministic.
func (d *discovery) walk(dir string, p *Project, recursive bool) []*File {
	skip := map[string]bool{}
	if p.Config.Path != "" {
		skip[mustAbs(p.Config.Path)] = true
		for _, c := range p.Config.Catalogs {
			skip[mustAbs(filepath.Join(p.Config.Dir, filepath.FromSlash(c.Value)))] = true
		}
	}
	var paths []string
	_ = filepath.WalkDir(dir, func(path string, e fs.DirEntry, err error) error {
		if err != nil {
			if path == dir {
				// The folder itself cannot be read: say so rather than
				// report it as holding no recipes.
				d.files[mustAbs(path)] = &File{Path: path, project: p, Target: true, Problems: diag.Problems{{Path: path, Message: "cannot read: " + unwrapPathErr(err).Error()}}}
				return nil
			}
			if _, seen := d.files[mustAbs(path)]; !seen {
				d.files[mustAbs(path)] = &File{Path: path, project: p, Problems: diag.Problems{{Path: path, Message: "cannot read: " + unwrapPathErr(err).Error()}}}
			}
			paths = append(paths, path)
			return nil
		}
		rel := relSlash(p.Config.Dir, path)
		if e.IsDir() {
			if path != dir && (!recursive || strings.HasPrefix(e.Name(), ".") || p.excluded(rel)) {
				return filepath.SkipDir
			}
			return nil
		}
		ext := strings.ToLower(filepath.Ext(path))
		if ext != ".yaml" && ext != ".yml" {
			return nil
		}
		if e.Name() == ConfigName || skip[mustAbs(path)] || p.excluded(rel) || !p.included(rel) {
			return nil
		}
		paths = append(paths, path)
		return nil
	})
	d.parseAll(paths, p)
	var out []*File
	for _, path := range paths {
		f := d.register(path, false, p)
		if !f.Skipped {
			out = append(out, f)
		}
	}
	return out
}

// parseAll reads and parses the files not seen yet, on all cores.
func (d *discovery) parseAll(paths []string, p *Project) {
	var todo []string
	for _, path := range paths {
		if _, seen := d.files[mustAbs(path)]; !seen && d.parsed[mustAbs(path)] == nil {
			todo = append(todo, path)
		}
	}
	parsed := make([]*File, len(todo))
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				if d.opts.Lazy {
					parsed[i] = indexFile(todo[i], p, d.opts.MaxFileSize)
				} else {
					parsed[i] = parseFile(todo[i], p, d.opts.MaxFileSize)
				}
			}
		}()
	}
	for i := range todo {
		next <- i
	}
	close(next)
	wg.Wait()
	for i, path := range todo {
		d.parsed[mustAbs(path)] = parsed[i]
	}
}

func relSlash(base, path string) string {
	rel, err := filepath.Rel(base, path)
	if err != nil {
		return filepath.ToSlash(path)
	}
	return filepath.ToSlash(rel)
}

func (p *Project) excluded(rel string) bool {
	for _, g := range p.Config.Exclude {
		if matchGlob(g, rel) {
			return true
		}
	}
	return false
}

func (p *Project) included(rel string) bool {
	if len(p.Config.Include) == 0 {
		return true
	}
	for _, g := range p.Config.Include {
		if matchGlob(g, rel) {
			return true
		}
	}
	return false
}

// parseFile reads, decodes and validates one file; it touches no shared
// state, so files parse in parallel.
func parseFile(path string, p *Project, limit int64) *File {
	f := &File{Path: path, project: p}
	data, err := readAtMost(path, limit)
	if err != nil {
		f.Problems = diag.Problems{{Path: path, Message: err.Error()}}
		return f
	}
	doc, ps := yamldoc.Parse(data, path)
	if ps != nil {
		f.Problems = ps
		return f
	}
	if !spec.IsRecipe(doc) {
		f.Skipped = true
		return f
	}
	f.Recipe, f.Problems = spec.FromDoc(doc)
	return f
}

// indexFile reads a file's recipe id from its top-level `recipe:` line
// without parsing the rest; a file where that line cannot be found for
// sure (flow style, anchors, no such line) is parsed in full instead.
func indexFile(path string, p *Project, limit int64) *File {
	data, err := readAtMost(path, limit)
	if err != nil {
		return &File{Path: path, project: p, Problems: diag.Problems{{Path: path, Message: err.Error()}}}
	}
	id, pos, ok := scanID(data)
	if !ok {
		return parseFile(path, p, limit)
	}
	return &File{Path: path, project: p, lazy: true, id: id, idPos: pos, limit: limit}
}

// scanID finds a plain `recipe: ID` line at the top level of a block-style
// YAML document: no indentation, an id of kebab-case characters, at most
// a quote pair and a trailing comment. The full parse at evaluation time
// confirms it.
func scanID(data []byte) (string, spec.Pos, bool) {
	text := strings.TrimPrefix(string(data), "\ufeff")
	for n, line := range strings.Split(text, "\n") {
		if !strings.HasPrefix(line, "recipe:") {
			continue
		}
		rest := strings.TrimRight(line[len("recipe:"):], "\r")
		if i := strings.Index(rest, " #"); i >= 0 {
			rest = rest[:i]
		}
		val := strings.TrimSpace(rest)
		col := len("recipe:") + len(rest) - len(strings.TrimLeft(rest, " \t")) + 1
		if len(val) >= 2 && (val[0] == '"' || val[0] == '\'') && val[len(val)-1] == val[0] {
			val = val[1 : len(val)-1]
		}
		for _, r := range val {
			if !(r >= 'a' && r <= 'z' || r >= '0' && r <= '9' || r == '-' || r == '.') {
				return "", spec.Pos{}, false
			}
		}
		if val == "" {
			return "", spec.Pos{}, false
		}
		return val, spec.Pos{Line: n + 1, Column: col}, true
	}
	return "", spec.Pos{}, false
}

// load parses one file (once) and registers it.
func (d *discovery) load(path string, named bool, p *Project) *File {
	if _, seen := d.files[mustAbs(path)]; !seen && d.parsed[mustAbs(path)] == nil {
		d.parsed[mustAbs(path)] = parseFile(path, p, d.opts.MaxFileSize)
	}
	return d.register(path, named, p)
}

// register files a parsed file under its path and its recipe id; the
// first call for a path decides, later calls return the same File.
func (d *discovery) register(path string, named bool, p *Project) *File {
	key := mustAbs(path)
	if f, ok := d.files[key]; ok {
		return f
	}
	f := d.parsed[key]
	delete(d.parsed, key)
	d.files[key] = f
	if f.Skipped && !named {
		d.skipped++
	}
	id, pos, ok := f.identity()
	if !ok {
		return f
	}
	if other, dup := p.byID[id]; dup && other != f && d.opts.PreferTargets && d.targeted(path) != d.targeted(other.Path) {
		if d.targeted(path) {
			p.byID[id] = f
			other.shadowed = true
		} else {
			f.shadowed = true
		}
		return f
	}
	if other, dup := p.byID[id]; dup && other != f {
		// Both files are wrong until one is renamed: neither is checked,
		// and each names the other.
		f.Problems = append(f.Problems, diag.Problem{Path: path, Line: pos.Line, Column: pos.Column,
			Message: fmt.Sprintf("recipe id %q is also used by %s", id, other.Path)})
		f.Recipe, f.lazy = nil, false
		if _, opos, ok := other.identity(); ok {
			other.Problems = append(other.Problems, diag.Problem{Path: other.Path, Line: opos.Line, Column: opos.Column,
				Message: fmt.Sprintf("recipe id %q is also used by %s", id, path)})
			other.Recipe, other.lazy = nil, false
		}
		return f
	}
	p.byID[id] = f
	return f
}

// identity is the recipe id of a file and its position, if it has one.
func (f *File) identity() (string, spec.Pos, bool) {
	switch {
	case f.Recipe != nil:
		return f.Recipe.ID.Value, f.Recipe.ID.Pos, true
	case f.lazy:
		return f.id, f.idPos, true
	}
	return "", spec.Pos{}, false
}

// recipe returns the file's recipe, parsing it now for a lazy file (the
// result is not kept).
func (f *File) recipe() (*spec.Recipe, diag.Problems) {
	if !f.lazy {
		return f.Recipe, f.Problems
	}
	full := parseFile(f.Path, f.project, f.limit)
	if full.Recipe == nil {
		return nil, full.Problems
	}
	if full.Recipe.ID.Value != f.id {
		return nil, diag.Problems{{Path: f.Path, Line: f.idPos.Line, Column: f.idPos.Column,
			Message: fmt.Sprintf("the recipe id read from the file (%q) differs from its recipe: line (%q); write recipe: as a plain top-level key", full.Recipe.ID.Value, f.id)}}
	}
	return full.Recipe, nil
}

// Project returns the project a file belongs to.
func (f *File) Project() *Project { return f.project }

// Evaluate solves a file's recipe with its stocks. It is safe for
// concurrent use. Results are not kept: a stock recipe is solved again for
// each recipe that uses it (cheap next to parsing), so memory does not grow
// with the number of recipes checked.
func (f *File) Evaluate() (*evaluate.Result, diag.Problems) {
	r, ps := f.recipe()
	if r == nil {
		return nil, ps
	}
	return f.project.evaluate(f, r, nil)
}

func (p *Project) evaluate(f *File, r *spec.Recipe, chain []string) (*evaluate.Result, diag.Problems) {
	id := r.ID.Value
	for i, c := range chain {
		if c == id {
			cycle := append(append([]string{}, chain[i:]...), id)
			return nil, diag.Problems{{Path: f.Path, Line: r.ID.Pos.Line, Column: r.ID.Pos.Column,
				Message: "stock recipes form a cycle: " + strings.Join(cycle, " → ")}}
		}
	}
	return p.evaluateNow(f, r, append(chain, id))
}

func (p *Project) evaluateNow(f *File, r *spec.Recipe, chain []string) (*evaluate.Result, diag.Problems) {
	lookup := func(stockID string, at spec.Pos) (*evaluate.Result, *diag.Problem) {
		sf, ok := p.byID[stockID]
		if !ok {
			msg := fmt.Sprintf("no recipe with id %q in this project", stockID)
			if s := suggest.Nearest(stockID, without(p.IDs(), r.ID.Value)); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			return nil, &diag.Problem{Path: f.Path, Line: at.Line, Column: at.Column, Message: msg}
		}
		sr, ps := sf.recipe()
		if sr == nil {
			return nil, &diag.Problem{Path: f.Path, Line: at.Line, Column: at.Column,
				Message: fmt.Sprintf("stock recipe %q cannot be used: %s", stockID, ps[0].Error())}
		}
		res, ps := p.evaluate(sf, sr, chain)
		if len(ps) > 0 {
			msg := fmt.Sprintf("stock recipe %q cannot be used: %s", stockID, ps[0].Error())
			if strings.Contains(ps[0].Message, "cycle") {
				msg = ps[0].Message
			}
			return nil, &diag.Problem{Path: f.Path, Line: at.Line, Column: at.Column, Message: msg}
		}
		return res, nil
	}
	return evaluate.Evaluate(r, p.Catalog, lookup)
}

// IDs returns the project's recipe ids, sorted.
func (p *Project) IDs() []string {
	ids := make([]string, 0, len(p.byID))
	for id := range p.byID {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	return ids
}

// Stocks returns the ids of the recipes r uses through from:, directly.
func Stocks(r *spec.Recipe) []string {
	var out []string
	for _, in := range r.Ingredients {
		if in.From.Value != "" {
			out = append(out, in.From.Value)
		}
	}
	return out
}

// CatalogFor is the built-in catalog plus the catalog files a config
// names, each file's entries able to refer to those before it. A file
// that is missing or broken is reported and left out.
func CatalogFor(c *Config) (*catalog.Catalog, diag.Problems) {
	cat := catalog.Default()
	var problems diag.Problems
	for _, ref := range c.Catalogs {
		cp := filepath.Join(c.Dir, filepath.FromSlash(ref.Value))
		if _, err := os.Stat(cp); err != nil {
			problems = append(problems, diag.Problem{Path: c.Path, Line: ref.Pos.Line, Column: ref.Pos.Column, Message: fmt.Sprintf("catalog %s: %v", ref.Value, unwrapPathErr(err))})
			continue
		}
		extra, ps := ReadCatalog(cp, cat)
		if len(ps) > 0 {
			problems = append(problems, ps...)
			continue
		}
		merged, err := cat.Merge(extra)
		if err != nil {
			problems = append(problems, diag.Problem{Path: cp, Message: err.Error()})
			continue
		}
		cat = merged
	}
	return cat, problems
}

// ReadCatalog reads and parses a project catalog file whose entries may
// refer to those of base.
func ReadCatalog(path string, base *catalog.Catalog) (*catalog.Catalog, diag.Problems) {
	data, err := readLimited(path)
	if err != nil {
		return nil, diag.Problems{{Path: path, Message: err.Error()}}
	}
	return catalog.ParseWithBase(data, path, base)
}

// without returns ids less one of them.
func without(ids []string, drop string) []string {
	out := ids[:0:0]
	for _, id := range ids {
		if id != drop {
			out = append(out, id)
		}
	}
	return out
}
