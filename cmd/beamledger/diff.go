package main

import (
	"github.com/spf13/cobra"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/revision"
)

type diffOptions struct {
	json bool
}

func (e *env) newDiff() *cobra.Command {
	o := &diffOptions{}
	cmd := &cobra.Command{
		Use:   "diff OLD.toml NEW.toml",
		Short: "Show what changed between two revisions of a setup, and what it does to the hazards and the drive",
		Long: `diff evaluates two revisions of a setup and lists what changed in the file
(lasers, paths, elements, clouds and eyewear added, removed or changed, old →
new as written), what that does to the hazards (open segments, eye or skin
ratios moving more than 10 %, OD, classes, NOHD and diffuse zones, stray
reflections and beams leaving a path, eyewear coverage, findings that need
action) and to the drive (the power at each cloud and each goal's margin).
Elements are matched by path and name, else by type and order.

Exit status: 0 no change affects safety, 1 a change affects safety and the
table needs a new sign-off (README lists which changes count), 2 an input
could not be used.`,
		Example: `  beamledger diff testdata/examples/table-c.toml testdata/examples/table-c-rev4.toml
  beamledger diff --json old.toml new.toml`,
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			return e.runDiff(o, args[0], args[1])
		},
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "write JSON instead of text")
	return cmd
}

// loadRevision reads and evaluates one revision of a setup (hazards and
// drive only: the tolerance analysis does not enter a comparison).
func loadRevision(file string) (revision.Revision, error) {
	data, err := setup.ReadSetupFile(file)
	if err != nil {
		return revision.Revision{}, err
	}
	s, err := setup.Parse(file, data)
	if err != nil {
		return revision.Revision{}, err
	}
	a, err := safety.EvaluateWith(s, safety.Options{})
	if err != nil {
		return revision.Revision{}, err
	}
	return revision.Revision{File: file, Data: data, Assessment: a}, nil
}

func (e *env) runDiff(o *diffOptions, oldFile, newFile string) error {
	old, err := loadRevision(oldFile)
	if err != nil {
		return err
	}
	nw, err := loadRevision(newFile)
	if err != nil {
		return err
	}
	r, err := revision.Compare(old, nw)
	if err != nil {
		return err
	}
	if o.json {
		err = revision.JSON(e.stdout, r)
	} else {
		err = revision.Text(e.stdout, r)
	}
	if err != nil {
		return err
	}
	if r.AffectsSafety {
		return errDiffer
	}
	return nil
}
