package main

import "github.com/spf13/cobra"

// newUnitsCmd is replaced by the unit catalogue listing (issue: foundation).
func newUnitsCmd(a *app) *cobra.Command {
	return &cobra.Command{
		Use:   "units",
		Short: "List the unit catalogue",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			return userErrorf("the unit catalogue is not built yet")
		},
	}
}
