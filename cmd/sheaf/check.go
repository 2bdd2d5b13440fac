package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
)

// checkOptions are the flags of `sheaf check`.
type checkOptions struct{}

func newCheckCmd(a *app) *cobra.Command {
	o := &checkOptions{}
	return &cobra.Command{
		Use:   "check FILE",
		Short: "Check a sheet's names, dimensions and dependencies without evaluating it",
		Long: `Check reads the sheet and reports every problem at once: syntax, undefined
names, duplicate names, cycles, dimension mismatches, display units that do not
fit, wrong arguments. Nothing is evaluated.

Exit status: 0 when the sheet is sound, 2 when it has errors.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return runCheck(a, o, args[0])
		},
	}
}

func runCheck(a *app, _ *checkOptions, path string) error {
	s, err := loadSheet(a, path, "")
	if err != nil {
		return err
	}
	cells, checks := 0, 0
	for _, c := range s.Cells() {
		if c.Kind == engine.Check {
			checks++
		} else {
			cells++
		}
	}
	if cs := s.Combos(); cs != nil {
		_, err = fmt.Fprintf(a.stdout, "ok: %d cells, %d checks, %d actions in %d combinations of %s\n",
			cells, checks, len(cs.Actions), len(cs.All), cs.Rules.Name)
		return err
	}
	_, err = fmt.Fprintf(a.stdout, "ok: %d cells, %d checks\n", cells, checks)
	return err
}
