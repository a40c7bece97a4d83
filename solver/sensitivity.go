package solver

import (
	"fmt"
	"math"
)

// Sensitivity returns dpH/d(amount of c), in pH units per mol/L, at the
// solution eq of m (as returned by Solve(m)).
//
// It applies the implicit function theorem to the charge balance
// F(ln[H+], amount) = 0 with the activity coefficients held at their
// values in eq (the ionic strength is not re-iterated):
//
//	dpH/da = (∂F/∂a) / (ln10 · ∂F/∂ln[H+]) = (∂F/∂a) / β
//
// ∂F/∂a is the charge the component brings per mol/L at fixed [H+], with
// the complexation equilibria re-solved to first order (the same
// Jacobian as the buffer capacity). Neglecting the change of γ is a
// relative error of the order of a few per cent for buffers near 0.1 mol/L
// (less when the ionic strength is dominated by other salts); a component
// that carries no net charge (a neutral salt) has sensitivity 0 here
// although it shifts the pH slightly through γ.
func Sensitivity(m Mixture, eq *Equilibrium, c Component) (float64, error) {
	if err := validate(&m); err != nil {
		return 0, err
	}
	if err := validateComponent(&m, &c); err != nil {
		return 0, err
	}
	if eq == nil || !(eq.H > 0) || !finite(eq.H) || !finite(eq.IonicStrength) || eq.IonicStrength < 0 ||
		len(eq.Systems) != len(m.Systems) || len(eq.Strong) != len(m.Strong) {
		return 0, &InputError{"Equilibrium", -1, "not a solution of this mixture"}
	}
	md := newModel(&m)
	defer md.release()
	md.setIonicStrength(eq.IonicStrength)
	_, df, err := md.evalCharge(math.Log(eq.H))
	if err != nil {
		return 0, err
	}
	out := md.chargeSlope(&c) / (math.Ln10 * df)
	if !finite(out) {
		return 0, fmt.Errorf("solver: sensitivity to %s is not finite", c.Name)
	}
	return out, nil
}

// chargeSlope is ∂F/∂a, the charge component c brings per mol/L at fixed
// [H+] and γ, at the model's current speciation.
func (md *model) chargeSlope(c *Component) float64 {
	fa := 0.0
	for _, s := range c.StrongPerUnit {
		fa += s.Count * md.strongSlope(s.Index)
	}
	for _, s := range c.SystemPerUnit {
		fa += s.Count * md.systemSlope(s.Index)
	}
	return fa
}

// strongSlope is ∂F/∂(total of strong ion i) at fixed [H+] and γ, at the
// model's current speciation. For a metal in the complexation problem it
// is w_r (see complexCorrection). Otherwise the metal is absent or has no
// partner: an added amount splits between the free ion and its complexes
// in the ratio 1 : r_j with r_j = K'_j α_j [L_j], and every complex formed
// takes its ligand out of the partner's free pool, which changes F by the
// partner's own slope (first order exact).
func (md *model) strongSlope(i int) float64 {
	ion := &md.strong[i]
	if ion.slot >= 0 {
		return md.inner.w[ion.slot]
	}
	num, den := float64(ion.charge), 1.0
	for j := range md.complexes {
		c := &md.complexes[j]
		if c.metal != i {
			continue
		}
		s := &md.systems[c.sys]
		r := math.Exp(c.lnK + math.Log(s.alpha[c.state]*s.free))
		partner := float64(s.top) - s.kbar
		if s.slot >= 0 {
			partner = md.inner.w[s.slot]
		}
		num += r * (float64(c.charge) - partner)
		den += r
	}
	return num / den
}

// systemSlope is ∂F/∂(total of system i), the ligand counterpart of
// strongSlope.
func (md *model) systemSlope(i int) float64 {
	s := &md.systems[i]
	if s.slot >= 0 {
		return md.inner.w[s.slot]
	}
	num, den := float64(s.top)-s.kbar, 1.0
	for j := range md.complexes {
		c := &md.complexes[j]
		if c.sys != i {
			continue
		}
		metal := &md.strong[c.metal]
		r := math.Exp(c.lnK + math.Log(s.alpha[c.state]*metal.free))
		partner := float64(metal.charge)
		if metal.slot >= 0 {
			partner = md.inner.w[metal.slot]
		}
		num += r * (float64(c.charge) - partner)
		den += r
	}
	return num / den
}
