package review

import (
	"bytes"
	"encoding/json"
	"math"
	"sort"

	"github.com/phgate/phgate/rules"
	"github.com/phgate/phgate/rules/report"
	"github.com/phgate/phgate/spec/diag"
)

// Status says how a recipe changed between the sides.
type Status string

// Statuses of a change. Unchanged appears only when the caller asks for
// every recipe.
const (
	Modified  Status = "modified"
	Added     Status = "added"
	Removed   Status = "removed"
	Renamed   Status = "renamed"
	Unchanged Status = "unchanged"
)

// Diff is the comparison of two sides.
type Diff struct {
	// Old and New name the sides.
	Old SideInfo `json:"old"`
	New SideInfo `json:"new"`
	// Changes are the recipes that changed, by path.
	Changes []Change `json:"changes"`
	// Unchanged counts paired recipes whose file, inputs and results did
	// not move.
	Unchanged int `json:"unchanged"`
	// InputsChanged lists phgate.yaml and project catalog files whose
	// bytes differ between the sides (or exist on one side only).
	InputsChanged []string `json:"inputs_changed"`
	// Problems are project-level problems of each side.
	Problems SideProblems `json:"problems"`
	// GatesCrossed says which gate failed and why; empty when none did.
	GatesCrossed []string `json:"gates_crossed"`
}

// SideInfo names one side.
type SideInfo struct {
	Label string `json:"label"`
}

// SideProblems holds problems on either side.
type SideProblems struct {
	Old []diag.Problem `json:"old"`
	New []diag.Problem `json:"new"`
}

// Change is one recipe that moved.
type Change struct {
	Recipe  string `json:"recipe"`
	Status  Status `json:"status"`
	OldPath string `json:"old_path,omitempty"`
	NewPath string `json:"new_path,omitempty"`
	// Before and After are nil for an added and a removed recipe.
	Before *State `json:"before"`
	After  *State `json:"after"`
	// DeltaPH, DeltaBufferCapacity and DeltaIonicStrength are after minus
	// before; nil unless both sides were solved. A recipe whose inputs are
	// identical on both sides gets exactly 0.
	DeltaPH             *float64 `json:"delta_ph"`
	DeltaBufferCapacity *float64 `json:"delta_buffer_capacity"`
	DeltaIonicStrength  *float64 `json:"delta_ionic_strength"`
	// RecipeEdited reports that the recipe file's bytes differ.
	RecipeEdited bool `json:"recipe_edited"`
	// Causes name what else changed under the recipe.
	Causes       []Cause            `json:"causes"`
	QS           []QSChange         `json:"qs_changes"`
	Dominant     []DominantChange   `json:"dominant_changes"`
	Ingredients  []IngredientChange `json:"ingredient_changes"`
	NewFindings  []rules.Finding    `json:"new_findings"`
	GoneFindings []rules.Finding    `json:"gone_findings"`

	rawDeltaPH float64
}

// State is one side's key results for a recipe.
type State struct {
	PH             *float64 `json:"ph,omitempty"`
	BufferCapacity *float64 `json:"buffer_capacity,omitempty"`
	IonicStrength  *float64 `json:"ionic_strength,omitempty"`
	// ConcentrationUnit is mol/L, or mol/kg on a water-mass basis.
	ConcentrationUnit string `json:"concentration_unit,omitempty"`
	// Problems kept the recipe from being solved on this side.
	Problems []diag.Problem `json:"problems,omitempty"`
}

// CauseKind is what kind of input changed under a recipe.
type CauseKind string

// Kinds of cause.
const (
	// CauseStock: a stock recipe reached through from: changed.
	CauseStock CauseKind = "stock"
	// CauseCatalog: a catalog entry the recipe depends on changed.
	CauseCatalog CauseKind = "catalog"
	// CauseConfig: the governing phgate.yaml changed.
	CauseConfig CauseKind = "config"
)

// Cause is one changed input.
type Cause struct {
	Kind CauseKind `json:"kind"`
	// Name is the stock recipe id, the catalog entry ("ingredient
	// sodium-chloride", "system phosphate") or the config path.
	Name string `json:"name"`
	// Path is where the input is defined on the new side (or the old side
	// when it went away).
	Path string `json:"path,omitempty"`
	// Note is "added" or "removed" when the input exists on one side only.
	Note string `json:"note,omitempty"`
}

// QSChange is a q.s. amount that moved.
type QSChange struct {
	Use    string         `json:"use"`
	Before *report.Adjust `json:"before"`
	After  *report.Adjust `json:"after"`
}

// DominantChange is an acid–base system whose dominant species changed.
type DominantChange struct {
	System string `json:"system"`
	Before string `json:"before"`
	After  string `json:"after"`
}

// IngredientChange is an ingredient line whose amount changed, or that
// was added or removed.
type IngredientChange struct {
	Ingredient string       `json:"ingredient"`
	Before     *report.Line `json:"before"`
	After      *report.Line `json:"after"`
}

// Options tune Compare.
type Options struct {
	// Pair compares the only recipe of each side whatever their ids (two
	// files named on the command line).
	Pair bool
	// All lists unchanged recipes too, with status "unchanged".
	All bool
}

// Compare pairs the recipes of two sides and describes what moved.
func Compare(old, new *Side, opt Options) *Diff {
	d := &Diff{Old: SideInfo{Label: old.Label}, New: SideInfo{Label: new.Label},
		Changes: []Change{}, InputsChanged: []string{}, GatesCrossed: []string{},
		Problems: SideProblems{Old: nonNil(old.Problems), New: nonNil(new.Problems)}}
	for _, p := range pair(old.Recipes, new.Recipes, opt.Pair) {
		c, changed := compareOne(p.old, p.new)
		if changed || opt.All {
			d.Changes = append(d.Changes, c)
		}
		if !changed {
			d.Unchanged++
		}
	}
	sort.SliceStable(d.Changes, func(i, j int) bool {
		a, b := d.Changes[i], d.Changes[j]
		if pa, pb := a.path(), b.path(); pa != pb {
			return pa < pb
		}
		return a.Recipe < b.Recipe
	})
	seen := map[string]bool{}
	for p, sum := range old.Inputs {
		if other, ok := new.Inputs[p]; !ok || other != sum {
			seen[p] = true
		}
	}
	for p := range new.Inputs {
		if _, ok := old.Inputs[p]; !ok {
			seen[p] = true
		}
	}
	for p := range seen {
		d.InputsChanged = append(d.InputsChanged, p)
	}
	sort.Strings(d.InputsChanged)
	return d
}

func nonNil(ps []diag.Problem) []diag.Problem {
	if ps == nil {
		return []diag.Problem{}
	}
	return ps
}

func (c *Change) path() string {
	if c.NewPath != "" {
		return c.NewPath
	}
	return c.OldPath
}

type pairing struct{ old, new *Recipe }

// pair matches recipes by id, then files that could not be loaded (no id)
// by path; the rest are added or removed.
func pair(old, new []*Recipe, force bool) []pairing {
	if force && len(old) == 1 && len(new) == 1 {
		return []pairing{{old[0], new[0]}}
	}
	var out []pairing
	newByID := map[string]*Recipe{}
	used := map[*Recipe]bool{}
	for _, n := range new {
		if n.ID != "" {
			newByID[n.ID] = n
		}
	}
	var oldLeft []*Recipe
	for _, o := range old {
		if n, ok := newByID[o.ID]; ok && o.ID != "" {
			out = append(out, pairing{o, n})
			used[n] = true
			continue
		}
		oldLeft = append(oldLeft, o)
	}
	newByPath := map[string]*Recipe{}
	for _, n := range new {
		if !used[n] {
			newByPath[n.Path] = n
		}
	}
	for _, o := range oldLeft {
		if n, ok := newByPath[o.Path]; ok && (o.ID == "" || n.ID == "") {
			out = append(out, pairing{o, n})
			used[n] = true
			continue
		}
		out = append(out, pairing{o, nil})
	}
	for _, n := range new {
		if !used[n] {
			out = append(out, pairing{nil, n})
		}
	}
	return out
}

// compareOne describes one pair and reports whether it counts as a change.
func compareOne(o, n *Recipe) (Change, bool) {
	c := Change{Causes: []Cause{}, QS: []QSChange{}, Dominant: []DominantChange{},
		Ingredients: []IngredientChange{}, NewFindings: []rules.Finding{}, GoneFindings: []rules.Finding{}}
	switch {
	case o == nil:
		c.Recipe, c.Status, c.NewPath, c.After = n.name(), Added, n.Path, state(n)
		c.NewFindings = active(n.findings())
		return c, true
	case n == nil:
		c.Recipe, c.Status, c.OldPath, c.Before = o.name(), Removed, o.Path, state(o)
		c.GoneFindings = active(o.findings())
		return c, true
	}
	c.Recipe = n.name()
	if n.ID == "" {
		c.Recipe = o.name()
	}
	c.OldPath, c.NewPath = o.Path, n.Path
	c.Before, c.After = state(o), state(n)
	c.RecipeEdited = o.Sum != n.Sum
	c.Causes = causes(o, n)
	// Identical inputs solve to identical results: the deltas are then
	// exactly 0 by definition, not by a subtraction.
	sameInputs := !c.RecipeEdited && len(c.Causes) == 0
	if o.Result != nil && n.Result != nil {
		oe, ne := o.Result.Equilibrium, n.Result.Equilibrium
		if sameInputs {
			oe = ne
		}
		c.rawDeltaPH = delta(oe.PH, ne.PH)
		c.DeltaPH = ptr(round(c.rawDeltaPH, 4))
		c.DeltaBufferCapacity = ptr(round(delta(oe.BufferCapacity, ne.BufferCapacity), 6))
		c.DeltaIonicStrength = ptr(round(delta(oe.IonicStrength, ne.IonicStrength), 6))
		c.QS = qsChanges(o.Report.Adjustments, n.Report.Adjustments)
		c.Dominant = dominantChanges(o.Report.Systems, n.Report.Systems)
		c.Ingredients = ingredientChanges(o.Report, n.Report)
	}
	c.NewFindings, c.GoneFindings = findingChanges(o.findings(), n.findings())
	moved := (!sameInputs && resultsMoved(o, n)) || len(c.NewFindings) > 0 || len(c.GoneFindings) > 0 ||
		!sameProblems(o.Problems, n.Problems)
	switch {
	case o.Path != n.Path:
		c.Status = Renamed
	case c.RecipeEdited || moved:
		c.Status = Modified
	default:
		c.Status = Unchanged
	}
	return c, c.Status != Unchanged
}

func (r *Recipe) name() string {
	if r.ID != "" {
		return r.ID
	}
	return r.Path
}

func (r *Recipe) findings() []rules.Finding {
	if r.Report == nil {
		return nil
	}
	return r.Report.Findings
}

func state(r *Recipe) *State {
	s := &State{Problems: r.Problems}
	if r.Report != nil {
		s.PH = ptr(r.Report.PH)
		s.BufferCapacity = ptr(r.Report.BufferCapacity)
		s.IonicStrength = ptr(r.Report.IonicStrength)
		s.ConcentrationUnit = r.Report.ConcentrationUnit
	}
	return s
}

// delta is b − a, exactly 0 when the two raw values are identical (the
// same inputs solve to the same bits).
func delta(a, b float64) float64 {
	if a == b || math.IsNaN(a) || math.IsNaN(b) {
		return 0
	}
	return b - a
}

func ptr(x float64) *float64 { return &x }

// round keeps n decimals and never yields −0.
func round(x float64, n int) float64 {
	p := math.Pow(10, float64(n))
	r := math.Round(x*p) / p
	if r == 0 {
		return 0
	}
	return r
}

// resultsMoved compares the raw solution and the built report of both
// sides, positions and paths aside.
func resultsMoved(o, n *Recipe) bool {
	if (o.Result == nil) != (n.Result == nil) {
		return true
	}
	if o.Result == nil {
		return false
	}
	oe, ne := o.Result.Equilibrium, n.Result.Equilibrium
	if oe.PH != ne.PH || oe.BufferCapacity != ne.BufferCapacity || oe.IonicStrength != ne.IonicStrength || oe.Osmolarity != ne.Osmolarity {
		return true
	}
	a, b := *o.Report, *n.Report
	a.Path, b.Path = "", ""
	a.Findings, b.Findings = nil, nil
	ja, errA := json.Marshal(a)
	jb, errB := json.Marshal(b)
	return errA != nil || errB != nil || !bytes.Equal(ja, jb)
}

func sameProblems(a, b []diag.Problem) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].Message != b[i].Message {
			return false
		}
	}
	return true
}

// causes lists the stock recipes, catalog entries and config that differ
// between the sides for a pair.
func causes(o, n *Recipe) []Cause {
	out := []Cause{}
	out = append(out, inputCauses(CauseStock, o.Stocks, n.Stocks)...)
	out = append(out, inputCauses(CauseCatalog, o.Catalog, n.Catalog)...)
	if o.Config != "" || n.Config != "" {
		if o.Config != n.Config || o.ConfigSum != n.ConfigSum {
			name := n.Config
			if name == "" {
				name = o.Config
			}
			out = append(out, Cause{Kind: CauseConfig, Name: name, Path: name})
		}
	}
	return out
}

// inputCauses compares two input maps; maps are nil when a side was not
// solved, and then nothing can be said.
func inputCauses(kind CauseKind, o, n map[string]Input) []Cause {
	if o == nil || n == nil {
		return nil
	}
	var out []Cause
	for k, ni := range n {
		oi, ok := o[k]
		switch {
		case !ok:
			out = append(out, Cause{Kind: kind, Name: k, Path: ni.Path, Note: "added"})
		case oi.Sum != ni.Sum:
			out = append(out, Cause{Kind: kind, Name: k, Path: ni.Path})
		}
	}
	for k, oi := range o {
		if _, ok := n[k]; !ok {
			out = append(out, Cause{Kind: kind, Name: k, Path: oi.Path, Note: "removed"})
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

func qsChanges(o, n []report.Adjust) []QSChange {
	out := []QSChange{}
	byUse := map[string]*report.Adjust{}
	for i := range o {
		byUse[o[i].Use] = &o[i]
	}
	for i := range n {
		a := &n[i]
		b := byUse[a.Use]
		delete(byUse, a.Use)
		if b == nil || *b != *a {
			out = append(out, QSChange{Use: a.Use, Before: b, After: a})
		}
	}
	for i := range o {
		if b, ok := byUse[o[i].Use]; ok {
			out = append(out, QSChange{Use: b.Use, Before: b})
		}
	}
	return out
}

func dominantChanges(o, n []report.System) []DominantChange {
	out := []DominantChange{}
	before := map[string]string{}
	for _, s := range o {
		before[s.Name] = s.Dominant
	}
	for _, s := range n {
		b, ok := before[s.Name]
		delete(before, s.Name)
		if !ok || b != s.Dominant {
			out = append(out, DominantChange{System: s.Name, Before: b, After: s.Dominant})
		}
	}
	for _, s := range o {
		if b, ok := before[s.Name]; ok {
			out = append(out, DominantChange{System: s.Name, Before: b})
		}
	}
	return out
}

// ingredientChanges pairs ingredient lines by label, in order of
// appearance (a label used twice pairs first with first). The q.s.
// titrant's line is left to qsChanges.
func ingredientChanges(or, nr *report.Recipe) []IngredientChange {
	titrant := map[string]bool{}
	for _, a := range append(append([]report.Adjust{}, or.Adjustments...), nr.Adjustments...) {
		titrant[a.Use] = true
	}
	keep := func(ls []report.Line) []report.Line {
		var out []report.Line
		for _, l := range ls {
			if !(titrant[l.Ingredient] && l.Amount == "") {
				out = append(out, l)
			}
		}
		return out
	}
	o, n := keep(or.Ingredients), keep(nr.Ingredients)
	out := []IngredientChange{}
	left := map[string][]int{}
	for i, l := range o {
		left[l.Ingredient] = append(left[l.Ingredient], i)
	}
	used := make([]bool, len(o))
	for i := range n {
		a := &n[i]
		idx := left[a.Ingredient]
		if len(idx) == 0 {
			out = append(out, IngredientChange{Ingredient: a.Ingredient, After: a})
			continue
		}
		left[a.Ingredient] = idx[1:]
		used[idx[0]] = true
		b := &o[idx[0]]
		if b.Amount != a.Amount || b.Conc != a.Conc || b.QS != a.QS {
			out = append(out, IngredientChange{Ingredient: a.Ingredient, Before: b, After: a})
		}
	}
	for i := range o {
		if !used[i] {
			out = append(out, IngredientChange{Ingredient: o[i].Ingredient, Before: &o[i]})
		}
	}
	return out
}

// findingChanges returns the findings that appeared and went away.
// Positions are ignored (an edit above a line moves it); findings pair
// first by rule, severity and message, then by rule and severity alone, so
// a finding whose numbers moved is neither new nor gone.
func findingChanges(o, n []rules.Finding) (appeared, gone []rules.Finding) {
	appeared, gone = []rules.Finding{}, []rules.Finding{}
	used := make([]bool, len(o))
	matched := make([]bool, len(n))
	match := func(same func(a, b rules.Finding) bool) {
		for j, f := range n {
			if matched[j] {
				continue
			}
			for i, g := range o {
				if !used[i] && same(g, f) {
					used[i], matched[j] = true, true
					break
				}
			}
		}
	}
	match(func(a, b rules.Finding) bool {
		return a.Rule == b.Rule && a.Severity == b.Severity && a.Message == b.Message && a.Waived == b.Waived
	})
	match(func(a, b rules.Finding) bool {
		return a.Rule == b.Rule && a.Severity == b.Severity && (a.Waived == "") == (b.Waived == "")
	})
	for j, f := range n {
		if !matched[j] {
			appeared = append(appeared, f)
		}
	}
	for i, f := range o {
		if !used[i] {
			gone = append(gone, f)
		}
	}
	return appeared, gone
}

// active returns a copy of the findings, for added and removed recipes.
func active(fs []rules.Finding) []rules.Finding {
	return append([]rules.Finding{}, fs...)
}
