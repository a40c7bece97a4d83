// Package solver computes the chemical equilibrium of an aqueous mixture:
// pH, speciation, ionic strength, buffer capacity, osmolarity, saturation
// indices of declared salts, titrations and sensitivities. It is pure
// numerics: it takes plain numbers (a Mixture) and returns a result
// struct (an Equilibrium) or a typed error, and imports none of phgate's
// other packages.
//
// # Units and conventions
//
//   - Amounts are mol/L (or consistently mol/kg of water). The constants
//     are thermodynamic, molality-based values; using molarities in their
//     place is the usual dilute-solution approximation; for dilute
//     solutions the two scales differ by log10 of the water density in
//     kg/L: 0.001 at 25 °C, 0.005 at 50 °C, 0.018 at 100 °C.
//   - Temperatures are °C, valid 0–100 °C as input.
//   - State k of a System (k = 0 fully protonated) has charge
//     TopCharge − k; PKa[k] is the step from state k to state k+1.
//   - pH is −log10 of the hydrogen-ion activity, pH = −log10(γH·[H+]),
//     with γH from the activity model (a single-ion convention: the IUPAC
//     standards use Bates–Guggenheim instead of Davies; at I ≤ 0.1 the two
//     differ by about 0.01).
//
// # Model, equation by equation
//
// Charge balance (electroneutrality), solved for [H+]:
//
//	Σ_strong z·[M]free + Σ_systems Σ_k z_k·[state k] + Σ_complexes z·[ML] + [H+] − [OH−] = 0
//
// Systems carry only totals; how an ingredient entered the mixture is
// carried by its counter-ions (strong ions): 0.025 mol/L Na2HPO4 is
// 0.025 phosphate and 0.05 Na+; HCl is Cl− alone; NaOH is Na+ alone.
//
// Fractions of the free part of a system (log-sum-exp relative to the
// dominant state, so pKa −10…20 and pH −1…15 neither overflow nor
// underflow):
//
//	α_k = β'_k·[H+]^−k / Σ_j β'_j·[H+]^−j,   β'_k = Π_{j≤k} Ka'_j
//
// Conditional constants from the thermodynamic ones and the activity
// coefficients (neutral species have γ = 1):
//
//	Ka'_j = Ka_j·γ(state j−1)/(γH·γ(state j)),   Kw' = Kw/(γH·γOH),   K'(ML) = K·γM·γL/γML
//
// Activity coefficients, Davies equation with coefficient 0.3 (Davies,
// Ion Association, Butterworths 1962, p. 41; 0.2 in the 1938 paper):
//
//	log10 γ = −A(T)·z²·(√I/(1+√I) − 0.3·I)
//
// Ideal gives γ = 1 for comparison. The ionic strength
// I = ½ Σ c·z² runs over every free ion (strong ions, system states,
// complexes, H+, OH−) and is made self-consistent with γ.
//
// Temperature. Every constant is converted once per Solve:
//   - pKa(T): PKaAt, the van 't Hoff equation with constant ΔrCp° in the
//     form of Goldberg, Kishore & Lennen, J. Phys. Chem. Ref. Data 31
//     (2002) 231, θ = 298.15 K, R = 8.314462618 J/(K·mol); valid about
//     274–350 K. A System without DeltaH keeps its 25 °C values.
//   - Kw(T): PKw, Marshall & Franck, J. Phys. Chem. Ref. Data 10 (1981)
//     295, with the water density of Kell, J. Chem. Eng. Data 20 (1975) 97.
//   - A(T): DebyeHuckelA, from first principles,
//     A = e³(2N_Aρ)^½ / (8π·ln10·(ε₀ε_r kT)^{3/2}), CODATA 2018
//     constants, ε_r of Malmberg & Maryott, J. Res. NBS 56 (1956) 1, and
//     Kell's density: 0.5108 at 25 °C, 0.5215 at 37 °C.
//   - Ksp(T) and complex K(T): van 't Hoff with constant ΔH (their
//     DeltaH; 0 means temperature-independent).
//
// Complexes (1:1, metal = a strong ion, ligand = one protonation state of
// a system). At fixed [H+] the free metal [M] and free ligand total L
// satisfy the coupled mass balances
//
//	c_M = [M] + Σ_j K'_j·α_j·[M]·L_j,   C_L = L + Σ_j K'_j·α_j·[M_j]·L,
//
// the stationarity conditions of a strictly convex function of ln[M] and
// ln L. They are solved by Newton's method in log space with a
// backtracking line search on that function, which converges from any
// start; when the Newton matrix is numerically singular (strong binding
// with both partners nearly used up) the function is minimised exactly
// over each complex's metal–ligand pair instead (a closed-form
// quadratic). At most 200 steps; mass balances closed to 1e-13 relative
// (1e-11 if rounding stalls the iteration).
// Equilibrium.Strong[i].Free is the free metal; a ligand system's
// Fractions are over its free (uncomplexed) part, and its Conc are the
// free concentrations of each state.
//
// Salts: SI = log10(IAP/Ksp(T)), the ion activity product from
// activities of the referenced species (free strong ion, system state,
// H+, OH−). Nothing is precipitated: SI > 0 flags a risk. SI is floored
// at SaturationIndexFloor (an absent ion would give −∞).
//
// Osmolarity: the ideal sum of every free particle (strong ions, system
// states, neutrals, complexes, H+, OH−), in osmol/L (no osmotic
// coefficient).
//
// # Buffer capacity (generalised Van Slyke)
//
// Write the charge balance as F(x) with x = ln[H+]. Adding a strong base
// Cb (say Na+) gives F(x) + Cb = 0, so β = dCb/dpH = ln10·dF/dx with γ
// held fixed. Since α_k ∝ e^{−kx}, d(Σ z_k α_k)/dx = Var(k), the variance
// of the number of protons released, hence
//
//	β = ln10·([H+] + [OH−] + Σ_systems C·Var(k))
//
// which for one monoprotic acid is Van Slyke's (1922)
// ln10·(C·Ka·[H+]/(Ka+[H+])² + [H+] + Kw/[H+]). With complexes the free
// metal and ligand adjust along with [H+]; their contribution is
// included exactly (at fixed γ) by the implicit function theorem:
// dF/dx = ∂F/∂x − (∂F/∂y)·J⁻¹·(∂T/∂x), with y the log free
// concentrations, T the mass-balance totals and J = ∂T/∂y. β > 0 always.
//
// # Numerical method
//
//   - Charge balance: F is strictly increasing in x (its derivative is β/ln10
//     > 0), so its root is unique. Newton's method on x is safeguarded by
//     a bracket on the activity scale pH −5…20 that every evaluation
//     tightens, with bisection whenever Newton would leave the bracket or
//     stalls; at most 200 evaluations, stop at a step of 1e-12 in ln[H+].
//   - Ionic strength: a coupled Newton warm-up on (ln[H+], √I) (at most
//     12 steps, no guarantee needed), then the fixed point I = Φ(I) by
//     fixed-point steps until bracketed, then secant steps kept inside the
//     bracket (bisection otherwise); each stage calls the safeguarded
//     charge-balance solve; relative tolerance 1e-12, at most 100 stages.
//   - All iteration counts are bounded; failure gives a *ConvergenceError,
//     never a hang, a panic or a NaN.
//
// # Titration and sensitivity
//
// Titrate: at fixed target pH and fixed γ the charge balance is linear in
// the amount a of a component that forms no complex:
// F0 + a·∂F/∂a = 0. The amount and the ionic strength it produces are
// iterated to self-consistency, then confirmed by a full Solve. When the
// titrant takes part in a complex (or the check fails) the amount is
// found by regula falsi (Illinois) on the solved pH over [0, MaxTitrant].
// A target needing a < 0 or a > MaxTitrant gives *UnreachableError with
// the reachable range.
//
// Sensitivity: dpH/da = (∂F/∂a)/β at the solution, by the implicit
// function theorem, with γ held fixed (the change of γ with the amount is
// neglected: a few per cent for buffers near 0.1 mol/L).
//
// # Validity limits and warnings
//
//   - WarnIonicStrength above I = 0.5 mol/L (Davies is good to about
//     0.1–0.5); a *RangeError above I = 20 mol/L.
//   - WarnTemperature above 60 °C (the checked range of the temperature
//     data), and for systems without DeltaH used more than 5 °C from 25 °C.
//   - Only declared complexes form; no precipitation; ion pairing of the
//     background electrolyte is not modelled.
//
// # Errors
//
// *InputError (Field, Index) for invalid data: negative, NaN or infinite
// amounts or constants, amounts above 100 mol/L, charges beyond ±12,
// decreasing pKa, wrong lengths of DeltaH/DeltaCp/Species, bad
// references, temperatures outside 0–100 °C. *ConvergenceError,
// *RangeError and *UnreachableError as above.
package solver
