package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
)

func templatesCmd(stdout io.Writer) *cobra.Command {
	c := &cobra.Command{
		Use:   "templates",
		Short: "List the built-in template library; show a template or copy it into a job",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			w := tabwriter.NewWriter(stdout, 2, 4, 2, ' ', 0)
			fmt.Fprintln(w, "TEMPLATE\tWHAT IT COMPUTES\tINPUTS TO SET")
			for _, name := range sheets.LibraryNames() {
				doc, err := sheets.LibraryTemplate(name)
				if err != nil {
					return err
				}
				var need []string
				for _, in := range project.TemplateInputs(doc) {
					if in.Required {
						need = append(need, in.Name+" ["+in.Unit+"]")
					}
				}
				fmt.Fprintf(w, "%s%s\t%s\t%s\n", sheets.LibraryPrefix, name, doc.Meta.Title, strings.Join(need, ", "))
			}
			w.Flush()
			fmt.Fprintln(stdout, "\nsheaf templates show <name> prints one; sheaf templates copy <name> <job-folder> starts a job from it.")
			return nil
		},
	}
	c.AddCommand(&cobra.Command{
		Use:   "show <name>",
		Short: "Print a built-in template's Markdown",
		Args:  cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			data, ok := sheets.LibrarySource(strings.TrimPrefix(args[0], sheets.LibraryPrefix))
			if !ok {
				return fmt.Errorf("no built-in template %s; sheaf templates lists them", args[0])
			}
			_, err := stdout.Write(data)
			return err
		},
	})
	c.AddCommand(&cobra.Command{
		Use:   "copy <name> <job-folder>",
		Short: "Copy a built-in template into a job, with a starter sheet that uses it",
		Long: "copy writes <job-folder>/_templates/<name>.md, the template to adapt to the job, and\n" +
			"<job-folder>/<name>.md, a sheet that uses it with an example value for every input to set.\n" +
			"It never overwrites a file.",
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			name := strings.TrimSuffix(strings.TrimPrefix(args[0], sheets.LibraryPrefix), ".md")
			data, ok := sheets.LibrarySource(name)
			if !ok {
				return fmt.Errorf("no built-in template %s; sheaf templates lists them", args[0])
			}
			doc, err := sheets.LibraryTemplate(name)
			if err != nil {
				return err
			}
			tmpl := filepath.Join(args[1], "_templates", name+".md")
			sheet := filepath.Join(args[1], name+".md")
			for _, p := range []string{tmpl, sheet} {
				if _, err := os.Stat(p); err == nil {
					return fmt.Errorf("%s already exists; copy into another folder, or move it away first", p)
				}
			}
			if err := atomicfile.Write(tmpl, data, 0o644); err != nil {
				return err
			}
			if err := atomicfile.Write(sheet, []byte(starterSheet(name, doc)), 0o644); err != nil {
				return err
			}
			fmt.Fprintf(stdout, "wrote %s (the template) and %s (a sheet that uses it)\nnext: set the job's values in %s, then sheaf build %s -o <out>\n",
				tmpl, sheet, sheet, args[1])
			return nil
		},
	})
	return c
}

// starterSheet writes a sheet that uses a copied template, with the job's
// title block to fill in and an example value for each input it must set.
func starterSheet(name string, doc *sheets.Document) string {
	var b strings.Builder
	fmt.Fprintf(&b, "---\ntitle: %s\nproject: \njob: \nsubject: %s\nrevision: A\nprepared by: \nchecked by: \n---\n\n", doc.Meta.Title, doc.Meta.Subject)
	fmt.Fprintf(&b, "# %s\n\nThis sheet uses the template `_templates/%s.md`, copied from sheaf's library. Replace the example\nvalues below with the job's, each with its source, and adapt the template if the job needs it.\n\n```sheaf\n", doc.Meta.Title, name)
	var sets []string
	for _, in := range project.TemplateInputs(doc) {
		if !in.Required {
			continue
		}
		example := in.Example
		if example == "" {
			example = "1"
			if in.Unit != "1" {
				example += " " + in.Unit
			}
		}
		fmt.Fprintf(&b, "%s = %s ; %s ; source: example value, replace with the job's\n", in.Name, example, orDefault(in.Description, in.Name))
		sets = append(sets, in.Name+" = "+in.Name)
	}
	line := "use calc = _templates/" + name
	if len(sets) > 0 {
		line += " with " + strings.Join(sets, ",\n    ")
	}
	b.WriteString(line + "\n```\n")
	return b.String()
}

func orDefault(s, d string) string {
	if s == "" {
		return d
	}
	return s
}
