package main

import (
	"github.com/spf13/cobra"

	"beamledger/budget/setup"
)

func (e *env) newSchema() *cobra.Command {
	return &cobra.Command{
		Use:   "schema",
		Short: "Print a JSON Schema of the setup format, for editors",
		Long: `schema prints a JSON Schema (draft 2020-12) of the setup format, written from
the same key table the loader reads: every table and key with its type, the
choices, a pattern for every quantity string with its dimension and an
example, per-laser tables and tolerances, and the keys each element type
takes and requires. Point your editor's TOML support at it to have typos
underlined while you type, and keys completed with their descriptions.`,
		Example: `  beamledger schema > beamledger.schema.json
  beamledger init --schema beamledger.schema.json mylab.toml`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			doc, err := setup.Schema(version)
			if err != nil {
				return err
			}
			_, err = e.stdout.Write(append(doc, '\n'))
			return err
		},
	}
}
