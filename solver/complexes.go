package solver

import "math"

// Complexation at fixed [H+].
//
// For a 1:1 complex ML_j of metal i (a strong ion) and state k of system s,
// [ML_j] = K'_j·[M_i]·α_{s,k}·L_s, where L_s is the free (uncomplexed)
// total of system s and α its fractions. With u_i = ln[M_i] and
// v_s = ln L_s the mass balances
//
//	c_i = e^{u_i} + Σ_{j∋i} [ML_j]      C_s = e^{v_s} + Σ_{j∋s} [ML_j]
//
// are the stationarity conditions of the strictly convex function
//
//	Φ(u,v) = Σ_i e^{u_i} + Σ_s e^{v_s} + Σ_j K'_j α_j e^{u_i+v_s} − Σ c_i u_i − Σ C_s v_s,
//
// so Newton's method with an Armijo backtracking line search on Φ converges
// from any start. When the Newton matrix is numerically singular (both
// partners of a strong complex nearly used up) or no step is accepted, an
// exact minimisation of Φ over each complex's metal–ligand pair (a
// closed-form quadratic) lowers Φ instead and resolves strong binding in
// one sweep. The Hessian of Φ is the Jacobian J = ∂(totals)/∂(u,v), which
// is symmetric positive definite; it is reused for the derivatives of the
// charge balance (implicit function theorem).

// Convergence control of the complexation solve.
const (
	// innerTol is the relative mass-balance error at which the solve
	// stops; it keeps the mass balances closed far below the 1e-10 users
	// check.
	innerTol = 1e-13
	// innerFloorTol is accepted instead when the iteration stalls (the
	// error no longer halves): with nanomolar partners next to molar ones
	// rounding can leave ~1e-13, still well inside 1e-10.
	innerFloorTol = 1e-11
	// maxInnerIter bounds the Newton iterations (each is also a descent
	// step, so the bound is only reached for pathological data).
	maxInnerIter = 200
	// maxBacktrack bounds the step halvings of one line search.
	maxBacktrack = 40
	// maxLogStep caps a Newton step in ln-concentration units so that a
	// trial point cannot overflow exp.
	maxLogStep = 30
	// armijo is the sufficient-decrease fraction of the line search.
	armijo = 1e-4
	// phiRoundoff is the relative rounding allowance when comparing Φ,
	// so that a converged iterate is not refused for noise.
	phiRoundoff = 1e-14
)

// innerSolver solves the complexation mass balances. Unknowns ("slots")
// are the ln free concentrations of the metals and ligand systems that
// take part in at least one active complex.
type innerSolver struct {
	p int
	// metal[r] / sys[r] give the strong-ion or system index of slot r (-1
	// for the other kind).
	metal, sys []int
	total      []float64
	y          []float64
	warm       bool
	// lnA[j] = ln(K'_j α_j), the conditional affinity of complex j.
	lnA []float64
	// Work space: totals, gradient, step, trial point, Jacobian and its
	// Cholesky factor, and the derivative vectors of the charge balance.
	tot, g, d, yTry, jac, chol []float64
	dFdy, dTdx, w              []float64
	// dydx = dy/dx at xLast (from the last derivative evaluation) predicts
	// the start of the next solve when x moves: y ≈ y + dydx·(x − xLast).
	dydx       []float64
	xLast      float64
	havePredic bool
	// buf backs all the vectors above (reused between solves).
	buf []float64
}

func (in *innerSolver) init(md *model) {
	for j := range md.complexes {
		c := &md.complexes[j]
		if !c.active {
			continue
		}
		if md.strong[c.metal].slot < 0 {
			md.strong[c.metal].slot = in.p
			in.metal = append(in.metal, c.metal)
			in.sys = append(in.sys, -1)
			in.total = append(in.total, md.strong[c.metal].conc)
			in.p++
		}
		if md.systems[c.sys].slot < 0 {
			md.systems[c.sys].slot = in.p
			in.metal = append(in.metal, -1)
			in.sys = append(in.sys, c.sys)
			in.total = append(in.total, md.systems[c.sys].total)
			in.p++
		}
	}
	if in.p == 0 {
		return
	}
	p := in.p
	in.buf = resize(in.buf, 9*p+2*p*p+len(md.complexes))
	buf := in.buf
	take := func(n int) []float64 { s := buf[:n:n]; buf = buf[n:]; return s }
	in.y, in.tot, in.g, in.d, in.yTry = take(p), take(p), take(p), take(p), take(p)
	in.dFdy, in.dTdx, in.w, in.dydx = take(p), take(p), take(p), take(p)
	in.jac, in.chol = take(p*p), take(p*p)
	in.lnA = take(len(md.complexes))
}

// slots returns the metal and ligand slots of complex c.
func slots(md *model, c *complexModel) (int, int) {
	return md.strong[c.metal].slot, md.systems[c.sys].slot
}

// phi evaluates Φ at y.
func (in *innerSolver) phi(md *model, y []float64) float64 {
	f := 0.0
	for r, v := range y {
		f += math.Exp(v) - in.total[r]*v
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		if c.active {
			rm, rs := slots(md, c)
			f += math.Exp(in.lnA[j] + y[rm] + y[rs])
		}
	}
	return f
}

// totals fills in.tot and the complex concentrations at in.y and returns
// the largest relative mass-balance error.
func (in *innerSolver) totals(md *model) float64 {
	for r, v := range in.y {
		in.tot[r] = math.Exp(v)
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		if !c.active {
			continue
		}
		rm, rs := slots(md, c)
		c.conc = math.Exp(in.lnA[j] + in.y[rm] + in.y[rs])
		in.tot[rm] += c.conc
		in.tot[rs] += c.conc
	}
	worst := 0.0
	for r, t := range in.tot {
		in.g[r] = t - in.total[r]
		worst = math.Max(worst, math.Abs(in.g[r])/in.total[r])
	}
	return worst
}

// factor builds J at the current complex concentrations and factors it
// (Cholesky, in.chol); false if rounding made it numerically singular.
func (in *innerSolver) factor(md *model) bool {
	p := in.p
	clear(in.jac)
	for r := 0; r < p; r++ {
		in.jac[r*p+r] = in.tot[r]
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		if c.active {
			rm, rs := slots(md, c)
			in.jac[rm*p+rs] += c.conc
			in.jac[rs*p+rm] += c.conc
		}
	}
	copy(in.chol, in.jac)
	a := in.chol
	for k := 0; k < p; k++ {
		d := a[k*p+k]
		for m := 0; m < k; m++ {
			d -= a[k*p+m] * a[k*p+m]
		}
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		a[k*p+k] = d
		for i := k + 1; i < p; i++ {
			s := a[i*p+k]
			for m := 0; m < k; m++ {
				s -= a[i*p+m] * a[k*p+m]
			}
			a[i*p+k] = s / d
		}
	}
	return true
}

// cholSolve solves J x = b in place with the factor from factor.
func (in *innerSolver) cholSolve(b []float64) {
	p, a := in.p, in.chol
	for i := 0; i < p; i++ {
		s := b[i]
		for m := 0; m < i; m++ {
			s -= a[i*p+m] * b[m]
		}
		b[i] = s / a[i*p+i]
	}
	for i := p - 1; i >= 0; i-- {
		s := b[i]
		for m := i + 1; m < p; m++ {
			s -= a[m*p+i] * b[m]
		}
		b[i] = s / a[i*p+i]
	}
}

// pairSweep minimises Φ exactly over the (metal, ligand) pair of each
// active complex in turn, the other partners held fixed. Each is an exact
// block minimisation of a convex function, so Φ never increases; and a
// pair that dominates its partners' chemistry (strong binding, where the
// Newton matrix is numerically singular) is solved in one step.
func (in *innerSolver) pairSweep(md *model) {
	for j := range md.complexes {
		if md.complexes[j].active {
			in.pairStep(md, j)
		}
	}
}

// pairStep solves, for the pair (M, L) of complex j,
//
//	M·(p + a·L) = c_M,   L·(q + a·M) = C_L
//
// where a sums K'α over the complexes of this very pair and p − 1, q − 1
// are the (fixed) complexation of M and L by other partners.
func (in *innerSolver) pairStep(md *model, j int) {
	rm, rs := slots(md, &md.complexes[j])
	a, p, q := 0.0, 1.0, 1.0
	for k := range md.complexes {
		c := &md.complexes[k]
		if !c.active {
			continue
		}
		km, ks := slots(md, c)
		switch {
		case km == rm && ks == rs:
			a += math.Exp(in.lnA[k])
		case km == rm:
			p += math.Exp(in.lnA[k] + in.y[ks])
		case ks == rs:
			q += math.Exp(in.lnA[k] + in.y[km])
		}
	}
	m := pairRoot(in.total[rm], in.total[rs], p, q, a)
	l := pairRoot(in.total[rs], in.total[rm], q, p, a)
	if m > 0 && l > 0 && finite(m) && finite(l) && finite(a) && finite(p) && finite(q) {
		in.y[rm], in.y[rs] = math.Log(m), math.Log(l)
		return
	}
	// Constants beyond the floating-point range (K'α > 1e308): minimise
	// over each partner alone, in logarithms, which is always representable.
	in.scaleSlot(md, rm)
	in.scaleSlot(md, rs)
}

// scaleSlot minimises Φ exactly over slot r alone:
// ln free_r = ln total_r − ln(1 + Σ_k K'_k α_k·partner_k), computed as a
// log-sum-exp so that it cannot overflow.
func (in *innerSolver) scaleSlot(md *model, r int) {
	top := 0.0
	for k := range md.complexes {
		if t, ok := in.partnerLog(md, k, r); ok {
			top = math.Max(top, t)
		}
	}
	sum := math.Exp(-top)
	for k := range md.complexes {
		if t, ok := in.partnerLog(md, k, r); ok {
			sum += math.Exp(t - top)
		}
	}
	in.y[r] = math.Log(in.total[r]) - top - math.Log(sum)
}

// partnerLog returns ln(K'_k α_k · partner) for complex k if it is active
// and involves slot r.
func (in *innerSolver) partnerLog(md *model, k, r int) (float64, bool) {
	c := &md.complexes[k]
	if !c.active {
		return 0, false
	}
	km, ks := slots(md, c)
	switch r {
	case km:
		return in.lnA[k] + in.y[ks], true
	case ks:
		return in.lnA[k] + in.y[km], true
	}
	return 0, false
}

// pairRoot returns the free concentration x of the first partner from
// x·(p + a·y) = c, y·(q + a·x) = d, i.e. the positive root of
// a·p·x² + (p·q + a·(d − c))·x − c·q = 0, in the cancellation-free form
// of the quadratic formula; hypot avoids overflow of the discriminant.
func pairRoot(c, d, p, q, a float64) float64 {
	if a >= 1 {
		// Divided by a: p·x² + b·x − e = 0.
		b := p*q/a + d - c
		e := c * q / a
		disc := math.Hypot(b, 2*math.Sqrt(p*e))
		if b >= 0 {
			return 2 * e / (b + disc)
		}
		return (disc - b) / (2 * p)
	}
	b := p*q + a*(d-c)
	disc := math.Hypot(b, 2*math.Sqrt(a*p*c*q))
	if b >= 0 {
		return 2 * c * q / (b + disc)
	}
	return (disc - b) / (2 * a * p)
}

// solve finds the free metal and ligand concentrations for the fractions
// currently held by the systems (evaluated at x = ln[H+]), warm-starting
// from the previous solution moved along its tangent.
func (in *innerSolver) solve(md *model, x float64) error {
	for j := range md.complexes {
		c := &md.complexes[j]
		if c.active {
			in.lnA[j] = c.lnK + md.systems[c.sys].lnAlpha[c.state]
		}
	}
	switch {
	case !in.warm:
		for r := range in.y {
			in.y[r] = math.Log(in.total[r])
		}
		in.pairSweep(md)
		in.warm = true
	case in.havePredic:
		for r := range in.y {
			in.y[r] += in.dydx[r] * (x - in.xLast)
		}
	}
	in.havePredic = false
	res, prev := 0.0, math.Inf(1)
	for it := 0; it < maxInnerIter; it++ {
		res = in.totals(md)
		if res <= innerTol || (res <= innerFloorTol && res > prev/2) {
			in.publish(md)
			return nil
		}
		prev = res
		if !in.newtonStep(md) {
			in.pairSweep(md)
		}
	}
	in.warm = false
	return &ConvergenceError{Stage: "complexation", Iterations: maxInnerIter, Residual: res}
}

// newtonStep tries a damped Newton step on Φ; false if none was accepted.
func (in *innerSolver) newtonStep(md *model) bool {
	if !in.factor(md) {
		return false
	}
	for r := range in.d {
		in.d[r] = -in.g[r]
	}
	in.cholSolve(in.d)
	big, slope, scale := 0.0, 0.0, 0.0
	for r, d := range in.d {
		big = math.Max(big, math.Abs(d))
		slope += in.g[r] * d
		scale += in.tot[r] + in.total[r]*math.Abs(in.y[r])
	}
	t := 1.0
	if big > maxLogStep {
		t = maxLogStep / big
	}
	phi0 := in.phi(md, in.y)
	for bt := 0; bt < maxBacktrack; bt++ {
		for r := range in.yTry {
			in.yTry[r] = in.y[r] + t*in.d[r]
		}
		if in.phi(md, in.yTry) <= phi0+armijo*t*slope+phiRoundoff*scale {
			copy(in.y, in.yTry)
			return true
		}
		t /= 2
	}
	return false
}

// publish copies the solution into the model's free concentrations.
func (in *innerSolver) publish(md *model) {
	for r, v := range in.y {
		if i := in.metal[r]; i >= 0 {
			md.strong[i].free = math.Exp(v)
		} else {
			md.systems[in.sys[r]].free = math.Exp(v)
		}
	}
}
