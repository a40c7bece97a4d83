package main

import (
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// corpusIngredients are the building blocks of generated recipes: a
// buffer pair, salts and excipients, each with a plausible amount range.
var corpusIngredients = []struct {
	use      string
	lo, hi   float64
	unit     string
	titrants []string
}{
	{"tris", 10, 100, "mM", []string{"hydrochloric-acid"}},
	{"sodium-acetate-trihydrate", 5, 50, "mM", []string{"acetic-acid", "hydrochloric-acid"}},
	{"potassium-dihydrogen-phosphate", 5, 50, "mM", []string{"sodium-hydroxide", "potassium-hydroxide"}},
	{"citric-acid-monohydrate", 1, 20, "g", []string{"sodium-hydroxide"}},
	{"hepes", 10, 50, "mM", []string{"sodium-hydroxide"}},
	{"glycine", 10, 100, "mM", []string{"hydrochloric-acid", "sodium-hydroxide"}},
}

var corpusExtras = []struct {
	use    string
	lo, hi float64
	unit   string
}{
	{"sodium-chloride", 1, 9, "g"},
	{"potassium-chloride", 0.1, 1, "g"},
	{"sucrose", 5, 50, "g"},
	{"glycerol", 1, 3, "% w/w"},
	{"mannitol", 1, 5, "g"},
	{"sodium-benzoate", 0.1, 1, "g"},
	{"magnesium-sulfate-heptahydrate", 0.05, 0.5, "g"},
	{"edta-disodium-dihydrate", 0.01, 0.1, "g"},
}

// writeCorpus writes n generated recipes (6–8 ingredients, one q.s. each)
// into dir, deterministically (a fixed random stream).
func writeCorpus(tb testing.TB, dir string, n int) {
	tb.Helper()
	rng := rand.New(rand.NewPCG(7, 11))
	for i := 0; i < n; i++ {
		var b strings.Builder
		buf := corpusIngredients[rng.IntN(len(corpusIngredients))]
		fmt.Fprintf(&b, "recipe: generated-%05d\nbasis: 1 L\ntemperature: %d C\nph: {min: 2, max: 12}\ningredients:\n", i, 15+rng.IntN(20))
		fmt.Fprintf(&b, "  - use: %s\n    amount: %.3g %s\n", buf.use, buf.lo+rng.Float64()*(buf.hi-buf.lo), buf.unit)
		perm := rng.Perm(len(corpusExtras))
		extras := 4 + rng.IntN(3)
		for _, k := range perm[:extras] {
			e := corpusExtras[k]
			fmt.Fprintf(&b, "  - use: %s\n    amount: %.3g %s\n", e.use, e.lo+rng.Float64()*(e.hi-e.lo), e.unit)
		}
		// A target inside the buffer's own range keeps every q.s. reachable.
		fmt.Fprintf(&b, "  - use: %s\n    adjust-to-ph: %.2f\n", buf.titrants[rng.IntN(len(buf.titrants))], targetFor(buf.use, rng))
		sub := filepath.Join(dir, fmt.Sprintf("r%02d", i%100))
		if err := os.MkdirAll(sub, 0o755); err != nil {
			tb.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(sub, fmt.Sprintf("recipe-%05d.yaml", i)), []byte(b.String()), 0o644); err != nil {
			tb.Fatal(err)
		}
	}
}

func targetFor(use string, rng *rand.Rand) float64 {
	mid := map[string]float64{"tris": 7.8, "sodium-acetate-trihydrate": 4.8, "potassium-dihydrogen-phosphate": 7.0,
		"citric-acid-monohydrate": 4.5, "hepes": 7.4, "glycine": 9.5}[use]
	return mid + (rng.Float64()-0.5)*0.8
}

// BenchmarkCheckCorpus checks a generated repository of 10,000 recipes
// end to end (discovery, parsing, validation, solving, rules, JSON
// output). Set PHGATE_CORPUS=N for another size, and PHGATE_CORPUS_DIR to
// keep the generated recipes in that folder (to time the binary on them).
func BenchmarkCheckCorpus(b *testing.B) {
	n := 10000
	if s := os.Getenv("PHGATE_CORPUS"); s != "" {
		fmt.Sscan(s, &n)
	}
	dir := os.Getenv("PHGATE_CORPUS_DIR")
	if dir == "" {
		dir = b.TempDir()
	}
	writeCorpus(b, dir, n)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		code := New(strings.NewReader(""), io.Discard, io.Discard).Run([]string{"check", "--format", "json", "--fail-on", "never", dir})
		if code != ExitOK {
			b.Fatalf("exit status %d", code)
		}
	}
	b.ReportMetric(float64(n), "recipes/op")
}

// TestGeneratedCorpusSolves guards the generator: a small corpus checks
// cleanly, so the benchmark measures real work rather than error paths.
func TestGeneratedCorpusSolves(t *testing.T) {
	dir := t.TempDir()
	writeCorpus(t, dir, 60)
	var out strings.Builder
	code := New(strings.NewReader(""), &out, io.Discard).Run([]string{"check", "--fail-on", "never", dir})
	if code != ExitOK {
		t.Fatalf("exit status %d\n%s", code, out.String())
	}
	if !strings.Contains(out.String(), "60 recipes") {
		t.Errorf("summary does not count 60 recipes:\n%s", lastLines(out.String(), 3))
	}
}

func lastLines(s string, n int) string {
	lines := strings.Split(strings.TrimRight(s, "\n"), "\n")
	if len(lines) > n {
		lines = lines[len(lines)-n:]
	}
	return strings.Join(lines, "\n")
}
