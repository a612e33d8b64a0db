package verify

import (
	"bytes"
	"fmt"
	"time"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/pdf"
	"beamledger/safety/report"
	"beamledger/safety/revision"
)

// writeAgain writes the sign-off document again, as report does, from the
// assessment of the attached setup and what the document records it was
// written from, and reads its pages.
func writeAgain(a *safety.Assessment, setupBytes []byte, rd report.Render, since *revision.Report) ([][]run, error) {
	date, err := time.Parse("2006-01-02", rd.Date)
	if err != nil {
		return nil, fmt.Errorf("the recorded date %q: %v", rd.Date, err)
	}
	doc := report.Build(a, report.Meta{Date: rd.Date, ToolVersion: rd.Tool, SetupBytes: setupBytes, Samples: rd.Samples, Seed: rd.Seed, Since: since})
	var b bytes.Buffer
	if err := pdf.Write(&b, doc, pdf.Options{Date: date, Compress: true}); err != nil {
		return nil, err
	}
	_, pages, err := read(b.Bytes())
	return pages, err
}

// sinceRevision compares the previous revision given, read under the name
// the document records for it and evaluated as report does, with the
// attached setup: the changes the document opens with.
func sinceRevision(rd report.Render, since []byte, now revision.Revision) (*revision.Report, error) {
	s, err := setup.Parse(rd.SinceFile, since)
	if err != nil {
		return nil, fmt.Errorf("%w: the previous revision does not load: %v", ErrGiven, err)
	}
	a, err := safety.EvaluateWith(s, safety.Options{})
	if err != nil {
		return nil, fmt.Errorf("%w: evaluating the previous revision: %v", ErrGiven, err)
	}
	return revision.Compare(revision.Revision{File: rd.SinceFile, Data: since, Assessment: a}, now)
}

// maxBodyDifferences bounds the page differences listed.
const maxBodyDifferences = 10

// bodyAgrees compares the text every page shows with the text of the same
// page of the document written again, run by run in drawing order, and
// lists where they differ: the first differing text of each page that
// differs, at most maxBodyDifferences pages.
func bodyAgrees(pages, again [][]run) []string {
	var out []string
	if len(pages) != len(again) {
		out = append(out, fmt.Sprintf("the document has %d pages; written again from the attached setup it has %d", len(pages), len(again)))
	}
	for i := range min(len(pages), len(again)) {
		if len(out) == maxBodyDifferences {
			out = append(out, "and more pages differ")
			break
		}
		p, q := pages[i], again[i]
		for k := range max(len(p), len(q)) {
			var has, want string
			if k < len(p) {
				has = p[k].text
			}
			if k < len(q) {
				want = q[k].text
			}
			if has != want {
				out = append(out, fmt.Sprintf("page %d reads %q where the document written again from the attached setup reads %q", i+1, has, want))
				break
			}
		}
	}
	return out
}
