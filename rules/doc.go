// Package rules judges a solved recipe the way an experienced formulator
// would. Each rule is a value (name, summary, long documentation, default
// severity, typed settings) in one explicit registry; rules read the
// solved equilibrium from the Pass they are given and report findings
// through Pass.Report, always at a recipe position.
package rules
