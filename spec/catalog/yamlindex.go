package catalog

import (
	"math"
	"strings"

	"github.com/phgate/phgate/spec/diag"
	"github.com/phgate/phgate/spec/yamldoc"
	"gopkg.in/yaml.v3"
)

// document is one decoded catalog (a file, or a recipe's inline catalog)
// indexed by JSON pointer through the shared YAML decoder, so schema
// errors map back to positions.
type document struct {
	*yamldoc.Doc
	path string
	root *yaml.Node
}

func escapePtr(s string) string {
	return strings.ReplaceAll(strings.ReplaceAll(s, "~", "~0"), "/", "~1")
}

func deref(n *yaml.Node) *yaml.Node { return yamldoc.Deref(n) }

// newDocument indexes root (a document or mapping node).
func newDocument(root *yaml.Node, path string) (*document, diag.Problems) {
	d, ps := yamldoc.FromNode(root, path)
	if ps != nil {
		return nil, ps
	}
	return &document{Doc: d, path: path, root: d.Root}, nil
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
