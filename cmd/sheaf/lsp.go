package main

import (
	"fmt"
	"time"

	"github.com/spf13/cobra"

	"github.com/sheafcalc/sheaf/engine/lsp"
)

// lspOptions are the flags of `sheaf lsp`.
type lspOptions struct {
	debounce time.Duration
}

func newLspCmd(a *app) *cobra.Command {
	o := &lspOptions{}
	cmd := &cobra.Command{
		Use:   "lsp",
		Short: "Serve editors over the Language Server Protocol (stdin/stdout)",
		Long: `Lsp runs a language server for sheets on stdin and stdout, for an editor
to start (editors/vscode in the repository holds an extension that does).
It shows the problems of a sheet and of its templates as you type, each
cell's value at the end of its line, and on hover a cell's value, unit,
formula with its inputs' values, description and reference; it completes
names, functions, units, fields and template paths, goes to definitions
(also in templates), finds references, renames a cell across the sheets
of the project that use it, lays a sheet out as sheaf fmt does, and
offers the fix a problem's hint names.

The server writes no file: formatting and renaming send edits that the
editor applies to its buffers. Messages about the protocol go to stderr.

Exit status: 0 after the editor's shutdown and exit, 1 otherwise.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runLsp(a, o)
		},
	}
	cmd.Flags().DurationVar(&o.debounce, "debounce", 200*time.Millisecond, "how long to wait after typing stops before checking the sheet again")
	return cmd
}

func runLsp(a *app, o *lspOptions) error {
	if err := lsp.Serve(a.stdin, a.stdout, lsp.Options{Debounce: o.debounce, Log: a.stderr}); err != nil {
		fmt.Fprintf(a.stderr, "sheaf lsp: %v\n", err)
		return &reportedError{err, 1} // the protocol's code for an exit without shutdown
	}
	return nil
}
