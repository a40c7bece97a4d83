package main

import (
	"io"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// TestShardsPartitionTheRecipes checks that --shard I/N over N shards
// checks every recipe exactly once.
func TestShardsPartitionTheRecipes(t *testing.T) {
	dir := t.TempDir()
	writeCorpus(t, dir, 40)
	count := regexp.MustCompile(`"recipes": (\d+)`)
	total := 0
	seen := map[string]int{}
	for i := 1; i <= 3; i++ {
		var out strings.Builder
		code := New(strings.NewReader(""), &out, io.Discard).Run([]string{"check", "--format", "json", "--fail-on", "never", "--shard", strconv.Itoa(i) + "/3", dir})
		if code != ExitOK {
			t.Fatalf("shard %d: exit %d", i, code)
		}
		m := count.FindStringSubmatch(out.String())
		if m == nil {
			t.Fatalf("shard %d: no summary", i)
		}
		n, _ := strconv.Atoi(m[1])
		total += n
		for _, id := range regexp.MustCompile(`"recipe":"(generated-\d+)"`).FindAllStringSubmatch(out.String(), -1) {
			seen[id[1]]++
		}
	}
	if total != 40 || len(seen) != 40 {
		t.Errorf("shards checked %d recipes (%d distinct), want 40", total, len(seen))
	}
}

func TestCheckFlagErrors(t *testing.T) {
	for _, args := range [][]string{
		{"check", "--shard", "0/3", "."},
		{"check", "--shard", "4/3", "."},
		{"check", "--shard", "two", "."},
		{"check", "--max-file-size", "lots", "."},
		{"check", "--jobs", "0", "."},
	} {
		var errOut strings.Builder
		if code := New(strings.NewReader(""), io.Discard, &errOut).Run(args); code != ExitProblem || errOut.Len() == 0 {
			t.Errorf("%v: exit %d, stderr %q", args, code, errOut.String())
		}
	}
}

func TestMaxFileSize(t *testing.T) {
	var out strings.Builder
	code := New(strings.NewReader(""), &out, io.Discard).Run([]string{"check", "--max-file-size", "100B", "../../testdata/standards/borax.yaml"})
	if code != ExitProblem || !strings.Contains(out.String(), "larger than the 100-byte limit") {
		t.Errorf("exit %d, output:\n%s", code, out.String())
	}
}
