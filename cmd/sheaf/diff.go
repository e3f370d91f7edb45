package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/project"
)

func diffCmd(stdout, stderr io.Writer) *cobra.Command {
	var html, threshold string
	var digits int
	c := &cobra.Command{
		Use:   "diff <old> <new>",
		Short: "Compare two revisions of a package: changed inputs and formulas, results that moved, checks that flipped",
		Long: "Each side is a folder (or file), or a git revision of a folder written <revision>:<folder>,\n" +
			"for example HEAD~1:examples/tarnwick-weir (git must be on the PATH).\n\n" +
			"Exit codes: 0 compared (whatever changed); 2 a side could not be read or usage.",
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			t, err := parseThreshold(threshold)
			if err != nil {
				return err
			}
			if digits < 1 || digits > 15 {
				return fmt.Errorf("--digits must be between 1 and 15")
			}
			_, err = build.Diff(args[0], args[1], build.DiffOptions{Threshold: t, Digits: digits, Version: version.Version, HTML: html}, stdout)
			return err
		},
	}
	c.Flags().StringVar(&html, "html", "", "also write the changes as an HTML page to this file")
	c.Flags().IntVar(&digits, "digits", project.DefaultDigits, "significant figures for values (a sheet's front matter may set its own)")
	c.Flags().StringVar(&threshold, "threshold", "0.01%", "smallest relative change of a result to report, as a fraction or a percentage")
	return c
}

// parseThreshold reads "0.01%", "1 %" or "0.0001".
func parseThreshold(s string) (float64, error) {
	s = strings.TrimSpace(s)
	pct := strings.HasSuffix(s, "%")
	v, err := strconv.ParseFloat(strings.TrimSpace(strings.TrimSuffix(s, "%")), 64)
	if err != nil || v < 0 {
		return 0, fmt.Errorf("--threshold %q: write a fraction such as 0.001 or a percentage such as 0.1%%", s)
	}
	if pct {
		v /= 100
	}
	return v, nil
}
