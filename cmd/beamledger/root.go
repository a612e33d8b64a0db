package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"
	"time"

	"github.com/spf13/cobra"
)

// Exit statuses, decided here only.
const (
	exitOK       = 0 // no defect and no uncontrolled hazard (check), the document written (report)
	exitFindings = 1 // a defect or an uncontrolled hazard; with check --fail-on-goals also a drive goal not met
	exitBadInput = 2 // the input could not be used
)

// version of the tool, printed by `version` and recorded in reports.
var version = "0.1.0"

// errFindings is returned by check when a defect or an uncontrolled hazard
// (or, when asked, an unmet goal) was found.
var errFindings = errors.New("findings need action")

// env carries what commands take from outside: output streams and the clock.
type env struct {
	stdout, stderr io.Writer
	now            func() time.Time
	getenv         func(string) string
	// interrupts delivers the signals that stop a run (SIGINT, SIGTERM),
	// and a function that stops delivering them.
	interrupts func() (<-chan os.Signal, func())
}

// osInterrupts delivers the process's SIGINT and SIGTERM.
func osInterrupts() (<-chan os.Signal, func()) {
	c := make(chan os.Signal, 1)
	signal.Notify(c, os.Interrupt, syscall.SIGTERM)
	return c, func() { signal.Stop(c) }
}

func run(args []string, stdout, stderr io.Writer) int {
	e := &env{stdout: stdout, stderr: stderr, now: time.Now, getenv: os.Getenv, interrupts: osInterrupts}
	return e.execute(args)
}

func (e *env) execute(args []string) int {
	root := e.newRoot()
	root.SetArgs(args)
	err := root.Execute()
	switch {
	case err == nil:
		return exitOK
	case errors.Is(err, errFindings), errors.Is(err, errDiffer):
		return exitFindings
	default:
		fmt.Fprintf(e.stderr, "beamledger: %v\n", err)
		return exitBadInput
	}
}

func (e *env) newRoot() *cobra.Command {
	root := &cobra.Command{
		Use:   "beamledger",
		Short: "Check the light at the atoms and the hazards of a laser setup before alignment",
		Long: `beamledger reads a TOML setup of lasers, beam paths, optics and atom clouds,
propagates Gaussian beams (1/e² radii, M², x and y planes) through the optics,
and reports the power budget element by element, the light at the atoms and
the drive goals against the lasers, and the hazards against the exposure
limits of IEC 60825-1:2014; report writes the same as a sign-off PDF.

Its figures support, and never replace, the evaluation of your laser safety
officer under local regulations.`,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetOut(e.stdout)
	root.SetErr(e.stderr)
	root.Version = version
	root.SetVersionTemplate("beamledger {{.Version}}\n")
	root.CompletionOptions.DisableDefaultCmd = true
	root.AddCommand(e.newCheck(), e.newReport(), e.newServe(), e.newLimits(), e.newInit(), e.newTransitions(), e.newVerify(), e.newDiff(), e.newSchema(), e.newVersion(), e.newCompletion(root))
	return root
}
