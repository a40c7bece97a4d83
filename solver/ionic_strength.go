package solver

import "math"

// Ionic-strength iteration. The activity coefficients depend on I, and I
// on the speciation, so I is the fixed point of Φ(I) = I(speciation at
// γ(I)). It is found as the root of g(I) = Φ(I) − I: plain fixed-point
// steps until a sign change brackets the root, then secant steps kept
// inside the bracket (bisection when the secant leaves it). Φ varies
// slowly with I, so from a cold start this takes 3–5 charge-balance
// solves; after the coupled warm-up of solveSelfConsistent it usually
// only confirms, in one.

// Convergence control of the ionic-strength iteration.
const (
	// ionicRelTol is the relative self-consistency accepted for I; at
	// this level γ is exact to ~1e-12, far below the model's own error.
	ionicRelTol = 1e-12
	// ionicAbsTol guards the relative test in nearly pure water.
	ionicAbsTol = 1e-16
	// maxIonicIter bounds the outer iterations.
	maxIonicIter = 100
	// maxIonicStrength (mol/L) is where the model stops: the Davies
	// equation is meaningless long before, and beyond it activity
	// coefficients of multiply charged ions overflow.
	maxIonicStrength = 20
)

// ionicStrength returns I = ½ Σ c z² over every free ion of the current
// speciation, H+ and OH− included, given x = ln[H+].
func (md *model) ionicStrength(x float64) float64 {
	sum := math.Exp(x) + math.Exp(md.lnKw-x)
	for i := range md.strong {
		z := float64(md.strong[i].charge)
		sum += z * z * md.strong[i].free
	}
	for i := range md.systems {
		s := &md.systems[i]
		if s.free == 0 {
			continue
		}
		sum += s.free * s.meanZ2()
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		z := float64(c.charge)
		sum += z * z * c.conc
	}
	return sum / 2
}

// ionicGuess starts the iteration from the strong ions' contribution.
func (md *model) ionicGuess() float64 {
	sum := 0.0
	for i := range md.strong {
		z := float64(md.strong[i].charge)
		sum += z * z * md.strong[i].conc
	}
	return sum / 2
}

// fixedPoint solves I = phi(I) for I ≥ 0 starting at i0 as described
// above; phi must leave the model in the state of its argument. It returns
// the converged I.
func fixedPoint(i0 float64, phi func(float64) (float64, error)) (float64, error) {
	cur := math.Max(i0, 0)
	lo, hi := 0.0, math.Inf(1)
	var prevI, prevG float64
	havePrev := false
	g := 0.0
	for it := 0; it < maxIonicIter; it++ {
		next, err := phi(cur)
		if err != nil {
			return cur, err
		}
		g = next - cur
		if math.Abs(g) <= ionicRelTol*next+ionicAbsTol {
			return cur, nil
		}
		if g > 0 {
			lo = math.Max(lo, cur)
		} else {
			hi = math.Min(hi, cur)
		}
		if havePrev && g != prevG {
			next = cur - g*(cur-prevI)/(g-prevG)
		}
		if next < lo || next > hi || !finite(next) {
			if math.IsInf(hi, 1) {
				next = cur + g
			} else {
				next = lo + (hi-lo)/2
			}
		}
		prevI, prevG, havePrev = cur, g, true
		cur = next
	}
	return cur, &ConvergenceError{Stage: "ionic strength", Iterations: maxIonicIter, Residual: g}
}

// solveSelfConsistent solves the charge balance with self-consistent
// activity coefficients and returns ln[H+], I and the number of
// charge-balance evaluations.
//
// A coupled Newton iteration on (ln[H+], √I) first brings both close to
// the solution (it converges quadratically but carries no guarantee); the
// safeguarded fixed-point iteration with its bracketed charge-balance
// solves then confirms or finishes the job, usually in one evaluation.
func (md *model) solveSelfConsistent() (x, ionic float64, iters int, err error) {
	x = md.xOfPH(startPH)
	if md.activity == Ideal {
		md.setIonicStrength(0)
		x, iters, err = md.solveCharge(x)
		if err == nil {
			ionic = md.ionicStrength(x)
			if ionic > maxIonicStrength {
				err = &RangeError{Quantity: "ionic strength", Value: ionic, Limit: maxIonicStrength}
			}
		}
		return x, ionic, iters, err
	}
	x, ionic, iters = md.coupledNewton(x, md.ionicGuess())
	ionic, err = fixedPoint(ionic, func(i float64) (float64, error) {
		md.setIonicStrength(i)
		var n int
		var err error
		x, n, err = md.solveCharge(x)
		iters += n
		next := md.ionicStrength(x)
		if err == nil && next > maxIonicStrength {
			err = &RangeError{Quantity: "ionic strength", Value: next, Limit: maxIonicStrength}
		}
		return next, err
	})
	return x, ionic, iters, err
}

// Control of the coupled warm-up.
const (
	// maxCoupledSteps bounds the warm-up; it is only a starting point.
	maxCoupledSteps = 12
	// coupledTol ends the warm-up when the last step in ln[H+] and the
	// relative step in √I are this small: quadratic convergence makes
	// the next point exact to rounding.
	coupledTol = 1e-7
	// maxCoupledStep caps a step in ln[H+] (one pH unit) and the relative
	// change of √I, so that a poor start cannot throw the iterate away.
	maxCoupledStep = math.Ln10
)

// coupledNewton runs Newton's method on r1 = F(x, lnγ₁(I)) and
// r2 = Φ(x, I) − I with s = √I as unknown (lnγ₁ is smooth in √I, not in
// I, at I = 0). The Jacobian leaves out the complexation terms of the
// γ-derivatives, which slows convergence only when complexes dominate.
// It returns its last (x, I) and the evaluations used; if anything goes
// wrong it returns the start.
func (md *model) coupledNewton(x0, i0 float64) (x, ionic float64, iters int) {
	x, s := x0, math.Sqrt(i0)
	for k := 0; k < maxCoupledSteps; k++ {
		md.setIonicStrength(s * s)
		f, fx, err := md.evalCharge(x)
		iters++
		if err != nil || !finite(f) || !(fx > 0) {
			return x0, i0, iters
		}
		fL, phiX, phiL := md.ionicDerivatives(x)
		// dlnγ₁/ds for Davies: −ln10·A·(1/(1+s)² − 0.6 s).
		ls := -math.Ln10 * md.dhA * (1/((1+s)*(1+s)) - 2*daviesCoefficient*s)
		r1, r2 := f, md.ionicStrength(x)-s*s
		a, b := fx, fL*ls
		c, d := phiX, phiL*ls-2*s
		det := a*d - b*c
		if !(math.Abs(det) > 0) || !finite(det) {
			return x0, i0, iters
		}
		dx := -(r1*d - b*r2) / det
		ds := -(a*r2 - c*r1) / det
		dx = math.Max(-maxCoupledStep, math.Min(maxCoupledStep, dx))
		ds = math.Max(-0.5*s, math.Min(ds, s+1))
		x, s = x+dx, s+ds
		if !finite(x) || !finite(s) || s*s > maxIonicStrength {
			return x0, i0, iters
		}
		if math.Abs(dx) <= coupledTol && math.Abs(ds) <= coupledTol*s {
			break
		}
	}
	return x, s * s, iters
}

// ionicDerivatives returns, at fixed x and from the current speciation
// (complexation terms left out), ∂F/∂lnγ₁, ∂Φ/∂x and ∂Φ/∂lnγ₁ where Φ is
// the ionic strength. ln β'_k moves by c_k = z₀² − z_k² − k per unit of
// lnγ₁ and by −k per unit of x, so each derivative of a fraction-weighted
// mean is a covariance over the states.
func (md *model) ionicDerivatives(x float64) (fL, phiX, phiL float64) {
	h, oh := math.Exp(x), math.Exp(md.lnKw-x)
	fL = 2 * oh
	phiX = (h - oh) / 2
	phiL = -oh
	for i := range md.systems {
		sm := &md.systems[i]
		if sm.free == 0 {
			continue
		}
		z0 := float64(sm.top * sm.top)
		var kbar, zbar, cbar, z2, z2k, z2c, zc float64
		for k, a := range sm.alpha {
			z := float64(sm.top - k)
			c := z0 - z*z - float64(k)
			kbar += a * float64(k)
			zbar += a * z
			cbar += a * c
			z2 += a * z * z
			z2k += a * z * z * float64(k)
			z2c += a * z * z * c
			zc += a * z * c
		}
		fL += sm.free * (zc - zbar*cbar)
		phiX -= sm.free * (z2k - z2*kbar) / 2
		phiL += sm.free * (z2c - z2*cbar) / 2
	}
	return fL, phiX, phiL
}

// meanZ2 returns Σ α_k z_k², the mean squared charge of the free system.
func (s *sysModel) meanZ2() float64 {
	q := 0.0
	for k, a := range s.alpha {
		z := float64(s.top - k)
		q += a * z * z
	}
	return q
}
