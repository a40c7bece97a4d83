package evaluate

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/phgate/phgate/spec/catalog"
	"github.com/phgate/phgate/spec/formula"
)

// residueFormula is the composition of each amino-acid residue in a chain
// (the free amino acid minus H2O); a chain adds one H2O for its termini.
// Standard residue formulas (IUPAC-IUB amino-acid nomenclature; from memory).
var residueFormula = map[byte]string{
	'A': "C3H5NO", 'R': "C6H12N4O", 'N': "C4H6N2O2", 'D': "C4H5NO3", 'C': "C3H5NOS",
	'E': "C5H7NO3", 'Q': "C5H8N2O2", 'G': "C2H3NO", 'H': "C6H7N3O", 'I': "C6H11NO",
	'L': "C6H11NO", 'K': "C6H12N2O", 'M': "C5H9NOS", 'F': "C9H9NO", 'P': "C5H7NO",
	'S': "C3H5NO2", 'T': "C4H7NO2", 'W': "C11H10N2O", 'Y': "C9H9NO2", 'V': "C5H9NO",
}

// Group is one kind of ionizable group of a peptide with its count per molecule.
type Group struct {
	// Code is "Nterm", "Cterm" or a one-letter residue code.
	Code  string
	PKa   float64
	Basic bool
	Count int
}

// Peptide is a peptide or protein derived from its one-letter sequence.
type Peptide struct {
	Sequence  string
	MolarMass float64
	Groups    []Group
}

// PeptideState is a peptide's charge state in the solved recipe.
type PeptideState struct {
	Label string
	// NetCharge is the mean charge per molecule at the recipe's pH.
	NetCharge float64
	// PI is the isoelectric point computed from the same group pKa set.
	PI float64
}

// NewPeptide derives the ionizable groups (termini and D, E, C, Y, H, K, R
// side chains) from the catalog's peptide pKa set and the molar mass from
// the residue formulas.
func NewPeptide(seq string, cat *catalog.Catalog) (*Peptide, error) {
	seq = strings.ToUpper(strings.TrimSpace(seq))
	if seq == "" {
		return nil, fmt.Errorf("empty sequence")
	}
	var comp strings.Builder
	counts := map[string]int{"Nterm": 1, "Cterm": 1}
	for i := 0; i < len(seq); i++ {
		f, ok := residueFormula[seq[i]]
		if !ok {
			return nil, fmt.Errorf("%q at position %d is not a standard one-letter amino-acid code", seq[i:i+1], i+1)
		}
		comp.WriteString(f)
		counts[seq[i:i+1]]++
	}
	comp.WriteString("H2O")
	mm, err := formula.MolarMass(comp.String())
	if err != nil {
		return nil, fmt.Errorf("molar mass of the sequence: %v", err)
	}
	p := &Peptide{Sequence: seq, MolarMass: mm}
	for _, g := range cat.PeptideGroups() {
		if n := counts[g.Code]; n > 0 {
			p.Groups = append(p.Groups, Group{Code: g.Code, PKa: g.PKa.V, Basic: g.Basic, Count: n})
		}
	}
	sort.Slice(p.Groups, func(i, j int) bool { return p.Groups[i].PKa < p.Groups[j].PKa })
	return p, nil
}

// Charge is the mean charge of one molecule at pH (Henderson–Hasselbalch
// for each independent group).
func (p *Peptide) Charge(pH float64) float64 {
	q := 0.0
	for _, g := range p.Groups {
		if g.Basic {
			q += float64(g.Count) / (1 + math.Pow(10, pH-g.PKa))
		} else {
			q -= float64(g.Count) / (1 + math.Pow(10, g.PKa-pH))
		}
	}
	return q
}

// IsoelectricPoint is the pH where Charge is zero, by bisection on 0–14
// (Charge falls monotonically with pH).
func (p *Peptide) IsoelectricPoint() float64 {
	lo, hi := 0.0, 14.0
	for i := 0; i < 60; i++ {
		mid := (lo + hi) / 2
		if p.Charge(mid) > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

func (b *builder) peptideStates() []PeptideState {
	var out []PeptideState
	eq := b.res.Equilibrium
	for i := range b.res.Lines {
		l := &b.res.Lines[i]
		if l.Peptide == nil {
			continue
		}
		q := 0.0
		for _, s := range l.Component.SystemPerUnit {
			q += s.Count * eq.Systems[s.Index].MeanCharge
		}
		out = append(out, PeptideState{Label: l.Label(), NetCharge: q, PI: l.Peptide.IsoelectricPoint()})
	}
	return out
}
