package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Every recipe of docs/cookbook.md is a setup file in testdata/cookbook that
// check accepts (exit 0 or 1, never 2), and the page shows each file as it
// is, so a recipe cannot drift from a file that works.
func TestCookbook(t *testing.T) {
	t.Chdir("../..")
	page, err := os.ReadFile("docs/cookbook.md")
	if err != nil {
		t.Fatal(err)
	}
	files, _ := filepath.Glob("testdata/cookbook/*.toml")
	if len(files) < 8 {
		t.Fatalf("%d recipes, want at least 8", len(files))
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			src, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(string(page), "`"+f+"`:\n\n```toml\n"+string(src)+"```\n") {
				t.Errorf("docs/cookbook.md does not show %s as it is", f)
			}
			if _, errOut, code := runCLI(t, "check", f); code != exitOK && code != exitFindings {
				t.Errorf("check %s: exit %d: %s", f, code, errOut)
			}
		})
	}
}
