package main

import (
	"fmt"

	"github.com/spf13/cobra"
)

func (e *env) newVersion() *cobra.Command {
	return &cobra.Command{
		Use:   "version",
		Short: "Print the version",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			_, err := fmt.Fprintf(e.stdout, "beamledger %s\n", version)
			return err
		},
	}
}
