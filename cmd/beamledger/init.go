package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"

	"github.com/spf13/cobra"

	"beamledger/budget/starter"
)

func (e *env) newInit() *cobra.Command {
	return &cobra.Command{
		Use:     "init [FILE]",
		Short:   "Write a commented starter setup file",
		Long:    "init writes a commented starter setup (an invented imaging beam) to FILE, default beamledger.toml. It never overwrites a file.",
		Example: "  beamledger init mylab.toml",
		Args:    cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			name := "beamledger.toml"
			if len(args) == 1 {
				name = args[0]
			}
			return e.runInit(name)
		},
	}
}

func (e *env) runInit(name string) error {
	f, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if errors.Is(err, fs.ErrExist) {
		return fmt.Errorf("%s already exists; init never overwrites a file", name)
	}
	if err != nil {
		return err
	}
	if _, err := f.Write(starter.Setup); err != nil {
		f.Close()
		os.Remove(name)
		return err
	}
	if err := f.Close(); err != nil {
		os.Remove(name)
		return err
	}
	_, err = fmt.Fprintf(e.stdout, "wrote %s; edit it, then run: beamledger check %s\n", name, name)
	return err
}
