// Package yamldoc decodes a YAML file into a node tree that keeps every
// value's position, indexes the nodes by JSON pointer (so JSON Schema
// errors can be mapped back to a line and column), converts the tree to
// plain JSON-like values for validation, and validates it against a schema.
package yamldoc

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/phgate/phgate/spec/diag"
	"gopkg.in/yaml.v3"
)

// Limits bound the work a hostile document can cause.
const (
	// MaxDepth is the deepest nesting of mappings and sequences accepted.
	MaxDepth = 64
	// MaxNodes bounds the number of nodes visited, alias expansions
	// included, so that a "billion laughs" document is refused quickly.
	MaxNodes = 200000
)

// Doc is one decoded YAML document with its JSON-pointer index.
type Doc struct {
	// Path is the file name used in problems.
	Path string
	// Root is the top-level node (a mapping for recipes and catalogs).
	Root   *yaml.Node
	values map[string]*yaml.Node
	keys   map[string]*yaml.Node
}

var lineRe = regexp.MustCompile(`line (\d+)`)

// Parse decodes data. An empty document, a document that is not a
// mapping at the top, more than one document, a syntax error, excessive
// nesting or aliasing are problems with the best position available.
func Parse(data []byte, path string) (*Doc, diag.Problems) {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	if !utf8.Valid(data) {
		return nil, diag.Problems{{Path: path, Message: "file is not valid UTF-8 text"}}
	}
	if bytes.IndexByte(data, 0) >= 0 {
		return nil, diag.Problems{{Path: path, Message: "file looks binary (it contains NUL bytes)"}}
	}
	dec := yaml.NewDecoder(bytes.NewReader(data))
	var root yaml.Node
	if err := dec.Decode(&root); err != nil {
		if errors.Is(err, io.EOF) {
			return nil, diag.Problems{{Path: path, Message: "file is empty"}}
		}
		return nil, diag.Problems{syntaxProblem(path, err)}
	}
	var extra yaml.Node
	if err := dec.Decode(&extra); err == nil {
		return nil, diag.Problems{{Path: path, Line: extra.Line, Column: extra.Column, Message: "more than one YAML document in the file; keep one document (one recipe, one catalog) per file"}}
	}
	return FromNode(&root, path)
}

// FromNode indexes an already decoded node (a document, or a part of one
// such as a recipe's inline catalog) with the same nesting, alias and key
// checks as Parse; pointers are relative to the node.
func FromNode(n *yaml.Node, path string) (*Doc, diag.Problems) {
	top := Deref(n)
	if top != nil && top.Kind == yaml.DocumentNode && len(top.Content) == 1 {
		top = top.Content[0]
	}
	d := &Doc{Path: path, Root: top, values: map[string]*yaml.Node{}, keys: map[string]*yaml.Node{}}
	if top == nil {
		return d, nil
	}
	budget := MaxNodes
	if p := d.index(top, "", 0, &budget); p != nil {
		return nil, diag.Problems{*p}
	}
	return d, nil
}

func syntaxProblem(path string, err error) diag.Problem {
	msg := strings.TrimPrefix(err.Error(), "yaml: ")
	p := diag.Problem{Path: path, Message: "YAML syntax: " + msg}
	if m := lineRe.FindStringSubmatch(msg); m != nil {
		p.Line, _ = strconv.Atoi(m[1])
		p.Message = "YAML syntax: " + strings.TrimSpace(lineRe.ReplaceAllString(msg, ""))
		p.Message = strings.TrimSuffix(strings.ReplaceAll(p.Message, ": :", ":"), ":")
		p.Message = strings.Replace(p.Message, "syntax: :", "syntax:", 1)
	}
	return p
}

// index records every node under its JSON pointer, following aliases.
func (d *Doc) index(n *yaml.Node, ptr string, depth int, budget *int) *diag.Problem {
	*budget--
	if *budget < 0 {
		return &diag.Problem{Path: d.Path, Line: n.Line, Column: n.Column, Message: fmt.Sprintf("document too large or too heavily aliased (more than %d values after expanding aliases)", MaxNodes)}
	}
	if depth > MaxDepth {
		return &diag.Problem{Path: d.Path, Line: n.Line, Column: n.Column, Message: fmt.Sprintf("nesting deeper than %d levels", MaxDepth)}
	}
	n = Deref(n)
	if _, seen := d.values[ptr]; !seen {
		d.values[ptr] = n
	}
	switch n.Kind {
	case yaml.MappingNode:
		seen := map[string]*yaml.Node{}
		for i := 0; i+1 < len(n.Content); i += 2 {
			k, v := n.Content[i], n.Content[i+1]
			if k.Kind != yaml.ScalarNode {
				return &diag.Problem{Path: d.Path, Line: k.Line, Column: k.Column, Message: "mapping keys must be plain text"}
			}
			if k.Value == "<<" {
				return &diag.Problem{Path: d.Path, Line: k.Line, Column: k.Column, Message: "merge keys (<<) are not supported; write the keys out"}
			}
			if prev, dup := seen[k.Value]; dup {
				return &diag.Problem{Path: d.Path, Line: k.Line, Column: k.Column, Message: fmt.Sprintf("key %q appears twice (first at line %d)", k.Value, prev.Line)}
			}
			seen[k.Value] = k
			child := ptr + "/" + escape(k.Value)
			d.keys[child] = k
			if p := d.index(v, child, depth+1, budget); p != nil {
				return p
			}
		}
	case yaml.SequenceNode:
		for i, v := range n.Content {
			if p := d.index(v, ptr+"/"+strconv.Itoa(i), depth+1, budget); p != nil {
				return p
			}
		}
	}
	return nil
}

// Deref follows alias nodes to the node they stand for.
func Deref(n *yaml.Node) *yaml.Node {
	for i := 0; n != nil && n.Kind == yaml.AliasNode && n.Alias != nil && i < MaxDepth; i++ {
		n = n.Alias
	}
	return n
}

func escape(s string) string {
	return strings.ReplaceAll(strings.ReplaceAll(s, "~", "~0"), "/", "~1")
}

// Node returns the value node at a JSON pointer ("" is the root), or nil.
func (d *Doc) Node(ptr string) *yaml.Node { return d.values[ptr] }

// Key returns the key node of the mapping entry at ptr, or nil.
func (d *Doc) Key(ptr string) *yaml.Node { return d.keys[ptr] }

// ProblemAt builds a problem positioned at the node for ptr, falling back
// to the nearest ancestor that exists.
func (d *Doc) ProblemAt(ptr, msg string) diag.Problem {
	for {
		if n := d.values[ptr]; n != nil {
			return diag.Problem{Path: d.Path, Line: n.Line, Column: n.Column, Message: msg}
		}
		i := strings.LastIndex(ptr, "/")
		if i < 0 {
			return diag.Problem{Path: d.Path, Line: 1, Column: 1, Message: msg}
		}
		ptr = ptr[:i]
	}
}

// Value converts the document to JSON-like values (map[string]any,
// []any, float64, string, bool, nil) for schema validation.
func (d *Doc) Value() any { return value(d.Root, 0) }

func value(n *yaml.Node, depth int) any {
	n = Deref(n)
	if n == nil || depth > MaxDepth {
		return nil
	}
	switch n.Kind {
	case yaml.MappingNode:
		m := make(map[string]any, len(n.Content)/2)
		for i := 0; i+1 < len(n.Content); i += 2 {
			m[n.Content[i].Value] = value(n.Content[i+1], depth+1)
		}
		return m
	case yaml.SequenceNode:
		s := make([]any, len(n.Content))
		for i, c := range n.Content {
			s[i] = value(c, depth+1)
		}
		return s
	case yaml.ScalarNode:
		return scalar(n)
	}
	return nil
}

func scalar(n *yaml.Node) any {
	switch n.ShortTag() {
	case "!!null":
		return nil
	case "!!bool":
		var b bool
		if n.Decode(&b) == nil {
			return b
		}
	case "!!int", "!!float":
		var f float64
		if n.Decode(&f) == nil && !math.IsNaN(f) && !math.IsInf(f, 0) {
			return f
		}
	}
	return n.Value
}

// Keys returns the mapping keys under ptr in document order.
func (d *Doc) Keys(ptr string) []string {
	n := d.values[ptr]
	if n == nil || n.Kind != yaml.MappingNode {
		return nil
	}
	var ks []string
	for i := 0; i+1 < len(n.Content); i += 2 {
		ks = append(ks, n.Content[i].Value)
	}
	return ks
}
