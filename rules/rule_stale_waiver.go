package rules

// staleWaiver has no Run: Policy.Check and Policy.Stale raise its
// findings while applying waivers (see waivers.go).
var staleWaiver = &Rule{
	Name:    "stale-waiver",
	Summary: "A waiver expired, or accepts a finding that no longer occurs.",
	Doc: `What it checks: every waiver, in a recipe (waivers:) or project-wide in
phgate.yaml (waivers:, optionally limited to recipes:).

How it is computed: a waiver accepts every finding of its rule in the
recipes it covers; findings stay in the report marked waived with the
waiver's reason. After the rules ran, a waiver whose expires: date has
passed no longer applies (its findings count again) and is reported; a
waiver that matched no finding is reported as unused; a project waiver
naming a recipe id the project does not have is reported too. A project
waiver is judged unused only when every recipe it covers was checked in
the same run.

Why it matters: a waiver is a decision with a reason and an end. One that
outlived its finding hides the next real problem of that rule; one that
expired must be looked at again.

How to fix: remove an unused waiver; for an expired one, fix the finding
or renew the waiver with a new date and reason.

Thresholds: none. A waiver's expires date is inclusive: it applies through
that day.`,
	Default: Warning,
}
