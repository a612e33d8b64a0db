package page

import (
	"bufio"
	"io"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/report"
)

// liveOn is a Live over a copy of table C in a temporary folder.
func liveOn(t *testing.T) (*Live, string) {
	t.Helper()
	data, err := os.ReadFile("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "table.toml")
	if err := os.WriteFile(file, data, 0o644); err != nil {
		t.Fatal(err)
	}
	l := &Live{
		Read: func() ([]byte, error) { return os.ReadFile(file) },
		Build: func(data []byte) (*report.Document, error) {
			s, err := setup.Parse(file, data)
			if err != nil {
				return nil, err
			}
			a, err := safety.Evaluate(s)
			if err != nil {
				return nil, err
			}
			return report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data}), nil
		},
		Poll: 20 * time.Millisecond,
	}
	return l, file
}

// The live page follows the file: the first read shows the document; an
// edit (a laser's power raised) pushes the new content over the event
// stream; a file that no longer loads shows its error with file and line,
// escaped, above the last document greyed; an unchanged file pushes
// nothing.
func TestLiveFollowsTheFile(t *testing.T) {
	l, file := liveOn(t)
	if !l.Refresh() || !strings.Contains(string(l.Content()), "1.5 W at 780.2 nm") {
		t.Fatalf("first content lacks the probe's 1.5 W: %.200s", l.Content())
	}
	srv := httptest.NewServer(l.Handler())
	defer srv.Close()
	res, err := http.Get(srv.URL + "/")
	if err != nil {
		t.Fatal(err)
	}
	b, _ := io.ReadAll(res.Body)
	res.Body.Close()
	if !strings.Contains(string(b), "<h2>1 At a glance</h2>") || !strings.Contains(string(b), "EventSource") {
		t.Errorf("the page: %.300s", b)
	}
	ev, err := http.Get(srv.URL + "/events")
	if err != nil {
		t.Fatal(err)
	}
	defer ev.Body.Close()
	r := bufio.NewReader(ev.Body)
	if line, _ := r.ReadString('\n'); !strings.HasPrefix(line, ": connected") {
		t.Fatalf("stream opens with %q", line)
	}
	r.ReadString('\n')      // the comment's blank line
	next := func() string { // the next event's data
		var b strings.Builder
		for {
			line, err := r.ReadString('\n')
			if err != nil {
				t.Fatal(err)
			}
			if line == "\n" {
				return b.String()
			}
			b.WriteString(strings.TrimPrefix(strings.TrimSuffix(line, "\n"), "data: ") + "\n")
		}
	}
	if l.Refresh() {
		t.Error("an unchanged file changed the page")
	}
	data, _ := os.ReadFile(file)
	os.WriteFile(file, []byte(strings.Replace(string(data), `power = "1.5 W"`, `power = "1.6 W"`, 1)), 0o644)
	if !l.Refresh() {
		t.Fatal("the edit did not change the page")
	}
	if got := next(); !strings.Contains(got, "1.6 W at 780.2 nm") {
		t.Errorf("the update lacks the new power: %.300s", got)
	}
	os.WriteFile(file, append(data, []byte("\nbroken = [<b>\n")...), 0o644)
	l.Refresh()
	got := next()
	if !strings.Contains(got, `class="load-error"`) || !strings.Contains(got, "table.toml:") || !strings.Contains(got, `class="stale"`) || strings.Contains(got, "<b>") {
		t.Errorf("the error update: %.600s", got)
	}
}
