package main

import (
	"fmt"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	xlsxout "github.com/sheafcalc/sheaf/engine/export/xlsx"
	"github.com/sheafcalc/sheaf/internal/plural"
	"github.com/sheafcalc/sheaf/internal/userfile"
)

// exportOptions are the flags of `sheaf export`.
type exportOptions struct {
	out   string
	sets  []string
	draft bool
	sheet sheetFlags
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
FILE - reads the sheet from stdin; -o is then needed.

A header value that is still a placeholder of a new sheet (a date
YYYY-MM-DD, an author <name>) is written as it is, with a warning on stderr:
the client sees it on the summary.

Exit status here: 0 when the workbook is written and every design check passes,
1 when it is written but a check fails or cannot be assessed, 2 when the
sheet, a flag or the output path is wrong, or a cell could not be computed
(the workbook is written then too; --draft keeps the status at 0 or 1).`,
		Example: `  sheaf export hanger.sheaf
  sheaf export hanger.sheaf -o client/hanger-rev-B.xlsx --set P=45kN`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: completeSheets,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runExport(a, o, args[0])
		},
	}
	cmd.Flags().StringVarP(&o.out, "output", "o", "", "workbook to write (default: the sheet's name with .xlsx)")
	cmd.Flags().StringArrayVar(&o.sets, "set", nil, setUsage)
	_ = cmd.RegisterFlagCompletionFunc("set", completeInputs)
	cmd.Flags().BoolVar(&o.draft, "draft", false, draftUsage)
	o.sheet.add(cmd, true)
	return cmd
}

func runExport(a *app, o *exportOptions, path string) error {
	out := o.out
	if out == "" && path == "-" {
		return userErrorf("export - reads the sheet from stdin: name the workbook with -o, e.g. -o calc.xlsx")
	}
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
	s, st, err := loadState(a, path, &o.sheet, o.sets)
	if err != nil {
		return err
	}
	for _, in := range s.Files() {
		if userfile.Same(out, in) {
			return userErrorf("-o %s would overwrite %s, which this sheet is built from; choose another name", out, in)
		}
	}
	res := st.Eval()
	stats, err := xlsxout.WriteFile(out, s, res, xlsxout.Options{Generator: "Sheaf " + versionString()})
	if err != nil {
		return userErrorf("cannot write %s: %v", out, err)
	}
	fmt.Fprintf(a.stdout, "wrote %s: %s, %s, %s only Sheaf computes, %s, %s\n", out,
		plural.Count(stats.Cells, "cell"), plural.Count(stats.Live, "live formula"), plural.Count(stats.ValueOnly, "value"),
		plural.Count(stats.Tables, "table"), plural.Count(stats.Charts, "chart"))
	warnPlaceholders(a, s.Name(), s.Meta())
	if n := res.Failed(); n > 0 {
		fmt.Fprintf(a.stderr, "%s; the workbook shows them\n", (&checksFailedError{n}).Error())
	}
	return resultsError(a, res, o.draft)
}

// warnPlaceholders warns on stderr about header values that are still the
// placeholders `sheaf new` writes (or look like them): they would reach the
// client's summary as they are.
func warnPlaceholders(a *app, name string, m engine.Meta) {
	for _, kv := range [][2]string{{"title", m.Title}, {"project", m.Project}, {"author", m.Author},
		{"checker", m.Checker}, {"date", m.Date}, {"revision", m.Revision}} {
		if isPlaceholder(kv[1]) {
			fmt.Fprintf(a.stderr, "sheaf: warning: %s: the header %s is still the placeholder %q; the workbook's summary shows it to the client\n", name, kv[0], kv[1])
		}
	}
}

// isPlaceholder reports whether a header value is a template's
// placeholder: a date pattern like YYYY-MM-DD, a <name> in angle brackets,
// or a TODO / TBD / XXX marker.
func isPlaceholder(v string) bool {
	v = strings.TrimSpace(v)
	up := strings.ToUpper(v)
	switch {
	case v == "":
		return false
	case strings.Contains(up, "YYYY") || strings.Contains(up, "DD-MM") || strings.Contains(up, "MM-DD"):
		return true
	case strings.HasPrefix(v, "<") && strings.HasSuffix(v, ">"):
		return true
	}
	for _, w := range strings.FieldsFunc(up, func(r rune) bool { return r < 'A' || r > 'Z' }) {
		if w == "TODO" || w == "TBD" || w == "XXX" || w == "FIXME" {
			return true
		}
	}
	return false
}
