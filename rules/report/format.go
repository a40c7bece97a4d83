package report

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
)

// Formatter writes a finished report.
type Formatter interface {
	Write(w io.Writer, rep *Report) error
}

// JSON writes the report as indented JSON.
type JSON struct{}

// Write implements Formatter.
func (JSON) Write(w io.Writer, rep *Report) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(rep)
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
