package sheets

import (
	"bytes"
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

// yamlParserError tells yaml.v3's parser errors, whose "line N" counts from
// 0, from its scanner errors, which count from 1 (yaml.v3 decode.go, fail).
func yamlParserError(msg string) bool {
	for _, p := range []string{"did not find expected", "found duplicate %", "found incompatible YAML", "found undefined tag"} {
		if strings.HasPrefix(msg, p) {
			return true
		}
	}
	return false
}

// maxYAMLScan bounds the front matter, in lines, that yamlErrorLine reads
// again line by line; title blocks are a dozen lines.
const maxYAMLScan = 200

// yamlErrorLine returns the file line at which front matter stops being
// readable YAML: the end of the shortest prefix that fails. yaml.v3 names
// the line where the enclosing construct began (for a misindented field,
// the first field of the mapping), which is rarely the line to fix. It
// returns 0 for front matter too long to scan.
func yamlErrorLine(text []byte) int {
	lines := bytes.Split(text, []byte("\n"))
	if len(lines) > maxYAMLScan {
		return 0
	}
	for k := 1; k <= len(lines); k++ {
		var n yaml.Node
		if yaml.Unmarshal(bytes.Join(lines[:k], []byte("\n")), &n) != nil {
			return k + 1 // the opening --- is line 1
		}
	}
	return 0
}

// decodeMeta reads YAML front matter, whose first line is line 2 of the
// file. It decodes the text behind one blank line, standing in for the
// opening ---, so that yaml.v3's line numbers are the file's, and so that
// yaml.v3 never places an error on its line 0, which it reports as no line
// or as a later one.
func decodeMeta(path string, text []byte, diags *diag.List) Meta {
	var m Meta
	var root yaml.Node
	at := func(n *yaml.Node) diag.Pos {
		if n == nil || n.Line == 0 {
			return diag.Pos{File: path, Line: 2, Col: 1}
		}
		return diag.Pos{File: path, Line: n.Line, Col: n.Column}
	}
	if err := yaml.Unmarshal(append([]byte("\n"), text...), &root); err != nil {
		pos, msg := diag.Pos{File: path, Line: 2, Col: 1}, err.Error()
		if sm := yamlLine.FindStringSubmatch(msg); sm != nil {
			n, _ := strconv.Atoi(sm[1])
			if yamlParserError(sm[2]) {
				n++ // yaml.v3 counts these lines from 0
			}
			pos.Line, msg = max(n, 2), sm[2]
		}
		if l := yamlErrorLine(text); l > 0 {
			pos.Line = l
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
