package main

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

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
					switch {
					case in.Required:
						need = append(need, in.Name+" ["+in.Unit+"]")
					case in.Optional:
						need = append(need, in.Name+" ["+in.Unit+"] optional")
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
			tmpl, sheet, err := project.CopyTemplate(args[0], args[1])
			if err != nil {
				return err
			}
			fmt.Fprintf(stdout, "wrote %s (the template) and %s (a sheet that uses it)\nnext: set the job's values in %s, then sheaf build %s -o <out>\n",
				tmpl, sheet, sheet, args[1])
			return nil
		},
	})
	return c
}
