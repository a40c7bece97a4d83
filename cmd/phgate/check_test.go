package main

import (
	"bytes"
	"path/filepath"
	"strings"
	"testing"
)

// e2e names a fixture of testdata/golden/e2e.
func e2e(name string) string { return filepath.Join("..", "..", "testdata", "golden", "e2e", name) }

// TestCheckExitStatus runs check in process on single recipes and checks
// the exit status policy: 1 on an unwaived finding at the --fail-on
// severity, 0 when it is waived with a reason, 2 on a file that cannot be
// read, parsed or validated.
func TestCheckExitStatus(t *testing.T) {
	tests := []struct {
		name   string
		args   []string
		status int
		// out must appear in stdout, errOut in stderr.
		out, errOut string
	}{
		{name: "error finding", args: []string{"check", e2e("error.yaml")}, status: ExitFindings, out: "ph-window"},
		{name: "waived with a reason", args: []string{"check", e2e("waived.yaml")}, status: ExitOK, out: "waived"},
		{name: "error finding, fail on never", args: []string{"check", "--fail-on", "never", e2e("error.yaml")}, status: ExitOK},
		{name: "warning only", args: []string{"check", e2e("warning.yaml")}, status: ExitOK, out: "weak-buffer"},
		{name: "warning, fail on warning", args: []string{"check", "--fail-on", "warning", e2e("warning.yaml")}, status: ExitFindings},
		{name: "unparseable file", args: []string{"check", e2e("unreadable.yaml")}, status: ExitProblem, out: "could not check"},
		{name: "missing file", args: []string{"check", e2e("no-such-recipe.yaml")}, status: ExitProblem, out: "cannot read"},
		{name: "waiver without reason", args: []string{"check", e2e("no-reason.yaml")}, status: ExitProblem, out: "reason"},
		{name: "problem outranks findings", args: []string{"check", e2e("error.yaml"), e2e("unreadable.yaml")}, status: ExitProblem},
		{name: "bad fail-on", args: []string{"check", "--fail-on", "sometimes", e2e("error.yaml")}, status: ExitProblem, errOut: "--fail-on"},
		{name: "bad format", args: []string{"check", "--format", "xml", e2e("error.yaml")}, status: ExitProblem, errOut: "sarif"},
		{name: "sarif", args: []string{"check", "--format", "sarif", e2e("error.yaml")}, status: ExitFindings, out: `"ruleId": "ph-window"`},
		{name: "github", args: []string{"check", "--format", "github", e2e("error.yaml")}, status: ExitFindings, out: "::error file="},
		{name: "markdown", args: []string{"check", "--format", "markdown", e2e("error.yaml")}, status: ExitFindings, out: "### phgate: fail"},
		{name: "rules list", args: []string{"rules"}, status: ExitOK, out: "temperature-drift"},
		{name: "rules explain", args: []string{"rules", "weak-buffer"}, status: ExitOK, out: "minimum: 5"},
		{name: "rules table", args: []string{"rules", "--format", "markdown"}, status: ExitOK, out: "| `ph-window` | error |"},
		{name: "rules typo", args: []string{"rules", "weak-bufer"}, status: ExitProblem, errOut: `did you mean "weak-buffer"`},
		{name: "show applies waivers", args: []string{"show", e2e("waived.yaml")}, status: ExitOK, out: "waived (release window"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var out, errOut bytes.Buffer
			got := New(strings.NewReader(""), &out, &errOut).Run(tt.args)
			if got != tt.status {
				t.Errorf("exit status %d, want %d\nstdout:\n%s\nstderr:\n%s", got, tt.status, out.String(), errOut.String())
			}
			if !strings.Contains(out.String(), tt.out) {
				t.Errorf("stdout lacks %q:\n%s", tt.out, out.String())
			}
			if !strings.Contains(errOut.String(), tt.errOut) {
				t.Errorf("stderr lacks %q:\n%s", tt.errOut, errOut.String())
			}
		})
	}
}

// TestCheckOrderIndependentOfJobs checks that the parallel pool gives
// the same report as a single worker.
func TestCheckOrderIndependentOfJobs(t *testing.T) {
	run := func(jobs string) string {
		var out, errOut bytes.Buffer
		New(strings.NewReader(""), &out, &errOut).Run([]string{"check", "--format", "json", "--jobs", jobs, filepath.Join("..", "..", "examples"), e2e("")})
		return out.String()
	}
	one := run("1")
	if !strings.Contains(one, "e2e-error") || !strings.Contains(one, "clearlid-eye-rinse") {
		t.Fatalf("report lacks the expected recipes:\n%s", one)
	}
	for i := 0; i < 3; i++ {
		if many := run("8"); many != one {
			t.Fatal("report with 8 workers differs from the one with 1")
		}
	}
}
