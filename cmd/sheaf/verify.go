package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/verify"
)

func verifyCmd(stdout, stderr io.Writer) *cobra.Command {
	return &cobra.Command{
		Use:   "verify <built-folder> <source-folder>",
		Short: "Say whether a delivered package was built from exactly these sources, and name what differs",
		Long: "verify reads the manifest a build leaves beside its pages, hashes the sources again, checks the\n" +
			"stamp every page states, and rebuilds the pages to compare them byte for byte.\n\n" +
			"Exit codes: 0 verified; 1 the package does not match the sources; 2 usage or unreadable files.",
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			r, err := verify.Verify(args[0], args[1], version.Version)
			if err != nil {
				return err
			}
			if r.OK() {
				fmt.Fprintf(stdout, "verified: %s was built from %s by %s (stamp %s, %d sources, %d pages)\n",
					args[0], args[1], r.Manifest.Tool, r.Stamp, len(r.Manifest.Sources), len(r.Manifest.Pages))
				return nil
			}
			fmt.Fprintf(stdout, "NOT verified: %s was not built from %s as they stand\n", args[0], args[1])
			for _, p := range r.Problems {
				if p.File != "" {
					fmt.Fprintf(stdout, "  %s: %s\n", p.File, p.Message)
				} else {
					fmt.Fprintf(stdout, "  %s\n", p.Message)
				}
			}
			return exitCode(exitCheckFailed)
		},
	}
}
