package solver

import "math"

// Physical constants, CODATA 2018 (exact SI values except the permittivity).
const (
	gasConstant        = 8.314462618     // R, J/(K·mol)
	kelvinOffset       = 273.15          // 0 °C in K
	refTempK           = 298.15          // θ of the Goldberg temperature form
	elementaryCharge   = 1.602176634e-19 // e, C
	vacuumPermittivity = 8.8541878128e-12
	boltzmann          = 1.380649e-23 // k, J/K
	avogadro           = 6.02214076e23
)

// PKaAt returns the thermodynamic pK of an ionization step at tempC (°C)
// from its value pKa25 at 25 °C, its standard enthalpy deltaHJ (J/mol) and
// its standard heat-capacity change deltaCpJ (J/(K·mol)).
//
// It is the integrated van 't Hoff equation with a constant ΔrCp°, in the
// form used by Goldberg, Kishore & Lennen, J. Phys. Chem. Ref. Data 31
// (2002) 231, with θ = 298.15 K:
//
//	pK(T) = pK(θ) + ΔrH°/(R ln10)·(1/T − 1/θ) + ΔrCp°/(R ln10)·(1 − θ/T − ln(T/θ))
//
// Goldberg et al. state it holds for about 274–350 K. The same function
// serves any reaction written as a dissociation (pK = −log10 K), such as a
// solubility product with its dissolution enthalpy.
func PKaAt(pKa25, deltaHJ, deltaCpJ, tempC float64) float64 {
	t := tempC + kelvinOffset
	c := 1 / (gasConstant * math.Ln10)
	return pKa25 + deltaHJ*c*(1/t-1/refTempK) + deltaCpJ*c*(1-refTempK/t-math.Log(t/refTempK))
}

// waterDensity returns the density of liquid water at 0.1 MPa in kg/m³,
// from Kell, J. Chem. Eng. Data 20 (1975) 97, valid 0–150 °C.
func waterDensity(tempC float64) float64 {
	t := tempC
	num := 999.83952 + t*(16.945176+t*(-7.9870401e-3+t*(-46.170461e-6+t*(105.56302e-9+t*(-280.54253e-12)))))
	return num / (1 + 16.879850e-3*t)
}

// PKw returns −log10 Kw of water (molality scale) at tempC (°C).
//
// Source: Marshall & Franck, J. Phys. Chem. Ref. Data 10 (1981) 295,
//
//	log10 Kw = A + B/T + C/T² + D/T³ + (E + F/T + G/T²)·log10 ρ
//
// with A = −4.098, B = −3245.2 K, C = 2.2362×10⁵ K², D = −3.984×10⁷ K³,
// E = 13.957, F = −1262.3 K, G = 8.5641×10⁵ K² and ρ the water density in
// g/cm³ (here from Kell 1975 at 0.1 MPa). It reproduces the
// Marshall–Franck table printed in the CRC Handbook within 0.001 for
// 0–60 °C (13.995 at 25 °C).
func PKw(tempC float64) float64 {
	t := tempC + kelvinOffset
	logRho := math.Log10(waterDensity(tempC) / 1000)
	logKw := -4.098 - 3245.2/t + 2.2362e5/(t*t) - 3.984e7/(t*t*t) +
		(13.957-1262.3/t+8.5641e5/(t*t))*logRho
	return -logKw
}

// relativePermittivity returns the dielectric constant of water from
// Malmberg & Maryott, J. Res. Natl. Bur. Stand. 56 (1956) 1, valid 0–100 °C.
func relativePermittivity(tempC float64) float64 {
	t := tempC
	return 87.740 - 0.40008*t + 9.398e-4*t*t - 1.410e-6*t*t*t
}

// DebyeHuckelA returns the Debye–Hückel limiting-law constant A for
// log10 γ on the molality scale, in kg^½ mol^-½, at tempC (°C).
//
// It is computed from first principles rather than fitted:
//
//	A = e³ (2 N_A ρ)^½ / (8π ln10 (ε₀ ε_r k T)^{3/2})
//
// with CODATA 2018 constants, ε_r from Malmberg & Maryott (1956) and ρ
// from Kell (1975). This equals the textbook form
// (2π N_A ρ)^½ (e²/(4π ε₀ ε_r k T))^{3/2} / ln10; it gives 0.5108 at
// 25 °C and 0.5215 at 37 °C.
func DebyeHuckelA(tempC float64) float64 {
	t := tempC + kelvinOffset
	rho := waterDensity(tempC)
	ekt := vacuumPermittivity * relativePermittivity(tempC) * boltzmann * t
	e3 := elementaryCharge * elementaryCharge * elementaryCharge
	return e3 * math.Sqrt(2*avogadro*rho) / (8 * math.Pi * math.Ln10 * ekt * math.Sqrt(ekt))
}

// logKAt converts a formation constant log10 K at 25 °C to tempC with the
// van 't Hoff equation at constant ΔH (no heat-capacity term: the
// catalog carries none for salts and complexes).
func logKAt(logK25, deltaHJ, tempC float64) float64 {
	return -PKaAt(-logK25, deltaHJ, 0, tempC)
}
