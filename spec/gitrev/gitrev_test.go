package gitrev

import (
	"bufio"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

func TestCheckRev(t *testing.T) {
	tests := []struct {
		name string
		rev  string
		ok   bool
	}{
		{"branch", "main", true},
		{"relative", "HEAD~2", true},
		{"remote branch", "origin/main", true},
		{"reflog", "main@{1}", true},
		{"hash", "0123456789abcdef0123456789abcdef01234567", true},
		{"shell text is left to git to refuse", "HEAD;rm -rf /", true},
		{"empty", "", false},
		{"long option", "--output=/tmp/x", false},
		{"short option", "-x", false},
		{"lone dash", "-", false},
		{"newline", "HEAD\n--output=x", false},
		{"nul", "HEAD\x00", false},
		{"escape", "HEAD\x1b[2J", false},
		{"invalid UTF-8", "HEAD\xff", false},
		{"too long", strings.Repeat("a", MaxRevLength+1), false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			err := CheckRev(tc.rev)
			if (err == nil) != tc.ok {
				t.Fatalf("CheckRev(%q) = %v, want ok %v", tc.rev, err, tc.ok)
			}
			var ue *UsageError
			if err != nil && !errors.As(err, &ue) {
				t.Errorf("error %T is not a *UsageError", err)
			}
		})
	}
}

func TestSafeRel(t *testing.T) {
	tests := []struct {
		path string
		ok   bool
	}{
		{"recipes/a.yaml", true},
		{"a.yaml", true},
		{"..yaml", true},
		{"../a.yaml", false},
		{"recipes/../../a.yaml", false},
		{"/etc/passwd", false},
		{"recipes//a.yaml", false},
		{"./a.yaml", false},
		{".git/config", false},
		{"sub/.GIT/hooks/x.yaml", false},
		{`a\..\b.yaml`, false},
		{"", false},
	}
	for _, tc := range tests {
		if err := safeRel(tc.path); (err == nil) != tc.ok {
			t.Errorf("safeRel(%q) = %v, want ok %v", tc.path, err, tc.ok)
		}
	}
}

func gitT(t *testing.T, dir string, args ...string) string {
	t.Helper()
	cmd := exec.Command("git", append([]string{"-c", "init.defaultBranch=main", "-c", "commit.gpgsign=false"}, args...)...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "GIT_CONFIG_GLOBAL="+os.DevNull, "GIT_CONFIG_NOSYSTEM=1",
		"GIT_AUTHOR_NAME=t", "GIT_AUTHOR_EMAIL=t@example.invalid", "GIT_COMMITTER_NAME=t", "GIT_COMMITTER_EMAIL=t@example.invalid")
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("git %v: %v\n%s", args, err, out)
	}
	return strings.TrimSpace(string(out))
}

func TestResolveAndExtract(t *testing.T) {
	if _, err := exec.LookPath("git"); err != nil {
		t.Skip("git not installed")
	}
	dir := t.TempDir()
	gitT(t, dir, "init", "-q")
	files := map[string]string{
		"phgate.yaml":          "project: x\n",
		"recipes/a.yaml":       "recipe: a\n",
		"recipes/deep/b.yml":   "recipe: b\n",
		"recipes/notes.txt":    "not read\n",
		"recipes/ünïcode.yaml": "recipe: u\n",
	}
	for name, body := range files {
		p := filepath.Join(dir, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.Symlink("../../outside.yaml", filepath.Join(dir, "recipes", "link.yaml")); err != nil {
		t.Fatal(err)
	}
	gitT(t, dir, "add", "-A")
	gitT(t, dir, "commit", "-q", "-m", "one")
	// The working tree moves on; the extracted revision must not.
	if err := os.WriteFile(filepath.Join(dir, "recipes", "a.yaml"), []byte("recipe: changed\n"), 0o644); err != nil {
		t.Fatal(err)
	}

	repo, err := Open(filepath.Join(dir, "recipes"))
	if err != nil {
		t.Fatal(err)
	}
	if want, _ := filepath.EvalSymlinks(dir); repo.Top != want {
		t.Errorf("Top %q, want %q", repo.Top, want)
	}
	c, err := repo.Resolve("HEAD")
	if err != nil {
		t.Fatal(err)
	}
	if want := gitT(t, dir, "rev-parse", "HEAD"); c.Hash != want {
		t.Errorf("hash %q, want %q", c.Hash, want)
	}
	for _, bad := range []string{"no-such-branch", "HEAD:phgate.yaml", "--all", "HEAD~5"} {
		var ue *UsageError
		if _, err := repo.Resolve(bad); !errors.As(err, &ue) {
			t.Errorf("Resolve(%q) = %v, want a usage error", bad, err)
		}
	}

	dst := t.TempDir()
	n, err := repo.Extract(c, dst, func(p string) bool { return strings.HasSuffix(p, ".yaml") || strings.HasSuffix(p, ".yml") })
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	err = filepath.WalkDir(dst, func(p string, e os.DirEntry, err error) error {
		if err != nil || e.IsDir() {
			return err
		}
		rel, _ := filepath.Rel(dst, p)
		got = append(got, filepath.ToSlash(rel))
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	sort.Strings(got)
	want := []string{"phgate.yaml", "recipes/a.yaml", "recipes/deep/b.yml", "recipes/ünïcode.yaml"}
	if strings.Join(got, ",") != strings.Join(want, ",") || n != len(want) {
		t.Errorf("extracted %d %v, want %v (no symbolic link, no other files)", n, got, want)
	}
	if b, _ := os.ReadFile(filepath.Join(dst, "recipes", "a.yaml")); string(b) != "recipe: a\n" {
		t.Errorf("recipes/a.yaml holds %q, want the committed bytes", b)
	}
	if _, err := repo.Extract(Commit{Hash: "HEAD"}, t.TempDir(), func(string) bool { return true }); err == nil {
		t.Error("Extract accepted an unverified revision")
	}
}

func TestWriteBlobsRefusesBadStreams(t *testing.T) {
	oid := strings.Repeat("a", 40)
	tests := []struct {
		name, stream string
	}{
		{"wrong object", strings.Repeat("b", 40) + " blob 3\nabc\n"},
		{"not a blob", oid + " tree 3\nabc\n"},
		{"missing", oid + " missing\n"},
		{"short body", oid + " blob 10\nabc"},
		{"no record end", oid + " blob 3\nabcX"},
		{"negative size", oid + " blob -1\n"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := writeBlobs(bufio.NewReader(strings.NewReader(tc.stream)), t.TempDir(), []entry{{oid, "a.yaml"}})
			if err == nil {
				t.Error("accepted a malformed answer")
			}
		})
	}
	t.Run("size cap", func(t *testing.T) {
		old := MaxTotalBytes
		MaxTotalBytes = 2
		defer func() { MaxTotalBytes = old }()
		_, err := writeBlobs(bufio.NewReader(strings.NewReader(oid+" blob 3\nabc\n")), t.TempDir(), []entry{{oid, "a.yaml"}})
		if err == nil {
			t.Error("wrote past MaxTotalBytes")
		}
	})
}
