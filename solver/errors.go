package solver

import "fmt"

// InputError reports invalid input data. Field names the Mixture (or
// argument) field at fault ("Systems", "Strong", "Neutrals", "Salts",
// "Complexes", "TemperatureC", "Activity", the Component fields
// "StrongPerUnit" and "SystemPerUnit", "Target", "Equilibrium", "Amounts",
// "PH"); Index is the position in that slice, or -1 when the field
// is not a slice, so a caller can map the error back to a recipe line.
type InputError struct {
	Field   string
	Index   int
	Message string
}

// Error implements error.
func (e *InputError) Error() string {
	if e.Index >= 0 {
		return fmt.Sprintf("solver: %s[%d]: %s", e.Field, e.Index, e.Message)
	}
	return fmt.Sprintf("solver: %s: %s", e.Field, e.Message)
}

// ConvergenceError reports that an iteration did not converge within its
// bounded number of steps. It signals an extreme or degenerate mixture,
// not a programming error; the caller should report it and go on.
type ConvergenceError struct {
	// Stage is the iteration that failed: "charge balance",
	// "ionic strength", "complexation" or "titration".
	Stage string
	// Iterations is the number of steps taken.
	Iterations int
	// Residual is the last convergence measure (stage dependent).
	Residual float64
}

// Error implements error.
func (e *ConvergenceError) Error() string {
	return fmt.Sprintf("solver: %s did not converge in %d iterations (residual %.3g)", e.Stage, e.Iterations, e.Residual)
}

// UnreachableError reports a titration target that the titrant cannot
// reach: a negative amount would be needed, or more than MaxTitrant mol/L.
// MinPH and MaxPH bound the reachable range: the pH with no titrant and the
// pH with MaxAmount mol/L, in increasing order.
type UnreachableError struct {
	Target, MinPH, MaxPH float64
	Component            string
	// MaxAmount is the amount (mol/L) at the far end of the range:
	// MaxTitrant, or less when that much titrant would take the mixture
	// beyond the model (ionic strength above 20 mol/L).
	MaxAmount float64
}

// Error implements error.
func (e *UnreachableError) Error() string {
	return fmt.Sprintf("solver: %s cannot bring the mixture to pH %.3f: reachable range is pH %.3f to %.3f (0 to %g mol/L)",
		e.Component, e.Target, e.MinPH, e.MaxPH, e.MaxAmount)
}

// RangeError reports a mixture outside what the model can represent, for
// example an ionic strength at which the activity coefficients overflow.
// The input is valid item by item; the combination is not.
type RangeError struct {
	// Quantity names what is out of range ("ionic strength", "result").
	Quantity string
	// Value is its value and Limit the bound it crossed.
	Value, Limit float64
}

// Error implements error.
func (e *RangeError) Error() string {
	return fmt.Sprintf("solver: %s %.6g is at or beyond the model's range (limit %g)", e.Quantity, e.Value, e.Limit)
}
