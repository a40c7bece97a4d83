package solver

import (
	"errors"
	"math"
	"slices"
)

// MaxTitrant is the largest titrant amount (mol/L) Titrate considers; the
// pH reached with it is the far end of the reachable range.
const MaxTitrant = 5.0

// Titration control.
const (
	// titratePHTol is the accuracy demanded of the titrated pH; the
	// documented contract is 1e-6, this leaves a wide margin. A target
	// this close to the mixture's own pH needs no titrant: the amount is
	// exactly 0 (and rounding of the target cannot make it "unreachable").
	titratePHTol = 1e-8
	// maxTitrateIter bounds the bracketed search on the amount (each step
	// is a full Solve); bisection alone reaches 1e-15 mol/L in ~60.
	maxTitrateIter = 200
	// amountTol is the bracket width on the amount (mol/L) at which the
	// bracketed search stops.
	amountTol = 1e-15
)

// Titration is the result of Titrate.
type Titration struct {
	// Amount is the titrant needed, in mol/L.
	Amount float64
	// Equilibrium is the solved mixture with that amount added.
	Equilibrium *Equilibrium
}

// With returns a copy of m with amount mol/L of c added: for every share,
// Count·amount is added to the strong ion's Conc or the system's Total.
// The Systems and Strong slices are copied, so m is not modified; the
// other slices are shared (With never writes to them). Shares whose Index
// is out of range are skipped; Titrate and Sensitivity report them as an
// *InputError instead.
func (m Mixture) With(c Component, amount float64) Mixture {
	m.Systems = slices.Clone(m.Systems)
	m.Strong = slices.Clone(m.Strong)
	for _, s := range c.StrongPerUnit {
		if s.Index >= 0 && s.Index < len(m.Strong) {
			m.Strong[s.Index].Conc += s.Count * amount
		}
	}
	for _, s := range c.SystemPerUnit {
		if s.Index >= 0 && s.Index < len(m.Systems) {
			m.Systems[s.Index].Total += s.Count * amount
		}
	}
	return m
}

// Titrate finds the amount (mol/L, ≥ 0) of component t that brings m to
// targetPH (activity scale), counting t's own effect on ionic strength.
//
// When no complex involves t, the charge balance at a fixed pH and fixed
// activity coefficients is linear in the amount, so Titrate iterates
// {γ from I → [H+] from the target → amount from the linear charge
// balance → I of that solution} to self-consistency, then confirms with a
// Solve. Otherwise (or if that check fails) it searches the amount in
// [0, MaxTitrant] by bracketed regula falsi (Illinois variant) on pH.
// A target that needs a negative amount or more than MaxTitrant (less if
// that much titrant would take the mixture beyond the model, see
// RangeError) gives an *UnreachableError carrying the reachable range.
func Titrate(m Mixture, t Component, targetPH float64) (*Titration, error) {
	if !finite(targetPH) {
		return nil, &InputError{"Target", -1, "target pH is not a finite number"}
	}
	if err := validate(&m); err != nil {
		return nil, err
	}
	if err := validateComponent(&m, &t); err != nil {
		return nil, err
	}
	eq0, err := Solve(m)
	if err != nil {
		return nil, err
	}
	if math.Abs(eq0.PH-targetPH) <= titratePHTol {
		return &Titration{Amount: 0, Equilibrium: eq0}, nil
	}
	if !touchesComplex(&m, &t) {
		// A failure of the fast path is not final: the bracketed search
		// below needs nothing from it. Nor is a linear amount outside
		// [0, MaxTitrant]: far beyond Davies' range (I of several mol/L)
		// the pH need not be monotonic in the amount, so that root can lie
		// outside while another lies inside. The bracketed search decides,
		// and reports the range when the target is outside it.
		amount, ok, err := titrateLinear(&m, &t, targetPH)
		if err == nil && ok && amount >= 0 && amount <= MaxTitrant {
			eq, err := Solve(m.With(t, amount))
			if err == nil && math.Abs(eq.PH-targetPH) <= titratePHTol {
				return &Titration{Amount: amount, Equilibrium: eq}, nil
			}
		}
	}
	return titrateBracketed(m, t, targetPH, eq0.PH)
}

// touchesComplex reports whether a share of t feeds a metal or a ligand
// system of an active or potential complex, which makes the charge
// balance non-linear in the amount.
func touchesComplex(m *Mixture, t *Component) bool {
	for _, c := range m.Complexes {
		for _, s := range t.StrongPerUnit {
			if s.Index == c.Metal && s.Count != 0 {
				return true
			}
		}
		for _, s := range t.SystemPerUnit {
			if s.Index == c.Ligand.Index && s.Count != 0 {
				return true
			}
		}
	}
	return false
}

// titrateLinear solves for the amount at the target pH by the linear
// charge balance with the ionic strength iterated to self-consistency.
// ok is false when the titrant does not change the charge balance.
func titrateLinear(m *Mixture, t *Component, targetPH float64) (amount float64, ok bool, err error) {
	md := newModel(m)
	defer md.release()
	var slope, ionicSlope float64
	solveAt := func(ionic float64) (float64, error) {
		md.setIonicStrength(ionic)
		x := md.xOfPH(targetPH)
		f, _, err := md.evalCharge(x)
		if err != nil {
			return 0, err
		}
		slope, ionicSlope = md.chargeSlope(t), ionicSlopeOf(md, t)
		if slope == 0 {
			return 0, nil
		}
		amount = -f / slope
		return math.Max(md.ionicStrength(x)+amount*ionicSlope, 0), nil
	}
	if md.activity == Ideal {
		_, err = solveAt(0)
	} else {
		_, err = fixedPoint(md.ionicGuess(), solveAt)
	}
	return amount, slope != 0, err
}

// ionicSlopeOf returns ∂I/∂amount of component t at the model's current
// speciation, for shares that form no complex.
func ionicSlopeOf(md *model, t *Component) float64 {
	ionic := 0.0
	for _, s := range t.StrongPerUnit {
		z := float64(md.strong[s.Index].charge)
		ionic += s.Count * z * z / 2
	}
	for _, s := range t.SystemPerUnit {
		ionic += s.Count * md.systems[s.Index].meanZ2() / 2
	}
	return ionic
}

// maxFarEndHalvings bounds the search for a far end of the titration
// range that the model can still solve (5 mol/L · 2^−30 ≈ 5 nmol/L).
const maxFarEndHalvings = 30

// farEnd solves m with the largest amount of t, starting at MaxTitrant
// and halving while the result lies beyond the model (*RangeError: a
// concentrated mixture plus 5 mol/L of titrant can exceed I = 20 mol/L).
func farEnd(m Mixture, t Component) (float64, *Equilibrium, error) {
	amount := MaxTitrant
	for range maxFarEndHalvings {
		eq, err := Solve(m.With(t, amount))
		var re *RangeError
		if !errors.As(err, &re) {
			return amount, eq, err
		}
		amount /= 2
	}
	return 0, nil, &RangeError{Quantity: "titrant amount", Value: amount, Limit: MaxTitrant}
}

// titrateBracketed searches the amount in [0, far end] for which the
// solved pH equals the target, by regula falsi with the Illinois
// modification (guaranteed convergence on a sign change).
func titrateBracketed(m Mixture, t Component, targetPH, ph0 float64) (*Titration, error) {
	hi, eqMax, err := farEnd(m, t)
	if err != nil {
		return nil, err
	}
	lo := 0.0
	flo, fhi := ph0-targetPH, eqMax.PH-targetPH
	if flo*fhi > 0 {
		return nil, rangeError(t, targetPH, ph0, eqMax.PH, hi)
	}
	side := 0
	for it := 0; it < maxTitrateIter; it++ {
		a := (lo*fhi - hi*flo) / (fhi - flo)
		if !(a > lo && a < hi) {
			a = lo + (hi-lo)/2
		}
		eq, err := Solve(m.With(t, a))
		if err != nil {
			return nil, err
		}
		f := eq.PH - targetPH
		if math.Abs(f) <= titratePHTol || hi-lo <= amountTol {
			return &Titration{Amount: a, Equilibrium: eq}, nil
		}
		if (f < 0) == (flo < 0) {
			lo, flo = a, f
			if side == -1 {
				fhi /= 2
			}
			side = -1
		} else {
			hi, fhi = a, f
			if side == 1 {
				flo /= 2
			}
			side = 1
		}
	}
	return nil, &ConvergenceError{Stage: "titration", Iterations: maxTitrateIter, Residual: hi - lo}
}

func rangeError(t Component, target, ph0, phFar, amount float64) error {
	return &UnreachableError{Target: target, MinPH: math.Min(ph0, phFar), MaxPH: math.Max(ph0, phFar), Component: t.Name, MaxAmount: amount}
}
