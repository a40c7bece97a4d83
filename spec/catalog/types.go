package catalog

// Source names where a number comes from, e.g. "Goldberg, Kishore & Lennen
// 2002, J. Phys. Chem. Ref. Data 31, 231" and whether it was read in the
// source or recalled.
type Source struct {
	// Cite is the bibliographic reference.
	Cite string `yaml:"cite" json:"cite"`
	// Status is "checked" (read in a copy of the source), "from memory"
	// (recalled, not yet checked) or "derived" (computed from other cited values).
	Status string `yaml:"status,omitempty" json:"status,omitempty"`
}

// Value is a number with its source.
type Value struct {
	V      float64 `json:"value"`
	Source Source  `json:"source"`
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
	ID   string `json:"id"`
	Name string `json:"name"`
	// TopCharge is the charge of the fully protonated form.
	TopCharge int `json:"top_charge"`
	// Species labels, most protonated first (len(Steps)+1).
	Species []string `json:"species"`
	Steps   []Step   `json:"steps"`
}

// Ion is a strong (fully dissociated, non-hydrolysing in this model) ion.
type Ion struct {
	ID     string `json:"id"`
	Charge int    `json:"charge"`
	// MolarMass in g/mol computed from its formula.
	MolarMass float64 `json:"molar_mass"`
}

// SpeciesRef points at one dissolved species: a strong ion by id, a
// protonation state of a system ("phosphate" + species label "HPO4-2"),
// or "H+" / "OH-".
type SpeciesRef struct {
	Ion     string `json:"ion,omitempty"`
	System  string `json:"system,omitempty"`
	Species string `json:"species,omitempty"`
}

// SaltTerm is one ion of a salt's dissolution with its count.
type SaltTerm struct {
	Ref   SpeciesRef `json:"ref"`
	Count int        `json:"count"`
}

// Salt is a sparingly soluble solid whose saturation is checked when all
// its ions are present.
type Salt struct {
	ID      string     `json:"id"`
	Name    string     `json:"name"`
	Formula string     `json:"formula"`
	Terms   []SaltTerm `json:"terms"`
	// PKsp is −log10 Ksp at 25 °C.
	PKsp Value `json:"pksp"`
	// DeltaH is the dissolution enthalpy in kJ/mol (nil: unknown).
	DeltaH *Value `json:"delta_h_kj_mol,omitempty"`
}

// Complex is a 1:1 metal–ligand complex.
type Complex struct {
	ID     string     `json:"id"`
	Metal  string     `json:"metal"`
	Ligand SpeciesRef `json:"ligand"`
	// LogK is log10 of the formation constant at 25 °C, infinite dilution.
	LogK   Value  `json:"log_k"`
	DeltaH *Value `json:"delta_h_kj_mol,omitempty"`
}

// SystemShare is an amount of a system released per mole of ingredient,
// entering in the given protonation state.
type SystemShare struct {
	System string  `json:"system"`
	Count  float64 `json:"count"`
	// Species is the label of the protonation state the ingredient brings.
	Species string `json:"species"`
}

// IonShare is an amount of a strong ion released per mole of ingredient.
type IonShare struct {
	Ion   string  `json:"ion"`
	Count float64 `json:"count"`
}

// Ingredient is one catalog entry: something a formulator weighs or pours.
type Ingredient struct {
	ID   string `json:"id"`
	Name string `json:"name"`
	// Formula with hydrate water, e.g. "Na2HPO4·7H2O" (empty for water
	// or when MolarMassOverride is given).
	Formula string `json:"formula,omitempty"`
	// MolarMass in g/mol, computed from Formula with IUPAC standard atomic weights.
	MolarMass float64 `json:"molar_mass"`
	// Systems, Ions and Neutrals are what one mole releases in water.
	Systems  []SystemShare `json:"systems,omitempty"`
	Ions     []IonShare    `json:"ions,omitempty"`
	Neutrals float64       `json:"neutral_particles,omitempty"`
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
