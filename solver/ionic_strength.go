package solver

import "math"

// Ionic-strength iteration. The activity coefficients depend on I, and I
// on the speciation, so I is the fixed point of Φ(I) = I(speciation at
// γ(I)). It is found as the root of g(I) = Φ(I) − I: plain fixed-point
// steps until a sign change brackets the root, then secant steps kept
// inside the bracket (bisection when the secant leaves it). Because Φ
// varies slowly with I, this usually converges in 3–5 charge-balance solves.

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
		q := 0.0
		for k, a := range s.alpha {
			z := float64(s.top - k)
			q += z * z * a
		}
		sum += s.free * q
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
	ionic, err = fixedPoint(md.ionicGuess(), func(i float64) (float64, error) {
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
