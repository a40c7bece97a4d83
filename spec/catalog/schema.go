package catalog

import (
	"bytes"
	"fmt"
	"regexp"
	"sort"
	"strings"
	"sync"

	"github.com/phgate/phgate/schemas"
	"github.com/phgate/phgate/spec/diag"
	"github.com/santhosh-tekuri/jsonschema/v5"
)

// SchemaFile is the name of the catalog schema in package schemas.
const SchemaFile = "catalog.schema.json"

const schemaURL = "https://phgate.invalid/schemas/catalog.schema.json"

var (
	schemaOnce sync.Once
	schemaVal  *jsonschema.Schema
	schemaErr  error
)

// compiledSchema compiles the embedded catalog schema once.
func compiledSchema() (*jsonschema.Schema, error) {
	schemaOnce.Do(func() {
		src, err := schemas.FS.ReadFile(SchemaFile)
		if err != nil {
			schemaErr = err
			return
		}
		c := jsonschema.NewCompiler()
		c.Draft = jsonschema.Draft2020
		if err := c.AddResource(schemaURL, bytes.NewReader(src)); err != nil {
			schemaErr = err
			return
		}
		schemaVal, schemaErr = c.Compile(schemaURL)
	})
	return schemaVal, schemaErr
}

var (
	addPropRe = regexp.MustCompile(`'([^']*)'`)
)

// validate checks the document against the schema and returns problems
// at the positions of the offending nodes, plus the set of pointers that
// had errors (so the semantic checks skip broken entries).
func (d *document) validate() (diag.Problems, []string) {
	s, err := compiledSchema()
	if err != nil {
		return diag.Problems{{Path: d.path, Message: "internal error: catalog schema: " + err.Error()}}, []string{""}
	}
	err = s.Validate(d.Value())
	if err == nil {
		return nil, nil
	}
	ve, ok := err.(*jsonschema.ValidationError)
	if !ok {
		return diag.Problems{{Path: d.path, Message: err.Error()}}, []string{""}
	}
	var out diag.Problems
	var bad []string
	seen := map[string]bool{}
	add := func(ptr string, key bool, msg string) {
		p := d.problemAt(ptr, key, msg)
		k := p.Error()
		if seen[k] {
			return
		}
		seen[k] = true
		out = append(out, p)
		bad = append(bad, ptr)
	}
	var walk func(e *jsonschema.ValidationError)
	walk = func(e *jsonschema.ValidationError) {
		if strings.HasSuffix(e.KeywordLocation, "/oneOf") {
			var leaves []*jsonschema.ValidationError
			collectLeaves(e, &leaves)
			var deeper []*jsonschema.ValidationError
			for _, l := range leaves {
				if l.InstanceLocation != e.InstanceLocation {
					deeper = append(deeper, l)
				}
			}
			if len(deeper) > 0 {
				for _, l := range deeper {
					d.describe(l, add)
				}
				return
			}
			var msgs []string
			for _, l := range leaves {
				msgs = append(msgs, l.Message)
			}
			add(e.InstanceLocation, false, fmt.Sprintf("%s: none of the allowed forms fits (%s)", label(e.InstanceLocation), strings.Join(msgs, "; ")))
			return
		}
		if len(e.Causes) == 0 {
			d.describe(e, add)
			return
		}
		for _, c := range e.Causes {
			walk(c)
		}
	}
	walk(ve)
	sort.Strings(bad)
	return out, bad
}

func collectLeaves(e *jsonschema.ValidationError, out *[]*jsonschema.ValidationError) {
	if len(e.Causes) == 0 {
		*out = append(*out, e)
		return
	}
	for _, c := range e.Causes {
		collectLeaves(c, out)
	}
}

// label names the last pointer segment for messages.
func label(ptr string) string {
	if ptr == "" {
		return "catalog"
	}
	i := strings.LastIndex(ptr, "/")
	seg := strings.ReplaceAll(strings.ReplaceAll(ptr[i+1:], "~1", "/"), "~0", "~")
	return fmt.Sprintf("%q", seg)
}

// describe turns one leaf error into a readable problem.
func (d *document) describe(e *jsonschema.ValidationError, add func(ptr string, key bool, msg string)) {
	msg := e.Message
	switch {
	case strings.HasPrefix(msg, "additionalProperties"):
		for _, m := range addPropRe.FindAllStringSubmatch(msg, -1) {
			add(e.InstanceLocation+"/"+escapePtr(m[1]), true, fmt.Sprintf("unknown key %q in %s", m[1], label(e.InstanceLocation)))
		}
		return
	case strings.Contains(e.KeywordLocation, "/propertyNames"):
		name := strings.TrimPrefix(e.InstanceLocation[strings.LastIndex(e.InstanceLocation, "/")+1:], "")
		name = strings.ReplaceAll(strings.ReplaceAll(name, "~1", "/"), "~0", "~")
		hint := "ids are kebab-case: lower-case letters and digits joined by single hyphens"
		if strings.Contains(e.KeywordLocation, "label") || strings.HasPrefix(e.InstanceLocation, "/ions") || strings.HasPrefix(e.InstanceLocation, "/complexes") {
			hint = "labels are letters, digits and brackets, optionally followed by a charge such as +, -2"
		}
		add(e.InstanceLocation, true, fmt.Sprintf("%q is not a valid name here: %s", name, hint))
		return
	case strings.HasPrefix(msg, "missing properties"):
		add(e.InstanceLocation, true, fmt.Sprintf("%s: %s", label(e.InstanceLocation), msg))
		return
	case strings.HasPrefix(msg, "does not match pattern") && strings.Contains(e.KeywordLocation, "$defs/id"):
		msg = "must be a kebab-case id (lower-case letters and digits joined by single hyphens)"
	case strings.HasPrefix(msg, "does not match pattern") && strings.Contains(e.KeywordLocation, "$defs/label"):
		msg = "must be a label such as Na+, HPO4-2 or TrisH+"
	}
	add(e.InstanceLocation, false, fmt.Sprintf("%s: %s", label(e.InstanceLocation), msg))
}

// problemAt positions a message at the node of a pointer (its key when
// key is true and the pointer names a mapping entry), falling back to the
// nearest indexed ancestor.
func (d *document) problemAt(ptr string, key bool, msg string) diag.Problem {
	for p := ptr; ; {
		n := d.Node(p)
		if key || n == nil {
			if k := d.Key(p); k != nil {
				n = k
			}
		}
		if n != nil {
			return diag.Problem{Path: d.path, Line: n.Line, Column: n.Column, Message: msg}
		}
		if p == "" {
			return diag.Problem{Path: d.path, Message: msg}
		}
		p = p[:strings.LastIndex(p, "/")]
	}
}
