package main

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strconv"
	"time"

	"github.com/spf13/cobra"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/page"
	"beamledger/safety/pdf"
	"beamledger/safety/report"
	"beamledger/safety/revision"
)

type reportOptions struct {
	file, output, date string
	since, diagram     string
	html               string
	force              bool
	tol                toleranceFlags
}

func (e *env) newReport() *cobra.Command {
	o := &reportOptions{}
	cmd := &cobra.Command{
		Use:   "report FILE -o OUT.pdf [--html OUT.html]",
		Short: "Write the sign-off document of a setup as a PDF (and as one HTML page)",
		Long: `report evaluates a setup as check does and writes the sign-off document: a
title block with the SHA-256 of the setup file, a summary, the sources, every
beam path with plots of its beam radius and power, the drive at the atoms, the
hazards against IEC 60825-1:2014, the eyewear needed, the assumptions, the
cautions and a sign-off block for the preparer, the laser safety officer and
the responsible person.

With --diagram FILE.svg the drawing of the beam paths (the document's
second section) is also written as SVG, for wikis and lab notebooks.

With --html OUT.html the same document is written as one self-contained
HTML page (inline SVG and style, no scripts, nothing fetched), for a group's
wiki; -o may then be left out. It carries the setup's SHA-256 and the setup
file, and is reproducible byte for byte like the PDF.

With --since OLD.toml the document opens with the changes since that
revision: its title, revision and SHA-256, then what changed in the setup,
the hazards and the drive, as diff shows them.

The date comes from --date, else from SOURCE_DATE_EPOCH, else today; the same
setup, tool version and date give the same bytes. The PDF is written to a
temporary file beside OUT and renamed into place; an existing OUT is replaced
only with --force, and nothing is written when the setup cannot be used.

Exit status: 0 once the document is written, whatever it finds (its job is
the document; check is the gate), 2 when the setup could not be used or the
document could not be written.`,
		Example: `  beamledger report testdata/examples/table-c.toml -o table-c.pdf
  SOURCE_DATE_EPOCH=1767225600 beamledger report testdata/examples/table-c.toml -o table-c.pdf --force
  beamledger report testdata/examples/table-c.toml --html table-c.html`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.file = args[0]
			return e.runReport(o)
		},
	}
	cmd.Flags().StringVarP(&o.output, "output", "o", "", "the PDF to write (required unless --html is given)")
	cmd.Flags().StringVar(&o.html, "html", "", "also (or only) write the document as one self-contained HTML page to this file")
	cmd.Flags().StringVar(&o.date, "date", "", "the document date, YYYY-MM-DD (default: SOURCE_DATE_EPOCH, else today)")
	cmd.Flags().BoolVar(&o.force, "force", false, "replace an existing output file")
	cmd.Flags().StringVar(&o.diagram, "diagram", "", "also write the drawing of the beam paths as SVG to this file")
	cmd.Flags().StringVar(&o.since, "since", "", "the setup file of the previous revision: the document opens with the changes since it (as diff shows them)")
	o.tol.add(cmd)
	return cmd
}

// reportDate picks the document date: --date, SOURCE_DATE_EPOCH, or today.
func (e *env) reportDate(flag string) (time.Time, error) {
	if flag != "" {
		t, err := time.Parse("2006-01-02", flag)
		if err != nil {
			return time.Time{}, fmt.Errorf("--date: %q is not a date of the form YYYY-MM-DD", flag)
		}
		return t, nil
	}
	if s := e.getenv("SOURCE_DATE_EPOCH"); s != "" {
		n, err := strconv.ParseInt(s, 10, 64)
		if err != nil || n < 0 {
			return time.Time{}, fmt.Errorf("SOURCE_DATE_EPOCH: %q is not a count of seconds since 1970", s)
		}
		if n > maxEpoch {
			return time.Time{}, fmt.Errorf("SOURCE_DATE_EPOCH: %q is after the year 9999; a document date has four digits of year", s)
		}
		return time.Unix(n, 0).UTC(), nil
	}
	return e.now().UTC(), nil
}

func (e *env) runReport(o *reportOptions) error {
	if o.output == "" && o.html == "" {
		return fmt.Errorf("-o OUT.pdf (or --html OUT.html) is required")
	}
	date, err := e.reportDate(o.date)
	if err != nil {
		return err
	}
	var outputs [][2]string
	for _, out := range [][2]string{{"-o", o.output}, {"--html", o.html}, {"--diagram", o.diagram}} {
		if out[1] != "" {
			outputs = append(outputs, out)
		}
	}
	inputs := [][2]string{{"setup file", o.file}}
	if o.since != "" {
		inputs = append(inputs, [2]string{"--since setup", o.since})
	}
	if err := checkOutputs(outputs, inputs); err != nil {
		return err
	}
	if o.output != "" {
		if err := checkOutput(o.file, o.output, o.force); err != nil {
			return err
		}
	}
	if o.html != "" {
		if err := checkOutput(o.file, o.html, o.force); err != nil {
			return fmt.Errorf("--html: %w", err)
		}
	}
	if o.diagram != "" {
		if err := checkOutput(o.file, o.diagram, o.force); err != nil {
			return fmt.Errorf("--diagram: %w", err)
		}
	}
	data, err := setup.ReadSetupFile(o.file)
	if err != nil {
		return err
	}
	s, err := setup.Parse(o.file, data)
	if err != nil {
		return err
	}
	opts, err := o.tol.options()
	if err != nil {
		return err
	}
	done, interrupted := e.tolerancesRun(&opts)
	a, err := safety.EvaluateWith(s, opts)
	done()
	if err != nil {
		return err
	}
	if interrupted() {
		// A sign-off document is never of part of its analysis.
		return errInterrupted
	}
	meta := report.Meta{Date: date.Format("2006-01-02"), ToolVersion: version, SetupBytes: data, Samples: opts.Samples, Seed: opts.Seed}
	if o.since != "" {
		old, err := loadRevision(o.since)
		if err != nil {
			return fmt.Errorf("--since: %w", err)
		}
		if meta.Since, err = revision.Compare(old, revision.Revision{File: o.file, Data: data, Assessment: a}); err != nil {
			return fmt.Errorf("--since: %w", err)
		}
	}
	doc := report.Build(a, meta)
	// The SVG is drawn before anything is written, so that a failure
	// leaves no file behind.
	var svg bytes.Buffer
	if o.diagram != "" {
		if err := report.WriteSVG(&svg, "Beam paths of "+doc.Title+" (setup SHA-256 "+doc.SetupSHA256+")", doc.Drawings()); err != nil {
			return err
		}
	}
	var htmlPage bytes.Buffer
	if o.html != "" {
		if err := page.Write(&htmlPage, doc); err != nil {
			return err
		}
	}
	// Every output is written to a temporary file beside it first; only
	// when all are written are they renamed into place, so a failure (a
	// missing folder, a full disk, an interrupt) replaces nothing.
	type output struct {
		name, what string
		write      func(*os.File) error
	}
	var outs []output
	if o.output != "" {
		outs = append(outs, output{o.output, fmt.Sprintf("(%s, setup SHA-256 %s)", doc.Date, doc.SetupSHA256), func(f *os.File) error {
			return pdf.Write(f, doc, pdf.Options{Date: date, Compress: true})
		}})
	}
	if o.html != "" {
		outs = append(outs, output{o.html, fmt.Sprintf("(%s, setup SHA-256 %s, one HTML page)", doc.Date, doc.SetupSHA256), func(f *os.File) error {
			_, err := f.Write(htmlPage.Bytes())
			return err
		}})
	}
	if o.diagram != "" {
		outs = append(outs, output{o.diagram, "(the drawing of the beam paths)", func(f *os.File) error {
			_, err := f.Write(svg.Bytes())
			return err
		}})
	}
	var staged []string
	unstage := func() {
		for _, t := range staged {
			os.Remove(t)
		}
	}
	for _, out := range outs {
		tmp, err := stageFile(out.name, e.interrupts, out.write)
		if err != nil {
			unstage()
			return fmt.Errorf("%s: %w (nothing was written)", out.name, err)
		}
		staged = append(staged, tmp)
	}
	for i, out := range outs {
		if err := os.Rename(staged[i], out.name); err != nil {
			unstage()
			return err
		}
		if _, err := fmt.Fprintf(e.stdout, "wrote %s %s\n", out.name, out.what); err != nil {
			return err
		}
	}
	return nil
}

// samePath reports whether two names resolve to one file: the same file
// where both exist, else the same absolute path once the links in their
// folders are followed.
func samePath(a, b string) bool {
	if ia, err := os.Stat(a); err == nil {
		if ib, err := os.Stat(b); err == nil {
			return os.SameFile(ia, ib)
		}
	}
	resolve := func(p string) string {
		abs, err := filepath.Abs(p)
		if err != nil {
			return filepath.Clean(p)
		}
		if dir, err := filepath.EvalSymlinks(filepath.Dir(abs)); err == nil {
			return filepath.Join(dir, filepath.Base(abs))
		}
		return abs
	}
	return resolve(a) == resolve(b)
}

// checkOutputs refuses outputs that are one file under two spellings, and
// an output that is an input (the setup, the --since setup).
func checkOutputs(outputs, inputs [][2]string) error {
	for i, a := range outputs {
		for _, b := range outputs[i+1:] {
			if samePath(a[1], b[1]) {
				return fmt.Errorf("%s %s and %s %s are the same file; give each output a name of its own", a[0], a[1], b[0], b[1])
			}
		}
		for _, in := range inputs {
			if samePath(a[1], in[1]) {
				return fmt.Errorf("%s %s is the %s %s; the report never replaces its inputs", a[0], a[1], in[0], in[1])
			}
		}
	}
	return nil
}

// maxEpoch is the last second of the year 9999, UTC.
const maxEpoch = 253402300799

// checkOutput refuses an output that would replace the setup file itself,
// or anything but a regular file, and an existing output (a dangling link
// included) without --force.
func checkOutput(setup, output string, force bool) error {
	fi, err := os.Lstat(output)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("-o %s: %w", output, err)
	}
	if si, err := os.Stat(setup); err == nil {
		if oi, err := os.Stat(output); err == nil && os.SameFile(si, oi) {
			return fmt.Errorf("-o %s is the setup file %s itself; the report never replaces its own setup", output, setup)
		}
	}
	switch m := fi.Mode(); {
	case m.IsDir():
		return fmt.Errorf("-o %s is a directory; give the name of the PDF to write", output)
	case m&fs.ModeSymlink != 0:
		if !force {
			return fmt.Errorf("-o %s exists (a symbolic link); use --force to replace the link with the PDF", output)
		}
	case !m.IsRegular():
		return fmt.Errorf("-o %s is not a regular file (%s); the report is written only to a regular file", output, m.Type())
	case !force:
		return fmt.Errorf("%s exists; use --force to replace it", output)
	}
	return nil
}

// errInterrupted is returned when a signal stops a report being written.
var errInterrupted = errors.New("interrupted; no report was written")

// writeAtomically writes through a temporary file beside name and renames it
// into place, so no half-written file is ever left at name (stageFile, then
// the rename).
func writeAtomically(name string, interrupts func() (<-chan os.Signal, func()), write func(*os.File) error) error {
	tmp, err := stageFile(name, interrupts, write)
	if err != nil {
		return err
	}
	if err := os.Rename(tmp, name); err != nil {
		os.Remove(tmp)
		return err
	}
	return nil
}

// stageFile writes a temporary file beside name with write and returns its
// name, ready to be renamed into place. The temporary name is short (a
// long output name still fits the file system's limit); a signal arriving
// on interrupts removes it and returns errInterrupted.
func stageFile(name string, interrupts func() (<-chan os.Signal, func()), write func(*os.File) error) (string, error) {
	tmp, err := os.CreateTemp(filepath.Dir(name), ".beamledger-*.tmp")
	if err != nil {
		return "", err
	}
	sig, stop := interrupts()
	defer stop()
	done := make(chan error, 1)
	go func() {
		err := write(tmp)
		if cerr := tmp.Close(); err == nil {
			err = cerr
		}
		done <- err
	}()
	select {
	case <-sig:
		tmp.Close()
		os.Remove(tmp.Name())
		return "", errInterrupted
	case err := <-done:
		if err != nil {
			os.Remove(tmp.Name())
			return "", err
		}
	}
	if err := os.Chmod(tmp.Name(), 0o644); err != nil {
		os.Remove(tmp.Name())
		return "", err
	}
	return tmp.Name(), nil
}
