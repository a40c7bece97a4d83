package solver

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"
)

// Validity limits that trigger warnings.
const (
	// IonicStrengthLimit is the ionic strength (mol/L) above which the
	// Davies equation is no longer reliable (about 0.1–0.5 in the
	// literature; the upper end is used so that ordinary buffers pass).
	IonicStrengthLimit = 0.5
	// TemperatureLimitC is the upper end (°C) of the range in which the
	// catalog's temperature data are checked (the reference tables stop at
	// 60 °C; Goldberg et al. give 274–350 K for their fit).
	TemperatureLimitC = 60
	// NoEnthalpyToleranceC is how far (°C) from 25 °C a system without
	// DeltaH may be used before a warning says its pKa was not corrected.
	NoEnthalpyToleranceC = 5
	// SaturationIndexFloor is the lowest saturation index reported; a salt
	// one of whose ions is absent would otherwise have SI = −∞.
	SaturationIndexFloor = -100
)

// Solve computes the equilibrium of m: it validates m, converts every
// constant to the temperature once, then solves the charge balance for
// [H+] with the ionic strength iterated to self-consistency, and reports
// the speciation, pH, buffer capacity, osmolarity, saturation indices and
// warnings. Invalid input gives an *InputError; a failed iteration a
// *ConvergenceError. See the package documentation for the model.
func Solve(m Mixture) (*Equilibrium, error) {
	if err := validate(&m); err != nil {
		return nil, err
	}
	md := newModel(&m)
	defer md.release()
	x, ionic, iters, err := md.solveSelfConsistent()
	if err != nil {
		return nil, err
	}
	return md.result(&m, x, ionic, iters)
}

// result builds the Equilibrium from the model's speciation at x, which
// must be the point of the last charge-balance evaluation.
func (md *model) result(m *Mixture, x, ionic float64, iters int) (*Equilibrium, error) {
	g1 := math.Exp(md.lnG)
	eq := &Equilibrium{
		PH:             md.phOfX(x),
		H:              math.Exp(x),
		OH:             math.Exp(md.lnKw - x),
		GammaH:         g1,
		GammaOH:        g1,
		IonicStrength:  ionic,
		PKw:            -md.lnKwT / math.Ln10,
		BufferCapacity: math.Ln10 * md.df, // β = dC_base/dpH = ln10·dF/dln[H+]
		Systems:        make([]SystemState, len(md.systems)),
		Strong:         make([]IonState, len(md.strong)),
		Salts:          make([]SaltState, len(m.Salts)),
		Complexes:      make([]ComplexState, len(md.complexes)),
		Iterations:     iters,
	}
	// One backing array per element type for all systems: the result is
	// built once per Solve, and few allocations keep Solve fast.
	states := 0
	for i := range md.systems {
		states += len(md.systems[i].alpha)
	}
	floats := make([]float64, 5*states)
	ints := make([]int, states)
	labels := make([]string, states)
	osm := eq.H + eq.OH
	for i := range md.systems {
		sm, s := &md.systems[i], &m.Systems[i]
		n := len(sm.alpha)
		st := &eq.Systems[i]
		st.Name = s.Name
		st.PKa, floats = floats[:n-1:n-1], floats[n-1:]
		st.Conc, floats = floats[:n:n], floats[n:]
		st.Fractions, floats = floats[:n:n], floats[n:]
		st.Gamma, floats = floats[:n:n], floats[n:]
		st.Charges, ints = ints[:n:n], ints[n:]
		st.Species, labels = labels[:n:n], labels[n:]
		copy(st.PKa, sm.pKaT)
		for k, a := range sm.alpha {
			z := sm.top - k
			st.Fractions[k] = a
			st.Conc[k] = sm.free * a
			st.Charges[k] = z
			st.Gamma[k] = math.Exp(float64(z*z) * md.lnG)
			st.MeanCharge += a * float64(z)
			if a > sm.alpha[st.Dominant] {
				st.Dominant = k
			}
			if len(s.Species) != 0 {
				st.Species[k] = s.Species[k]
			} else {
				st.Species[k] = speciesLabel(n-1-k, z)
			}
		}
		osm += sm.free
	}
	for i := range md.strong {
		z := float64(md.strong[i].charge)
		eq.Strong[i] = IonState{Name: m.Strong[i].Name, Free: md.strong[i].free, Gamma: math.Exp(z * z * md.lnG)}
		osm += md.strong[i].free
	}
	for _, n := range m.Neutrals {
		osm += n.Conc
	}
	for j := range md.complexes {
		c := &md.complexes[j]
		eq.Complexes[j] = ComplexState{Name: m.Complexes[j].Name, Conc: c.conc, LogK: c.lnKT / math.Ln10}
		osm += c.conc
	}
	eq.Osmolarity = osm
	for i := range m.Salts {
		eq.Salts[i] = saltState(&m.Salts[i], eq, m.TemperatureC)
	}
	eq.Warnings = warnings(m, ionic)
	if !eq.finite() || !(eq.BufferCapacity > 0) {
		return nil, &RangeError{Quantity: "ionic strength", Value: ionic, Limit: maxIonicStrength}
	}
	return eq, nil
}

// labelCache holds generated species labels for the charges the
// validation admits, so that results do not build strings on every Solve.
var labelCache = sync.OnceValue(func() [][]string {
	t := make([][]string, 2*maxCharge+1) // [protons][charge+maxCharge]
	for p := range t {
		t[p] = make([]string, 2*maxCharge+1)
		for z := -maxCharge; z <= maxCharge; z++ {
			t[p][z+maxCharge] = buildLabel(p, z)
		}
	}
	return t
})

// speciesLabel returns a generated label such as "H2A-" for a state with
// the given number of bound protons and charge.
func speciesLabel(protons, charge int) string {
	t := labelCache()
	if protons < len(t) && charge >= -maxCharge && charge <= maxCharge {
		return t[protons][charge+maxCharge]
	}
	return buildLabel(protons, charge)
}

func buildLabel(protons, charge int) string {
	var b strings.Builder
	switch {
	case protons == 1:
		b.WriteString("H")
	case protons > 1:
		b.WriteString("H" + strconv.Itoa(protons))
	}
	b.WriteString("A")
	mag, sign := charge, "+"
	if charge < 0 {
		mag, sign = -charge, "-"
	}
	if mag > 1 {
		b.WriteString(strconv.Itoa(mag))
	}
	if mag > 0 {
		b.WriteString(sign)
	}
	return b.String()
}

// saltState computes SI = log10(IAP/Ksp(T)) from activities.
func saltState(s *Salt, eq *Equilibrium, tempC float64) SaltState {
	pksp := PKaAt(s.PKsp, s.DeltaH, 0, tempC)
	si := pksp
	for _, t := range s.Terms {
		a := activity(eq, t.Ion)
		if !(a > 0) {
			si = SaturationIndexFloor
			break
		}
		si += float64(t.Count) * math.Log10(a)
	}
	return SaltState{Name: s.Name, SaturationIndex: math.Max(si, SaturationIndexFloor), PKsp: pksp}
}

// activity returns the activity (γ·c) of the species r names.
func activity(eq *Equilibrium, r Ref) float64 {
	switch r.Kind {
	case RefStrong:
		return eq.Strong[r.Index].Gamma * eq.Strong[r.Index].Free
	case RefSpecies:
		s := &eq.Systems[r.Index]
		return s.Gamma[r.Species] * s.Conc[r.Species]
	case RefHydrogen:
		return eq.GammaH * eq.H
	case RefHydroxide:
		return eq.GammaOH * eq.OH
	}
	panic(fmt.Sprintf("solver: unvalidated reference kind %d", int(r.Kind)))
}

// warnings lists the validity limits the solution crosses.
func warnings(m *Mixture, ionic float64) []Warning {
	var w []Warning
	if ionic > IonicStrengthLimit {
		w = append(w, Warning{
			Kind:    WarnIonicStrength,
			Message: fmt.Sprintf("ionic strength %.3g mol/L exceeds %g, where the %s activity model is no longer reliable", ionic, IonicStrengthLimit, m.Activity),
			Value:   ionic,
			Limit:   IonicStrengthLimit,
		})
	}
	if m.TemperatureC > TemperatureLimitC {
		w = append(w, Warning{
			Kind:    WarnTemperature,
			Message: fmt.Sprintf("temperature %g °C is above %g °C, beyond the checked range of the temperature data", m.TemperatureC, float64(TemperatureLimitC)),
			Value:   m.TemperatureC,
			Limit:   TemperatureLimitC,
		})
	}
	if d := math.Abs(m.TemperatureC - 25); d > NoEnthalpyToleranceC {
		for i := range m.Systems {
			s := &m.Systems[i]
			if len(s.DeltaH) == 0 && len(s.PKa) > 0 && s.Total > 0 {
				w = append(w, Warning{
					Kind:    WarnTemperature,
					Message: fmt.Sprintf("%s has no ionization enthalpy: its 25 °C pKa is used at %g °C", s.Name, m.TemperatureC),
					Value:   m.TemperatureC,
					Limit:   25 + math.Copysign(NoEnthalpyToleranceC, m.TemperatureC-25),
				})
			}
		}
	}
	return w
}

// finite reports whether every number of eq is finite; a last guard so
// that an overflow in an extreme mixture becomes an error, never a NaN.
func (eq *Equilibrium) finite() bool {
	ok := finite(eq.PH) && finite(eq.H) && finite(eq.OH) && finite(eq.GammaH) &&
		finite(eq.IonicStrength) && finite(eq.BufferCapacity) && finite(eq.Osmolarity)
	for i := range eq.Systems {
		s := &eq.Systems[i]
		for k := range s.Conc {
			ok = ok && finite(s.Conc[k]) && finite(s.Fractions[k]) && finite(s.Gamma[k])
		}
		ok = ok && finite(s.MeanCharge)
	}
	for _, s := range eq.Strong {
		ok = ok && finite(s.Free) && finite(s.Gamma)
	}
	for _, s := range eq.Salts {
		ok = ok && finite(s.SaturationIndex) && finite(s.PKsp)
	}
	for _, c := range eq.Complexes {
		ok = ok && finite(c.Conc) && finite(c.LogK)
	}
	return ok
}
