package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/sheaf-calc/sheaf/units"
)

func unitsCmd(stdout io.Writer) *cobra.Command {
	return &cobra.Command{
		Use:   "units",
		Short: "List the units, prefixes and constants sheaf knows",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			w := tabwriter.NewWriter(stdout, 2, 4, 2, ' ', 0)
			fmt.Fprintln(w, "SYMBOL\tALSO\tNAME\tCLASS\tPREFIXES\tIN SI\tNOTE")
			for i := range units.Table {
				d := &units.Table[i]
				u := d.Unit()
				si := strconv.FormatFloat(u.Scale, 'g', 10, 64) + " " + u.Dim.SIUnits()
				if u.Offset != 0 {
					si = fmt.Sprintf("(x + %g) × %.10g K", u.Offset, u.Scale)
				}
				pre := ""
				if d.Prefix {
					pre = "yes"
				}
				fmt.Fprintf(w, "%s\t%s\t%s\t%s\t%s\t%s\t%s\n", d.Symbol, strings.Join(d.Aliases, " "), d.Name, d.Class, pre, si, d.Note)
			}
			w.Flush()
			fmt.Fprintln(stdout)
			fmt.Fprintln(stdout, "SI prefixes (SI Brochure 9th ed. with the 2022 additions):")
			var ps []string
			for _, p := range units.Prefixes {
				ps = append(ps, fmt.Sprintf("%s %s 1e%d", p.Symbol, p.Name, p.Exp))
			}
			fmt.Fprintln(stdout, "  "+strings.Join(ps, ", "))
			fmt.Fprintln(stdout, "  micro may also be written μ (Greek mu) or u.")
			fmt.Fprintln(stdout)
			fmt.Fprintln(stdout, "Constants:")
			for _, c := range units.Constants {
				fmt.Fprintf(stdout, "  %-10s %s = %s %s  (%s)\n", c.Name, c.Symbol, units.FormatNumber(c.Value, 11), c.Dim.SIUnits(), c.Source)
			}
			return nil
		},
	}
}
