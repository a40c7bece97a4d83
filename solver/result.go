package solver

// Equilibrium is the solved state of a Mixture. All concentrations are in
// mol/L (or mol/kg of water on a molal basis), matching the input.
type Equilibrium struct {
	// PH is −log10 of the hydrogen-ion activity.
	PH float64
	// H and OH are the free concentrations of H+ and OH−.
	H, OH float64
	// GammaH and GammaOH are their activity coefficients.
	GammaH, GammaOH float64
	// IonicStrength is I = ½ Σ c z², solved self-consistently.
	IonicStrength float64
	// PKw is −log10 Kw at the mixture's temperature.
	PKw float64
	// BufferCapacity is β = dC_base/dpH in mol/L per pH unit, from the
	// analytic derivative of the charge balance (activity coefficients
	// held at their solved values).
	BufferCapacity float64
	// Osmolarity is the ideal osmolarity estimate Σ c of every free
	// dissolved particle, in osmol/L.
	Osmolarity float64
	// Systems holds one result per Mixture.Systems entry, same order.
	Systems []SystemState
	// Strong holds the free concentration of each Mixture.Strong entry
	// after complexation, same order.
	Strong []IonState
	// Salts holds one saturation result per Mixture.Salts entry.
	Salts []SaltState
	// Complexes holds one result per Mixture.Complexes entry.
	Complexes []ComplexState
	// Warnings are conditions a caller should show (e.g. ionic strength
	// beyond the activity model's validity); never fatal.
	Warnings []Warning
	// Iterations is the total number of charge-balance evaluations used.
	Iterations int
}

// SystemState is the speciation of one acid–base system at equilibrium.
type SystemState struct {
	// Name is the system's name.
	Name string
	// PKa are the stepwise constants at the mixture's temperature
	// (thermodynamic, infinite dilution).
	PKa []float64
	// Species are the labels, most protonated first.
	Species []string
	// Conc is the free concentration of each protonation state.
	Conc []float64
	// Fractions is each state's share of the free (uncomplexed) system; sums to 1.
	Fractions []float64
	// Gamma is each state's activity coefficient.
	Gamma []float64
	// Charges is each state's charge.
	Charges []int
	// Dominant is the index of the largest fraction.
	Dominant int
	// MeanCharge is Σ fraction·charge.
	MeanCharge float64
}

// IonState is the free state of one strong ion.
type IonState struct {
	// Name is the ion's name.
	Name string
	// Free is its free (uncomplexed) concentration.
	Free float64
	// Gamma is its activity coefficient.
	Gamma float64
}

// SaltState is the saturation of one declared salt.
type SaltState struct {
	// Name is the salt's name.
	Name string
	// SaturationIndex is log10(IAP/Ksp); above 0 the solution is
	// supersaturated. It is never below SaturationIndexFloor.
	SaturationIndex float64
	// PKsp is −log10 Ksp at the mixture's temperature.
	PKsp float64
}

// ComplexState is the concentration of one metal–ligand complex.
type ComplexState struct {
	// Name is the complex's name.
	Name string
	// Conc is its concentration.
	Conc float64
	// LogK is log10 of the thermodynamic formation constant at the
	// mixture's temperature.
	LogK float64
}

// WarningKind classifies a Warning.
type WarningKind int

const (
	// WarnIonicStrength: ionic strength beyond the activity model's validity.
	WarnIonicStrength WarningKind = iota
	// WarnTemperature: temperature outside the range where the
	// temperature dependence of the constants is validated.
	WarnTemperature
)

// Warning is a non-fatal condition found while solving.
type Warning struct {
	// Kind classifies the warning.
	Kind WarningKind
	// Message is a readable explanation.
	Message string
	// Value is the quantity that triggered it (e.g. the ionic strength).
	Value float64
	// Limit is the threshold it crossed.
	Limit float64
}
