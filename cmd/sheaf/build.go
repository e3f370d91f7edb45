package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// commonFlags are the flags that build, check and audit share.
type commonFlags struct {
	json   string
	digits int
}

func (f *commonFlags) register(c *cobra.Command) {
	c.Flags().StringVar(&f.json, "json", "", "also write every value, check, register, finding and error as JSON to this file (outside the sources)")
	c.Flags().IntVar(&f.digits, "digits", project.DefaultDigits, "significant figures for results (a sheet's front matter may set its own)")
}

// options turns the flags and the environment into the pipeline's options.
func (f *commonFlags) options() (build.Options, error) {
	if f.digits < 1 || f.digits > 15 {
		return build.Options{}, fmt.Errorf("--digits must be between 1 and 15")
	}
	return build.Options{
		Digits: f.digits, Version: version.Version, JSON: f.json,
		SourceDateEpoch: os.Getenv("SOURCE_DATE_EPOCH"),
	}, nil
}

// run runs the pipeline on the package at src with these flags.
func (f *commonFlags) run(src string, adjust func(*build.Options)) (*build.Result, error) {
	opt, err := f.options()
	if err != nil {
		return nil, err
	}
	if adjust != nil {
		adjust(&opt)
	}
	return build.Run(src, opt)
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
		Long: "build writes the package into a new folder beside <dir> and swaps it in whole when it is done, so\n" +
			"that <dir> always holds a complete package. <dir> must be new, empty or a package sheaf built, and\n" +
			"lie outside the sources; a second build into the same folder at the same time is refused.",
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			res, err := flags.run(args[0], func(o *build.Options) {
				o.Out, o.NoGraphs = out, noGraphs
			})
			if err != nil {
				return err
			}
			render.WriteDiagnostics(res.Package, stderr)
			fmt.Fprintf(stdout, "wrote %s (%s)\n", filepath.Join(out, "index.html"), render.Summary(res.Package))
			return outcome(res.Package)
		},
	}
	flags.register(c)
	c.Flags().StringVarP(&out, "out", "o", "", "folder to write the package into (required; new, empty or built by sheaf)")
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
			res, err := flags.run(args[0], nil)
			if err != nil {
				return err
			}
			render.Terminal(res.Package, res.Render, stdout, stderr)
			return outcome(res.Package)
		},
	}
	flags.register(c)
	return c
}
