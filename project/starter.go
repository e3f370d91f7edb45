package project

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/sheets"
)

// CopyTemplate starts a job from a built-in template: it writes
// <dir>/_templates/<name>.md, the template to adapt to the job, and
// <dir>/<name>.md, a sheet that uses it with an example value for every
// input to set. It never overwrites a file, and returns the two paths.
func CopyTemplate(name, dir string) (tmpl, sheet string, err error) {
	name = strings.TrimSuffix(strings.TrimPrefix(name, sheets.LibraryPrefix), ".md")
	data, ok := sheets.LibrarySource(name)
	if !ok {
		return "", "", fmt.Errorf("no built-in template %s; sheaf templates lists them", name)
	}
	doc, err := sheets.LibraryTemplate(name)
	if err != nil {
		return "", "", err
	}
	tmpl = filepath.Join(dir, "_templates", name+".md")
	sheet = filepath.Join(dir, name+".md")
	for _, p := range []string{tmpl, sheet} {
		if _, err := os.Stat(p); err == nil {
			return "", "", fmt.Errorf("%s already exists; copy into another folder, or move it away first", p)
		}
	}
	if err := atomicfile.Write(tmpl, data, 0o644); err != nil {
		return "", "", err
	}
	if err := atomicfile.Write(sheet, []byte(starterSheet(name, doc)), 0o644); err != nil {
		return "", "", err
	}
	return tmpl, sheet, nil
}

// starterSheet writes a sheet that uses a copied template, with the job's
// title block to fill in and an example value for each input it must set.
func starterSheet(name string, doc *sheets.Document) string {
	var b strings.Builder
	fmt.Fprintf(&b, "---\ntitle: %s\nproject: \njob: \nsubject: %s\nrevision: A\nprepared by: \nchecked by: \n---\n\n", doc.Meta.Title, doc.Meta.Subject)
	fmt.Fprintf(&b, "# %s\n\nThis sheet uses the template `_templates/%s.md`, copied from sheaf's library. Replace the example\nvalues below with the job's, each with its source, and adapt the template if the job needs it.\n\n```sheaf\n", doc.Meta.Title, name)
	var sets []string
	for _, in := range TemplateInputs(doc) {
		if !in.Required && !in.Optional {
			continue
		}
		example := in.Example
		if example == "" {
			example = "1"
			if in.Unit != "1" {
				example += " " + in.Unit
			}
		}
		desc := in.Description
		if desc == "" {
			desc = in.Name
		}
		if in.Optional {
			desc += " (optional: delete it and its setting in the use statement to leave out what rests on it)"
		}
		fmt.Fprintf(&b, "%s = %s ; %s ; source: example value, replace with the job's\n", in.Name, example, desc)
		sets = append(sets, in.Name+" = "+in.Name)
	}
	line := "use calc = _templates/" + name
	if len(sets) > 0 {
		line += " with " + strings.Join(sets, ",\n    ")
	}
	b.WriteString(line + "\n```\n")
	return b.String()
}
