package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"beamledger/budget/setup/starter"
)

func (e *env) newInit() *cobra.Command {
	var schema string
	cmd := &cobra.Command{
		Use:   "init [FILE]",
		Short: "Write a commented starter setup file",
		Long: `init writes a commented starter setup (an invented imaging beam) to FILE,
default beamledger.toml. It never overwrites a file. With --schema PATH the
file's first line is a "#:schema PATH" comment, which editors' TOML support
reads to validate and complete the file against the schema that
"beamledger schema" prints.`,
		Example: "  beamledger init mylab.toml\n  beamledger schema > beamledger.schema.json && beamledger init --schema beamledger.schema.json mylab.toml",
		Args:    cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			name := "beamledger.toml"
			if len(args) == 1 {
				name = args[0]
			}
			return e.runInit(name, schema)
		},
	}
	cmd.Flags().StringVar(&schema, "schema", "", "write a first line pointing editors at this JSON Schema file")
	return cmd
}

// schemaLine is the first line that points an editor's TOML support at a
// schema file.
func schemaLine(path string) string { return "#:schema " + path + "\n" }

func (e *env) runInit(name, schema string) error {
	if strings.ContainsAny(schema, "\r\n") {
		return fmt.Errorf("--schema: %q holds a line break", schema)
	}
	f, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if errors.Is(err, fs.ErrExist) {
		return fmt.Errorf("%s already exists; init never overwrites a file", name)
	}
	if err != nil {
		return err
	}
	data := starter.Setup
	if schema != "" {
		data = append([]byte(schemaLine(schema)), data...)
	}
	if _, err := f.Write(data); err != nil {
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
