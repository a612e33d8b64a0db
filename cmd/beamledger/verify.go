package main

import (
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"beamledger/budget/setup"
	"beamledger/safety/verify"
)

// errDiffer is returned by verify and diff when what they compare differs
// (exit status 1).
var errDiffer = errors.New("differences found")

func (e *env) newVerify() *cobra.Command {
	var since string
	cmd := &cobra.Command{
		Use:   "verify REPORT.pdf [SETUP.toml]",
		Short: "Check that a sign-off document carries its setup, and what this version finds for it",
		Long: fmt.Sprintf(`verify reads the setup file attached to a sign-off document written by
report and the document's own pages: the title, revision and setup SHA-256
in every footer and on the cover, and the hazard record printed in its
appendix must agree with the attached setup and the attached list of
hazards. It recomputes the setup's SHA-256 and compares it with the hash the
document states. Given a setup file, it says whether that file is the one
the document covers, byte for byte. It then evaluates the attached setup with
this version of the tool and lists every hazard (class, open-segment ratio
and OD, eyewear need, finding that needs action) that differs from those the
document recorded. A document written by this same version without --since
is written again from the attached setup and what the document records it
was written from (the setup file's name, the date, the tolerance samples
and seed), and every page must read word for word as the one written again.
A document written with --since is written again when the previous revision
it compares with is given with --since too (its SHA-256 must be the one the
document records). The cover's tool and date must agree with that record.

The document must be a regular file of at most %d MiB carrying exactly one
setup file and one hazard list, its compressed streams Flate streams that
expand to at most %d MiB in all.

Exit status: 0 everything matches, 1 something differs, 2 the document or the
setup cannot be used (not a PDF, not a regular file, not exactly one setup
attached, a --since file that is not the revision the document compares
with).`, verify.MaxDocumentBytes>>20, verify.MaxInflatedBytes>>20),
		Example: `  beamledger verify table-c.pdf
  beamledger verify table-c.pdf testdata/examples/table-c.toml
  beamledger verify table-c-rev4.pdf --since testdata/examples/table-c.toml`,
		Args: cobra.RangeArgs(1, 2),
		RunE: func(cmd *cobra.Command, args []string) error {
			return e.runVerify(args, since)
		},
	}
	cmd.Flags().StringVar(&since, "since", "", "the previous revision's setup file, for a document written with report --since")
	return cmd
}

func (e *env) runVerify(args []string, sinceFile string) error {
	doc, err := verify.ReadDocument(args[0])
	if err != nil {
		return err
	}
	var given, since []byte
	if len(args) == 2 {
		if given, err = setup.ReadSetupFile(args[1]); err != nil {
			return err
		}
	}
	if sinceFile != "" {
		if since, err = setup.ReadSetupFile(sinceFile); err != nil {
			return fmt.Errorf("--since: %w", err)
		}
	}
	r, err := verify.Check(doc, given, version, since)
	if errors.Is(err, verify.ErrGiven) {
		return &setup.InputError{Problems: []string{fmt.Sprintf("%s: %v", sinceFile, err)}}
	}
	if err != nil {
		return fmt.Errorf("%s: %w", args[0], err)
	}
	var b strings.Builder
	fmt.Fprintf(&b, "%s carries the setup %s\n", args[0], verify.AttachmentLabel(r.SetupName))
	switch {
	case len(r.Pages) == 0 && r.BodyCompared:
		b.WriteString("  its pages state that setup's title, revision and hash and the hazards recorded with it, and read word for word as this version writes them for it\n")
	case len(r.Pages) == 0:
		b.WriteString("  its pages state that setup's title, revision and hash, and the hazards recorded with it\n")
		fmt.Fprintf(&b, "  the rest of its pages were not compared: %s\n", r.BodyNote)
	default:
		b.WriteString("  its pages and its attachments disagree:\n")
		for _, p := range r.Pages {
			fmt.Fprintf(&b, "    %s\n", p)
		}
	}
	if r.SetupSHA256 == r.RecordedSHA256 {
		fmt.Fprintf(&b, "  SHA-256 %s, as the document states\n", r.SetupSHA256)
	} else {
		fmt.Fprintf(&b, "  SHA-256 %s, but the document states %s: the attachment is not the setup signed\n", r.SetupSHA256, orDash(r.RecordedSHA256))
	}
	if r.Given {
		if r.GivenMatches {
			fmt.Fprintf(&b, "  %s is the attached setup, byte for byte\n", args[1])
		} else {
			fmt.Fprintf(&b, "  %s differs from the attached setup: the document does not cover it (beamledger diff shows what changed)\n", args[1])
		}
	}
	if len(r.Removed) == 0 && len(r.Added) == 0 {
		fmt.Fprintf(&b, "  beamledger %s finds the hazards the document recorded\n", version)
	} else {
		fmt.Fprintf(&b, "  beamledger %s finds different hazards for the attached setup:\n", version)
		for _, l := range r.Removed {
			fmt.Fprintf(&b, "    recorded, no longer found: %s\n", l)
		}
		for _, l := range r.Added {
			fmt.Fprintf(&b, "    found now, not recorded:   %s\n", l)
		}
	}
	if r.Match() {
		b.WriteString("The document matches. This checks the file, not the table: the laser safety officer confirms that the table is built as described.\n")
	} else {
		b.WriteString("The document does not match; ask the laser safety officer before relying on it.\n")
	}
	if _, err := fmt.Fprint(e.stdout, b.String()); err != nil {
		return err
	}
	if !r.Match() {
		return errDiffer
	}
	return nil
}

func orDash(s string) string {
	if s == "" {
		return "none"
	}
	return s
}
