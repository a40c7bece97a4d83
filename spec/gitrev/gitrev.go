package gitrev

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path"
	"path/filepath"
	"strconv"
	"strings"
	"unicode"
)

// UsageError is a revision refused before or by verification: it starts
// with "-", holds control characters, or does not name a commit. The
// command line reports it as a usage error.
type UsageError struct {
	Rev    string
	Reason string
}

func (e *UsageError) Error() string { return fmt.Sprintf("revision %q: %s", e.Rev, e.Reason) }

// MaxRevLength bounds a revision string; real ones (names, hashes,
// HEAD~3, origin/main@{1}) are far shorter.
const MaxRevLength = 256

// CheckRev refuses revision strings that could be read as an option or
// smuggle something past the command line. It runs nothing.
func CheckRev(rev string) error {
	switch {
	case rev == "":
		return &UsageError{rev, "is empty"}
	case strings.HasPrefix(rev, "-"):
		return &UsageError{rev, "starts with '-'; a revision cannot be an option"}
	case len(rev) > MaxRevLength:
		return &UsageError{rev[:32] + "…", fmt.Sprintf("is longer than %d bytes", MaxRevLength)}
	}
	for _, r := range rev {
		if unicode.IsControl(r) || r == unicode.ReplacementChar {
			return &UsageError{rev, "holds a control character"}
		}
	}
	return nil
}

// Repo is a git repository reached from a folder inside it.
type Repo struct {
	// Top is the repository's top folder (symbolic links resolved).
	Top string
	// Dir is the folder git runs in.
	Dir string
	// Git is the git program (default "git", looked up on PATH).
	Git string
}

// Open finds the repository containing dir.
func Open(dir string) (*Repo, error) {
	r := &Repo{Dir: dir, Git: "git"}
	out, err := r.run(nil, "rev-parse", "--show-toplevel")
	if err != nil {
		var ee *exitError
		if errors.As(err, &ee) {
			return nil, fmt.Errorf("%s is not inside a git working tree (git: %s)", dir, ee.stderr)
		}
		return nil, err
	}
	top := strings.TrimRight(string(out), "\r\n")
	if top == "" {
		return nil, fmt.Errorf("%s is not inside a git working tree", dir)
	}
	r.Top = filepath.Clean(top)
	return r, nil
}

// Commit is a verified commit: its full hash as printed by git.
type Commit struct {
	// Hash is the full hexadecimal object name.
	Hash string
	// Rev is what the user typed.
	Rev string
}

// Short is the first 10 characters of the hash.
func (c Commit) Short() string {
	if len(c.Hash) > 10 {
		return c.Hash[:10]
	}
	return c.Hash
}

// Resolve checks a revision's shape, then asks git to verify that it names
// a commit. It returns a *UsageError when the revision is refused or does
// not resolve.
func (r *Repo) Resolve(rev string) (Commit, error) {
	if err := CheckRev(rev); err != nil {
		return Commit{}, err
	}
	out, err := r.run(nil, "rev-parse", "--verify", "--quiet", "--end-of-options", rev+"^{commit}")
	if err != nil {
		var ee *exitError
		if errors.As(err, &ee) {
			return Commit{}, &UsageError{rev, "does not name a commit in " + r.Top}
		}
		return Commit{}, err
	}
	h := strings.TrimSpace(string(out))
	if !isHash(h) {
		return Commit{}, fmt.Errorf("git rev-parse printed %q for %q, not a commit hash", h, rev)
	}
	return Commit{Hash: h, Rev: rev}, nil
}

func isHash(s string) bool {
	if len(s) != 40 && len(s) != 64 {
		return false
	}
	for _, c := range s {
		if !('0' <= c && c <= '9' || 'a' <= c && c <= 'f') {
			return false
		}
	}
	return true
}

// MaxTotalBytes bounds what Extract writes, so a huge history object
// cannot fill the disk.
var MaxTotalBytes int64 = 256 << 20

// Extract writes the regular files of commit c whose repository-relative
// path keep accepts into dst, an existing empty folder (normally made
// with os.MkdirTemp). Symbolic links and submodules are skipped; a path
// that would leave dst is an error. It returns the number of files
// written.
func (r *Repo) Extract(c Commit, dst string, keep func(path string) bool) (int, error) {
	if !isHash(c.Hash) {
		return 0, fmt.Errorf("extract: %q is not a verified commit hash", c.Hash)
	}
	list, err := r.run(nil, "ls-tree", "-r", "-z", "--full-tree", c.Hash)
	if err != nil {
		return 0, err
	}
	var blobs []entry
	for _, rec := range bytes.Split(list, []byte{0}) {
		if len(rec) == 0 {
			continue
		}
		meta, p, ok := strings.Cut(string(rec), "\t")
		f := strings.Fields(meta)
		if !ok || len(f) != 3 {
			return 0, fmt.Errorf("git ls-tree: unexpected line %q", rec)
		}
		mode, typ, oid := f[0], f[1], f[2]
		if typ != "blob" || (mode != "100644" && mode != "100755") || !keep(p) {
			continue
		}
		if err := safeRel(p); err != nil {
			return 0, err
		}
		if !isHash(oid) {
			return 0, fmt.Errorf("git ls-tree: bad object name %q", oid)
		}
		blobs = append(blobs, entry{oid, p})
	}
	if len(blobs) == 0 {
		return 0, nil
	}
	var req bytes.Buffer
	for _, b := range blobs {
		req.WriteString(b.oid + "\n")
	}
	cmd := r.command("cat-file", "--batch")
	cmd.Stdin = &req
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		return 0, err
	}
	if err := cmd.Start(); err != nil {
		return 0, fmt.Errorf("running git: %w", err)
	}
	n, werr := writeBlobs(bufio.NewReader(stdout), dst, blobs)
	if werr != nil {
		_ = cmd.Process.Kill()
		_ = cmd.Wait()
		return n, werr
	}
	if err := cmd.Wait(); err != nil {
		return n, fmt.Errorf("git cat-file: %v: %s", err, strings.TrimSpace(stderr.String()))
	}
	return n, nil
}

// entry is one blob to read: its object name and repository path.
type entry struct{ oid, path string }

// writeBlobs reads `git cat-file --batch` answers in request order and
// writes each blob under dst.
func writeBlobs(rd *bufio.Reader, dst string, want []entry) (int, error) {
	var total int64
	for i, e := range want {
		head, err := rd.ReadString('\n')
		if err != nil {
			return i, fmt.Errorf("git cat-file: reading header: %v", err)
		}
		f := strings.Fields(head)
		if len(f) != 3 || f[0] != e.oid || f[1] != "blob" {
			return i, fmt.Errorf("git cat-file: unexpected answer %q for %s", strings.TrimSpace(head), e.path)
		}
		size, err := strconv.ParseInt(f[2], 10, 64)
		if err != nil || size < 0 {
			return i, fmt.Errorf("git cat-file: bad size in %q", strings.TrimSpace(head))
		}
		total += size
		if total > MaxTotalBytes {
			return i, fmt.Errorf("the files to read from git exceed %d bytes", MaxTotalBytes)
		}
		target := filepath.Join(dst, filepath.FromSlash(e.path))
		if err := os.MkdirAll(filepath.Dir(target), 0o755); err != nil {
			return i, err
		}
		out, err := os.OpenFile(target, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
		if err != nil {
			return i, err
		}
		_, err = io.CopyN(out, rd, size)
		if cerr := out.Close(); err == nil {
			err = cerr
		}
		if err != nil {
			return i, fmt.Errorf("git cat-file: %s: %v", e.path, err)
		}
		if b, err := rd.ReadByte(); err != nil || b != '\n' {
			return i, fmt.Errorf("git cat-file: %s: missing end of record", e.path)
		}
	}
	return len(want), nil
}

// safeRel refuses repository paths that are absolute, climb with "..",
// or step into a .git folder.
func safeRel(p string) error {
	if p == "" || path.IsAbs(p) || strings.Contains(p, "\\") || strings.ContainsRune(p, 0) {
		return fmt.Errorf("git tree holds an unsafe path %q", p)
	}
	for _, part := range strings.Split(p, "/") {
		if part == "" || part == "." || part == ".." || strings.EqualFold(part, ".git") {
			return fmt.Errorf("git tree holds an unsafe path %q", p)
		}
	}
	return nil
}

// exitError is a git command that ran and failed.
type exitError struct {
	args   []string
	code   int
	stderr string
}

func (e *exitError) Error() string {
	msg := fmt.Sprintf("git %s exited with status %d", strings.Join(e.args, " "), e.code)
	if e.stderr != "" {
		msg += ": " + e.stderr
	}
	return msg
}

// command builds a git command with a fixed prefix: no pager, no
// optional locks, no prompts, and no filesystem monitor hook.
func (r *Repo) command(args ...string) *exec.Cmd {
	full := append([]string{"-c", "core.fsmonitor=false", "--no-pager"}, args...)
	cmd := exec.Command(r.Git, full...)
	cmd.Dir = r.Dir
	cmd.Env = append(os.Environ(), "GIT_OPTIONAL_LOCKS=0", "GIT_TERMINAL_PROMPT=0", "GIT_PAGER=cat", "LC_ALL=C")
	return cmd
}

// run runs git and returns its standard output.
func (r *Repo) run(stdin io.Reader, args ...string) ([]byte, error) {
	cmd := r.command(args...)
	cmd.Stdin = stdin
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Run(); err != nil {
		var ee *exec.ExitError
		if errors.As(err, &ee) {
			return nil, &exitError{args: args, code: ee.ExitCode(), stderr: strings.TrimSpace(errb.String())}
		}
		return nil, fmt.Errorf("running git: %w", err)
	}
	return out.Bytes(), nil
}
