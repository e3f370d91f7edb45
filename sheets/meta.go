package sheets

import (
	"bytes"
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf8"

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
	PreparedOn string `json:"prepared_on,omitempty"`
	CheckedBy  string `json:"checked_by,omitempty"`
	CheckedOn  string `json:"checked_on,omitempty"`
	ApprovedBy string `json:"approved_by,omitempty"`
	ApprovedOn string `json:"approved_on,omitempty"`
	// History is the revision history, oldest first.
	History []Revision `json:"history,omitempty"`
	// Accept records audit findings of the sheet as a whole that the firm
	// accepts, each with its reason.
	Accept []Acceptance `json:"accept,omitempty"`
	// Digits is the number of significant figures for results; 0 means the
	// package default.
	Digits int `json:"digits,omitempty"`
	// Template marks a sheet that other sheets use and that is not a page
	// of the package itself.
	Template bool `json:"template,omitempty"`
	// Caution is a warning that goes wherever the sheet is used as a
	// template, beside the instance's results.
	Caution string `json:"caution,omitempty"`
	// Validity and Sources go, like Caution, wherever the sheet is used
	// as a template: short statements of where it holds, and the
	// published references it rests on.
	Validity []string `json:"validity,omitempty"`
	Sources  []string `json:"sources,omitempty"`
}

// Revision is one row of a sheet's revision history.
type Revision struct {
	Rev  string `json:"rev"`
	Date string `json:"date,omitempty"`
	By   string `json:"by,omitempty"`
	Note string `json:"note,omitempty"`
}

// Acceptance is an audit finding accepted in the front matter.
type Acceptance struct {
	Code   string   `json:"code"`
	Reason string   `json:"reason"`
	Pos    diag.Pos `json:"pos"`
}

// Dates returns every date of the title block and the history written as
// YYYY-MM-DD.
func (m Meta) Dates() []string {
	var out []string
	for _, d := range []string{m.Date, m.PreparedOn, m.CheckedOn, m.ApprovedOn} {
		if isDate(d) {
			out = append(out, d)
		}
	}
	for _, r := range m.History {
		if isDate(r.Date) {
			out = append(out, r.Date)
		}
	}
	return out
}

var datePattern = regexp.MustCompile(`^\d{4}-\d{2}-\d{2}$`)

func isDate(s string) bool { return datePattern.MatchString(s) }

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
	"prepared_on": func(m *Meta) *string { return &m.PreparedOn },
	"checked_by":  func(m *Meta) *string { return &m.CheckedBy },
	"checked_on":  func(m *Meta) *string { return &m.CheckedOn },
	"approved_by": func(m *Meta) *string { return &m.ApprovedBy },
	"approved_on": func(m *Meta) *string { return &m.ApprovedOn },
	"caution":     func(m *Meta) *string { return &m.Caution },
}

// dateFields are the fields that hold a date.
var dateFields = map[string]bool{"date": true, "prepared_on": true, "checked_on": true, "approved_on": true}

func knownFields() string {
	names := []string{"digits", "history", "accept", "template", "validity", "sources"}
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

// tabAt returns the column of the first tab on a file line of the front
// matter (text starts at file line 2).
func tabAt(text []byte, line int) (int, bool) {
	lines := bytes.Split(text, []byte("\n"))
	if i := line - 2; i >= 0 && i < len(lines) {
		if j := bytes.IndexByte(lines[i], '\t'); j >= 0 {
			return utf8.RuneCount(lines[i][:j]) + 1, true
		}
	}
	return 0, false
}

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
		if col, ok := tabAt(text, pos.Line); ok {
			// YAML refuses tabs for indentation, and says so in its own words.
			pos.Col = col
			diags.Add(pos, "indent front matter with spaces; YAML does not allow tabs there",
				"front matter: a tab character at line %d, column %d", pos.Line, col)
			return m
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
		metaField(&m, doc.Content[i], doc.Content[i+1], at, diags)
	}
	return m
}

// metaField reads one field of the front matter into m.
func metaField(m *Meta, k, v *yaml.Node, at func(*yaml.Node) diag.Pos, diags *diag.List) {
	key := normaliseKey(k.Value)
	switch key {
	case "digits":
		n, err := strconv.Atoi(v.Value)
		if err != nil || n < 1 || n > 15 {
			diags.Add(at(v), "write a whole number from 1 to 15", "digits must be a whole number of significant figures")
			return
		}
		m.Digits = n
		return
	case "template":
		b, err := strconv.ParseBool(v.Value)
		if err != nil {
			diags.Add(at(v), "write template: true", "template must be true or false")
		}
		m.Template = b
		return
	case "history":
		m.History = decodeHistory(v, at, diags)
		return
	case "accept":
		m.Accept = decodeAccept(v, at, diags)
		return
	case "validity":
		m.Validity = decodeTextList(k.Value, v, at, diags)
		return
	case "sources":
		m.Sources = decodeTextList(k.Value, v, at, diags)
		return
	}
	field, ok := metaFields[key]
	if !ok {
		d := diag.Diagnostic{Pos: at(k), Severity: diag.Warning,
			Message: fmt.Sprintf("unknown front-matter field %q", k.Value), Hint: "known fields are " + knownFields()}
		*diags = append(*diags, d)
		return
	}
	if v.Kind != yaml.ScalarNode {
		diags.Add(at(v), "write a single line of text", "front-matter field %q must be text", k.Value)
		return
	}
	*field(m) = v.Value
	if dateFields[key] && v.Value != "" && !isDate(v.Value) {
		*diags = append(*diags, diag.Diagnostic{Pos: at(v), Severity: diag.Warning,
			Message: fmt.Sprintf("%s %q is not a date written YYYY-MM-DD", k.Value, v.Value), Hint: "write for example 2026-11-30"})
	}
}

// decodeHistory reads the revision history: a list of entries with rev,
// date, by and note.
func decodeHistory(v *yaml.Node, at func(*yaml.Node) diag.Pos, diags *diag.List) []Revision {
	const hint = "write history as a list of entries, each with rev, date, by and note"
	if v.Kind != yaml.SequenceNode {
		diags.Add(at(v), hint, "history must be a list")
		return nil
	}
	var out []Revision
	for _, item := range v.Content {
		if item.Kind != yaml.MappingNode {
			diags.Add(at(item), hint, "a history entry must have fields")
			continue
		}
		var r Revision
		for i := 0; i+1 < len(item.Content); i += 2 {
			k, val := item.Content[i], item.Content[i+1]
			if val.Kind != yaml.ScalarNode {
				diags.Add(at(val), hint, "history field %q must be text", k.Value)
				continue
			}
			switch normaliseKey(k.Value) {
			case "rev", "revision":
				r.Rev = val.Value
			case "date":
				r.Date = val.Value
			case "by":
				r.By = val.Value
			case "note", "description":
				r.Note = val.Value
			default:
				*diags = append(*diags, diag.Diagnostic{Pos: at(k), Severity: diag.Warning,
					Message: fmt.Sprintf("unknown history field %q", k.Value), Hint: "history entries have rev, date, by and note"})
			}
		}
		if r.Rev == "" {
			diags.Add(at(item), hint, "a history entry needs rev")
			continue
		}
		out = append(out, r)
	}
	return out
}

// decodeAccept reads accepted findings: code: reason.
func decodeAccept(v *yaml.Node, at func(*yaml.Node) diag.Pos, diags *diag.List) []Acceptance {
	const hint = "write accept as finding codes with their reasons, for example  no-checker: checked in the design review of 2026-11-30"
	if v.Kind != yaml.MappingNode {
		diags.Add(at(v), hint, "accept must list codes with reasons")
		return nil
	}
	var out []Acceptance
	for i := 0; i+1 < len(v.Content); i += 2 {
		k, val := v.Content[i], v.Content[i+1]
		if val.Kind != yaml.ScalarNode {
			diags.Add(at(val), hint, "the reason for accepting %s must be text", k.Value)
			continue
		}
		out = append(out, Acceptance{Code: strings.TrimSpace(k.Value), Reason: strings.TrimSpace(val.Value), Pos: at(k)})
	}
	return out
}

// decodeTextList reads a list of short texts, one per item; a single text
// is a list of one.
func decodeTextList(key string, v *yaml.Node, at func(*yaml.Node) diag.Pos, diags *diag.List) []string {
	hint := "write " + key + " as a list, one statement a line, each line starting with - "
	switch v.Kind {
	case yaml.ScalarNode:
		if t := strings.TrimSpace(v.Value); t != "" {
			return []string{t}
		}
		return nil
	case yaml.SequenceNode:
	default:
		diags.Add(at(v), hint, "%s must be a list of texts", key)
		return nil
	}
	var out []string
	for _, item := range v.Content {
		t := strings.TrimSpace(item.Value)
		if item.Kind != yaml.ScalarNode || t == "" {
			diags.Add(at(item), hint, "each item of %s must be a line of text", key)
			continue
		}
		out = append(out, t)
	}
	return out
}
