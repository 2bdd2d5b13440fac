package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/export/jsonout"
)

// checkOptions are the flags of `sheaf check`.
type checkOptions struct {
	json  bool
	sheet sheetFlags
}

func newCheckCmd(a *app) *cobra.Command {
	o := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check FILE",
		Short: "Check a sheet's names, dimensions and dependencies without evaluating it",
		Long: `Check reads the sheet and reports every problem at once: syntax, undefined
names, duplicate names, cycles, dimension mismatches, display units that do not
fit, wrong arguments. Nothing is evaluated. FILE - reads the sheet from
stdin. With --json the outcome is a JSON document on stdout (schema in
schema/sheaf.schema.json), problems included.

Exit status here: 0 when the sheet is sound, 2 when it has errors.`,
		Args:              cobra.ExactArgs(1),
		ValidArgsFunction: completeSheets,
		RunE: func(cmd *cobra.Command, args []string) error {
			err := runCheck(a, o, args[0])
			if o.json {
				return jsonFailure(a, checkSchema, args[0], err)
			}
			return err
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print the outcome as JSON")
	o.sheet.add(cmd, false)
	return cmd
}

// checkSchema is the schema version of the JSON of `sheaf check`.
const checkSchema = "sheaf.check/1"

// checkDoc is the JSON of `sheaf check`.
type checkDoc struct {
	Schema   string            `json:"schema"`
	ExitCode int               `json:"exit_code"`
	File     string            `json:"file"`
	Cells    int               `json:"cells"`
	Checks   int               `json:"checks"`
	Problems []jsonout.Problem `json:"problems"`
	// A sheet with actions: how many, the rules that combine them and the
	// combinations its checks are checked in.
	Actions      int    `json:"actions,omitempty"`
	Combinations int    `json:"combinations,omitempty"`
	Rules        string `json:"combination_rules,omitempty"`
}

func runCheck(a *app, o *checkOptions, path string) error {
	s, err := loadSheet(a, path, &o.sheet)
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
	cs := s.Combos()
	if o.json {
		doc := checkDoc{Schema: checkSchema, File: s.Name(), Cells: cells, Checks: checks, Problems: []jsonout.Problem{}}
		if cs != nil {
			doc.Actions, doc.Combinations, doc.Rules = len(cs.Actions), len(cs.All), cs.Rules.Name
		}
		return jsonout.Encode(a.stdout, doc)
	}
	if cs != nil {
		_, err = fmt.Fprintf(a.stdout, "ok: %d cells, %d checks, %d actions in %d combinations of %s\n",
			cells, checks, len(cs.Actions), len(cs.All), cs.Rules.Name)
		return err
	}
	_, err = fmt.Fprintf(a.stdout, "ok: %d cells, %d checks\n", cells, checks)
	return err
}
