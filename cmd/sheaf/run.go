package main

import (
	"errors"
	"strings"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
	"github.com/sheafcalc/sheaf/engine/export/text"
	"github.com/sheafcalc/sheaf/engine/units"
)

// runOptions are the flags of `sheaf run`.
type runOptions struct {
	sets         []string
	json         bool
	system       string
	combinations bool
}

func newRunCmd(a *app) *cobra.Command {
	o := &runOptions{}
	cmd := &cobra.Command{
		Use:   "run FILE",
		Short: "Evaluate a sheet and print its results and design checks",
		Long: `Run checks the sheet, evaluates every cell in dependency order and prints
the results: each cell in its display unit, then the design checks with their
utilisation. Inputs can be replaced with --set name=value (the value takes a
unit: --set P=45kN --set "d=24 mm").

Exit status: 0 when every design check passes, 1 when a check fails or
cannot be assessed, 2 when the sheet or a --set has errors.

A sheet with actions is evaluated in every combination of its rules
(SPEC.md §5a): each check shows its governing combination and how many were
evaluated, and fails when it fails in any of them. --combinations prints the
table of all combinations instead of the listing.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runRun(a, o, args[0])
		},
	}
	cmd.Flags().StringArrayVar(&o.sets, "set", nil, setUsage)
	cmd.Flags().BoolVar(&o.json, "json", false, "print the results as JSON")
	cmd.Flags().BoolVar(&o.combinations, "combinations", false, "print the table of every combination of the sheet's actions, with each check's utilisation in it")
	cmd.Flags().StringVar(&o.system, "system", "", "display units for cells without a written unit: metric or us")
	return cmd
}

// loadSheet loads a sheet with the --system choice, rendering sheet errors.
func loadSheet(a *app, path, system string) (*engine.Sheet, error) {
	var opts []engine.Option
	if system != "" {
		s, ok := units.ParseSystem(system)
		if !ok || s == units.Neutral {
			return nil, userErrorf("unknown unit system %q: use metric or us", system)
		}
		opts = append(opts, engine.WithSystem(s))
	}
	s, err := engine.Load(path, opts...)
	if err != nil {
		var list diag.List
		if errors.As(err, &list) {
			reportProblems(a.stderr, list, engine.ReadSources(list), path, "")
			return nil, &reportedError{err, exitInput}
		}
		return nil, &inputError{err}
	}
	return s, nil
}

// setUsage is the help of the --set flag of run and export.
const setUsage = "replace an input: name=value with a unit, e.g. P=45kN (repeatable)"

// loadState loads the sheet at path (see loadSheet) and returns it with a
// new state whose inputs are replaced as the --set flags (name=value) say.
func loadState(a *app, path, system string, sets []string) (*engine.Sheet, *engine.State, error) {
	s, err := loadSheet(a, path, system)
	if err != nil {
		return nil, nil, err
	}
	st := s.NewState()
	for _, kv := range sets {
		name, val, ok := strings.Cut(kv, "=")
		name, val = strings.TrimSpace(name), strings.TrimSpace(val)
		if !ok || name == "" || val == "" {
			return nil, nil, userErrorf("--set %q: expected name=value, e.g. --set P=45kN", kv)
		}
		v, err := s.ParseInput(name, val)
		if err != nil {
			return nil, nil, userErrorf("--set %s: %v", kv, err)
		}
		if err := st.Set(name, v); err != nil {
			return nil, nil, userErrorf("--set %s: %v", kv, err)
		}
	}
	return s, st, nil
}

func runRun(a *app, o *runOptions, path string) error {
	s, st, err := loadState(a, path, o.system, o.sets)
	if err != nil {
		return err
	}
	res := st.Eval()
	switch {
	case o.json:
		err = jsonout.Write(a.stdout, res)
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
	if n := res.Failed(); n > 0 {
		return &reportedError{&checksFailedError{n}, exitChecks}
	}
	return nil
}
