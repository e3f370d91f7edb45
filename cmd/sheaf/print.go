package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strconv"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/pdf"
)

func printCmd(stdout, stderr io.Writer) *cobra.Command {
	var flags commonFlags
	var out, paper string
	var checker, graphs bool
	c := &cobra.Command{
		Use:   "print <folder|file> -o <file.pdf>",
		Short: "Print the package as one PDF through a local Chromium: index and contents, every sheet, the registers, the audit",
		Long: "print builds the package in a temporary folder and prints each page with a locally installed Chromium\n" +
			"(headless, through the DevTools protocol), each on its own so that its pages count \"page x of y\" of\n" +
			"that sheet, then joins them with a bookmark per page. On Debian: apt-get install chromium. Set\n" +
			"SHEAF_CHROMIUM to use another browser. The issue view is printed unless --checker is given; the\n" +
			"dependency graphs only with --graphs.",
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			size, err := pdf.PaperNamed(paper)
			if err != nil {
				return err
			}
			view := pdf.IssueView
			if checker {
				view = pdf.CheckerView
			}
			return printPackage(args[0], out, pdf.Layout{Paper: size, View: view, Graphs: graphs}, flags, stdout, stderr)
		},
	}
	flags.register(c)
	c.Flags().StringVarP(&out, "out", "o", "", "PDF file to write (required; outside the sources)")
	c.Flags().StringVar(&paper, "paper", "a4", "paper size: a4 or letter")
	c.Flags().BoolVar(&checker, "checker", false, "print the checker view: positions, uses, used-by and what each result rests on")
	c.Flags().BoolVar(&graphs, "graphs", false, "print each sheet's dependency graph on a page of its own after the sheet")
	_ = c.MarkFlagRequired("out")
	return c
}

// printPackage builds the package at src into a temporary folder and
// prints it to out.
func printPackage(src, out string, layout pdf.Layout, flags commonFlags, stdout, stderr io.Writer) error {
	if _, err := pdf.FindChromium(); err != nil {
		return err
	}
	tmp, err := os.MkdirTemp("", "sheaf-print-")
	if err != nil {
		return err
	}
	defer os.RemoveAll(tmp)
	site := filepath.Join(tmp, "package")
	res, err := flags.run(src, func(o *build.Options) { o.Out = site })
	if err != nil {
		return err
	}
	if err := build.Outside(out, res.Sources, "-o", ".pdf"); err != nil {
		return err
	}
	pages := []struct{ path, mark string }{{"index.html", "Package index and contents"}}
	for i, s := range res.Package.Sheets {
		pages = append(pages, struct{ path, mark string }{s.Page, strconv.Itoa(i+1) + ". " + s.Title()})
	}
	pages = append(pages, struct{ path, mark string }{"inputs.html", "Inputs register"}, struct{ path, mark string }{"assumptions.html", "Assumptions register"})
	if res.Render.Audit != nil {
		pages = append(pages, struct{ path, mark string }{"audit.html", "Audit"})
	}
	var parts []pdf.Part
	for _, p := range pages {
		address, err := pdf.FileURL(filepath.Join(site, filepath.FromSlash(p.path)))
		if err != nil {
			return err
		}
		parts = append(parts, pdf.Part{Address: address, Bookmark: p.mark})
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	browser, err := pdf.Start(ctx)
	if err != nil {
		return err
	}
	defer browser.Close()
	data, n, err := pdf.Package(ctx, browser, parts, layout)
	if err != nil {
		return err
	}
	if err := atomicfile.Write(out, data, 0o644); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "wrote %s (%d pages on %s: the index, %d sheets, the registers and the audit)\n", out, n, layout.Paper.Name, len(res.Package.Sheets))
	return outcome(res.Package)
}
