package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the expected output of testdata/e2e/scripts")

// script is one end-to-end case: a header of "key: value" lines (args,
// exit), then "-- stdout --" and "-- stderr --" sections with the
// expected output.
type script struct {
	header         []string
	args           []string
	exit           int
	stdout, stderr string
}

func readScript(t *testing.T, path string) script {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	s := script{}
	text := string(data)
	sections := map[string]*string{"-- stdout --\n": &s.stdout, "-- stderr --\n": &s.stderr}
	head := text
	if i := strings.Index(text, "\n-- "); i >= 0 {
		head = text[:i+1]
		rest := text[i+1:]
		for rest != "" {
			var name string
			for n := range sections {
				if strings.HasPrefix(rest, n) {
					name = n
				}
			}
			if name == "" {
				t.Fatalf("%s: unknown section at %q", path, firstLine(rest))
			}
			rest = rest[len(name):]
			body := rest
			switch end := strings.Index(rest, "\n-- "); {
			case strings.HasPrefix(rest, "-- "):
				body = ""
			case end >= 0:
				body, rest = rest[:end+1], rest[end+1:]
			default:
				rest = ""
			}
			*sections[name] = body
		}
	}
	for _, line := range strings.Split(strings.TrimRight(head, "\n"), "\n") {
		s.header = append(s.header, line)
		switch {
		case strings.HasPrefix(line, "args:"):
			s.args = strings.Fields(strings.TrimPrefix(line, "args:"))
		case strings.HasPrefix(line, "exit:"):
			n, err := strconv.Atoi(strings.TrimSpace(strings.TrimPrefix(line, "exit:")))
			if err != nil {
				t.Fatalf("%s: bad exit line %q", path, line)
			}
			s.exit = n
		}
	}
	return s
}

func firstLine(s string) string {
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		return s[:i]
	}
	return s
}

func (s script) render(stdout, stderr string) string {
	var b strings.Builder
	b.WriteString(strings.Join(s.header, "\n") + "\n")
	b.WriteString("-- stdout --\n" + stdout)
	if stderr != "" {
		b.WriteString("-- stderr --\n" + stderr)
	}
	return b.String()
}

// TestScripts runs every testdata/e2e/scripts/*.txt case in process and
// compares exit status and output; -update rewrites the expected output.
func TestScripts(t *testing.T) {
	paths, err := filepath.Glob("../../testdata/e2e/scripts/*.txt")
	if err != nil || len(paths) == 0 {
		t.Fatalf("no scripts: %v", err)
	}
	for _, path := range paths {
		t.Run(strings.TrimSuffix(filepath.Base(path), ".txt"), func(t *testing.T) {
			s := readScript(t, path)
			var stdout, stderr bytes.Buffer
			code := New(strings.NewReader(""), &stdout, &stderr).Run(s.args)
			if code != s.exit {
				t.Errorf("exit status %d, want %d\nstdout:\n%s\nstderr:\n%s", code, s.exit, stdout.String(), stderr.String())
			}
			if *update {
				if err := os.WriteFile(path, []byte(s.render(stdout.String(), stderr.String())), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			if stdout.String() != s.stdout {
				t.Errorf("stdout differs (run with -update to accept):\n--- got\n%s--- want\n%s", stdout.String(), s.stdout)
			}
			if stderr.String() != s.stderr {
				t.Errorf("stderr differs (run with -update to accept):\n--- got\n%s--- want\n%s", stderr.String(), s.stderr)
			}
		})
	}
}
