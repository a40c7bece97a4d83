package solver

import (
	"fmt"
	"math"
)

// TitrationCurve returns the pH of m with each of amounts (mol/L) of t
// added, each solved independently (ionic strength included).
func TitrationCurve(m Mixture, t Component, amounts []float64) ([]float64, error) {
	if err := validateComponent(&m, &t); err != nil {
		return nil, err
	}
	out := make([]float64, len(amounts))
	for i, a := range amounts {
		if !finite(a) {
			return nil, &InputError{"Amounts", i, "amount is not a finite number"}
		}
		eq, err := Solve(m.With(t, a))
		if err != nil {
			return nil, err
		}
		out[i] = eq.PH
	}
	return out, nil
}

// SpeciesCurve returns the distribution diagram of s: out[i][k] is the
// fraction of protonation state k at pH phs[i], with the thermodynamic pKa
// at tempC (ideal solution, pH = −log10[H+]). It returns nil when s,
// tempC or a pH is invalid (it has no error result; Solve reports why).
func SpeciesCurve(s System, tempC float64, phs []float64) [][]float64 {
	if badSystem(&s) != "" || !finite(tempC) || tempC < minTempC || tempC > maxTempC {
		return nil
	}
	n := len(s.PKa) + 1
	buf := make([]float64, 4*n)
	sm := sysModel{lnBetaT: buf[:n], lnBeta: buf[n : 2*n], alpha: buf[2*n : 3*n], lnAlpha: buf[3*n:]}
	cum := 0.0
	for k := range s.PKa {
		cum += systemPKa(&s, k, tempC)
		sm.lnBeta[k+1] = -math.Ln10 * cum
	}
	out := make([][]float64, len(phs))
	for i, ph := range phs {
		if !finite(ph) {
			return nil
		}
		sm.eval(-ph*math.Ln10, false)
		out[i] = append([]float64(nil), sm.alpha...)
	}
	return out
}

// CapacityCurve returns the buffer capacity β (mol/L per pH) of m's
// composition at each pH of phs, as if the pH were set by a strong acid or
// base without changing the activity coefficients: those of m's own
// solution are used throughout. β includes the water terms
// ln10·([H+] + [OH−]), so at m's own pH it equals Equilibrium.BufferCapacity.
func CapacityCurve(m Mixture, phs []float64) ([]float64, error) {
	eq, err := Solve(m)
	if err != nil {
		return nil, err
	}
	md := newModel(&m)
	defer md.release()
	md.setIonicStrength(eq.IonicStrength)
	out := make([]float64, len(phs))
	for i, ph := range phs {
		if !finite(ph) {
			return nil, &InputError{"PH", i, "pH is not a finite number"}
		}
		_, df, err := md.evalCharge(md.xOfPH(ph))
		if err != nil {
			return nil, err
		}
		out[i] = math.Ln10 * df
	}
	return out, nil
}

// TemperatureCurve returns the pH of m at each temperature of tempsC (°C),
// every constant and the Debye–Hückel A being re-evaluated.
func TemperatureCurve(m Mixture, tempsC []float64) ([]float64, error) {
	out := make([]float64, len(tempsC))
	for i, t := range tempsC {
		if !finite(t) || t < minTempC || t > maxTempC {
			return nil, &InputError{"Temperatures", i, fmt.Sprintf("temperature %g °C outside %d–%d °C", t, minTempC, maxTempC)}
		}
		m.TemperatureC = t
		eq, err := Solve(m)
		if err != nil {
			return nil, err
		}
		out[i] = eq.PH
	}
	return out, nil
}
