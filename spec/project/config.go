package project

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"sync"

	"github.com/phgate/phgate/schemas"
	"github.com/phgate/phgate/spec"
	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/yamldoc"
	"gopkg.in/yaml.v3"
)

// ConfigName is the file name of a project configuration.
const ConfigName = "phgate.yaml"

// Config is a loaded phgate.yaml. The zero Config (no file) means
// defaults everywhere.
type Config struct {
	// Path of the file, or "" when the project has none.
	Path string
	// Dir is the folder that globs and catalog paths are relative to.
	Dir      string
	Project  string
	Catalogs []spec.Text
	Include  []string
	Exclude  []string
	// DefaultTolerance is the weighing tolerance in percent for
	// ingredients that declare none (nil: the rule's own default).
	DefaultTolerance *float64
	// DefaultActivity is "davies", "ideal" or "".
	DefaultActivity string
	// Rules is the rules: node (settings keyed by rule name), or nil.
	Rules   *yaml.Node
	Waivers []spec.Waiver
}

var (
	configSchemaOnce sync.Once
	configSchemaMap  map[string]any
)

// ConfigSchema returns the config JSON Schema as raw bytes.
func ConfigSchema() []byte {
	b, err := schemas.FS.ReadFile("config.schema.json")
	if err != nil {
		panic("embedded config schema missing: " + err.Error())
	}
	return b
}

func configKeys(ptr string) []string {
	configSchemaOnce.Do(func() { _ = json.Unmarshal(ConfigSchema(), &configSchemaMap) })
	return yamldoc.KeysFromSchema(configSchemaMap, ptr)
}

// LoadConfig reads and validates a phgate.yaml.
func LoadConfig(path string) (*Config, diag.Problems) {
	data, err := readLimited(path)
	if err != nil {
		return nil, diag.Problems{{Path: path, Message: err.Error()}}
	}
	return ParseConfig(data, path)
}

// ParseConfig validates and converts the bytes of a phgate.yaml.
func ParseConfig(data []byte, path string) (*Config, diag.Problems) {
	c := &Config{Path: path, Dir: filepath.Dir(path)}
	d, ps := yamldoc.Parse(data, path)
	if ps != nil {
		if len(ps) == 1 && ps[0].Message == "file is empty" {
			return c, nil
		}
		return nil, ps
	}
	if d.Root.Kind != yaml.MappingNode {
		return nil, diag.Problems{d.ProblemAt("", "phgate.yaml must be a mapping of keys (catalogs:, rules:, ...)")}
	}
	schema, err := yamldoc.CompileSchema("config.schema.json", ConfigSchema())
	if err != nil {
		panic("embedded config schema does not compile: " + err.Error())
	}
	if ps := d.Validate(schema, configKeys); len(ps) > 0 {
		return nil, ps
	}
	if n := d.Node("/project"); n != nil {
		c.Project = n.Value
	}
	strs := func(ptr string) []spec.Text {
		var out []spec.Text
		if n := d.Node(ptr); n != nil {
			for _, e := range n.Content {
				out = append(out, spec.Text{Value: e.Value, Pos: spec.Pos{Line: e.Line, Column: e.Column}})
			}
		}
		return out
	}
	c.Catalogs = strs("/catalogs")
	var problems diag.Problems
	for _, g := range strs("/include") {
		if err := checkGlob(g.Value); err != nil {
			problems = append(problems, diag.Problem{Path: path, Line: g.Pos.Line, Column: g.Pos.Column, Message: err.Error()})
		}
		c.Include = append(c.Include, g.Value)
	}
	for _, g := range strs("/exclude") {
		if err := checkGlob(g.Value); err != nil {
			problems = append(problems, diag.Problem{Path: path, Line: g.Pos.Line, Column: g.Pos.Column, Message: err.Error()})
		}
		c.Exclude = append(c.Exclude, g.Value)
	}
	if n := d.Node("/defaults/tolerance"); n != nil {
		var f float64
		if n.Decode(&f) == nil {
			c.DefaultTolerance = &f
		}
	}
	if n := d.Node("/defaults/activity"); n != nil {
		c.DefaultActivity = n.Value
	}
	c.Rules = d.Node("/rules")
	c.Waivers = spec.LoadWaivers(d, "/waivers", path)
	if len(problems) > 0 {
		return nil, problems
	}
	return c, nil
}

// FindConfig walks up from dir to the filesystem root and returns the
// path of the first phgate.yaml, or "".
func FindConfig(dir string) string {
	abs, err := filepath.Abs(dir)
	if err != nil {
		return ""
	}
	for {
		p := filepath.Join(abs, ConfigName)
		if st, err := os.Stat(p); err == nil && st.Mode().IsRegular() {
			rel, err := filepath.Rel(mustAbs("."), p)
			if err == nil && !filepath.IsAbs(rel) && len(rel) < len(p) {
				return rel
			}
			return p
		}
		parent := filepath.Dir(abs)
		if parent == abs {
			return ""
		}
		abs = parent
	}
}

func mustAbs(p string) string {
	a, err := filepath.Abs(p)
	if err != nil {
		return p
	}
	return a
}

// DefaultMaxFileSize is the largest recipe, catalog or config file read,
// in bytes, unless Options.MaxFileSize says otherwise.
const DefaultMaxFileSize int64 = 1 << 20

// readLimited reads a file refusing anything larger than DefaultMaxFileSize.
func readLimited(path string) ([]byte, error) { return readAtMost(path, DefaultMaxFileSize) }

// readAtMost reads a file refusing anything larger than limit bytes; it
// checks while reading too, for files that grow or lie about their size.
func readAtMost(path string, limit int64) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read: %v", unwrapPathErr(err))
	}
	defer f.Close()
	st, err := f.Stat()
	if err != nil {
		return nil, fmt.Errorf("cannot read: %v", unwrapPathErr(err))
	}
	if st.IsDir() {
		return nil, fmt.Errorf("is a directory, not a file")
	}
	if st.Size() > limit {
		return nil, fmt.Errorf("file is %d bytes, larger than the %d-byte limit", st.Size(), limit)
	}
	buf := make([]byte, 0, st.Size()+1)
	for {
		if int64(len(buf)) > limit {
			return nil, fmt.Errorf("file is larger than the %d-byte limit", limit)
		}
		if len(buf) == cap(buf) {
			buf = append(buf, 0)[:len(buf)]
		}
		n, err := f.Read(buf[len(buf):cap(buf)])
		buf = buf[:len(buf)+n]
		if err != nil {
			break
		}
	}
	return buf, nil
}

func unwrapPathErr(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}
