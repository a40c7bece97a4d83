package project

import (
	"fmt"
	"path"
	"strings"
)

// matchGlob reports whether the slash-separated relative path name matches
// pattern. Besides path.Match syntax, a "**" segment matches any number of
// folders, and a pattern without a slash matches the base name anywhere.
func matchGlob(pattern, name string) bool {
	if !strings.Contains(pattern, "/") {
		ok, _ := path.Match(pattern, path.Base(name))
		if ok {
			return true
		}
		// A bare folder name also excludes everything below it.
		for _, seg := range strings.Split(path.Dir(name), "/") {
			if ok, _ := path.Match(pattern, seg); ok {
				return true
			}
		}
		return false
	}
	return matchSegs(strings.Split(strings.TrimSuffix(pattern, "/"), "/"), strings.Split(name, "/"))
}

func matchSegs(pat, segs []string) bool {
	for len(pat) > 0 {
		if pat[0] == "**" {
			for i := 0; i <= len(segs); i++ {
				if matchSegs(pat[1:], segs[i:]) {
					return true
				}
			}
			return false
		}
		if len(segs) == 0 {
			return false
		}
		if ok, _ := path.Match(pat[0], segs[0]); !ok {
			return false
		}
		pat, segs = pat[1:], segs[1:]
	}
	// A pattern naming a folder matches everything inside it.
	return true
}

func checkGlob(p string) error {
	for _, seg := range strings.Split(p, "/") {
		if seg == "**" {
			continue
		}
		if _, err := path.Match(seg, ""); err != nil {
			return fmt.Errorf("bad glob %q: %v", p, err)
		}
	}
	return nil
}
