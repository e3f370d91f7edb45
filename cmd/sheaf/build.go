package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
	"github.com/sheaf-calc/sheaf/verify"
)

// commonFlags are the flags that build, check and audit share.
type commonFlags struct {
	json   string
	digits int
}

func (f *commonFlags) register(c *cobra.Command) {
	c.Flags().StringVar(&f.json, "json", "", "also write every value, check, register, finding and error as JSON to this file")
	c.Flags().IntVar(&f.digits, "digits", project.DefaultDigits, "significant figures for results (a sheet's front matter may set its own)")
}

// load reads, evaluates and audits a package, works out the render
// options, and writes the JSON if asked.
func (f *commonFlags) load(path string) (*project.Package, render.Options, error) {
	if f.digits < 1 || f.digits > 15 {
		return nil, render.Options{}, fmt.Errorf("--digits must be between 1 and 15")
	}
	pkg, err := project.Load(path)
	if err != nil {
		return nil, render.Options{}, err
	}
	report := audit.Run(pkg)
	opt := render.Options{
		Digits: f.digits, Version: version.Version, Audit: &report,
		// Dates come from the sources, never the clock: builds stay byte-identical.
		BuildDate: pkg.BuildDate(os.Getenv("SOURCE_DATE_EPOCH")),
	}
	if f.json != "" {
		err := atomicfile.WriteFunc(f.json, 0o644, func(w io.Writer) error {
			return render.WriteJSON(pkg, opt, w)
		})
		if err != nil {
			return nil, opt, err
		}
	}
	return pkg, opt, nil
}

// outcome turns a package's counts into the documented exit code.
func outcome(pkg *project.Package) error {
	c := pkg.Counts()
	switch {
	case c.Errors > 0:
		return exitCode(exitErrors)
	case c.Fail > 0:
		return exitCode(exitCheckFailed)
	}
	return nil
}

func buildCmd(stdout, stderr io.Writer) *cobra.Command {
	var flags commonFlags
	var out string
	var noGraphs bool
	c := &cobra.Command{
		Use:   "build <folder|file> -o <dir>",
		Short: "Render the package as HTML: the index, the registers, the audit and one page per sheet",
		Args:  cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			pkg, opt, err := flags.load(args[0])
			if err != nil {
				return err
			}
			opt.NoGraphs = noGraphs
			var pages []verify.Page
			err = render.WriteHTML(pkg, opt, func(f render.File) error {
				pages = append(pages, verify.PageOf(f))
				return atomicfile.Write(filepath.Join(out, filepath.FromSlash(f.Path)), f.Data, 0o644)
			})
			if err != nil {
				return err
			}
			// The manifest goes last: its presence says the build finished.
			data, err := verify.NewManifest(pkg, opt, pages).Marshal()
			if err != nil {
				return err
			}
			if err := atomicfile.Write(filepath.Join(out, verify.ManifestName), data, 0o644); err != nil {
				return err
			}
			for _, d := range pkg.Diags {
				fmt.Fprintln(stderr, d.Error())
			}
			fmt.Fprintf(stdout, "wrote %s (%s)\n", filepath.Join(out, "index.html"), render.Summary(pkg))
			return outcome(pkg)
		},
	}
	flags.register(c)
	c.Flags().StringVarP(&out, "out", "o", "", "folder to write the package into (required)")
	c.Flags().BoolVar(&noGraphs, "no-graphs", false, "leave the dependency graphs out of the pages (faster for very large packages)")
	_ = c.MarkFlagRequired("out")
	return c
}

func checkCmd(stdout, stderr io.Writer) *cobra.Command {
	var flags commonFlags
	c := &cobra.Command{
		Use:   "check <folder|file>",
		Short: "Check and evaluate the sheets; print results and file:line:col errors",
		Args:  cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			pkg, opt, err := flags.load(args[0])
			if err != nil {
				return err
			}
			render.Terminal(pkg, opt, stdout, stderr)
			return outcome(pkg)
		},
	}
	flags.register(c)
	return c
}
