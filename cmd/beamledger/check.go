package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/view"
)

type checkOptions struct {
	file        string
	json        bool
	failOnGoals bool
	tol         toleranceFlags
}

// toleranceFlags are the tolerance analysis's flags, shared by check and
// report.
type toleranceFlags struct {
	samples int
	seed    uint64
}

func (t *toleranceFlags) add(cmd *cobra.Command) {
	cmd.Flags().IntVar(&t.samples, "samples", drive.DefaultSamples, "Monte Carlo samples of the tolerance analysis (0 turns it off; at most 1000000)")
	cmd.Flags().Uint64Var(&t.seed, "seed", drive.DefaultSeed, "seed of the tolerance analysis (the same seed gives the same figures on any machine)")
}

// options checks the flags and turns them into the evaluation's options.
func (t *toleranceFlags) options() (safety.Options, error) {
	if t.samples < 0 || t.samples > 1000000 {
		return safety.Options{}, fmt.Errorf("--samples: %d is outside 0 to 1000000", t.samples)
	}
	return safety.Options{Samples: t.samples, Seed: t.seed}, nil
}

func (e *env) newCheck() *cobra.Command {
	o := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check FILE",
		Short: "Print the budget, the light at the atoms, the hazards and the findings",
		Long: `check loads a setup file and prints, for every beam path, the 1/e² radii,
power in and out, peak irradiance and cumulative loss at every element; at
each atom cloud the irradiance, saturation, Rabi frequency, optical depth,
dipole trap and the power each goal needs at the laser; the hazards against
IEC 60825-1:2014 (open segments, escaping beams, reflections, damage, classes,
eyewear) with their assumptions; the power balance of each laser; and the
findings: defects (to fix before alignment, whatever the controls), hazards
(exposures above the MPE, each controlled by a declared control or not),
drive findings (planning, never safety) and notes.

Powers in the budget are at each laser's operating power; hazards, ratings and
escaping beams are judged at its maximum power. Exit status: 0 no defect and
no uncontrolled hazard, 1 a defect or an uncontrolled hazard (or, with
--fail-on-goals, a drive goal not met), 2 the setup could not be used.`,
		Example: `  beamledger check testdata/examples/table-c.toml
  beamledger check --json testdata/examples/table-c.toml`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.file = args[0]
			return e.runCheck(o)
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "write JSON (SI units, unit-suffixed keys) instead of text")
	cmd.Flags().BoolVar(&o.failOnGoals, "fail-on-goals", false, "exit 1 also when a drive goal is not met")
	o.tol.add(cmd)
	return cmd
}

func (e *env) runCheck(o *checkOptions) error {
	s, err := setup.Load(o.file)
	if err != nil {
		return err
	}
	opts, err := o.tol.options()
	if err != nil {
		return err
	}
	done, _ := e.tolerancesRun(&opts)
	a, err := safety.EvaluateWith(s, opts)
	done()
	if err != nil {
		return err
	}
	if o.json {
		err = view.JSON(e.stdout, a)
	} else {
		err = view.Text(e.stdout, a)
	}
	if err != nil {
		return err
	}
	if a.NeedsAction() || (o.failOnGoals && a.GoalsUnmet()) {
		return errFindings
	}
	return nil
}
