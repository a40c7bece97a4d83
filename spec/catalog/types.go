package catalog

// Source names where a number comes from, e.g. "Goldberg, Kishore & Lennen
// 2002, J. Phys. Chem. Ref. Data 31, 231" and whether it was read in the
// source or recalled.
type Source struct {
	// ID is the key the source has in its catalog file.
	ID string `yaml:"-" json:"id,omitempty"`
	// Cite is the bibliographic reference.
	Cite string `yaml:"cite" json:"cite"`
	// Status is "invented" (demo data only), "checked" (read in a copy of the source), "from memory"
	// (recalled, not yet checked) or "derived" (computed from other cited values).
	Status string `yaml:"status,omitempty" json:"status,omitempty"`
}

// Value is a number with its source.
type Value struct {
	// V is the number in the unit its field documents.
	V float64 `json:"value"`
	// Source says where V comes from.
	Source Source `json:"source"`
	// Notes qualifies the number (e.g. "50 % w/w solution" for a density).
	Notes string `json:"notes,omitempty"`
}

// Step is one ionization step of an acid–base system.
type Step struct {
	// PKa at 25 °C, infinite dilution.
	PKa Value `json:"pka"`
	// DeltaH is the standard ionization enthalpy in kJ/mol (nil: unknown, taken as 0).
	DeltaH *Value `json:"delta_h_kj_mol,omitempty"`
	// DeltaCp is the standard heat-capacity change in J/(K·mol) (nil: unknown).
	DeltaCp *Value `json:"delta_cp_j_k_mol,omitempty"`
}

// System is an acid–base system shared by all ingredients that release it
// (phosphate for phosphoric acid and every phosphate salt).
type System struct {
	// ID is the kebab-case key, e.g. "phosphate".
	ID string `json:"id"`
	// Name is shown to people.
	Name string `json:"name"`
	// TopCharge is the charge of the fully protonated form.
	TopCharge int `json:"top_charge"`
	// Species labels, most protonated first (len(Steps)+1).
	Species []string `json:"species"`
	// Steps are the ionization steps, strongest acid first.
	Steps []Step `json:"steps"`
	// Notes is free text.
	Notes string `json:"notes,omitempty"`
}

// SpeciesIndex returns the position of a species label in Species
// (0 = most protonated), or -1.
func (s *System) SpeciesIndex(label string) int {
	for i, l := range s.Species {
		if l == label {
			return i
		}
	}
	return -1
}

// SpeciesCharge returns the charge of the species at index i: the top
// charge minus the protons it has lost.
func (s *System) SpeciesCharge(i int) int { return s.TopCharge - i }

// Ion is a strong (fully dissociated, non-hydrolysing in this model) ion.
type Ion struct {
	// ID is the ion's label with its charge, e.g. "Na+", "Ca+2", "Cl-".
	ID string `json:"id"`
	// Name is the ion's name in words.
	Name string `json:"name,omitempty"`
	// Formula is the formula without charge, e.g. "SO4".
	Formula string `json:"formula"`
	Charge  int    `json:"charge"`
	// MolarMass in g/mol computed from its formula.
	MolarMass float64 `json:"molar_mass"`
}

// SpeciesRef points at one dissolved species: a strong ion by id, a
// protonation state of a system ("phosphate" + species label "HPO4-2"),
// or the water ions, written as Ion "H+" or "OH-" (see WaterH, WaterOH).
type SpeciesRef struct {
	// Ion is a strong-ion id, or "H+" / "OH-".
	Ion string `json:"ion,omitempty"`
	// System and Species name a protonation state of an acid–base system.
	System  string `json:"system,omitempty"`
	Species string `json:"species,omitempty"`
}

// Reserved ion labels for the water ions in salt terms and complexes.
const (
	// WaterH is the hydrogen ion.
	WaterH = "H+"
	// WaterOH is the hydroxide ion.
	WaterOH = "OH-"
)

// String renders the reference as "Ca+2" or "phosphate:HPO4-2".
func (r SpeciesRef) String() string {
	if r.System != "" {
		return r.System + ":" + r.Species
	}
	return r.Ion
}

// SaltTerm is one ion of a salt's dissolution with its count.
type SaltTerm struct {
	// Ref is the dissolved species.
	Ref SpeciesRef `json:"ref"`
	// Count is its stoichiometric coefficient.
	Count int `json:"count"`
}

// Salt is a sparingly soluble solid whose saturation is checked when all
// its ions are present.
type Salt struct {
	// ID is the kebab-case key, e.g. "calcite".
	ID string `json:"id"`
	// Name is shown to people.
	Name string `json:"name"`
	// Formula of the solid, e.g. "CaHPO4·2H2O".
	Formula string `json:"formula"`
	// Terms are the ions the solid dissolves into.
	Terms []SaltTerm `json:"terms"`
	// PKsp is −log10 Ksp at 25 °C.
	PKsp Value `json:"pksp"`
	// DeltaH is the dissolution enthalpy in kJ/mol (nil: unknown).
	DeltaH *Value `json:"delta_h_kj_mol,omitempty"`
	// Notes is free text.
	Notes string `json:"notes,omitempty"`
}

// Complex is a 1:1 metal–ligand complex.
type Complex struct {
	// ID is the complex's label, e.g. "CaCit-".
	ID string `json:"id"`
	// Metal is the strong-ion id of the metal, e.g. "Ca+2".
	Metal string `json:"metal"`
	// Ligand is the species the metal binds.
	Ligand SpeciesRef `json:"ligand"`
	// LogK is log10 of the formation constant at 25 °C, infinite dilution.
	LogK Value `json:"log_k"`
	// DeltaH is the formation enthalpy in kJ/mol (nil: unknown).
	DeltaH *Value `json:"delta_h_kj_mol,omitempty"`
	// Notes is free text.
	Notes string `json:"notes,omitempty"`
}

// SystemShare is an amount of a system released per mole of ingredient,
// entering in the given protonation state.
type SystemShare struct {
	// System is the system id.
	System string `json:"system"`
	// Count is moles of the system per mole of ingredient.
	Count float64 `json:"count"`
	// Species is the label of the protonation state the ingredient brings.
	Species string `json:"species"`
}

// IonShare is an amount of a strong ion released per mole of ingredient.
type IonShare struct {
	// Ion is the strong-ion id.
	Ion string `json:"ion"`
	// Count is moles of the ion per mole of ingredient.
	Count float64 `json:"count"`
}

// Ingredient is one catalog entry: something a formulator weighs or pours.
type Ingredient struct {
	// ID is the kebab-case key recipes use, e.g. "sodium-chloride".
	ID string `json:"id"`
	// Name is shown to people.
	Name string `json:"name"`
	// Formula with hydrate water, e.g. "Na2HPO4·7H2O" (empty for water
	// or when MolarMassOverride is given).
	Formula string `json:"formula,omitempty"`
	// MolarMass in g/mol, computed from Formula with IUPAC standard atomic weights.
	MolarMass float64 `json:"molar_mass"`
	// MolarMassSource is set when the molar mass was given explicitly
	// (no formula) and names where it comes from.
	MolarMassSource *Source `json:"molar_mass_source,omitempty"`
	// Systems, Ions and Neutrals are what one mole releases in water.
	Systems  []SystemShare `json:"systems,omitempty"`
	Ions     []IonShare    `json:"ions,omitempty"`
	Neutrals float64       `json:"neutral_particles,omitempty"`
	// Protons is the number of H+ one mole releases outright as a strong
	// acid (negative: OH− released by a strong base). It is not an ion
	// share: the solver closes the proton balance through the charge
	// balance, so hydrochloric acid lists only Cl− and Protons = 1. It
	// makes the ingredient's charge bookkeeping add up to zero.
	Protons float64 `json:"protons,omitempty"`
	// Density in g/mL of the commercial liquid form (for % w/w stocks), or 0.
	Density *Value `json:"density_g_ml,omitempty"`
	// IntrinsicSolubility of the neutral (un-ionized) form in mol/L, or nil.
	IntrinsicSolubility *Value `json:"intrinsic_solubility_mol_l,omitempty"`
	// PI is the isoelectric point, or nil.
	PI *Value `json:"pi,omitempty"`
	// Preservative, when set, is the minimum un-ionized fraction the
	// ingredient needs to act as a preservative.
	Preservative *Value `json:"preservative_min_unionized,omitempty"`
	// Sources lists every reference used by this entry and its systems.
	Sources []Source `json:"sources"`
	// Notes is free text shown by `phgate catalog ID`.
	Notes string `json:"notes,omitempty"`
}

// PeptideGroup is one ionizable group of a peptide or protein sequence.
type PeptideGroup struct {
	// Code is the one-letter residue code ("D", "E", "C", "Y", "H", "K",
	// "R") or "Nterm" / "Cterm" for the chain ends.
	Code string `json:"code"`
	// PKa is the group's pKa.
	PKa Value `json:"pka"`
	// Basic is true for groups that are positive when protonated (N
	// terminus, H, K, R) and false for groups that are neutral when
	// protonated (C terminus, D, E, C, Y).
	Basic bool `json:"basic"`
}

// Pos is where an entry is defined: file, 1-based line and column
// (counted in runes, as in diag.Problem).
type Pos struct {
	Path   string `json:"path"`
	Line   int    `json:"line"`
	Column int    `json:"column"`
}
