package main

import (
	"io"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/render"
)

func auditCmd(stdout, stderr io.Writer) *cobra.Command {
	var flags commonFlags
	var html string
	var all bool
	c := &cobra.Command{
		Use:   "audit <folder|file>",
		Short: "List what a careful checker would question: inputs without sources, buried factors, unnamed limits and more",
		Long: "audit reads the package as a checker does and prints each finding as file:line:col: [code] message.\n" +
			"Findings the sheets accept (`; accept <code>: <reason>` on a statement, or `accept:` in the front matter)\n" +
			"are listed with their reason and do not fail the audit.\n\n" +
			"Exit codes: 0 no open findings; 1 open findings; 2 errors in the sheets or usage.",
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			res, err := flags.run(args[0], func(o *build.Options) { o.AuditHTML = html })
			if err != nil {
				return err
			}
			pkg, r := res.Package, *res.Render.Audit
			render.AuditTerminal(r, all, stdout)
			render.WriteDiagnostics(pkg, stderr)
			switch {
			case pkg.Counts().Errors > 0:
				return exitCode(exitErrors)
			case r.Open() > 0:
				return exitCode(exitCheckFailed)
			}
			return nil
		},
	}
	flags.register(c)
	c.Flags().StringVar(&html, "html", "", "also write the audit as an HTML page to this file")
	c.Flags().BoolVar(&all, "all", false, "list accepted findings too")
	return c
}
