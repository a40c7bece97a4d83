package report

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"strings"
)

// Formatter writes a finished report.
type Formatter interface {
	Write(w io.Writer, rep *Report) error
}

// JSON writes the report as one JSON document in which each recipe sits
// on a line of its own: valid JSON for tools, greppable and diffable by
// line for people, and fast to write for repositories with thousands of
// recipes (no whole-document indentation pass).
type JSON struct{}

// Write implements Formatter.
func (JSON) Write(w io.Writer, rep *Report) error {
	bw := bufio.NewWriter(w)
	bw.WriteString("{\"recipes\": [")
	for i := range rep.Recipes {
		if i > 0 {
			bw.WriteByte(',')
		}
		bw.WriteString("\n  ")
		b, err := json.Marshal(&rep.Recipes[i])
		if err != nil {
			return err
		}
		bw.Write(b)
	}
	if len(rep.Recipes) > 0 {
		bw.WriteByte('\n')
	}
	bw.WriteString("],\n")
	rest := map[string]any{"project_findings": rep.Findings, "problems": rep.Problems, "summary": rep.Summary}
	for i, k := range []string{"project_findings", "problems", "summary"} {
		b, err := json.MarshalIndent(rest[k], "", "  ")
		if err != nil {
			return err
		}
		fmt.Fprintf(bw, "%q: %s", k, b)
		if i < 2 {
			bw.WriteString(",\n")
		}
	}
	bw.WriteString("}\n")
	return bw.Flush()
}

// formats lists the --format values in the order help shows them.
var formats = []struct {
	name string
	make func(color bool) Formatter
}{
	{"text", func(c bool) Formatter { return &Text{Color: c} }},
	{"json", func(bool) Formatter { return JSON{} }},
	{"sarif", func(bool) Formatter { return SARIF{} }},
	{"markdown", func(bool) Formatter { return Markdown{} }},
	{"github", func(bool) Formatter { return GitHub{} }},
}

// Names returns the --format values.
func Names() []string {
	out := make([]string, len(formats))
	for i, f := range formats {
		out[i] = f.name
	}
	return out
}

// ByName returns the formatter for a --format value; colour applies to
// text only.
func ByName(name string, color bool) (Formatter, error) {
	if name == "" {
		name = "text"
	}
	for _, f := range formats {
		if f.name == name {
			return f.make(color), nil
		}
	}
	return nil, fmt.Errorf("unknown format %q (use %s)", name, strings.Join(Names(), ", "))
}
