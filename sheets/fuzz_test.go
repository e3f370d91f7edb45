package sheets_test

import (
	"bytes"
	"fmt"
	"slices"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"github.com/sheaf-calc/sheaf/sheets"
)

// FuzzSheet reads arbitrary bytes as a sheet. Parse must not panic; every
// formula line must sit on a line of the file at a column inside it, with
// its text found there; and where the front matter is plain YAML of text
// fields, each field must land in Meta unchanged.
func FuzzSheet(f *testing.F) {
	for _, seed := range []string{
		"---\ntitle: Field coil\nproject: Tarnwick Weir\ndigits: 5\n---\n# Coil\n\n```sheaf\nN = 120\n```\n",
		"# Plain\n\nProse only.\n",
		"```sheaf\na = 1 m\n```\n",
		"---\ntitle: Open\n\n```sheaf\na = 1\n```\n",
		"---\ntitle: [bad\n---\n```sheaf\nx = 1\n```\n",
		"---\nPrepared by: A. Okafor\nchecked-by: B. Lind\nfoo: bar\ndigits: 99\n---\n",
		"> ```sheaf\n> a = 1\n> ```\n",
		"- item\n\n  ```sheaf\n  a = 1\n    b = 2\n  ```\n",
		"\xef\xbb\xbf# BOM\r\n\r\n```sheaf\r\na = 1\r\n```\r\n",
		"# Bad \xff byte\n```sheaf\nb = \xfe\n```\n",
		"```sheaf\n\tx = 1\n```\n~~~sheaf\ny = 2\n~~~\n",
		"```sheaf\n```\n```sheaf",
		"---\ntitle: Fine\nclient:\n  - a\n subject: b\n---\n",
		"---\n---\n",
		"---\ntitle: Coil\n--- \n# S\n\n```sheaf\na = 1\n```\n",
		"-----\ntitle: Coil\n---\n```sheaf\na = 1\n```\n",
		"Table BH from data/bh.csv: DC curve\n\n```sheaf\nx = 1\n```\nTable T from : c\nTable U from x.csv\n| a | b |\n|---|---|\n| 1 | 2 |\n",
		"---\ntemplate: true\nvalidity:\n  - \"linear iron: B below the knee\"\n  - sinusoidal flux\nsources:\n  - IEC 60034-1 (from memory)\n---\n```sheaf\nparam B [T] optional\n```\n",
		"---\nvalidity: one line only\nsources:\n  - [nested]\n  - \n  - {a: b}\n---\n",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		s := sheets.Parse("f.md", data)
		nLines := bytes.Count(s.Source, []byte("\n")) + 1
		for _, d := range s.Diags {
			if d.Pos.Line < 1 || d.Pos.Line > nLines || d.Pos.Col < 1 {
				t.Fatalf("diagnostic outside the file (%d lines): %s", nLines, d.Error())
			}
		}
		for _, b := range s.Blocks {
			if b.Fence.Line < 1 || b.Fence.Line > nLines || b.Fence.Col < 1 {
				t.Fatalf("fence outside the file: %v", b.Fence)
			}
			for _, l := range b.Lines {
				if l.Pos.Line < 1 || l.Pos.Line > nLines || l.Pos.Col < 1 {
					t.Fatalf("line %q at %v, outside the file (%d lines)", l.Text, l.Pos, nLines)
				}
				src := s.LineText(l.Pos.Line)
				if n := utf8.RuneCountInString(src); l.Pos.Col > n+1 {
					t.Fatalf("line %q at column %d of a %d-character line %q", l.Text, l.Pos.Col, n, src)
				}
				if !strings.Contains(src, strings.TrimSpace(l.Text)) {
					t.Fatalf("line %q is not on line %d: %q", l.Text, l.Pos.Line, src)
				}
			}
		}
		checkMeta(t, s)
		checkBody(t, s)
	})
}

// checkBody parses the sheet again with its front matter blanked out, line
// for line, and asserts that the formula blocks come out the same: front
// matter must never swallow, move or add a block.
func checkBody(t *testing.T, s *sheets.Document) {
	lines := strings.Split(string(s.Source), "\n")
	end := frontMatterEnd(lines)
	if end < 0 {
		return
	}
	blank := strings.Repeat("\n", end+1) + strings.Join(lines[end+1:], "\n")
	b := sheets.Parse("f.md", []byte(blank))
	if len(b.Blocks) != len(s.Blocks) {
		t.Fatalf("%d formula blocks with front matter, %d without", len(s.Blocks), len(b.Blocks))
	}
	for i := range b.Blocks {
		x, y := s.Blocks[i], b.Blocks[i]
		if x.Fence != y.Fence || len(x.Lines) != len(y.Lines) {
			t.Fatalf("block %d differs: %v with %d lines, %v with %d lines", i, x.Fence, len(x.Lines), y.Fence, len(y.Lines))
		}
		for j := range x.Lines {
			if x.Lines[j] != y.Lines[j] {
				t.Fatalf("block %d line %d differs: %+v, %+v", i, j, x.Lines[j], y.Lines[j])
			}
		}
	}
}

// frontMatterEnd returns the index of the line that closes the front
// matter, or -1 when there is none: the front-matter extension's rule, a
// first line of three or more dashes repeated exactly.
func frontMatterEnd(lines []string) int {
	if len(lines[0]) < 3 || strings.Trim(lines[0], "-") != "" {
		return -1
	}
	for i, l := range lines[1:] {
		if l == lines[0] {
			return i + 1
		}
	}
	return -1
}

// "--- " with a trailing space once closed nothing and swallowed the sheet.
func TestFrontMatterFenceWithTrailingSpace(t *testing.T) {
	for _, src := range []string{
		"---\ntitle: Coil\n--- \n# S\n\n```sheaf\na = 1\n```\n",
		"--- \ntitle: Coil\n---\t\n# S\n\n```sheaf\na = 1\n```\n",
	} {
		s := sheets.Parse("f.md", []byte(src))
		if s.Meta.Title != "Coil" || len(s.Blocks) != 1 || len(s.Diags) != 0 {
			t.Errorf("%q: title %q, %d blocks, diagnostics %v", src, s.Meta.Title, len(s.Blocks), s.Diags)
		}
	}
}

// checkMeta decodes closed front matter on its own, as a map, and compares
// every text field with what Parse put in Meta.
func checkMeta(t *testing.T, s *sheets.Document) {
	lines := strings.Split(string(s.Source), "\n")
	end := frontMatterEnd(lines)
	if end < 0 {
		return
	}
	for _, d := range s.Diags {
		if d.Pos.Line <= end && strings.HasPrefix(d.Message, "front matter") {
			return // not YAML, or not a mapping: Parse said so
		}
	}
	var m map[string]any
	if yaml.Unmarshal([]byte(strings.Join(lines[1:end], "\n")), &m) != nil {
		return
	}
	fields := map[string]*string{
		"title": &s.Meta.Title, "project": &s.Meta.Project, "client": &s.Meta.Client, "job": &s.Meta.Job,
		"subject": &s.Meta.Subject, "revision": &s.Meta.Revision, "date": &s.Meta.Date,
		"prepared_by": &s.Meta.PreparedBy, "checked_by": &s.Meta.CheckedBy,
	}
	seen := map[string]bool{}
	for k := range m {
		key := strings.NewReplacer(" ", "_", "-", "_").Replace(strings.ToLower(strings.TrimSpace(k)))
		if seen[key] {
			return // two spellings of one field: the later one wins
		}
		seen[key] = true
	}
	for k, v := range m {
		key := strings.NewReplacer(" ", "_", "-", "_").Replace(strings.ToLower(strings.TrimSpace(k)))
		if p, ok := fields[key]; ok {
			if text, isText := v.(string); isText && *p != text {
				t.Fatalf("field %q: Meta has %q, the YAML says %q", k, *p, text)
			}
		}
		if key == "validity" || key == "sources" {
			got := s.Meta.Validity
			if key == "sources" {
				got = s.Meta.Sources
			}
			if items, isList := v.([]any); isList {
				var want []string
				for _, it := range items {
					if text, isText := it.(string); isText && strings.TrimSpace(text) != "" {
						want = append(want, strings.TrimSpace(text))
					}
				}
				if !slices.Equal(got, want) && allText(items) {
					t.Fatalf("%s: Meta has %q, the YAML says %q", k, got, want)
				}
			}
		}
		if key == "digits" {
			if n, isInt := v.(int); isInt && n >= 1 && n <= 15 && s.Meta.Digits != n {
				t.Fatalf("digits: Meta has %d, the YAML says %d", s.Meta.Digits, n)
			}
			// YAML reads "08" as text; sheaf reads the digits of the text.
			if text, isText := v.(string); isText {
				n, err := strconv.Atoi(text)
				if err != nil || n < 1 || n > 15 {
					n = 0
				}
				if s.Meta.Digits != n {
					t.Fatalf("digits: Meta has %d from %q", s.Meta.Digits, text)
				}
			} else if _, isInt := v.(int); !isInt && s.Meta.Digits != 0 && fmt.Sprint(v) != strconv.Itoa(s.Meta.Digits) {
				// Another number type (YAML may read 08 as a float) must still
				// agree with what sheaf read.
				t.Fatalf("digits: Meta has %d from %v (%T)", s.Meta.Digits, v, v)
			}
		}
	}
}

// allText reports whether every item of a YAML list is a string.
func allText(items []any) bool {
	for _, it := range items {
		if _, ok := it.(string); !ok {
			return false
		}
	}
	return true
}

// A template's limits of validity and its sources: a list of texts, or
// one text; anything else is refused at its line.
func TestMetaValidityAndSources(t *testing.T) {
	s := sheets.Parse("t.md", []byte("---\ntemplate: true\nvalidity:\n  - linear iron\n  - \"sinusoidal flux: no harmonics\"\nsources: Chapman, 4th ed., chapter 1 (from memory)\n---\n"))
	if len(s.Diags) != 0 || !slices.Equal(s.Meta.Validity, []string{"linear iron", "sinusoidal flux: no harmonics"}) ||
		!slices.Equal(s.Meta.Sources, []string{"Chapman, 4th ed., chapter 1 (from memory)"}) {
		t.Errorf("got %q and %q, %v", s.Meta.Validity, s.Meta.Sources, s.Diags)
	}
	s = sheets.Parse("t.md", []byte("---\nvalidity:\n  - fine\n  - [not, text]\nsources:\n  a: b\n---\n"))
	want := []string{"t.md:4:5: each item of validity must be a line of text", "t.md:6:3: sources must be a list of texts"}
	var got []string
	for _, d := range s.Diags {
		got = append(got, d.Pos.String()+": "+d.Message)
	}
	if !slices.Equal(got, want) || !slices.Equal(s.Meta.Validity, []string{"fine"}) {
		t.Errorf("got %q, %q; want %q", got, s.Meta.Validity, want)
	}
}
