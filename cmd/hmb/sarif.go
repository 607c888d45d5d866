package main

import (
	"io"
	"path/filepath"
	"sort"

	"hmb/thermo/model"
)

// SARIF 2.1.0 (OASIS Static Analysis Results Interchange Format), the subset code-scanning
// services read: one run, the rules that fired, results with physical locations.

type sarifLog struct {
	Schema  string     `json:"$schema"`
	Version string     `json:"version"`
	Runs    []sarifRun `json:"runs"`
}

type sarifRun struct {
	Tool       sarifTool     `json:"tool"`
	ColumnKind string        `json:"columnKind"`
	Results    []sarifResult `json:"results"`
}

type sarifTool struct {
	Driver sarifDriver `json:"driver"`
}

type sarifDriver struct {
	Name           string      `json:"name"`
	Version        string      `json:"version"`
	InformationURI string      `json:"informationUri,omitempty"`
	Rules          []sarifRule `json:"rules"`
}

type sarifText struct {
	Text string `json:"text"`
}

type sarifRule struct {
	ID                   string      `json:"id"`
	Name                 string      `json:"name,omitempty"`
	ShortDescription     sarifText   `json:"shortDescription"`
	Help                 *sarifText  `json:"help,omitempty"`
	DefaultConfiguration sarifConfig `json:"defaultConfiguration"`
}

type sarifConfig struct {
	Level string `json:"level"`
}

type sarifResult struct {
	RuleID           string          `json:"ruleId"`
	RuleIndex        int             `json:"ruleIndex"`
	Level            string          `json:"level"`
	Message          sarifText       `json:"message"`
	Locations        []sarifLocation `json:"locations"`
	RelatedLocations []sarifLocation `json:"relatedLocations,omitempty"`
	// Properties carry the case a finding belongs to, {"case": NAME} (a SARIF property bag).
	Properties map[string]string `json:"properties,omitempty"`
}

type sarifLocation struct {
	ID               *int          `json:"id,omitempty"`
	PhysicalLocation sarifPhysical `json:"physicalLocation"`
	Message          *sarifText    `json:"message,omitempty"`
}

type sarifPhysical struct {
	ArtifactLocation sarifArtifact `json:"artifactLocation"`
	Region           sarifRegion   `json:"region"`
}

type sarifArtifact struct {
	URI string `json:"uri"`
}

type sarifRegion struct {
	StartLine   int `json:"startLine"`
	StartColumn int `json:"startColumn"`
	EndLine     int `json:"endLine"`
	EndColumn   int `json:"endColumn"`
}

func sarifLevel(s model.Severity) string {
	switch s {
	case model.Error:
		return "error"
	case model.Warning:
		return "warning"
	}
	return "note"
}

func writeSARIF(w io.Writer, files []*fileResult) error {
	codes := map[string]model.CodeInfo{}
	for _, c := range allCodes() {
		codes[c.Code] = c
	}
	fired := map[string]bool{}
	for _, f := range files {
		for _, d := range f.diags {
			fired[d.Code] = true
		}
	}
	var ids []string
	for id := range fired {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	index := map[string]int{}
	driver := sarifDriver{Name: "hmb", Version: version, Rules: []sarifRule{}}
	for i, id := range ids {
		index[id] = i
		c := codes[id]
		if c.Severity == 0 {
			c.Severity = model.Error
		}
		rule := sarifRule{ID: id, Name: c.Name, ShortDescription: sarifText{c.Summary},
			DefaultConfiguration: sarifConfig{Level: sarifLevel(c.Severity)}}
		if c.Help != "" {
			rule.Help = &sarifText{c.Help}
		}
		driver.Rules = append(driver.Rules, rule)
	}
	run := sarifRun{Tool: sarifTool{Driver: driver}, ColumnKind: "unicodeCodePoints", Results: []sarifResult{}}
	for _, f := range files {
		li := newLineIndex(f.src)
		uri := filepath.ToSlash(f.path)
		loc := func(sp model.Span) sarifPhysical {
			r := li.rng(sp)
			return sarifPhysical{ArtifactLocation: sarifArtifact{URI: uri},
				Region: sarifRegion{r.Start.Line, r.Start.Column, r.End.Line, r.End.Column}}
		}
		for _, d := range f.diags {
			res := sarifResult{RuleID: d.Code, RuleIndex: index[d.Code], Level: sarifLevel(d.Severity),
				Message: sarifText{d.Message}, Locations: []sarifLocation{{PhysicalLocation: loc(d.Span)}}}
			if d.Case != "" {
				res.Properties = map[string]string{"case": d.Case}
			}
			for i, r := range d.Related {
				id := i + 1
				res.RelatedLocations = append(res.RelatedLocations, sarifLocation{ID: &id,
					PhysicalLocation: loc(r.Span), Message: &sarifText{r.Message}})
			}
			run.Results = append(run.Results, res)
		}
	}
	return encodeIndent(w, sarifLog{Schema: "https://json.schemastore.org/sarif-2.1.0.json", Version: "2.1.0", Runs: []sarifRun{run}})
}
