// Package verify checks a sign-off document against its setup: the setup
// file attached to the PDF, its hash, an optional setup file given beside
// it, and the hazards this version of the tool finds for the attached setup
// against those the document recorded.
package verify

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"slices"
	"strings"

	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/validate"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/report"
)

// Result is what verify found.
type Result struct {
	// SetupName and SetupSHA256 are the attached setup's name and hash;
	// RecordedSHA256 the hash the document states for it.
	SetupName, SetupSHA256, RecordedSHA256 string
	// GivenMatches is set when a setup file was given and is the attached
	// one, byte for byte; Given says one was given.
	Given, GivenMatches bool
	// Removed and Added are the hazard lines the document recorded that
	// this version no longer finds, and the new ones.
	Removed, Added []string
}

// Match reports whether everything agrees.
func (r *Result) Match() bool {
	return r.SetupSHA256 == r.RecordedSHA256 && (!r.Given || r.GivenMatches) && len(r.Removed) == 0 && len(r.Added) == 0
}

// ErrUnusable marks an input that cannot be verified (not a PDF, no
// attached setup).
var ErrUnusable = errors.New("cannot be verified")

func init() {
	// pdfcpu would otherwise write its configuration into the user's
	// configuration directory on first use; verify only reads a document.
	model.ConfigPath = "disable"
}

// attachments reads and validates a PDF and returns its attached files. It
// uses pdfcpu's reader and validator directly (its api package brings in a
// text-width table whose start-up costs every command 30 ms); a panic in
// the reader on a malformed file is an unreadable file.
func attachments(pdf []byte) (atts []model.Attachment, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("the PDF reader failed: %v", r)
		}
	}()
	ctx, err := pdfcpu.Read(bytes.NewReader(pdf), model.NewDefaultConfiguration())
	if err != nil {
		return nil, err
	}
	if err := validate.XRefTable(ctx); err != nil {
		return nil, err
	}
	return ctx.ExtractAttachments(nil)
}

// Check verifies the document pdf; given is the setup file to compare with
// (nil: none).
func Check(pdf []byte, given []byte) (*Result, error) {
	atts, err := attachments(pdf)
	if err != nil {
		return nil, fmt.Errorf("%w: not a readable PDF: %v", ErrUnusable, err)
	}
	var attached, recorded []byte
	r := &Result{}
	for _, a := range atts {
		data, err := io.ReadAll(a)
		if err != nil {
			return nil, fmt.Errorf("%w: reading attachment %q: %v", ErrUnusable, a.FileName, err)
		}
		switch {
		case a.FileName == report.HazardsAttachment:
			recorded = data
		case strings.HasSuffix(a.FileName, ".toml") || strings.Contains(a.Desc, "SHA-256"):
			attached, r.SetupName = data, a.FileName
			if _, h, ok := strings.Cut(a.Desc, "SHA-256 "); ok {
				r.RecordedSHA256 = strings.TrimSpace(h)
			}
		}
	}
	if attached == nil {
		return nil, fmt.Errorf("%w: the PDF carries no setup file (was it written by beamledger report?)", ErrUnusable)
	}
	sum := sha256.Sum256(attached)
	r.SetupSHA256 = hex.EncodeToString(sum[:])
	if given != nil {
		r.Given = true
		r.GivenMatches = bytes.Equal(given, attached)
	}
	s, err := setup.Parse(r.SetupName, attached)
	if err != nil {
		return nil, fmt.Errorf("%w: the attached setup no longer loads: %v", ErrUnusable, err)
	}
	a, err := safety.EvaluateWith(s, safety.Options{})
	if err != nil {
		return nil, fmt.Errorf("%w: evaluating the attached setup: %v", ErrUnusable, err)
	}
	now := safety.HazardDigest(a)
	var then []string
	for _, l := range strings.Split(strings.TrimSpace(string(recorded)), "\n") {
		if l != "" {
			then = append(then, l)
		}
	}
	for _, l := range then {
		if !slices.Contains(now, l) {
			r.Removed = append(r.Removed, l)
		}
	}
	for _, l := range now {
		if !slices.Contains(then, l) {
			r.Added = append(r.Added, l)
		}
	}
	return r, nil
}
