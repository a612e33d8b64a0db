package main

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"beamledger/budget/units"
)

// browserRequired, when set in the environment (CI sets it), makes a
// missing browser a failure instead of a skip.
const browserRequired = "BEAMLEDGER_BROWSER_REQUIRED"

// startServe runs serve on a loopback port of its own for file until the
// test ends, and returns its address.
func startServe(t *testing.T, file string) string {
	t.Helper()
	pr, pw := io.Pipe()
	e := &env{stdout: pw, stderr: io.Discard, now: time.Now, getenv: func(string) string { return "" }, interrupts: noInterrupts}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan error, 1)
	go func() {
		done <- e.runServe(ctx, &serveOptions{file: file, addr: "127.0.0.1:0", poll: 50 * time.Millisecond})
		pw.Close()
	}()
	t.Cleanup(func() {
		cancel()
		if err := <-done; err != nil {
			t.Errorf("serve: %v", err)
		}
	})
	line, err := bufio.NewReader(pr).ReadString('\n')
	if err != nil {
		t.Fatalf("serve printed %q: %v", line, err)
	}
	go io.Copy(io.Discard, pr) // "stopped"
	m := regexp.MustCompile(`http://(\S+)/`).FindStringSubmatch(line)
	if m == nil {
		t.Fatalf("serve printed %q", line)
	}
	return "http://" + m[1] + "/"
}

// The live view in a real browser (Debian's Chromium, headless, driven
// over the DevTools protocol): the page shows the document's sections and
// the probe laser's maximum power as check --json gives it; raising that
// power in the file changes the page without a reload; a file that stops loading shows its error with the line
// number. A screenshot of the page is saved (BEAMLEDGER_SCREENSHOT names
// the file; else the test's temporary folder).
func TestServeInABrowser(t *testing.T) {
	browser, err := exec.LookPath("chromium")
	if err != nil {
		if os.Getenv(browserRequired) != "" {
			t.Fatalf("no chromium on PATH, and %s is set", browserRequired)
		}
		t.Skip("no chromium on PATH: install Debian's chromium to run the browser test (CI does)")
	}
	data, err := os.ReadFile("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "table.toml")
	if err := os.WriteFile(file, data, 0o644); err != nil {
		t.Fatal(err)
	}
	// The figure to look for, from check --json.
	out, _, _ := runCLI(t, "check", "--json", file)
	var js struct {
		Lasers []struct {
			Name   string  `json:"name"`
			PowerW float64 `json:"power_w"`
		} `json:"lasers"`
	}
	if err := json.Unmarshal([]byte(out), &js); err != nil || len(js.Lasers) == 0 {
		t.Fatalf("check --json: %v", err)
	}
	want := fmt.Sprintf("Laser %q: Class 4, %s at 780.2 nm at most", js.Lasers[0].Name, units.FormatPower(js.Lasers[0].PowerW))
	url := startServe(t, file)

	opts := append(chromedp.DefaultExecAllocatorOptions[:],
		chromedp.ExecPath(browser), chromedp.NoSandbox, chromedp.DisableGPU, chromedp.UserDataDir(t.TempDir()),
		chromedp.Flag("disable-quic", true), chromedp.Flag("disable-component-update", true), chromedp.WindowSize(1200, 1600))
	actx, cancelA := chromedp.NewExecAllocator(context.Background(), opts...)
	defer cancelA()
	ctx, cancel := chromedp.NewContext(actx)
	defer cancel()
	ctx, cancelT := context.WithTimeout(ctx, 60*time.Second)
	defer cancelT()

	if err := chromedp.Do(ctx, chromedp.Navigate(url)); err != nil {
		t.Fatal(err)
	}
	headings, err := chromedp.Run(ctx, chromedp.Evaluate[[]string](`Array.from(document.querySelectorAll("h2")).map(h => h.textContent)`))
	if err != nil {
		t.Fatal(err)
	}
	text, err := chromedp.Run(ctx, chromedp.Text("#document"))
	if err != nil {
		t.Fatal(err)
	}
	if len(headings) < 10 || headings[1] != "1 At a glance" || !strings.Contains(text, want) {
		t.Fatalf("headings %q; page has %q: %v", headings, want, strings.Contains(text, want))
	}
	// waitFor polls the page's text until it holds s, 200 times 50 ms
	// apart (10 s at most: a generous bound for a functional check, not a
	// timing; the page follows the file within a poll of 50 ms).
	waitFor := func(s string) (bool, string) {
		for range 200 {
			if text, err = chromedp.Run(ctx, chromedp.Text("#document")); err != nil {
				t.Fatal(err)
			}
			if strings.Contains(text, s) {
				return true, text
			}
			time.Sleep(50 * time.Millisecond)
		}
		return false, text
	}
	if _, err := chromedp.Run(ctx, chromedp.Evaluate[string](`window.notReloaded = "yes"; window.notReloaded`)); err != nil {
		t.Fatal(err)
	}
	os.WriteFile(file, []byte(strings.Replace(string(data), `power = "1.5 W"`, `power = "1.6 W"`, 1)), 0o644)
	if ok, _ := waitFor(strings.Replace(want, "1.5 W", "1.6 W", 1)); !ok {
		t.Errorf("the page did not show the raised power")
	}
	if marker, _ := chromedp.Run(ctx, chromedp.Evaluate[string](`window.notReloaded || ""`)); marker != "yes" {
		t.Error("the page was reloaded rather than updated")
	}
	// The broken line is the one after the file's last: its number is in
	// the error (file:line:).
	lines := strings.Count(string(data), "\n")
	os.WriteFile(file, append(data, []byte("broken = [\n")...), 0o644)
	if ok, got := waitFor("does not load"); !ok {
		t.Errorf("the page did not show the error: %.300s", got)
	} else if m := regexp.MustCompile(`table\.toml:(\d+):`).FindStringSubmatch(got); m == nil || m[1] != fmt.Sprint(lines+1) && m[1] != fmt.Sprint(lines+2) {
		t.Errorf("the error does not name the broken line %d: %v", lines+1, m)
	}
	shot, err := chromedp.Run(ctx, chromedp.CaptureScreenshot()) // the window: the error and the greyed result below it
	if err != nil {
		t.Fatal(err)
	}
	name := os.Getenv("BEAMLEDGER_SCREENSHOT")
	if name == "" {
		name = filepath.Join(t.TempDir(), "serve.png")
	}
	if err := os.WriteFile(name, shot, 0o644); err != nil {
		t.Fatal(err)
	}
	t.Logf("screenshot: %s (%d bytes)", name, len(shot))
}
