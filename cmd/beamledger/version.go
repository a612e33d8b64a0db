package main

import (
	"fmt"
	"slices"
	"strings"

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

// shells are the shells completion writes scripts for.
var shells = []string{"bash", "zsh", "fish", "powershell"}

// newCompletion writes a shell's completion script; an unknown shell is an
// input error (exit 2), not a help page.
func (e *env) newCompletion(root *cobra.Command) *cobra.Command {
	return &cobra.Command{
		Use:       "completion bash|zsh|fish|powershell",
		Short:     "Write the shell completion script",
		ValidArgs: shells,
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) != 1 || !slices.Contains(shells, args[0]) {
				return fmt.Errorf("completion: name one shell of %s", strings.Join(shells, ", "))
			}
			return nil
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			switch args[0] {
			case "bash":
				return root.GenBashCompletionV2(e.stdout, true)
			case "zsh":
				return root.GenZshCompletion(e.stdout)
			case "fish":
				return root.GenFishCompletion(e.stdout, true)
			}
			return root.GenPowerShellCompletionWithDesc(e.stdout)
		},
	}
}
