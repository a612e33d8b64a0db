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
	"strconv"
	"strings"

	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/types"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/validate"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/report"
	"beamledger/safety/revision"
)

// Result is what verify found.
type Result struct {
	// SetupName and SetupSHA256 are the attached setup's name and hash;
	// RecordedSHA256 the hash the attachment's description states for it.
	SetupName, SetupSHA256, RecordedSHA256 string
	// GivenMatches is set when a setup file was given and is the attached
	// one, byte for byte; Given says one was given.
	Given, GivenMatches bool
	// Pages lists where the document's pages disagree with its
	// attachments (the setup hash, title and revision in the footers and
	// on the cover, the hazard record): the pages are what people read
	// and sign, the attachments what verify evaluates.
	Pages []string
	// Removed and Added are the hazard lines the document recorded that
	// this version no longer finds, and the new ones.
	Removed, Added []string
	// BodyCompared is set when every page was compared with the document
	// this version writes from the attached setup and the render inputs
	// the document records (report.Render): the same version, no --since.
	// Its differences are in Pages. Otherwise BodyNote says why not.
	BodyCompared bool
	BodyNote     string
}

// Match reports whether everything agrees.
func (r *Result) Match() bool {
	return r.SetupSHA256 == r.RecordedSHA256 && (!r.Given || r.GivenMatches) && len(r.Pages) == 0 && len(r.Removed) == 0 && len(r.Added) == 0
}

// ErrUnusable marks an input that cannot be verified (not a PDF, no
// attached setup).
var ErrUnusable = errors.New("cannot be verified")

// ErrGiven marks a previous revision given that the document does not
// compare with.
var ErrGiven = errors.New("--since")

func init() {
	// pdfcpu would otherwise write its configuration into the user's
	// configuration directory on first use; verify only reads a document.
	model.ConfigPath = "disable"
}

// read bounds, reads and validates a PDF (checkStreams first, then
// pdfcpu's reader and validator directly: its api package brings in a
// text-width table whose start-up costs every command 30 ms) and returns
// its attached files and the text its pages show; a panic in the reader on
// a malformed file is an unreadable file.
func read(pdf []byte) (atts []model.Attachment, pages [][]run, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("the PDF reader failed: %v", r)
		}
	}()
	if err := checkStreams(pdf); err != nil {
		return nil, nil, err
	}
	ctx, err := pdfcpu.Read(bytes.NewReader(pdf), model.NewDefaultConfiguration())
	if err != nil {
		return nil, nil, err
	}
	if err := flateOnly(ctx); err != nil {
		return nil, nil, err
	}
	if err := validate.XRefTable(ctx); err != nil {
		return nil, nil, err
	}
	if pages, err = pageRuns(ctx); err != nil {
		return nil, nil, err
	}
	if !ctx.XRefTable.Valid {
		if err := ctx.XRefTable.LocateNameTree("EmbeddedFiles", false); err != nil {
			return nil, nil, err
		}
	}
	if ctx.XRefTable.Names["EmbeddedFiles"] == nil {
		return nil, pages, nil // no attachments: said below
	}
	atts, err = ctx.ExtractAttachments(nil)
	return atts, pages, err
}

// flateOnly refuses a stream with any filter but Flate, as the reader sees
// the document (checkStreams looked at its bytes).
func flateOnly(ctx *model.Context) error {
	for _, e := range ctx.XRefTable.Table {
		if e == nil {
			continue
		}
		var fp []types.PDFFilter
		switch o := e.Object.(type) {
		case types.StreamDict:
			fp = o.FilterPipeline
		case types.ObjectStreamDict:
			fp = o.FilterPipeline
		case types.XRefStreamDict:
			fp = o.FilterPipeline
		}
		for _, f := range fp {
			if f.Name != "FlateDecode" {
				return fmt.Errorf("a stream uses the filter %s, which a sign-off document never uses", f.Name)
			}
		}
	}
	return nil
}

// Check verifies the document; given is the setup file to compare with
// (nil: none). The document must carry exactly one setup file and one
// hazard list, and its pages must state what they hold.
//
// tool is this tool's version: the body of a document written by the same
// version is compared with the document it writes again. since is the
// previous revision's setup file for a document written with the changes
// since it (nil: none given); it must be the one the document records.
func Check(document []byte, given []byte, tool string, since []byte) (*Result, error) {
	atts, pages, err := read(document)
	if err != nil {
		if errors.Is(err, ErrUnusable) {
			return nil, err
		}
		return nil, fmt.Errorf("%w: not a readable PDF: %v", ErrUnusable, err)
	}
	var attached, recorded []byte
	var listDesc string
	var setups, lists, others []string
	r := &Result{}
	for _, a := range atts {
		data, err := io.ReadAll(a)
		if err != nil {
			return nil, fmt.Errorf("%w: reading attachment %q: %v", ErrUnusable, a.FileName, err)
		}
		switch {
		case a.FileName == report.HazardsAttachment:
			recorded, listDesc = data, a.Desc
			lists = append(lists, a.FileName)
		case strings.HasSuffix(a.FileName, ".toml") || strings.Contains(a.Desc, "SHA-256"):
			attached, r.SetupName = data, a.FileName
			setups = append(setups, a.FileName)
			r.RecordedSHA256 = ""
			if _, h, ok := strings.Cut(a.Desc, "SHA-256 "); ok {
				r.RecordedSHA256 = strings.TrimSpace(h)
			}
		default:
			others = append(others, a.FileName)
		}
	}
	switch {
	case len(setups) == 0:
		return nil, fmt.Errorf("%w: the PDF carries no setup file (was it written by beamledger report?)", ErrUnusable)
	case len(setups) > 1:
		return nil, fmt.Errorf("%w: the PDF carries %d setup files (%s); a sign-off covers exactly one", ErrUnusable, len(setups), quoteAll(setups))
	case len(lists) != 1:
		return nil, fmt.Errorf("%w: the PDF carries %d lists of the hazards at sign-off (%s); a sign-off carries exactly one", ErrUnusable, len(lists), report.HazardsAttachment)
	case len(others) > 0:
		return nil, fmt.Errorf("%w: the PDF carries files a sign-off never carries (%s)", ErrUnusable, quoteAll(others))
	}
	sum := sha256.Sum256(attached)
	r.SetupSHA256 = hex.EncodeToString(sum[:])
	if given != nil {
		r.Given = true
		r.GivenMatches = bytes.Equal(given, attached)
	}
	// The body is written again when the document records what it was
	// written from, by this version, without --since: then the setup is
	// read under the name the pages print, with the same tolerance
	// analysis.
	label, opts := AttachmentLabel(r.SetupName), safety.Options{}
	rd, ok := report.ParseRender(listDesc)
	switch {
	case !ok:
		r.BodyNote = "the document does not record what it was written from (it predates that record), so its pages were not written again to compare"
	case rd.Tool != tool:
		r.BodyNote = fmt.Sprintf("written by beamledger %s, this is %s: its pages were not written again to compare (verify with that version to compare them)", rd.Tool, tool)
	case rd.SinceSHA256 != "" && since == nil:
		r.BodyNote = fmt.Sprintf("written with the changes since a previous revision (report --since), whose setup is not attached: its pages were not written again to compare (give that revision, %s, with --since to compare them)", AttachmentLabel(rd.SinceFile))
	default:
		label, opts = rd.SetupFile, safety.Options{Samples: rd.Samples, Seed: rd.Seed}
	}
	if since != nil {
		switch sum := sha256.Sum256(since); {
		case rd.SinceSHA256 == "":
			return nil, fmt.Errorf("%w: a previous revision was given, but the document was not written with the changes since one", ErrGiven)
		case hex.EncodeToString(sum[:]) != rd.SinceSHA256:
			return nil, fmt.Errorf("%w: the previous revision given has SHA-256 %s; the document compares with %s (%s)", ErrGiven, hex.EncodeToString(sum[:]), rd.SinceSHA256, AttachmentLabel(rd.SinceFile))
		}
	}
	s, err := setup.Parse(label, attached)
	if err != nil {
		return nil, fmt.Errorf("%w: the attached setup no longer loads: %v", ErrUnusable, err)
	}
	a, err := safety.EvaluateWith(s, opts)
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
	r.Pages = pagesAgree(pages, s, r.SetupSHA256, then)
	if ok {
		r.Pages = append(r.Pages, coverAgrees(pages, rd)...)
	}
	if r.BodyNote == "" {
		var changes *revision.Report
		if rd.SinceSHA256 != "" {
			if changes, err = sinceRevision(rd, since, revision.Revision{File: label, Data: attached, Assessment: a}); err != nil {
				return nil, err
			}
		}
		again, err := writeAgain(a, attached, rd, changes)
		if err != nil {
			return nil, fmt.Errorf("%w: writing the document again: %v", ErrUnusable, err)
		}
		r.BodyCompared = true
		r.Pages = append(r.Pages, bodyAgrees(pages, again)...)
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

// AttachmentLabel is an attachment's name as verify prints it: as it is
// when it is plain printable text, else quoted with its control
// characters escaped (a name cannot print a line of its own).
func AttachmentLabel(name string) string {
	if q := strconv.Quote(name); q[1:len(q)-1] != name || strings.ContainsAny(name, " \t") {
		return q
	}
	return name
}

func quoteAll(names []string) string {
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = strconv.Quote(n)
	}
	return strings.Join(q, ", ")
}
