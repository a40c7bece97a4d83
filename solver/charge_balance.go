package solver

import "math"

// The charge balance, as a function of x = ln[H+] (concentration):
//
//	F(x) = Σ_strong z·[M]free + Σ_s L_s·Σ_k z_k α_k + Σ_j z_j [ML_j] + [H+] − Kw'/[H+]
//
// F is strictly increasing in x: F differs from the total proton count by
// a constant, and its derivative is [H+] + [OH−] plus a variance (without
// complexes) or a Schur complement of the positive definite complexation
// Jacobian (with them), so the root is unique.

// Root-finding control of the charge balance.
const (
	// bracketLowPH and bracketHighPH bound the search on the activity pH
	// scale. They are wider than the −1…15 range the solver is specified
	// for, so that a root near those limits is never clipped.
	bracketLowPH  = -5
	bracketHighPH = 20
	// chargeXTol is the Newton step in ln[H+] below which the root is
	// accepted: it is a pH error of 4e-13, far below any measurement.
	chargeXTol = 1e-12
	// maxChargeIter bounds the safeguarded Newton iterations; bisection
	// alone would need about 60 to reach chargeXTol from the bracket.
	maxChargeIter = 200
	// startPH is the cold-start guess.
	startPH = 7
)

// xOfPH converts an activity pH to x = ln[H+] at the current γ:
// pH = −log10(γH·[H+]).
func (md *model) xOfPH(ph float64) float64 { return -ph*math.Ln10 - md.lnG }

// phOfX is the inverse of xOfPH.
func (md *model) phOfX(x float64) float64 { return -(x + md.lnG) / math.Ln10 }

// evalCharge evaluates F and dF/dx at x and leaves the speciation of x in
// the model. dF/dx is the exact derivative at fixed activity coefficients.
func (md *model) evalCharge(x float64) (f, df float64, err error) {
	for i := range md.systems {
		s := &md.systems[i]
		s.eval(x, s.slot >= 0)
	}
	if md.inner.p > 0 {
		if err := md.inner.solve(md, x); err != nil {
			return 0, 0, err
		}
	}
	h := math.Exp(x)
	oh := math.Exp(md.lnKw - x)
	f = md.fixedCharge + h - oh
	df = h + oh
	for i := range md.strong {
		if ion := &md.strong[i]; ion.slot >= 0 {
			f += float64(ion.charge) * ion.free
		}
	}
	for i := range md.systems {
		s := &md.systems[i]
		f += s.free * (float64(s.top) - s.kbar)
		// d(mean charge)/dx = Var(k): the generalised Van Slyke term.
		df += s.free * s.kvar
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		if c.active {
			shift := md.systems[c.sys].kbar - float64(c.state) // ∂ln α_k/∂x
			f += float64(c.charge) * c.conc
			df += float64(c.charge) * c.conc * shift
		}
	}
	if md.inner.p > 0 {
		df -= md.complexCorrection(x)
	}
	md.df = df
	return f, df, nil
}

// complexCorrection returns wᵀ·∂T/∂x with J w = ∂F/∂y: the part of dF/dx
// that comes from the free metal and ligand concentrations adjusting to
// keep their mass balances (implicit function theorem). It leaves w in
// md.inner.w, where w_r = ∂F/∂(total of slot r) at fixed x, and the
// tangent dy/dx = −J⁻¹·∂T/∂x for the next warm start.
func (md *model) complexCorrection(x float64) float64 {
	in := &md.inner
	for r := 0; r < in.p; r++ {
		in.dTdx[r] = 0
		if i := in.metal[r]; i >= 0 {
			in.dFdy[r] = float64(md.strong[i].charge) * md.strong[i].free
		} else {
			s := &md.systems[in.sys[r]]
			in.dFdy[r] = s.free * (float64(s.top) - s.kbar)
		}
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		if !c.active {
			continue
		}
		rm, rs := slots(md, c)
		zc := float64(c.charge) * c.conc
		in.dFdy[rm] += zc
		in.dFdy[rs] += zc
		dt := c.conc * (md.systems[c.sys].kbar - float64(c.state))
		in.dTdx[rm] += dt
		in.dTdx[rs] += dt
	}
	if !in.factor(md) {
		// J is positive definite in exact arithmetic; a failed factor
		// means the complexes are negligible against rounding, and so is
		// their correction.
		clear(in.w)
		return 0
	}
	copy(in.w, in.dFdy)
	in.cholSolve(in.w)
	for r, v := range in.dTdx {
		in.dydx[r] = -v
	}
	in.cholSolve(in.dydx)
	in.xLast, in.havePredic = x, true
	corr := 0.0
	for r, w := range in.w {
		corr += w * in.dTdx[r]
	}
	return corr
}

// solveCharge finds the root of the charge balance at the current
// activity coefficients by Newton's method on x = ln[H+], safeguarded by a
// bracket that every evaluation tightens (F is monotone) and bisection
// whenever Newton would leave it or stalls. It returns the root and the
// number of evaluations; the model holds the speciation at the root.
func (md *model) solveCharge(x0 float64) (float64, int, error) {
	lo, hi := md.xOfPH(bracketHighPH), md.xOfPH(bracketLowPH)
	x := x0
	if !(x > lo && x < hi) {
		x = md.xOfPH(startPH)
	}
	dxOld := hi - lo
	negSeen, posSeen := false, false
	var f float64
	for it := 1; it <= maxChargeIter; it++ {
		var df float64
		var err error
		f, df, err = md.evalCharge(x)
		if err != nil {
			return x, it, err
		}
		if !finite(f) || !finite(df) {
			return x, it, &ConvergenceError{Stage: "charge balance", Iterations: it, Residual: f}
		}
		if f == 0 {
			return x, it, nil
		}
		if f < 0 {
			lo, negSeen = x, true
		} else {
			hi, posSeen = x, true
		}
		step := f / df
		if math.Abs(step) <= chargeXTol {
			return x, it, nil
		}
		if hi-lo <= chargeXTol {
			if negSeen && posSeen {
				return x, it, nil
			}
			// The bracket collapsed onto one of its ends: the root lies
			// outside bracketLowPH…bracketHighPH.
			return x, it, &ConvergenceError{Stage: "charge balance (pH outside the search range)", Iterations: it, Residual: f}
		}
		next := x - step
		if !(next > lo && next < hi) || math.Abs(2*step) > math.Abs(dxOld) {
			next = lo + (hi-lo)/2
		}
		dxOld = next - x
		x = next
	}
	return x, maxChargeIter, &ConvergenceError{Stage: "charge balance", Iterations: maxChargeIter, Residual: f}
}
