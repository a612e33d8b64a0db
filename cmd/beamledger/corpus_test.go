package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Every file in testdata/bad must be refused with exit status 2, with its
// expected message (file, line where known, field, what was expected) as
// the first problem, nothing on stdout, and no report written.
func TestBadInputCorpus(t *testing.T) {
	t.Chdir("../..")
	files, _ := filepath.Glob("testdata/bad/*.toml")
	if len(files) < 40 {
		t.Fatalf("%d bad inputs, want at least 40", len(files))
	}
	dir := t.TempDir()
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".toml")
		t.Run(name, func(t *testing.T) {
			want, err := os.ReadFile(strings.TrimSuffix(f, ".toml") + ".err")
			if err != nil {
				t.Fatalf("no expected message: %v", err)
			}
			exp := strings.TrimSpace(string(want))
			out, errOut, code := runCLI(t, "check", f)
			if code != exitBadInput || out != "" {
				t.Fatalf("check: exit %d, stdout %q", code, out)
			}
			first := strings.TrimPrefix(strings.SplitN(errOut, "\n", 2)[0], "beamledger: ")
			if !strings.HasPrefix(first, exp) {
				t.Errorf("first problem:\n got %s\nwant %s", first, exp)
			}
			pdf := filepath.Join(dir, name+".pdf")
			if _, _, code := runCLI(t, "report", f, "-o", pdf); code != exitBadInput {
				t.Errorf("report: exit %d", code)
			}
			if _, err := os.Stat(pdf); err == nil {
				t.Errorf("report wrote %s for bad input", pdf)
			}
		})
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Errorf("files left: %v", entries)
	}
}

// A file over the size a setup may have is refused before it is parsed.
func TestEnormousSetup(t *testing.T) {
	f := filepath.Join(t.TempDir(), "huge.toml")
	big := strings.Repeat("# padding line of an enormous setup file\n", 120000) // ≈ 5 MB
	if err := os.WriteFile(f, []byte(big), 0o644); err != nil {
		t.Fatal(err)
	}
	_, errOut, code := runCLI(t, "check", f)
	if code != exitBadInput || !strings.Contains(errOut, "more than the 4194304 bytes a setup may have") {
		t.Errorf("exit %d, %q", code, errOut)
	}
}
