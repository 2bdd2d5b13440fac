package main

import (
	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
	"github.com/sheafcalc/sheaf/engine/export/text"
)

// runOptions are the flags of `sheaf run`.
type runOptions struct {
	sets         []string
	json         bool
	draft        bool
	combinations bool // print the table of every combination instead of the listing
	sheet        sheetFlags
}

func newRunCmd(a *app) *cobra.Command {
	o := &runOptions{}
	cmd := &cobra.Command{
		Use:   "run FILE",
		Short: "Evaluate a sheet and print its results and design checks",
		Long: `Run checks the sheet, evaluates every cell in dependency order and prints
the results: each cell in its display unit, then the design checks with their
utilisation. Inputs can be replaced with --set name=value (the value takes a
unit: --set P=45kN --set "d=24 mm"); a field of a record input with
--set steel.f_y=460MPa, an input of a template with --set rod.d=20mm.
FILE - reads the sheet from stdin (its templates are found from the
working directory).

With --json the results are one JSON document on stdout (schema in
schema/sheaf.schema.json); every problem, including a sheet that does not
load or a bad --set, is in it, and the exit status is the same as without.

A sheet with actions is evaluated in every combination of its rules
(SPEC.md §5a): each check shows its governing combination and how many were
evaluated, and fails when it fails in any of them. --combinations prints the
table of all combinations instead of the listing (--json has them too).

Exit status here: 0 when every design check passes and every cell was
computed, 1 when a check fails or cannot be assessed, 2 when the sheet or a
--set has errors or a cell could not be computed (with --draft, an
uncomputed cell does not make it 2).`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: completeSheets,
		RunE: func(cmd *cobra.Command, args []string) error {
			err := runRun(a, o, args[0])
			if o.json {
				return jsonFailure(a, jsonout.Schema, args[0], err)
			}
			return err
		},
	}
	cmd.Flags().StringArrayVar(&o.sets, "set", nil, setUsage)
	_ = cmd.RegisterFlagCompletionFunc("set", completeInputs)
	cmd.Flags().BoolVar(&o.json, "json", false, "print the results as JSON (every problem included)")
	cmd.Flags().BoolVar(&o.combinations, "combinations", false, "print the table of every combination of the sheet's actions, with each check's utilisation in it")
	cmd.Flags().BoolVar(&o.draft, "draft", false, draftUsage)
	o.sheet.add(cmd, true)
	return cmd
}

func runRun(a *app, o *runOptions, path string) error {
	s, st, err := loadState(a, path, &o.sheet, o.sets)
	if err != nil {
		return err
	}
	res := st.Eval()
	rerr := resultsErrorQuiet(res, o.draft)
	switch {
	case o.json:
		err = jsonout.WriteExit(a.stdout, res, exitCode(rerr))
	case o.combinations:
		err = text.WriteCombinations(a.stdout, res)
	default:
		err = text.Write(a.stdout, res, engine.DefaultSigFigs)
	}
	if err != nil {
		return err
	}
	if len(res.Problems) > 0 && !o.json {
		_ = diag.Render(a.stderr, res.Problems, s.Sources())
	}
	if rerr != nil && !o.json {
		return resultsError(a, res, o.draft)
	}
	return rerr
}
