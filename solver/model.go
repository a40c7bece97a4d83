package solver

import (
	"math"
	"sync"
)

// model holds a Mixture converted once per Solve into the form the inner
// loops need: temperature-corrected constants in natural logarithms, the
// conditional constants for the current activity coefficients, and
// preallocated work space, so that evaluating the charge balance allocates
// nothing.
type model struct {
	systems   []sysModel
	strong    []ionModel
	complexes []complexModel
	// lnKwT is ln Kw at the temperature; lnKw the conditional value
	// Kw' = Kw/(γH γOH) at the current ionic strength.
	lnKwT, lnKw float64
	// dhA is the Debye–Hückel A at the temperature (log10 scale).
	dhA      float64
	activity ActivityModel
	// lnG is ln γ of a singly charged ion at the current ionic strength;
	// a z-charged ion has ln γ = z²·lnG (Davies depends on z only via z²).
	lnG float64
	// fixedCharge is Σ z·c over the strong ions that form no complex.
	fixedCharge float64
	// df is dF/dx at the last evaluation of the charge balance.
	df float64
	// stateBuf backs the per-state vectors of all systems.
	stateBuf []float64
	inner    innerSolver
}

// sysModel is one acid–base system. State k (0 = fully protonated) carries
// charge top − k.
type sysModel struct {
	total float64
	top   int
	// pKaT are the stepwise pKa at the temperature.
	pKaT []float64
	// lnBetaT[k] = −ln10·Σ_{j≤k} pKa_j(T): ln of the cumulative
	// thermodynamic dissociation constant of state k (lnBetaT[0] = 0).
	lnBetaT []float64
	// lnBeta is lnBetaT corrected to concentration terms at the current γ:
	// [k]/[0] = exp(lnBeta[k] − k·ln[H+]).
	lnBeta []float64
	// alpha and lnAlpha are the fractions of the free system in each
	// state at the last evaluation; lnAlpha only when complexed.
	alpha, lnAlpha []float64
	// kbar and kvar are the mean and variance of the number of protons
	// released (k) at the last evaluation.
	kbar, kvar float64
	// free is the uncomplexed total.
	free float64
	// slot is the index of ln(free) in the complexation unknowns, or -1.
	slot int
}

// ionModel is one strong ion.
type ionModel struct {
	conc   float64
	charge int
	free   float64
	slot   int
}

// complexModel is one 1:1 complex M + L ⇌ ML.
type complexModel struct {
	metal, sys, state int
	// charge is z(M) + z(L).
	charge int
	// lnKT is ln K at the temperature; lnK the conditional constant
	// K' = K·γM·γL/γML at the current ionic strength.
	lnKT, lnK float64
	// active: both partners are present, so the complex can form.
	active bool
	// conc is [ML] at the last evaluation.
	conc float64
}

// modelPool recycles models (and their work space) between solves: a
// Solve is a few microseconds, and without reuse allocation and garbage
// collection would cost about as much as the numerics.
var modelPool = sync.Pool{New: func() any { return new(model) }}

// resize returns s with length n and zeroed elements, reusing its array
// when large enough.
func resize[T any](s []T, n int) []T {
	if cap(s) < n {
		return make([]T, n)
	}
	s = s[:n]
	clear(s)
	return s
}

// newModel converts a validated mixture. The caller must release the
// model when done and keep no reference to its slices.
func newModel(m *Mixture) *model {
	md := modelPool.Get().(*model)
	old := *md
	*md = model{
		systems:   resize(old.systems, len(m.Systems)),
		strong:    resize(old.strong, len(m.Strong)),
		complexes: resize(old.complexes, len(m.Complexes)),
		lnKwT:     -math.Ln10 * PKw(m.TemperatureC),
		activity:  m.Activity,
		stateBuf:  old.stateBuf,
		inner:     innerSolver{buf: old.inner.buf, metal: old.inner.metal[:0], sys: old.inner.sys[:0], total: old.inner.total[:0]},
	}
	if m.Activity == Davies {
		md.dhA = DebyeHuckelA(m.TemperatureC)
	}
	states := 0
	for i := range m.Systems {
		states += len(m.Systems[i].PKa) + 1
	}
	// One backing array for all per-state vectors.
	md.stateBuf = resize(md.stateBuf, 5*states)
	buf := md.stateBuf
	for i := range m.Systems {
		s := &m.Systems[i]
		n := len(s.PKa) + 1
		sm := &md.systems[i]
		sm.total, sm.top, sm.free, sm.slot = s.Total, s.TopCharge, s.Total, -1
		sm.lnBetaT, buf = buf[:n:n], buf[n:]
		sm.lnBeta, buf = buf[:n:n], buf[n:]
		sm.alpha, buf = buf[:n:n], buf[n:]
		sm.lnAlpha, buf = buf[:n:n], buf[n:]
		sm.pKaT, buf = buf[:n-1:n-1], buf[n-1:]
		cum := 0.0
		for k := range s.PKa {
			sm.pKaT[k] = systemPKa(s, k, m.TemperatureC)
			cum += sm.pKaT[k]
			sm.lnBetaT[k+1] = -math.Ln10 * cum
		}
	}
	for i, s := range m.Strong {
		md.strong[i] = ionModel{conc: s.Conc, charge: s.Charge, free: s.Conc, slot: -1}
	}
	for j := range m.Complexes {
		c := &m.Complexes[j]
		sys := &md.systems[c.Ligand.Index]
		md.complexes[j] = complexModel{
			metal:  c.Metal,
			sys:    c.Ligand.Index,
			state:  c.Ligand.Species,
			charge: md.strong[c.Metal].charge + sys.top - c.Ligand.Species,
			lnKT:   math.Ln10 * logKAt(c.LogK, c.DeltaH, m.TemperatureC),
			active: md.strong[c.Metal].conc > 0 && sys.total > 0,
		}
	}
	md.inner.init(md)
	for i := range md.strong {
		if md.strong[i].slot < 0 {
			md.fixedCharge += float64(md.strong[i].charge) * md.strong[i].conc
		}
	}
	md.setIonicStrength(0)
	return md
}

// release returns md to the pool.
func (md *model) release() { modelPool.Put(md) }

// systemPKa is pKa step k of s at tempC; without DeltaH the 25 °C value is
// used unchanged (and Solve warns when that matters).
func systemPKa(s *System, k int, tempC float64) float64 {
	if len(s.DeltaH) == 0 {
		return s.PKa[k]
	}
	cp := 0.0
	if len(s.DeltaCp) != 0 {
		cp = s.DeltaCp[k]
	}
	return PKaAt(s.PKa[k], s.DeltaH[k], cp, tempC)
}

// daviesCoefficient is the linear term of the Davies equation (Davies,
// Ion Association, 1962, p. 41; 0.2 in the 1938 paper).
const daviesCoefficient = 0.3

// lnGammaUnit returns ln γ of a singly charged ion at ionic strength I:
// Davies, log10 γ = −A z² (√I/(1+√I) − 0.3 I), or 0 for the ideal model.
func lnGammaUnit(activity ActivityModel, a, ionic float64) float64 {
	if activity == Ideal {
		return 0
	}
	s := math.Sqrt(ionic)
	return -math.Ln10 * a * (s/(1+s) - daviesCoefficient*ionic)
}

// setIonicStrength sets the activity coefficients for ionic strength I and
// derives the conditional constants from the thermodynamic ones.
func (md *model) setIonicStrength(ionic float64) {
	g := lnGammaUnit(md.activity, md.dhA, ionic)
	md.lnG = g
	md.lnKw = md.lnKwT - 2*g // Kw' = Kw/(γH·γOH)
	for i := range md.systems {
		s := &md.systems[i]
		z0 := float64(s.top * s.top)
		for k := range s.lnBeta {
			// Ka'_j = Ka_j·γ(j−1)/(γH·γ(j)) telescopes to
			// β'_k = β_k·γ(0)/(γ(k)·γH^k).
			zk := float64((s.top - k) * (s.top - k))
			s.lnBeta[k] = s.lnBetaT[k] + g*(z0-zk) - float64(k)*g
		}
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		zm := md.strong[c.metal].charge
		zl := md.systems[c.sys].top - c.state
		// K' = K·γM·γL/γML
		c.lnK = c.lnKT + g*float64(zm*zm+zl*zl-c.charge*c.charge)
	}
}

// eval computes the fractions of the system's states at ln[H+] = x with
// a log-sum-exp relative to the dominant state, so that pKa values from −10
// to 20 and pH −1 to 15 neither overflow nor underflow. withLog also fills
// lnAlpha (needed by complexes).
func (s *sysModel) eval(x float64, withLog bool) {
	top := math.Inf(-1)
	for k, b := range s.lnBeta {
		t := b - float64(k)*x
		s.lnAlpha[k] = t
		if t > top {
			top = t
		}
	}
	sum := 0.0
	for k, t := range s.lnAlpha {
		e := math.Exp(t - top)
		s.alpha[k] = e
		sum += e
	}
	inv := 1 / sum
	kbar := 0.0
	for k := range s.alpha {
		s.alpha[k] *= inv
		kbar += float64(k) * s.alpha[k]
	}
	kvar := 0.0
	for k, a := range s.alpha {
		d := float64(k) - kbar
		kvar += a * d * d
	}
	s.kbar, s.kvar = kbar, kvar
	if withLog {
		lnSum := top + math.Log(sum)
		for k := range s.lnAlpha {
			s.lnAlpha[k] -= lnSum
		}
	}
}
