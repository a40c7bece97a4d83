package yamldoc

import (
	"bytes"
	"fmt"
	"sort"
	"strings"
	"sync"

	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/suggest"
	"github.com/santhosh-tekuri/jsonschema/v5"
)

var (
	schemaMu    sync.Mutex
	schemaCache = map[string]*jsonschema.Schema{}
)

// CompileSchema compiles a JSON Schema (draft 2020-12) once per url and
// caches it. The schema must not reference other resources.
func CompileSchema(url string, src []byte) (*jsonschema.Schema, error) {
	schemaMu.Lock()
	defer schemaMu.Unlock()
	if s, ok := schemaCache[url]; ok {
		return s, nil
	}
	c := jsonschema.NewCompiler()
	c.Draft = jsonschema.Draft2020
	if err := c.AddResource(url, bytes.NewReader(src)); err != nil {
		return nil, err
	}
	s, err := c.Compile(url)
	if err != nil {
		return nil, err
	}
	schemaCache[url] = s
	return s, nil
}

// Validate checks the document against schema and returns one problem per
// failing leaf, positioned at the offending YAML node and phrased for
// people (unknown keys get a "did you mean" from the allowed keys).
func (d *Doc) Validate(schema *jsonschema.Schema, allowedKeys func(ptr string) []string) diag.Problems {
	err := schema.Validate(d.Value())
	if err == nil {
		return nil
	}
	ve, ok := err.(*jsonschema.ValidationError)
	if !ok {
		return diag.Problems{{Path: d.Path, Message: err.Error()}}
	}
	var leaves []*jsonschema.ValidationError
	collectLeaves(ve, &leaves)
	seen := map[string]bool{}
	var ps diag.Problems
	for _, l := range leaves {
		for _, p := range d.describe(l, allowedKeys) {
			k := p.Error()
			if !seen[k] {
				seen[k] = true
				ps = append(ps, p)
			}
		}
	}
	ps = dropOneOfNoise(ps)
	ps.Sort()
	return ps
}

func collectLeaves(e *jsonschema.ValidationError, out *[]*jsonschema.ValidationError) {
	// An anyOf failure is one problem ("none of the allowed forms"), not
	// one per branch.
	if len(e.Causes) == 0 || strings.HasPrefix(e.Message, "anyOf failed") || wrongTypeForEveryForm(e) {
		*out = append(*out, e)
		return
	}
	for _, c := range e.Causes {
		collectLeaves(c, out)
	}
}

// dropOneOfNoise removes generic "oneOf" failures at a position that also
// has a precise problem.
func dropOneOfNoise(ps diag.Problems) diag.Problems {
	precise := map[[2]int]bool{}
	for _, p := range ps {
		if !strings.HasPrefix(p.Message, "value does not match") {
			precise[[2]int{p.Line, p.Column}] = true
		}
	}
	out := ps[:0]
	for _, p := range ps {
		if strings.HasPrefix(p.Message, "value does not match") && precise[[2]int{p.Line, p.Column}] {
			continue
		}
		out = append(out, p)
	}
	return out
}

func (d *Doc) describe(l *jsonschema.ValidationError, allowedKeys func(string) []string) []diag.Problem {
	ptr := l.InstanceLocation
	msg := l.Message
	where := keyName(ptr)
	switch {
	case strings.Contains(l.KeywordLocation, "dependentSchemas/"):
		// A key that excludes another: dependentSchemas/A/properties/B.
		parts := strings.Split(l.KeywordLocation[strings.Index(l.KeywordLocation, "dependentSchemas/"):], "/")
		if len(parts) >= 4 {
			parent := ptr[:strings.LastIndex(ptr, "/")]
			return []diag.Problem{d.ProblemAt(ptr, fmt.Sprintf("%s: %q cannot be combined with %q (%s)", orTop(keyName(parent)), parts[3], parts[1], oneOfHint(keyName(parent))))}
		}
	case strings.HasPrefix(msg, "anyOf failed"):
		return []diag.Problem{d.ProblemAt(ptr, fmt.Sprintf("value does not match any allowed form for %s (%s)", orTop(where), oneOfHint(where)))}
	case strings.HasPrefix(msg, "additionalProperties"):
		var out []diag.Problem
		for _, k := range quoted(msg) {
			kp := ptr + "/" + escape(k)
			text := fmt.Sprintf("unknown key %q", k)
			if allowedKeys != nil {
				if s := suggest.Nearest(k, allowedKeys(ptr)); s != "" {
					text += fmt.Sprintf("; did you mean %q?", s)
				}
			}
			if kn := d.keys[kp]; kn != nil {
				out = append(out, diag.Problem{Path: d.Path, Line: kn.Line, Column: kn.Column, Message: text})
			} else {
				out = append(out, d.ProblemAt(ptr, text))
			}
		}
		return out
	case strings.HasPrefix(msg, "missing properties"):
		ks := quoted(msg)
		text := fmt.Sprintf("missing required key %s", strings.Join(wrap(ks), ", "))
		if where != "" {
			text += " in " + where
		}
		return []diag.Problem{d.ProblemAt(ptr, text)}
	case strings.HasPrefix(msg, "expected "):
		return []diag.Problem{d.ProblemAt(ptr, fmt.Sprintf("%s: %s", orTop(where), msg))}
	case strings.Contains(msg, "does not match pattern"):
		val := ""
		if n := d.values[ptr]; n != nil {
			val = n.Value
		}
		return []diag.Problem{d.ProblemAt(ptr, fmt.Sprintf("%s: value %q has the wrong form (%s)", orTop(where), val, patternHint(lastKey(ptr))))}
	case strings.HasPrefix(msg, "valid against schemas at indexes"), strings.HasPrefix(msg, "oneOf failed"):
		return []diag.Problem{d.ProblemAt(ptr, fmt.Sprintf("value does not match any allowed form for %s (%s)", orTop(where), oneOfHint(where)))}
	}
	return []diag.Problem{d.ProblemAt(ptr, fmt.Sprintf("%s: %s", orTop(where), msg))}
}

func orTop(s string) string {
	if s == "" {
		return "document"
	}
	return s
}

func patternHint(key string) string {
	switch key {
	case "recipe", "id":
		return "use lower-case kebab-case such as wash-buffer-a"
	case "sequence":
		return "use one-letter amino-acid codes, upper case"
	case "expires":
		return "use a date such as 2027-06-30"
	}
	return "see the schema"
}

func oneOfHint(key string) string {
	switch {
	case strings.HasPrefix(key, "ingredients[") || key == "ingredient":
		return "an ingredient has exactly one of use, from or sequence"
	case key == "temperature":
		return "write it as 25 C, or as {nominal: 25 C, range: 4..25 C}"
	}
	return "see the schema"
}

// wrongTypeForEveryForm reports a oneOf whose every branch failed only on
// the value's type (temperature: 25 is neither a string nor a mapping):
// one problem says so, instead of one per branch.
func wrongTypeForEveryForm(e *jsonschema.ValidationError) bool {
	if !strings.HasPrefix(e.Message, "oneOf failed") {
		return false
	}
	for _, c := range e.Causes {
		if len(c.Causes) > 0 || c.InstanceLocation != e.InstanceLocation || !strings.HasPrefix(c.Message, "expected ") {
			return false
		}
	}
	return true
}

// keyName renders a JSON pointer as a readable key path:
// /ingredients/2/amount → ingredients[2].amount (0-based index shown 1-based).
func keyName(ptr string) string {
	if ptr == "" {
		return ""
	}
	parts := strings.Split(strings.TrimPrefix(ptr, "/"), "/")
	var b strings.Builder
	for _, p := range parts {
		p = strings.ReplaceAll(strings.ReplaceAll(p, "~1", "/"), "~0", "~")
		if n, ok := atoi(p); ok {
			fmt.Fprintf(&b, "[%d]", n+1)
			continue
		}
		if b.Len() > 0 {
			b.WriteByte('.')
		}
		b.WriteString(p)
	}
	return b.String()
}

func atoi(s string) (int, bool) {
	if s == "" {
		return 0, false
	}
	n := 0
	for _, r := range s {
		if r < '0' || r > '9' {
			return 0, false
		}
		n = n*10 + int(r-'0')
	}
	return n, true
}

func quoted(msg string) []string {
	var out []string
	for {
		i := strings.IndexByte(msg, '\'')
		if i < 0 {
			break
		}
		j := strings.IndexByte(msg[i+1:], '\'')
		if j < 0 {
			break
		}
		out = append(out, msg[i+1:i+1+j])
		msg = msg[i+j+2:]
	}
	sort.Strings(out)
	return out
}

func lastKey(ptr string) string {
	return ptr[strings.LastIndex(ptr, "/")+1:]
}

func wrap(ks []string) []string {
	out := make([]string, len(ks))
	for i, k := range ks {
		out[i] = fmt.Sprintf("%q", k)
	}
	return out
}

// KeysFromSchema lists the property names a schema allows for the object
// at the instance pointer ptr, following properties, items, $ref (local
// "#/$defs/..." only) and oneOf branches. It feeds "did you mean" hints.
func KeysFromSchema(schema map[string]any, ptr string) []string {
	node := schema
	var parts []string
	if ptr != "" {
		parts = strings.Split(strings.TrimPrefix(ptr, "/"), "/")
	}
	for _, p := range parts {
		node = resolveRef(schema, node)
		if _, isIndex := atoi(p); isIndex {
			items, _ := node["items"].(map[string]any)
			if items == nil {
				return nil
			}
			node = items
			continue
		}
		next := propertyOf(schema, node, p)
		if next == nil {
			return nil
		}
		node = next
	}
	node = resolveRef(schema, node)
	keys := map[string]bool{}
	collectProps(schema, node, keys, 0)
	out := make([]string, 0, len(keys))
	for k := range keys {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

func resolveRef(root, node map[string]any) map[string]any {
	for i := 0; i < 8; i++ {
		ref, _ := node["$ref"].(string)
		if !strings.HasPrefix(ref, "#/") {
			return node
		}
		cur := root
		for _, seg := range strings.Split(strings.TrimPrefix(ref, "#/"), "/") {
			next, _ := cur[seg].(map[string]any)
			if next == nil {
				return node
			}
			cur = next
		}
		node = cur
	}
	return node
}

func propertyOf(root, node map[string]any, name string) map[string]any {
	if props, _ := node["properties"].(map[string]any); props != nil {
		if p, _ := props[name].(map[string]any); p != nil {
			return p
		}
	}
	for _, branch := range []string{"oneOf", "anyOf", "allOf"} {
		list, _ := node[branch].([]any)
		for _, b := range list {
			if bm, _ := b.(map[string]any); bm != nil {
				if p := propertyOf(root, resolveRef(root, bm), name); p != nil {
					return p
				}
			}
		}
	}
	return nil
}

func collectProps(root, node map[string]any, keys map[string]bool, depth int) {
	if depth > 8 {
		return
	}
	if props, _ := node["properties"].(map[string]any); props != nil {
		for k := range props {
			keys[k] = true
		}
	}
	for _, branch := range []string{"oneOf", "anyOf", "allOf"} {
		list, _ := node[branch].([]any)
		for _, b := range list {
			if bm, _ := b.(map[string]any); bm != nil {
				collectProps(root, resolveRef(root, bm), keys, depth+1)
			}
		}
	}
}
