package report

import (
	"encoding/json"
	"io"
	"net/url"
	"path/filepath"
	"strings"

	"github.com/phgate/phgate/rules"
)

// SARIF writes the report as a SARIF 2.1.0 log: one run, the rule
// registry as the driver's rule descriptors, one result per finding at
// its recipe line and column (columns counted in Unicode code points),
// waived findings as suppressed results, and unreadable files as tool
// execution notifications.
type SARIF struct{}

// SARIFSchema is the $schema URI written into every log.
const SARIFSchema = "https://json.schemastore.org/sarif-2.1.0.json"

type sarifLog struct {
	Schema  string     `json:"$schema"`
	Version string     `json:"version"`
	Runs    []sarifRun `json:"runs"`
}

type sarifRun struct {
	Tool        sarifTool         `json:"tool"`
	Invocations []sarifInvocation `json:"invocations"`
	Results     []sarifResult     `json:"results"`
	ColumnKind  string            `json:"columnKind"`
}

type sarifTool struct {
	Driver sarifDriver `json:"driver"`
}

type sarifDriver struct {
	Name  string      `json:"name"`
	Rules []sarifRule `json:"rules"`
}

type sarifRule struct {
	ID                   string             `json:"id"`
	Name                 string             `json:"name"`
	ShortDescription     sarifText          `json:"shortDescription"`
	FullDescription      sarifText          `json:"fullDescription"`
	Help                 sarifText          `json:"help"`
	DefaultConfiguration sarifConfiguration `json:"defaultConfiguration"`
}

type sarifText struct {
	Text     string `json:"text"`
	Markdown string `json:"markdown,omitempty"`
}

type sarifConfiguration struct {
	Level string `json:"level"`
}

type sarifResult struct {
	RuleID       string             `json:"ruleId"`
	RuleIndex    int                `json:"ruleIndex"`
	Level        string             `json:"level"`
	Message      sarifText          `json:"message"`
	Locations    []sarifLocation    `json:"locations"`
	Suppressions []sarifSuppression `json:"suppressions,omitempty"`
}

type sarifLocation struct {
	PhysicalLocation sarifPhysical `json:"physicalLocation"`
}

type sarifPhysical struct {
	ArtifactLocation sarifArtifact `json:"artifactLocation"`
	Region           *sarifRegion  `json:"region,omitempty"`
}

type sarifArtifact struct {
	URI       string `json:"uri"`
	URIBaseID string `json:"uriBaseId,omitempty"`
}

type sarifRegion struct {
	StartLine   int `json:"startLine"`
	StartColumn int `json:"startColumn,omitempty"`
}

type sarifSuppression struct {
	Kind          string `json:"kind"`
	Justification string `json:"justification"`
}

type sarifInvocation struct {
	ExecutionSuccessful        bool                `json:"executionSuccessful"`
	ToolExecutionNotifications []sarifNotification `json:"toolExecutionNotifications,omitempty"`
}

type sarifNotification struct {
	Level     string          `json:"level"`
	Message   sarifText       `json:"message"`
	Locations []sarifLocation `json:"locations,omitempty"`
}

// sarifLevel maps a severity to a SARIF level.
func sarifLevel(s rules.Severity) string {
	switch s {
	case rules.Error:
		return "error"
	case rules.Warning:
		return "warning"
	}
	return "note"
}

// sarifLocationOf builds a location; line 0 means the whole file.
func sarifLocationOf(path string, line, col int) sarifLocation {
	a := sarifArtifact{URI: fileURI(path)}
	if !filepath.IsAbs(path) {
		a.URIBaseID = "%SRCROOT%"
	}
	loc := sarifLocation{PhysicalLocation: sarifPhysical{ArtifactLocation: a}}
	if line > 0 {
		loc.PhysicalLocation.Region = &sarifRegion{StartLine: line, StartColumn: col}
	}
	return loc
}

// fileURI turns a path into a URI reference: relative paths stay
// relative (resolved against %SRCROOT%), absolute ones become file URIs.
func fileURI(path string) string {
	p := filepath.ToSlash(path)
	if filepath.IsAbs(path) {
		if !strings.HasPrefix(p, "/") {
			p = "/" + p
		}
		return (&url.URL{Scheme: "file", Path: p}).String()
	}
	return (&url.URL{Path: p}).String()
}

// Write implements Formatter.
func (SARIF) Write(w io.Writer, rep *Report) error {
	run := sarifRun{Tool: sarifTool{Driver: sarifDriver{Name: "phgate"}}, Results: []sarifResult{}, ColumnKind: "unicodeCodePoints"}
	index := map[string]int{}
	for i, r := range rules.Registry {
		index[r.Name] = i
		run.Tool.Driver.Rules = append(run.Tool.Driver.Rules, sarifRule{
			ID: r.Name, Name: r.Name,
			ShortDescription:     sarifText{Text: r.Summary},
			FullDescription:      sarifText{Text: r.Doc},
			Help:                 sarifText{Text: r.Explain()},
			DefaultConfiguration: sarifConfiguration{Level: sarifLevel(r.Default)},
		})
	}
	for _, f := range rep.All() {
		text := f.Message
		if f.Fix != "" {
			text += "\nFix: " + f.Fix
		}
		res := sarifResult{RuleID: f.Rule, RuleIndex: index[f.Rule], Level: sarifLevel(f.Severity),
			Message: sarifText{Text: text}, Locations: []sarifLocation{sarifLocationOf(f.Path, f.Line, f.Column)}}
		if f.Waived != "" {
			kind := "external"
			if f.WaivedIn == f.Path {
				kind = "inSource"
			}
			res.Suppressions = []sarifSuppression{{Kind: kind, Justification: f.Waived}}
		}
		run.Results = append(run.Results, res)
	}
	inv := sarifInvocation{ExecutionSuccessful: len(rep.Problems) == 0}
	for _, p := range rep.Problems {
		n := sarifNotification{Level: "error", Message: sarifText{Text: p.Message}}
		if p.Path != "" {
			n.Locations = []sarifLocation{sarifLocationOf(p.Path, p.Line, p.Column)}
		}
		inv.ToolExecutionNotifications = append(inv.ToolExecutionNotifications, n)
	}
	run.Invocations = []sarifInvocation{inv}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(sarifLog{Schema: SARIFSchema, Version: "2.1.0", Runs: []sarifRun{run}})
}
