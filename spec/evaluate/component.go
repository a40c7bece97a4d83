package evaluate

import (
	"fmt"
	"slices"

	"github.com/phgate/phgate/solver"
)

// ComponentFor builds the solver component of catalog ingredient id
// against the result's final mixture, as Evaluate would for a recipe
// line, so callers can titrate the product with an ingredient it may not
// contain. The returned mixture is a copy of r.Mixture extended with a
// zero-concentration entry for every system or ion the ingredient brings
// that the product lacks (the component's shares index into it); r is
// not modified. Complexes or salts the new entries could form are not
// declared, and the component carries no neutral solutes (they do not
// enter the charge balance).
func (r *Result) ComponentFor(id string) (solver.Component, solver.Mixture, error) {
	e, ok := r.Catalog.Ingredient(id)
	if !ok {
		msg := fmt.Sprintf("unknown ingredient %q", id)
		if s := r.Catalog.Suggest(id, 3); len(s) > 0 {
			msg += fmt.Sprintf("; did you mean %s?", quoteList(s))
		}
		return solver.Component{}, solver.Mixture{}, fmt.Errorf("%s", msg)
	}
	m := r.Mixture
	// Clip the clones so appending to them can never write into the
	// backing arrays r.Mixture still uses.
	m.Systems = slices.Clip(slices.Clone(m.Systems))
	m.Strong = slices.Clip(slices.Clone(m.Strong))
	m.Neutrals = slices.Clip(slices.Clone(m.Neutrals))
	b := builder{r: r.Recipe, cat: r.Catalog, res: &Result{Mixture: m},
		sysIndex: map[string]int{}, ionIndex: map[string]int{}, neutralIndex: map[string]int{}}
	for i, s := range m.Systems {
		b.sysIndex[s.Name] = i
	}
	for i, s := range m.Strong {
		b.ionIndex[s.Name] = i
	}
	for i, n := range m.Neutrals {
		b.neutralIndex[n.Name] = i
	}
	c, _ := b.catalogComponent(e)
	return c, b.res.Mixture, nil
}
