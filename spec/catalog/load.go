package catalog

import (
	"errors"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/formula"
	"github.com/phgate/phgate/spec/yamldoc"
	"gopkg.in/yaml.v3"
)

// Tolerances and sanity bounds of the checks.
const (
	// NeutralityTolerance is how far the summed charge of what one mole
	// of an ingredient releases may be from zero (counts are decimal
	// numbers such as 1.5, so exact comparison would be fragile).
	NeutralityTolerance = 1e-9
	// MinPKa and MaxPKa bound plausible aqueous pKa values; anything
	// outside is a typo (a log K of the wrong sign, a missing decimal).
	MinPKa, MaxPKa = -10.0, 20.0
)

// Statuses a source may have.
const (
	StatusChecked    = "checked"
	StatusFromMemory = "from memory"
	StatusDerived    = "derived"
	// StatusInvented marks made-up numbers, allowed only in demo and
	// example catalogs (never in the built-in one, which a test checks).
	StatusInvented = "invented"
)

// decodeYAML parses one YAML document into a node, with the shared
// decoder's checks (UTF-8, binary, one document, nesting and alias limits).
func decodeYAML(data []byte, path string) (*yaml.Node, diag.Problems) {
	d, ps := yamldoc.Parse(data, path)
	if ps != nil {
		return nil, ps
	}
	return d.Root, nil
}

// builder turns documents into a catalog in two phases: decode every
// document (registering ids), then run the deferred checks in stages so
// that references across sections and files resolve.
type builder struct {
	cat    *Catalog
	base   *Catalog
	probs  diag.Problems
	later  [4][]func()
	broken map[string]bool // "section/id" of entries with schema errors
}

const (
	stageIons = iota
	stageSystems
	stageSaltsComplexes
	stageIngredients
)

func newBuilder(base *Catalog) *builder {
	return &builder{cat: newCatalog(), base: base, broken: map[string]bool{}}
}

func (b *builder) problem(p Pos, msg string) {
	b.probs = append(b.probs, diag.Problem{Path: p.Path, Line: p.Line, Column: p.Column, Message: msg})
}

func (b *builder) finish() (*Catalog, diag.Problems) {
	for _, stage := range b.later {
		for _, fn := range stage {
			fn()
		}
	}
	b.probs.Sort()
	return b.cat, b.probs
}

// addDoc validates one document and decodes its sections.
func (b *builder) addDoc(root *yaml.Node, path string) {
	d, ps := newDocument(root, path)
	if ps != nil {
		b.probs = append(b.probs, ps...)
		return
	}
	if d.root == nil {
		b.problem(Pos{Path: path}, "catalog is empty")
		return
	}
	if d.root.Kind != yaml.MappingNode {
		b.problem(d.pos(d.root), "a catalog is a mapping with sections such as sources, systems and ingredients")
		return
	}
	probs, bad := d.validate()
	b.probs = append(b.probs, probs...)
	for _, ptr := range bad {
		parts := strings.SplitN(strings.TrimPrefix(ptr, "/"), "/", 3)
		if len(parts) >= 2 {
			b.broken[parts[0]+"/"+unescapePtr(parts[1])] = true
		} else {
			b.broken[parts[0]] = true
		}
	}
	mapping(d.root, func(k, v *yaml.Node) {
		switch k.Value {
		case SectionSources:
			mapping(v, func(k, v *yaml.Node) { b.addSource(d, k, v) })
		case SectionIons:
			mapping(v, func(k, v *yaml.Node) { b.addIon(d, k, v) })
		case SectionSystems:
			mapping(v, func(k, v *yaml.Node) { b.addSystem(d, k, v) })
		case SectionSalts:
			mapping(v, func(k, v *yaml.Node) { b.addSalt(d, k, v) })
		case SectionComplexes:
			mapping(v, func(k, v *yaml.Node) { b.addComplex(d, k, v) })
		case SectionIngredients:
			mapping(v, func(k, v *yaml.Node) { b.addIngredient(d, k, v) })
		case "peptide":
			b.addPeptide(d, k, v)
		}
	})
}

func unescapePtr(s string) string {
	return strings.ReplaceAll(strings.ReplaceAll(s, "~1", "/"), "~0", "~")
}

// register records an entry's position and reports a duplicate id. It
// returns false when the entry must be skipped.
func (b *builder) register(d *document, section, id string, k *yaml.Node) bool {
	key := section + "/" + id
	p := d.pos(k)
	if prev, ok := b.cat.positions[key]; ok {
		b.problem(p, fmt.Sprintf("%s %q is defined twice (first at %s:%d:%d)", singular(section), id, prev.Path, prev.Line, prev.Column))
		return false
	}
	if b.base != nil {
		if _, ok := b.base.positions[key]; ok {
			b.problem(p, fmt.Sprintf("%s %q is already defined in the built-in catalog; a project catalog cannot override it: choose another id", singular(section), id))
			return false
		}
	}
	b.cat.positions[key] = p
	return true
}

func singular(section string) string {
	switch section {
	case SectionSources:
		return "source"
	case SectionIons:
		return "ion"
	case SectionSystems:
		return "system"
	case SectionSalts:
		return "salt"
	case SectionComplexes:
		return "complex"
	}
	return "ingredient"
}

func (b *builder) isBroken(section, id string) bool {
	return b.broken[section+"/"+id] || b.broken[section]
}

func (b *builder) addSource(d *document, k, v *yaml.Node) {
	if !b.register(d, SectionSources, k.Value, k) {
		return
	}
	b.cat.Sources[k.Value] = Source{ID: k.Value, Cite: str(field(v, "cite")), Status: str(field(v, "status"))}
}

// lookupSource finds a source here or in the base catalog.
func (b *builder) lookupSource(id string) (Source, bool) {
	if s, ok := b.cat.Sources[id]; ok {
		return s, true
	}
	if b.base != nil {
		if s, ok := b.base.Sources[id]; ok {
			return s, true
		}
	}
	return Source{}, false
}

func (b *builder) sourceIDs() []string {
	var ids []string
	for id := range b.cat.Sources {
		ids = append(ids, id)
	}
	if b.base != nil {
		for id := range b.base.Sources {
			ids = append(ids, id)
		}
	}
	return ids
}

// source resolves a source id written at node n.
func (b *builder) source(d *document, n *yaml.Node) (Source, bool) {
	id := str(n)
	s, ok := b.lookupSource(id)
	if !ok {
		b.problem(d.pos(n), "unknown source "+strconv.Quote(id)+didYouMean(id, b.sourceIDs()))
	}
	return s, ok
}

// value resolves a number that is either a bare scalar (sourced by the
// entry's default source node def) or a {value, source} mapping.
func (b *builder) value(d *document, n, def *yaml.Node, what string) (Value, bool) {
	if n.Kind == yaml.MappingNode {
		f, _ := number(field(n, "value"))
		s, ok := b.source(d, field(n, "source"))
		v := Value{V: f, Source: s}
		if nn := field(n, "notes"); nn != nil {
			v.Notes = nn.Value
		}
		return v, ok
	}
	f, _ := number(n)
	if def == nil {
		b.problem(d.pos(n), fmt.Sprintf("%s %v has no source: write {value: %v, source: SOURCE-ID} or give the entry a source", what, n.Value, n.Value))
		return Value{V: f}, false
	}
	s, ok := b.source(d, def)
	return Value{V: f, Source: s}, ok
}

// optValue is value for an optional field.
func (b *builder) optValue(d *document, n, def *yaml.Node, what string) *Value {
	if n == nil {
		return nil
	}
	v, _ := b.value(d, n, def, what)
	return &v
}

func firstNonNil(ns ...*yaml.Node) *yaml.Node {
	for _, n := range ns {
		if n != nil {
			return n
		}
	}
	return nil
}

// molarMass computes the molar mass of a formula written at node n,
// reporting a syntax error at the offending character.
func (b *builder) molarMass(d *document, n *yaml.Node) float64 {
	m, err := formula.MolarMass(n.Value)
	if err != nil {
		var se *formula.SyntaxError
		p := d.pos(n)
		if errors.As(err, &se) {
			p.Column = valueColumn(n) + se.Offset
			b.problem(p, fmt.Sprintf("formula %q: %s", n.Value, se.Msg))
		} else {
			b.problem(p, fmt.Sprintf("formula %q: %v", n.Value, err))
		}
		return 0
	}
	return m
}

var chargeRe = regexp.MustCompile(`([+-])([0-9]*)$`)

// LabelCharge returns the charge written at the end of a species or ion
// label: "HPO4-2" → −2, "TrisH+" → +1, "Ca+2" → +2, "CO2" → 0.
func LabelCharge(label string) int {
	m := chargeRe.FindStringSubmatch(label)
	if m == nil {
		return 0
	}
	n := 1
	if m[2] != "" {
		n, _ = strconv.Atoi(m[2])
	}
	if m[1] == "-" {
		return -n
	}
	return n
}

func (b *builder) addIon(d *document, k, v *yaml.Node) {
	id := k.Value
	if id == WaterH || id == WaterOH {
		b.problem(d.pos(k), fmt.Sprintf("%q is reserved for the water ion; it cannot be defined as a strong ion", id))
		return
	}
	if !b.register(d, SectionIons, id, k) {
		return
	}
	charge, _ := number(field(v, "charge"))
	ion := &Ion{ID: id, Name: str(field(v, "name")), Formula: str(field(v, "formula")), Charge: int(charge)}
	b.cat.Ions[id] = ion
	if b.isBroken(SectionIons, id) {
		return
	}
	b.later[stageIons] = append(b.later[stageIons], func() {
		if ion.Formula != "" {
			ion.MolarMass = b.molarMass(d, field(v, "formula"))
		}
		if chargeRe.MatchString(id) && LabelCharge(id) != ion.Charge {
			b.problem(d.pos(field(v, "charge")), fmt.Sprintf("ion %q has charge %d but its label says %+d", id, ion.Charge, LabelCharge(id)))
		}
	})
}

func (b *builder) addSystem(d *document, k, v *yaml.Node) {
	id := k.Value
	if !b.register(d, SectionSystems, id, k) {
		return
	}
	top, _ := number(field(v, "top-charge"))
	sys := &System{ID: id, Name: str(field(v, "name")), TopCharge: int(top), Notes: str(field(v, "notes"))}
	for _, s := range items(field(v, "species")) {
		sys.Species = append(sys.Species, str(s))
	}
	b.cat.Systems[id] = sys
	if b.isBroken(SectionSystems, id) {
		return
	}
	b.later[stageSystems] = append(b.later[stageSystems], func() {
		sysSrc := field(v, "source")
		steps := items(field(v, "steps"))
		species := items(field(v, "species"))
		if len(species) != len(steps)+1 {
			b.problem(d.pos(field(v, "species")), fmt.Sprintf("system %q has %d species and %d steps; list one species more than steps, most protonated first", id, len(species), len(steps)))
		}
		seen := map[string]bool{}
		for i, s := range species {
			if seen[s.Value] {
				b.problem(d.pos(s), fmt.Sprintf("species %q is listed twice in system %q", s.Value, id))
			}
			seen[s.Value] = true
			if want := sys.TopCharge - i; LabelCharge(s.Value) != want {
				b.problem(d.pos(s), fmt.Sprintf("species %q is number %d in a system with top-charge %+d, so its charge is %+d, but its label says %+d; end labels with their charge (HPO4-2, TrisH+)", s.Value, i+1, sys.TopCharge, want, LabelCharge(s.Value)))
			}
		}
		prev := math.Inf(-1)
		for i, st := range steps {
			def := firstNonNil(field(st, "source"), sysSrc)
			if n := field(st, "source"); n != nil {
				b.source(d, n)
			}
			pkaNode := field(st, "pka")
			pka, _ := b.value(d, pkaNode, def, "pKa")
			step := Step{PKa: pka}
			step.DeltaH = b.optValue(d, field(st, "enthalpy"), def, "enthalpy")
			step.DeltaCp = b.optValue(d, field(st, "heat-capacity"), def, "heat-capacity")
			sys.Steps = append(sys.Steps, step)
			if pka.V < MinPKa || pka.V > MaxPKa {
				b.problem(d.pos(pkaNode), fmt.Sprintf("pKa %g of step %d of system %q is outside %g..%g", pka.V, i+1, id, MinPKa, MaxPKa))
			}
			if pka.V < prev {
				b.problem(d.pos(pkaNode), fmt.Sprintf("pKa %g of step %d of system %q is below the previous step's %g; list steps from the most acidic, pKa non-decreasing", pka.V, i+1, id, prev))
			}
			prev = pka.V
		}
	})
}

// lookupIon finds a strong ion here or in the base catalog.
func (b *builder) lookupIon(id string) (*Ion, bool) {
	if x, ok := b.cat.Ions[id]; ok {
		return x, true
	}
	if b.base != nil {
		if x, ok := b.base.Ions[id]; ok {
			return x, true
		}
	}
	return nil, false
}

func (b *builder) lookupSystem(id string) (*System, bool) {
	if x, ok := b.cat.Systems[id]; ok {
		return x, true
	}
	if b.base != nil {
		if x, ok := b.base.Systems[id]; ok {
			return x, true
		}
	}
	return nil, false
}

func (b *builder) ids(section string) []string {
	var out []string
	pre := section + "/"
	for _, m := range []map[string]Pos{b.cat.positions, basePositions(b.base)} {
		for k := range m {
			if strings.HasPrefix(k, pre) {
				out = append(out, k[len(pre):])
			}
		}
	}
	return out
}

func basePositions(c *Catalog) map[string]Pos {
	if c == nil {
		return nil
	}
	return c.positions
}

// ion resolves an ion label written at node n; water ions are allowed
// when water is true. It returns the charge.
func (b *builder) ion(d *document, n *yaml.Node, water bool) (int, bool) {
	id := str(n)
	if id == WaterH || id == WaterOH {
		if water {
			return LabelCharge(id), true
		}
		b.problem(d.pos(n), fmt.Sprintf("%q is not a strong ion; write the H+ an ingredient releases as `protons: 1` (OH-: `protons: -1`)", id))
		return 0, false
	}
	ion, ok := b.lookupIon(id)
	if !ok {
		b.problem(d.pos(n), "unknown ion "+strconv.Quote(id)+didYouMean(id, b.ids(SectionIons)))
		return 0, false
	}
	return ion.Charge, true
}

// species resolves a system id and species label; it returns the
// species' charge.
func (b *builder) species(d *document, sysNode, spNode *yaml.Node) (int, bool) {
	sid := str(sysNode)
	sys, ok := b.lookupSystem(sid)
	if !ok {
		b.problem(d.pos(sysNode), "unknown system "+strconv.Quote(sid)+didYouMean(sid, b.ids(SectionSystems)))
		return 0, false
	}
	if b.isBroken(SectionSystems, sid) {
		return 0, false
	}
	i := sys.SpeciesIndex(str(spNode))
	if i < 0 {
		b.problem(d.pos(spNode), fmt.Sprintf("system %q has no species %q (it has %s)%s", sid, str(spNode), strings.Join(sys.Species, ", "), didYouMean(str(spNode), sys.Species)))
		return 0, false
	}
	return sys.SpeciesCharge(i), true
}

// ref resolves a SpeciesRef mapping ({ion} or {system, species}).
func (b *builder) ref(d *document, n *yaml.Node) (SpeciesRef, int, bool) {
	if in := field(n, "ion"); in != nil {
		z, ok := b.ion(d, in, true)
		return SpeciesRef{Ion: in.Value}, z, ok
	}
	sn, pn := field(n, "system"), field(n, "species")
	z, ok := b.species(d, sn, pn)
	return SpeciesRef{System: str(sn), Species: str(pn)}, z, ok
}

func (b *builder) addSalt(d *document, k, v *yaml.Node) {
	id := k.Value
	if !b.register(d, SectionSalts, id, k) {
		return
	}
	salt := &Salt{ID: id, Name: str(field(v, "name")), Formula: str(field(v, "formula")), Notes: str(field(v, "notes"))}
	b.cat.Salts = append(b.cat.Salts, salt)
	if b.isBroken(SectionSalts, id) {
		return
	}
	b.later[stageSaltsComplexes] = append(b.later[stageSaltsComplexes], func() {
		def := field(v, "source")
		if def != nil {
			b.source(d, def)
		}
		if f := field(v, "formula"); f != nil {
			b.molarMass(d, f)
		}
		total, ok := 0, true
		for _, t := range items(field(v, "dissolves-to")) {
			ref, z, good := b.ref(d, t)
			cnt, _ := number(field(t, "count"))
			salt.Terms = append(salt.Terms, SaltTerm{Ref: ref, Count: int(cnt)})
			total += z * int(cnt)
			ok = ok && good
		}
		if ok && total != 0 {
			b.problem(d.pos(field(v, "dissolves-to")), fmt.Sprintf("salt %q dissolves into ions with net charge %+d; the terms must balance", id, total))
		}
		salt.PKsp, _ = b.value(d, field(v, "pksp"), def, "pKsp")
		salt.DeltaH = b.optValue(d, field(v, "enthalpy"), def, "enthalpy")
	})
}

func (b *builder) addComplex(d *document, k, v *yaml.Node) {
	id := k.Value
	if !b.register(d, SectionComplexes, id, k) {
		return
	}
	cx := &Complex{ID: id, Metal: str(field(v, "metal")), Notes: str(field(v, "notes"))}
	b.cat.Complexes = append(b.cat.Complexes, cx)
	if b.isBroken(SectionComplexes, id) {
		return
	}
	b.later[stageSaltsComplexes] = append(b.later[stageSaltsComplexes], func() {
		def := field(v, "source")
		if def != nil {
			b.source(d, def)
		}
		mn := field(v, "metal")
		if z, ok := b.ion(d, mn, false); ok && z <= 0 {
			b.problem(d.pos(mn), fmt.Sprintf("metal %q of complex %q is not a cation", mn.Value, id))
		}
		cx.Ligand, _, _ = b.ref(d, field(v, "ligand"))
		cx.LogK, _ = b.value(d, field(v, "log-k"), def, "log K")
		cx.DeltaH = b.optValue(d, field(v, "enthalpy"), def, "enthalpy")
	})
}

func (b *builder) addPeptide(d *document, k, v *yaml.Node) {
	if len(b.cat.Peptide) > 0 || (b.base != nil && len(b.base.Peptide) > 0) {
		b.problem(d.pos(k), "the peptide pKa set is already defined; a catalog may define it once")
		return
	}
	if b.broken["peptide"] {
		return
	}
	def := field(v, "source")
	seen := map[string]bool{}
	b.later[stageSaltsComplexes] = append(b.later[stageSaltsComplexes], func() {
		for _, g := range items(field(v, "groups")) {
			cn := field(g, "code")
			if seen[cn.Value] {
				b.problem(d.pos(cn), fmt.Sprintf("peptide group %q is listed twice", cn.Value))
				continue
			}
			seen[cn.Value] = true
			pka, _ := b.value(d, field(g, "pka"), def, "pKa")
			b.cat.Peptide = append(b.cat.Peptide, PeptideGroup{Code: cn.Value, PKa: pka, Basic: str(field(g, "kind")) == "basic"})
		}
	})
}

func (b *builder) addIngredient(d *document, k, v *yaml.Node) {
	id := k.Value
	if !b.register(d, SectionIngredients, id, k) {
		return
	}
	ing := &Ingredient{ID: id, Name: str(field(v, "name")), Formula: str(field(v, "formula")), Notes: str(field(v, "notes"))}
	b.cat.Ingredients[id] = ing
	if b.isBroken(SectionIngredients, id) {
		return
	}
	b.later[stageIngredients] = append(b.later[stageIngredients], func() { b.checkIngredient(d, k, v, ing) })
}

func (b *builder) checkIngredient(d *document, k, v *yaml.Node, ing *Ingredient) {
	var srcs []Source
	addSrc := func(s Source) {
		if s.ID == "" {
			return
		}
		for _, x := range srcs {
			if x.ID == s.ID {
				return
			}
		}
		srcs = append(srcs, s)
	}
	for _, sn := range items(field(v, "sources")) {
		if s, ok := b.source(d, sn); ok {
			addSrc(s)
		}
	}
	fn, mm := field(v, "formula"), field(v, "molar-mass")
	switch {
	case fn != nil && mm != nil:
		b.problem(d.pos(mm), fmt.Sprintf("ingredient %q has a formula; its molar mass is computed from it, so drop molar-mass", ing.ID))
	case fn != nil:
		ing.MolarMass = b.molarMass(d, fn)
	case mm != nil:
		val, _ := b.value(d, mm, nil, "molar mass")
		ing.MolarMass = val.V
		ing.MolarMassSource = &val.Source
		addSrc(val.Source)
		if val.V <= 0 {
			b.problem(d.pos(mm), "molar mass must be positive")
		}
	default:
		b.problem(d.pos(k), fmt.Sprintf("ingredient %q needs a formula (or, for a polymer, a molar-mass with a source)", ing.ID))
	}
	charge, ok := 0.0, true
	var parts []string
	mapping(field(v, "ions"), func(in, cn *yaml.Node) {
		z, good := b.ion(d, in, false)
		cnt, _ := number(cn)
		ing.Ions = append(ing.Ions, IonShare{Ion: in.Value, Count: cnt})
		charge += float64(z) * cnt
		parts = append(parts, fmt.Sprintf("%s ×%g", in.Value, cnt))
		ok = ok && good
	})
	for _, s := range items(field(v, "systems")) {
		sn, pn := field(s, "system"), field(s, "species")
		cnt := 1.0
		if cn := field(s, "count"); cn != nil {
			cnt, _ = number(cn)
		}
		z, good := b.species(d, sn, pn)
		ing.Systems = append(ing.Systems, SystemShare{System: str(sn), Species: str(pn), Count: cnt})
		charge += float64(z) * cnt
		parts = append(parts, fmt.Sprintf("%s ×%g", str(pn), cnt))
		ok = ok && good
		if sys, found := b.lookupSystem(str(sn)); found && good {
			for _, st := range sys.Steps {
				addSrc(st.PKa.Source)
				if st.DeltaH != nil {
					addSrc(st.DeltaH.Source)
				}
				if st.DeltaCp != nil {
					addSrc(st.DeltaCp.Source)
				}
			}
		}
	}
	if n := field(v, "neutral"); n != nil {
		ing.Neutrals, _ = number(n)
	}
	if n := field(v, "protons"); n != nil {
		ing.Protons, _ = number(n)
		charge += ing.Protons
		parts = append(parts, fmt.Sprintf("protons %+g", ing.Protons))
	}
	if ok && math.Abs(charge) > NeutralityTolerance {
		what := "nothing"
		if len(parts) > 0 {
			what = strings.Join(parts, ", ")
		}
		b.problem(d.pos(k), fmt.Sprintf("ingredient %q is not electrically neutral: one mole releases net charge %+g (%s); balance it with ions, species or protons", ing.ID, charge, what))
	}
	opt := func(key, what string, lo, hi float64, loOpen bool) *Value {
		n := field(v, key)
		if n == nil {
			return nil
		}
		val, good := b.value(d, n, nil, what)
		if good {
			addSrc(val.Source)
		}
		if val.V < lo || val.V > hi || (loOpen && val.V == lo) {
			b.problem(d.pos(n), fmt.Sprintf("%s %g is outside %g..%g", what, val.V, lo, hi))
		}
		return &val
	}
	ing.Density = opt("density", "density (g/mL)", 0.5, 3, false)
	ing.IntrinsicSolubility = opt("solubility", "intrinsic solubility (mol/L)", 0, 100, true)
	ing.PI = opt("pi", "isoelectric point", 0, 14, false)
	ing.Preservative = opt("preservative", "minimum un-ionized fraction", 0, 1, true)
	ing.Sources = srcs
	if len(srcs) == 0 && len(items(field(v, "sources"))) == 0 {
		b.problem(d.pos(k), fmt.Sprintf("ingredient %q has no source", ing.ID))
	}
}
