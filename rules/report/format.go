package report

import (
	"encoding/json"
	"fmt"
	"io"
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

// ByName returns the formatter for a --format value.
func ByName(name string, color bool) (Formatter, error) {
	switch name {
	case "text", "":
		return &Text{Color: color}, nil
	case "json":
		return JSON{}, nil
	}
	return nil, fmt.Errorf("unknown format %q (use text or json)", name)
}
