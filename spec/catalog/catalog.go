package catalog

import (
	"embed"
	"fmt"
	"io/fs"
	"path"
	"sort"
	"strings"
	"sync"

	"github.com/phgate/phgate/spec/diag"

	"gopkg.in/yaml.v3"
)

// Catalog is a set of sources, strong ions, acid–base systems, salts,
// complexes, ingredients and peptide groups. A catalog is read-only once
// built: Merge returns a new one.
type Catalog struct {
	// Sources maps source ids to references.
	Sources map[string]Source
	// Ions maps strong-ion labels ("Na+") to ions.
	Ions map[string]*Ion
	// Systems maps system ids ("phosphate") to acid–base systems.
	Systems map[string]*System
	// Ingredients maps ingredient ids to entries.
	Ingredients map[string]*Ingredient
	// Salts are the sparingly soluble solids, in file order.
	Salts []*Salt
	// Complexes are the metal–ligand complexes, in file order.
	Complexes []*Complex
	// Peptide is the pKa set for peptide and protein sequences (empty
	// when the catalog defines none).
	Peptide []PeptideGroup

	positions map[string]Pos
}

// Sections of a catalog, as used by Position.
const (
	SectionSources     = "sources"
	SectionIons        = "ions"
	SectionSystems     = "systems"
	SectionSalts       = "salts"
	SectionComplexes   = "complexes"
	SectionIngredients = "ingredients"
)

func newCatalog() *Catalog {
	return &Catalog{
		Sources:     map[string]Source{},
		Ions:        map[string]*Ion{},
		Systems:     map[string]*System{},
		Ingredients: map[string]*Ingredient{},
		positions:   map[string]Pos{},
	}
}

//go:embed data/*.yaml
var dataFS embed.FS

var (
	defaultOnce sync.Once
	defaultCat  *Catalog
)

// Default returns the embedded default catalog, parsed once. It panics
// only if the embedded data is broken, which a test guards against.
func Default() *Catalog {
	defaultOnce.Do(func() {
		c, probs := loadEmbedded()
		if len(probs) > 0 {
			panic("catalog: embedded catalog is broken:\n" + probs.Error())
		}
		defaultCat = c
	})
	return defaultCat
}

// DefaultFiles lists the embedded catalog files, for `phgate catalog`
// style listings and tests.
func DefaultFiles() []string {
	names, _ := fs.Glob(dataFS, "data/*.yaml")
	sort.Strings(names)
	return names
}

func loadEmbedded() (*Catalog, diag.Problems) {
	b := newBuilder(nil)
	for _, name := range DefaultFiles() {
		data, err := dataFS.ReadFile(name)
		if err != nil {
			b.problem(Pos{Path: name}, err.Error())
			continue
		}
		p := "builtin:" + path.Base(name)
		root, probs := decodeYAML(data, p)
		if len(probs) > 0 {
			b.probs = append(b.probs, probs...)
			continue
		}
		b.addDoc(root, p)
	}
	return b.finish()
}

// Ingredient returns the ingredient with the given id.
func (c *Catalog) Ingredient(id string) (*Ingredient, bool) {
	ing, ok := c.Ingredients[id]
	return ing, ok
}

// IDs returns the ingredient ids in sorted order.
func (c *Catalog) IDs() []string {
	ids := make([]string, 0, len(c.Ingredients))
	for id := range c.Ingredients {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	return ids
}

// Suggest returns up to n ingredient ids closest to id by edit distance
// (ids containing id, or contained in it, count as close), nearest first,
// for "did you mean" messages. It returns nothing when no id is close.
func (c *Catalog) Suggest(id string, n int) []string {
	return nearest(id, c.IDs(), n)
}

// PeptideGroups returns the pKa set for ionizable groups of peptide and
// protein sequences.
func (c *Catalog) PeptideGroups() []PeptideGroup {
	return append([]PeptideGroup(nil), c.Peptide...)
}

// Position returns where an entry of a section (SectionIngredients, ...)
// is defined.
func (c *Catalog) Position(section, id string) (Pos, bool) {
	p, ok := c.positions[section+"/"+id]
	return p, ok
}

// Salt returns the salt with the given id.
func (c *Catalog) Salt(id string) (*Salt, bool) {
	for _, s := range c.Salts {
		if s.ID == id {
			return s, true
		}
	}
	return nil, false
}

// Merge returns a new catalog holding c's entries and other's. Entries
// are shared, not copied. An id defined in both (in any section) is an
// error naming it: a project catalog may add entries but never silently
// override built-in ones.
func (c *Catalog) Merge(other *Catalog) (*Catalog, error) {
	if other == nil {
		other = newCatalog()
	}
	out := newCatalog()
	var dup []string
	for k, v := range c.positions {
		out.positions[k] = v
	}
	for k, v := range other.positions {
		if _, ok := out.positions[k]; !ok {
			out.positions[k] = v
		}
	}
	dup = mergeInto(out.Sources, c.Sources, other.Sources, "source", dup)
	dup = mergeInto(out.Ions, c.Ions, other.Ions, "ion", dup)
	dup = mergeInto(out.Systems, c.Systems, other.Systems, "system", dup)
	dup = mergeInto(out.Ingredients, c.Ingredients, other.Ingredients, "ingredient", dup)
	out.Salts = append(append(out.Salts, c.Salts...), other.Salts...)
	seen := map[string]bool{}
	for _, s := range out.Salts {
		if seen[s.ID] {
			dup = append(dup, "salt "+s.ID)
		}
		seen[s.ID] = true
	}
	out.Complexes = append(append(out.Complexes, c.Complexes...), other.Complexes...)
	seen = map[string]bool{}
	for _, x := range out.Complexes {
		if seen[x.ID] {
			dup = append(dup, "complex "+x.ID)
		}
		seen[x.ID] = true
	}
	out.Peptide = append(out.Peptide, c.Peptide...)
	if len(other.Peptide) > 0 {
		if len(c.Peptide) > 0 {
			dup = append(dup, "peptide section")
		}
		out.Peptide = append(out.Peptide, other.Peptide...)
	}
	if len(dup) > 0 {
		sort.Strings(dup)
		return nil, fmt.Errorf("catalog: %s defined in both catalogs; choose new ids instead of redefining entries", strings.Join(dup, ", "))
	}
	return out, nil
}

// Parse reads a user's catalog file (a project catalog). Entries may
// refer to entries of the built-in catalog; ids already defined there are
// problems. Every problem has a line and column. The returned catalog
// holds only the file's own entries: Merge it into Default().
func Parse(data []byte, path string) (*Catalog, diag.Problems) {
	return ParseWithBase(data, path, Default())
}

// ParseWithBase is Parse with references resolved against base instead
// of the built-in catalog (e.g. a catalog already merged from several
// project files). A nil base resolves references within the file only.
func ParseWithBase(data []byte, path string, base *Catalog) (*Catalog, diag.Problems) {
	root, probs := decodeYAML(data, path)
	if len(probs) > 0 {
		return nil, probs
	}
	return FromNodeWithBase(root, path, base)
}

// FromNode builds a catalog from an already-decoded YAML node (a mapping
// in the catalog format, e.g. the value of a recipe's `catalog:` key),
// resolving references against the built-in catalog.
func FromNode(n *yaml.Node, path string) (*Catalog, diag.Problems) {
	return FromNodeWithBase(n, path, Default())
}

// FromNodeWithBase is FromNode with references resolved against base.
func FromNodeWithBase(n *yaml.Node, path string, base *Catalog) (*Catalog, diag.Problems) {
	b := newBuilder(base)
	b.addDoc(n, path)
	return b.finish()
}

// mergeInto copies base and then extra into out, appending "kind id" to
// dup for every id extra defines again.
func mergeInto[T any](out, base, extra map[string]T, kind string, dup []string) []string {
	for k, v := range base {
		out[k] = v
	}
	for k, v := range extra {
		if _, ok := out[k]; ok {
			dup = append(dup, kind+" "+k)
		}
		out[k] = v
	}
	return dup
}
