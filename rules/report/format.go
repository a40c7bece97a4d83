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

// Streamer is a Formatter that can write each recipe as soon as it is
// solved (in path order) and the rest at the end, so a check over a large
// repository holds only the tally, not every recipe.
type Streamer interface {
	Formatter
	// WriteRecipe writes one recipe's part of the output.
	WriteRecipe(w io.Writer, r *Recipe) error
	// WriteEnd writes what follows the recipes: project findings,
	// problems and the tally (rep.Recipes has been streamed already).
	WriteEnd(w io.Writer, rep *Report) error
}

// writeAll writes a whole report through a Streamer's two halves.
func writeAll(s Streamer, w io.Writer, rep *Report) error {
	for i := range rep.Recipes {
		if err := s.WriteRecipe(w, &rep.Recipes[i]); err != nil {
			return err
		}
	}
	return s.WriteEnd(w, rep)
}

// JSON writes the report as one JSON document in which each recipe sits
// on a line of its own: valid JSON for tools, greppable and diffable by
// line for people, and fast to write for repositories with thousands of
// recipes (no whole-document indentation pass). It streams.
type JSON struct {
	written int
}

// Write implements Formatter.
func (j *JSON) Write(w io.Writer, rep *Report) error { return writeAll(j, w, rep) }

// WriteRecipe implements Streamer.
func (j *JSON) WriteRecipe(w io.Writer, r *Recipe) error {
	b, err := json.Marshal(r)
	if err != nil {
		return err
	}
	sep := ",\n  "
	if j.written == 0 {
		sep = "{\"recipes\": [\n  "
	}
	j.written++
	if _, err := io.WriteString(w, sep); err != nil {
		return err
	}
	_, err = w.Write(b)
	return err
}

// WriteEnd implements Streamer.
func (j *JSON) WriteEnd(w io.Writer, rep *Report) error {
	bw := bufio.NewWriter(w)
	if j.written == 0 {
		bw.WriteString("{\"recipes\": [],\n")
	} else {
		bw.WriteString("\n],\n")
	}
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
	{"json", func(bool) Formatter { return &JSON{} }},
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
