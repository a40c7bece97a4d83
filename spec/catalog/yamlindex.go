package catalog

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"
)

// Limits against hostile documents.
const (
	// maxDepth bounds nesting of mappings and sequences.
	maxDepth = 64
	// maxNodes bounds nodes visited, alias expansions included, so an
	// alias bomb is refused quickly.
	maxNodes = 200000
)

// document is one decoded YAML file with a JSON-pointer index of its
// nodes, used to map schema errors back to positions.
type document struct {
	path   string
	root   *yaml.Node
	values map[string]*yaml.Node // pointer -> value node
	keys   map[string]*yaml.Node // pointer -> key node of a mapping entry
	value  any                   // JSON-like value for schema validation
}

func escapePtr(s string) string {
	return strings.ReplaceAll(strings.ReplaceAll(s, "~", "~0"), "/", "~1")
}

func deref(n *yaml.Node) *yaml.Node {
	for i := 0; n != nil && n.Kind == yaml.AliasNode && i < maxDepth; i++ {
		n = n.Alias
	}
	return n
}

// newDocument indexes root (a document or mapping node).
func newDocument(root *yaml.Node, path string) (*document, error) {
	if root != nil && root.Kind == yaml.DocumentNode {
		if len(root.Content) == 0 {
			root = nil
		} else {
			root = root.Content[0]
		}
	}
	d := &document{path: path, root: root, values: map[string]*yaml.Node{}, keys: map[string]*yaml.Node{}}
	if root == nil {
		return d, nil
	}
	budget := maxNodes
	v, err := d.walk(root, "", 0, &budget)
	if err != nil {
		return nil, err
	}
	d.value = v
	return d, nil
}

func (d *document) walk(n *yaml.Node, ptr string, depth int, budget *int) (any, error) {
	*budget--
	if *budget < 0 {
		return nil, fmt.Errorf("document too large or too many alias expansions (more than %d nodes)", maxNodes)
	}
	if depth > maxDepth {
		return nil, fmt.Errorf("nesting deeper than %d levels", maxDepth)
	}
	n = deref(n)
	if n == nil {
		return nil, nil
	}
	d.values[ptr] = n
	switch n.Kind {
	case yaml.MappingNode:
		m := map[string]any{}
		for i := 0; i+1 < len(n.Content); i += 2 {
			k, v := deref(n.Content[i]), n.Content[i+1]
			if k == nil {
				continue
			}
			p := ptr + "/" + escapePtr(k.Value)
			d.keys[p] = k
			val, err := d.walk(v, p, depth+1, budget)
			if err != nil {
				return nil, err
			}
			m[k.Value] = val
		}
		return m, nil
	case yaml.SequenceNode:
		s := make([]any, 0, len(n.Content))
		for i, c := range n.Content {
			val, err := d.walk(c, ptr+"/"+strconv.Itoa(i), depth+1, budget)
			if err != nil {
				return nil, err
			}
			s = append(s, val)
		}
		return s, nil
	case yaml.ScalarNode:
		return scalarValue(n), nil
	}
	return nil, nil
}

// scalarValue converts a scalar to the JSON-like value the schema sees.
func scalarValue(n *yaml.Node) any {
	switch n.ShortTag() {
	case "!!int", "!!float":
		if f, ok := number(n); ok {
			return f
		}
		return n.Value
	case "!!bool":
		var b bool
		if n.Decode(&b) == nil {
			return b
		}
	case "!!null":
		return nil
	}
	return n.Value
}

// number decodes a numeric scalar; NaN and infinities are refused.
func number(n *yaml.Node) (float64, bool) {
	if n == nil || n.Kind != yaml.ScalarNode {
		return 0, false
	}
	if t := n.ShortTag(); t != "!!int" && t != "!!float" {
		return 0, false
	}
	var f float64
	if err := n.Decode(&f); err != nil || math.IsNaN(f) || math.IsInf(f, 0) {
		return 0, false
	}
	return f, true
}

// pos returns the position of a node; for a quoted scalar the column of
// its first character inside the quotes is given by valueColumn.
func (d *document) pos(n *yaml.Node) Pos {
	if n == nil {
		return Pos{Path: d.path}
	}
	return Pos{Path: d.path, Line: n.Line, Column: n.Column}
}

// valueColumn is the column of the first character of a scalar's text.
func valueColumn(n *yaml.Node) int {
	if n.Style&(yaml.DoubleQuotedStyle|yaml.SingleQuotedStyle) != 0 {
		return n.Column + 1
	}
	return n.Column
}

// mapping iterates over a mapping node's entries in file order.
func mapping(n *yaml.Node, fn func(key, val *yaml.Node)) {
	n = deref(n)
	if n == nil || n.Kind != yaml.MappingNode {
		return
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		fn(deref(n.Content[i]), deref(n.Content[i+1]))
	}
}

// field returns the value node of key in a mapping, or nil.
func field(n *yaml.Node, key string) *yaml.Node {
	var out *yaml.Node
	mapping(n, func(k, v *yaml.Node) {
		if out == nil && k.Value == key {
			out = v
		}
	})
	return out
}

// str returns a scalar's text, or "".
func str(n *yaml.Node) string {
	if n == nil || n.Kind != yaml.ScalarNode {
		return ""
	}
	return n.Value
}

// items returns a sequence's elements.
func items(n *yaml.Node) []*yaml.Node {
	n = deref(n)
	if n == nil || n.Kind != yaml.SequenceNode {
		return nil
	}
	out := make([]*yaml.Node, len(n.Content))
	for i, c := range n.Content {
		out[i] = deref(c)
	}
	return out
}
