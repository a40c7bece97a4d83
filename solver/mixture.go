package solver

// ActivityModel selects how activity coefficients are computed.
type ActivityModel int

const (
	// Davies uses the Davies equation (coefficient 0.3) with the
	// temperature-dependent Debye–Hückel A; it is the zero value and default.
	Davies ActivityModel = iota
	// Ideal sets every activity coefficient to 1 (for comparison).
	Ideal
)

// String returns the model's name as used in reports ("davies", "ideal").
func (m ActivityModel) String() string {
	switch m {
	case Davies:
		return "davies"
	case Ideal:
		return "ideal"
	}
	return "unknown"
}

// Title returns the model's name as written in prose ("Davies", "ideal").
func (m ActivityModel) Title() string {
	if m == Davies {
		return "Davies"
	}
	return m.String()
}

// System is one acid–base system (a weak acid or base and all its
// protonation states), e.g. phosphate: H3PO4, H2PO4−, HPO4²−, PO4³−.
type System struct {
	// Name identifies the system in results and errors (e.g. "phosphate").
	Name string
	// Total is the analytical concentration of the system, all protonation
	// states together, in mol/L (or mol/kg of water on a molal basis).
	Total float64
	// TopCharge is the charge of the fully protonated form (H3PO4: 0,
	// TrisH+: +1, glycine as H2Gly+: +1). State k has charge TopCharge − k.
	TopCharge int
	// PKa holds the stepwise acid dissociation constants at 25 °C on the
	// thermodynamic (infinite dilution) scale, first step first; they must
	// be non-decreasing.
	PKa []float64
	// DeltaH is the standard enthalpy of each ionization step in J/mol
	// (same length as PKa, or nil for temperature-independent constants).
	DeltaH []float64
	// DeltaCp is the standard heat-capacity change of each step in
	// J/(K·mol) (same length as PKa, or nil when unknown).
	DeltaCp []float64
	// Species labels each protonation state, most protonated first
	// (len(PKa)+1 labels), or nil for generated labels.
	Species []string
}

// StrongIon is a fully dissociated ion (Na+, Cl−, Ca²+ ...).
type StrongIon struct {
	// Name identifies the ion (e.g. "Na+").
	Name string
	// Conc is its analytical concentration in mol/L (or mol/kg).
	Conc float64
	// Charge is its signed charge number.
	Charge int
}

// Neutral is a non-ionizing solute that counts only for osmolarity.
type Neutral struct {
	// Name identifies the solute (e.g. "sucrose").
	Name string
	// Conc is its concentration in mol/L (or mol/kg).
	Conc float64
}

// RefKind says what kind of dissolved species a Ref points at.
type RefKind int

const (
	// RefStrong points at Mixture.Strong[Index] (its free concentration,
	// after complexation).
	RefStrong RefKind = iota
	// RefSpecies points at protonation state Species of Mixture.Systems[Index].
	RefSpecies
	// RefHydrogen is H+ (Index unused).
	RefHydrogen
	// RefHydroxide is OH− (Index unused).
	RefHydroxide
)

// Ref names one dissolved species of a mixture.
type Ref struct {
	// Kind says what Index points at.
	Kind RefKind
	// Index is the index into Mixture.Strong or Mixture.Systems.
	Index int
	// Species is the protonation state for RefSpecies: 0 is the fully
	// protonated form, len(PKa) the fully deprotonated one.
	Species int
}

// SaltTerm is one ion of a sparingly soluble salt with its stoichiometric
// coefficient, e.g. Ca²+ ×3 in Ca3(PO4)2.
type SaltTerm struct {
	// Ion is the dissolved species.
	Ion Ref
	// Count is its stoichiometric coefficient (positive).
	Count int
}

// Salt is a sparingly soluble solid whose saturation index is reported.
// Salts are not removed from solution: the solver reports the risk, it does
// not precipitate anything.
type Salt struct {
	// Name identifies the solid (e.g. "CaHPO4·2H2O (brushite)").
	Name string
	// Terms are the ions of its dissolution reaction.
	Terms []SaltTerm
	// PKsp is −log10 Ksp at 25 °C (activity-based, infinite dilution).
	PKsp float64
	// DeltaH is the standard dissolution enthalpy in J/mol (0 if unknown).
	DeltaH float64
}

// Complex is a 1:1 metal–ligand complex M + L ⇌ ML whose formation takes
// free ions out of solution (e.g. Ca²+ + Cit³− ⇌ CaCit−).
type Complex struct {
	// Name identifies the complex (e.g. "CaCit-").
	Name string
	// Metal is the index into Mixture.Strong of the metal ion.
	Metal int
	// Ligand points at a protonation state of a system (Kind RefSpecies).
	Ligand Ref
	// LogK is log10 of the formation constant at 25 °C, infinite dilution.
	LogK float64
	// DeltaH is the standard formation enthalpy in J/mol (0 if unknown).
	DeltaH float64
}

// Mixture is a complete aqueous solution to solve.
type Mixture struct {
	// Systems are the weak acid–base systems (totals only).
	Systems []System
	// Strong are the fully dissociated ions, including the counter-ions
	// that say how each ingredient entered the solution.
	Strong []StrongIon
	// Neutrals count only for osmolarity.
	Neutrals []Neutral
	// Salts are the solids whose saturation index is reported.
	Salts []Salt
	// Complexes are the 1:1 complexes allowed to form.
	Complexes []Complex
	// TemperatureC is the temperature in °C (valid 0–100).
	TemperatureC float64
	// Activity is the activity model (zero value: Davies).
	Activity ActivityModel
}

// Component is something that can be added to a mixture in a variable
// amount: a titrant, or an ingredient whose weighing tolerance matters.
// One unit of the component (1 mol/L) adds StrongPerUnit[k].Count mol/L to
// Mixture.Strong[StrongPerUnit[k].Index] and SystemPerUnit[k].Count mol/L
// to the Total of Mixture.Systems[SystemPerUnit[k].Index]. A system or
// strong ion that the mixture does not yet contain is included by the
// caller with a zero concentration.
type Component struct {
	// Name identifies the component in results and errors.
	Name string
	// StrongPerUnit lists the strong ions one unit adds.
	StrongPerUnit []Share
	// SystemPerUnit lists the system totals one unit adds.
	SystemPerUnit []Share
}

// Share is an amount of one mixture entry per unit of a Component.
type Share struct {
	// Index is the position in Mixture.Strong or Mixture.Systems.
	Index int
	// Count is the amount (mol) per mol of the component.
	Count float64
}
