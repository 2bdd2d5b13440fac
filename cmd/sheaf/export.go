package main

import (
	"fmt"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	xlsxout "github.com/sheafcalc/sheaf/engine/export/xlsx"
	"github.com/sheafcalc/sheaf/internal/plural"
)

// exportOptions are the flags of `sheaf export`.
type exportOptions struct {
	out    string
	sets   []string
	system string
}

func newExportCmd(a *app) *cobra.Command {
	o := &exportOptions{}
	cmd := &cobra.Command{
		Use:   "export FILE [-o OUT.xlsx]",
		Short: "Write the client workbook (.xlsx) of a sheet",
		Long: `Export evaluates the sheet and writes a workbook for the client: a summary
with the design checks and the caution, the calculation in reading order with
each expression as written and with its values, tables and bar results on a
data tab, and charts of N(x), u(x), σ(x) and N(ε).

Every value is a named cell. Inputs can be changed in the workbook (in the
unit shown); the formulas that the workbook can compute recompute, and values
only Sheaf can compute are marked. The file is written whole or not at all:
an existing workbook is replaced only when the new one is complete.

Without -o the workbook goes beside the sheet, with the extension .xlsx.

Exit status: 0 when the workbook is written and every design check passes,
1 when it is written but a check fails or cannot be assessed, 2 when the
sheet, a flag or the output path is wrong.`,
		Example: `  sheaf export hanger.sheaf
  sheaf export hanger.sheaf -o client/hanger-rev-B.xlsx --set P=45kN`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runExport(a, o, args[0])
		},
	}
	cmd.Flags().StringVarP(&o.out, "output", "o", "", "workbook to write (default: the sheet's name with .xlsx)")
	cmd.Flags().StringArrayVar(&o.sets, "set", nil, setUsage)
	cmd.Flags().StringVar(&o.system, "system", "", "display units for cells without a written unit: metric or us")
	return cmd
}

func runExport(a *app, o *exportOptions, path string) error {
	out := o.out
	if out == "" {
		out = strings.TrimSuffix(path, filepath.Ext(path)) + ".xlsx"
	}
	if !strings.EqualFold(filepath.Ext(out), ".xlsx") {
		return userErrorf("-o %s: the workbook needs the extension .xlsx, e.g. -o %s.xlsx", out, strings.TrimSuffix(out, filepath.Ext(out)))
	}
	if abs, err := filepath.Abs(out); err == nil {
		if src, err := filepath.Abs(path); err == nil && abs == src {
			return userErrorf("-o %s would overwrite the sheet itself; choose another name", out)
		}
	}
	s, st, err := loadState(a, path, o.system, o.sets)
	if err != nil {
		return err
	}
	if s.Combos() != nil {
		// The workbook's live formulas would combine the characteristic
		// values as written, not in each combination: refuse rather than
		// deliver numbers that do not follow the checks.
		return userErrorf("%s has actions; the workbook does not yet carry their combinations, so it is not written (run `sheaf run --combinations` for the table)", path)
	}
	res := st.Eval()
	stats, err := xlsxout.WriteFile(out, s, res, xlsxout.Options{Generator: "Sheaf " + versionString()})
	if err != nil {
		return userErrorf("cannot write %s: %v", out, err)
	}
	fmt.Fprintf(a.stdout, "wrote %s: %s, %s, %s only Sheaf computes, %s, %s\n", out,
		plural.Count(stats.Cells, "cell"), plural.Count(stats.Live, "live formula"), plural.Count(stats.ValueOnly, "value"),
		plural.Count(stats.Tables, "table"), plural.Count(stats.Charts, "chart"))
	if n := res.Failed(); n > 0 {
		fmt.Fprintf(a.stderr, "%s; the workbook shows them\n", (&checksFailedError{n}).Error())
		return &reportedError{&checksFailedError{n}, exitChecks}
	}
	return nil
}
