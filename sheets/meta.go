package sheets

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/sheaf-calc/sheaf/diag"
)

// Meta is the title block of a sheet, read from its front matter.
type Meta struct {
	Title      string `json:"title,omitempty"`
	Project    string `json:"project,omitempty"`
	Client     string `json:"client,omitempty"`
	Job        string `json:"job,omitempty"`
	Subject    string `json:"subject,omitempty"`
	Revision   string `json:"revision,omitempty"`
	Date       string `json:"date,omitempty"`
	PreparedBy string `json:"prepared_by,omitempty"`
	CheckedBy  string `json:"checked_by,omitempty"`
	// Digits is the number of significant figures for results; 0 means the
	// package default.
	Digits int `json:"digits,omitempty"`
}

// metaFields maps a normalised front-matter key to the field it fills.
var metaFields = map[string]func(*Meta) *string{
	"title":       func(m *Meta) *string { return &m.Title },
	"project":     func(m *Meta) *string { return &m.Project },
	"client":      func(m *Meta) *string { return &m.Client },
	"job":         func(m *Meta) *string { return &m.Job },
	"subject":     func(m *Meta) *string { return &m.Subject },
	"revision":    func(m *Meta) *string { return &m.Revision },
	"date":        func(m *Meta) *string { return &m.Date },
	"prepared_by": func(m *Meta) *string { return &m.PreparedBy },
	"checked_by":  func(m *Meta) *string { return &m.CheckedBy },
}

func knownFields() string {
	names := []string{"digits"}
	for k := range metaFields {
		names = append(names, k)
	}
	return strings.Join(sortStrings(names), ", ")
}

// normaliseKey lets authors write "Prepared by", "prepared-by" or
// "prepared_by" for the same field.
func normaliseKey(k string) string {
	k = strings.ToLower(strings.TrimSpace(k))
	return strings.NewReplacer(" ", "_", "-", "_").Replace(k)
}

var yamlLine = regexp.MustCompile(`^yaml: line (\d+): (.*)$`)

// decodeMeta reads YAML front matter, whose first line is line 2 of the
// file, through decode (which unmarshals it into the value given).
func decodeMeta(path string, decode func(any) error, diags *diag.List) Meta {
	var m Meta
	var root yaml.Node
	at := func(n *yaml.Node) diag.Pos {
		if n == nil || n.Line == 0 {
			return diag.Pos{File: path, Line: 2, Col: 1}
		}
		return diag.Pos{File: path, Line: n.Line + 1, Col: n.Column}
	}
	if err := decode(&root); err != nil {
		pos, msg := diag.Pos{File: path, Line: 2, Col: 1}, err.Error()
		if sm := yamlLine.FindStringSubmatch(msg); sm != nil {
			n, _ := strconv.Atoi(sm[1])
			pos.Line, msg = n+1, sm[2]
		}
		diags.Add(pos, "front matter is YAML: one `field: value` per line", "front matter: %s", strings.TrimPrefix(msg, "yaml: "))
		return m
	}
	if len(root.Content) == 0 {
		return m
	}
	doc := root.Content[0]
	if doc.Kind != yaml.MappingNode {
		diags.Add(at(doc), "write one `field: value` per line", "front matter must be a list of fields")
		return m
	}
	for i := 0; i+1 < len(doc.Content); i += 2 {
		k, v := doc.Content[i], doc.Content[i+1]
		key := normaliseKey(k.Value)
		if key == "digits" {
			n, err := strconv.Atoi(v.Value)
			if err != nil || n < 1 || n > 15 {
				diags.Add(at(v), "write a whole number from 1 to 15", "digits must be a whole number of significant figures")
				continue
			}
			m.Digits = n
			continue
		}
		field, ok := metaFields[key]
		if !ok {
			d := diag.Diagnostic{Pos: at(k), Severity: diag.Warning,
				Message: fmt.Sprintf("unknown front-matter field %q", k.Value), Hint: "known fields are " + knownFields()}
			*diags = append(*diags, d)
			continue
		}
		if v.Kind != yaml.ScalarNode {
			diags.Add(at(v), "write a single line of text", "front-matter field %q must be text", k.Value)
			continue
		}
		*field(&m) = v.Value
	}
	return m
}
