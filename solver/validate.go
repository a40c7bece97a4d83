package solver

import (
	"fmt"
	"math"
)

// Validity range of the input temperature: liquid water at 0.1 MPa, where
// PKw, DebyeHuckelA and the water density fits are defined.
const (
	minTempC = 0
	maxTempC = 100
)

// Sanity bounds on amounts and charges. They reject typing errors before
// they reach exp(): no aqueous solution holds more than about 55 mol/L of
// anything, and no ion in the catalog carries more than 12 charges
// (phytate); beyond these the activity model would overflow.
const (
	maxConc   = 100
	maxCharge = 12
)

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// badAmount says why a concentration is unusable, or "" if it is fine.
func badAmount(v float64) string {
	switch {
	case math.IsNaN(v):
		return "concentration is NaN"
	case math.IsInf(v, 0):
		return "concentration is infinite"
	case v < 0:
		return fmt.Sprintf("concentration %g is negative", v)
	case v > maxConc:
		return fmt.Sprintf("concentration %g mol/L exceeds %d mol/L", v, maxConc)
	}
	return ""
}

// validate checks everything Solve relies on, so that the numerics never
// see NaN, Inf, a negative amount or an out-of-range index.
func validate(m *Mixture) error {
	if !finite(m.TemperatureC) || m.TemperatureC < minTempC || m.TemperatureC > maxTempC {
		return &InputError{"TemperatureC", -1, fmt.Sprintf("temperature %g °C outside %d–%d °C", m.TemperatureC, minTempC, maxTempC)}
	}
	if m.Activity != Davies && m.Activity != Ideal {
		return &InputError{"Activity", -1, fmt.Sprintf("unknown activity model %d", int(m.Activity))}
	}
	for i := range m.Systems {
		if msg := badSystem(&m.Systems[i]); msg != "" {
			return &InputError{"Systems", i, msg}
		}
	}
	for i, s := range m.Strong {
		if msg := badAmount(s.Conc); msg != "" {
			return &InputError{"Strong", i, msg}
		}
		if s.Charge < -maxCharge || s.Charge > maxCharge {
			return &InputError{"Strong", i, fmt.Sprintf("charge %d outside ±%d", s.Charge, maxCharge)}
		}
	}
	for i, n := range m.Neutrals {
		if msg := badAmount(n.Conc); msg != "" {
			return &InputError{"Neutrals", i, msg}
		}
	}
	for i := range m.Salts {
		if msg := badSalt(m, &m.Salts[i]); msg != "" {
			return &InputError{"Salts", i, msg}
		}
	}
	for i := range m.Complexes {
		if msg := badComplex(m, &m.Complexes[i]); msg != "" {
			return &InputError{"Complexes", i, msg}
		}
	}
	return nil
}

func badSystem(s *System) string {
	if msg := badAmount(s.Total); msg != "" {
		return msg
	}
	n := len(s.PKa)
	if s.TopCharge > maxCharge || s.TopCharge-n < -maxCharge {
		return fmt.Sprintf("state charges %d to %d outside ±%d", s.TopCharge, s.TopCharge-n, maxCharge)
	}
	for k, p := range s.PKa {
		if !finite(p) {
			return fmt.Sprintf("pKa %d is not a finite number", k+1)
		}
		if k > 0 && p < s.PKa[k-1] {
			return fmt.Sprintf("pKa %d (%g) is below pKa %d (%g); stepwise constants must not decrease", k+1, p, k, s.PKa[k-1])
		}
	}
	if len(s.DeltaH) != 0 && len(s.DeltaH) != n {
		return fmt.Sprintf("%d DeltaH values for %d pKa values", len(s.DeltaH), n)
	}
	if len(s.DeltaCp) != 0 && len(s.DeltaCp) != n {
		return fmt.Sprintf("%d DeltaCp values for %d pKa values", len(s.DeltaCp), n)
	}
	if len(s.DeltaCp) != 0 && len(s.DeltaH) == 0 {
		return "DeltaCp given without DeltaH"
	}
	for k, v := range s.DeltaH {
		if !finite(v) {
			return fmt.Sprintf("DeltaH %d is not a finite number", k+1)
		}
	}
	for k, v := range s.DeltaCp {
		if !finite(v) {
			return fmt.Sprintf("DeltaCp %d is not a finite number", k+1)
		}
	}
	if len(s.Species) != 0 && len(s.Species) != n+1 {
		return fmt.Sprintf("%d species labels for %d protonation states", len(s.Species), n+1)
	}
	return ""
}

// badRef checks that r names an existing dissolved species.
func badRef(m *Mixture, r Ref) string {
	switch r.Kind {
	case RefStrong:
		if r.Index < 0 || r.Index >= len(m.Strong) {
			return fmt.Sprintf("strong ion index %d out of range (%d ions)", r.Index, len(m.Strong))
		}
	case RefSpecies:
		if r.Index < 0 || r.Index >= len(m.Systems) {
			return fmt.Sprintf("system index %d out of range (%d systems)", r.Index, len(m.Systems))
		}
		if n := len(m.Systems[r.Index].PKa); r.Species < 0 || r.Species > n {
			return fmt.Sprintf("species %d out of range for system %d (states 0–%d)", r.Species, r.Index, n)
		}
	case RefHydrogen, RefHydroxide:
	default:
		return fmt.Sprintf("unknown reference kind %d", int(r.Kind))
	}
	return ""
}

func badSalt(m *Mixture, s *Salt) string {
	if !finite(s.PKsp) {
		return "PKsp is not a finite number"
	}
	if !finite(s.DeltaH) {
		return "DeltaH is not a finite number"
	}
	if len(s.Terms) == 0 {
		return "salt has no ions"
	}
	for k, t := range s.Terms {
		if t.Count <= 0 {
			return fmt.Sprintf("term %d: count %d must be positive", k, t.Count)
		}
		if msg := badRef(m, t.Ion); msg != "" {
			return fmt.Sprintf("term %d: %s", k, msg)
		}
	}
	return ""
}

func badComplex(m *Mixture, c *Complex) string {
	if c.Metal < 0 || c.Metal >= len(m.Strong) {
		return fmt.Sprintf("metal index %d out of range (%d strong ions)", c.Metal, len(m.Strong))
	}
	if c.Ligand.Kind != RefSpecies {
		return "ligand must be a protonation state of a system (RefSpecies)"
	}
	if msg := badRef(m, c.Ligand); msg != "" {
		return "ligand: " + msg
	}
	if !finite(c.LogK) {
		return "LogK is not a finite number"
	}
	if !finite(c.DeltaH) {
		return "DeltaH is not a finite number"
	}
	return ""
}

// validateComponent checks c against m so that With applies every share.
func validateComponent(m *Mixture, c *Component) error {
	for k, s := range c.StrongPerUnit {
		if s.Index < 0 || s.Index >= len(m.Strong) {
			return &InputError{"StrongPerUnit", k, fmt.Sprintf("%s: strong ion index %d out of range (%d ions)", c.Name, s.Index, len(m.Strong))}
		}
		if !finite(s.Count) {
			return &InputError{"StrongPerUnit", k, fmt.Sprintf("%s: count is not a finite number", c.Name)}
		}
	}
	for k, s := range c.SystemPerUnit {
		if s.Index < 0 || s.Index >= len(m.Systems) {
			return &InputError{"SystemPerUnit", k, fmt.Sprintf("%s: system index %d out of range (%d systems)", c.Name, s.Index, len(m.Systems))}
		}
		if !finite(s.Count) {
			return &InputError{"SystemPerUnit", k, fmt.Sprintf("%s: count is not a finite number", c.Name)}
		}
	}
	return nil
}
