package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"beamledger/budget/atoms"
)

func (e *env) newTransitions() *cobra.Command {
	return &cobra.Command{
		Use:   "transitions",
		Short: "List the built-in atomic transitions with their data and sources",
		Long: `transitions lists every built-in transition a cloud may name: vacuum
wavelength, natural linewidth Γ/2π, saturation intensity (cycling, or the
two-level value, and for isotropic light where the data sheet gives it), mass,
the lines used for dipole potentials, and the published source.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			for _, name := range atoms.Names() {
				t, _ := atoms.Lookup(name)
				if _, err := fmt.Fprintf(e.stdout, "%s\n  %s\n  mass %.6g u; dipole lines: %v\n  source: %s\n",
					name, t.Describe(), t.Mass/atoms.AMU, t.LineNames(), t.Source); err != nil {
					return err
				}
			}
			return nil
		},
	}
}
