package main

import (
	"fmt"
	"io"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine/units"
)

// unitsOptions are the flags of `sheaf units`.
type unitsOptions struct {
	dim    string // quantity name or unit; empty lists everything
	system string // metric, us or both
}

// newUnitsCmd builds `sheaf units`, the listing of the unit catalogue.
func newUnitsCmd(a *app) *cobra.Command {
	var o unitsOptions
	cmd := &cobra.Command{
		Use:   "units",
		Short: "List the units a sheet may use",
		Long: `List the unit catalogue: each unit's symbol, the quantity it measures,
the factor that converts one of it to SI, and the practice it belongs to.

--dim keeps the units of one dimension, named by a quantity ("stress",
"force per length") or by any unit of it ("kN", "N/mm^2"). --system keeps
metric or US customary units (units shared by both are always shown).

Units combine in expressions: kN*m, N/mm^2, mm2, kg/m^3, 1/K, m/s^2.
Temperatures are differences only: 1 degC = 1 K, 1 degF = 5/9 K.`,
		Example: `  sheaf units
  sheaf units --dim stress
  sheaf units --dim kN/m --system us`,
		Args: func(_ *cobra.Command, args []string) error {
			if len(args) > 0 {
				return userErrorf("units takes no arguments, got %q; filter with --dim %s", args[0], args[0])
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, _ []string) error {
			return runUnits(a, o)
		},
	}
	cmd.Flags().StringVar(&o.dim, "dim", "", "show only units of this quantity or unit's dimension")
	cmd.Flags().StringVar(&o.system, "system", "both", "show metric, us or both")
	_ = cmd.RegisterFlagCompletionFunc("system", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return []string{"metric\tSI units", "us\tUS customary units", "both\tmetric and US customary"}, cobra.ShellCompDirectiveNoFileComp
	})
	return cmd
}

// runUnits prints the filtered catalogue as an aligned table.
func runUnits(a *app, o unitsOptions) error {
	sys, ok := units.ParseSystem(o.system)
	if !ok {
		return userErrorf("--system: unknown unit system %q; use metric, us or both", o.system)
	}
	var (
		dim    units.Dim
		useDim = o.dim != ""
	)
	if useDim {
		d, err := units.DimOf(o.dim)
		if err != nil {
			return userErrorf("--dim: %v", err)
		}
		dim = d
	}
	var rows []units.Unit
	for _, u := range units.Catalogue() {
		if useDim && u.Dim != dim {
			continue
		}
		if sys != units.Neutral && u.System != units.Neutral && u.System != sys {
			continue
		}
		rows = append(rows, u)
	}
	if len(rows) == 0 {
		which := "unit"
		if sys != units.Neutral {
			which = sys.String() + " unit"
		}
		fmt.Fprintf(a.stdout, "no listed %s has dimension %s; its coherent SI unit is %s\n",
			which, dim, units.Coherent(dim).Symbol)
		return nil
	}
	return writeUnitTable(a.stdout, rows)
}

// writeUnitTable writes one unit per line under a header.
func writeUnitTable(w io.Writer, rows []units.Unit) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "SYMBOL\tQUANTITY\tSI FACTOR\tSYSTEM")
	for _, u := range rows {
		fmt.Fprintf(tw, "%s\t%s\t%.10g\t%s\n", u.Symbol, u.Quantity, u.Factor, u.System)
	}
	return tw.Flush()
}
