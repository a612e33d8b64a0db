//go:build unix

package verify

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// Only a regular file of bounded size is read; a device or a named pipe is
// refused before it is opened for reading (a pipe would block or never
// end).
func TestReadDocument(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "fifo")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no named pipes here:", err)
	}
	big := filepath.Join(dir, "big.pdf")
	if err := os.WriteFile(big, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Truncate(big, MaxDocumentBytes+1); err != nil { // sparse: no disk used
		t.Fatal(err)
	}
	for name, want := range map[string]string{"/dev/zero": "a character device", fifo: "a named pipe", dir: "a directory", big: "more than the 67108864 bytes"} {
		_, err := ReadDocument(name)
		if !errors.Is(err, ErrUnusable) || !strings.Contains(err.Error(), want) {
			t.Errorf("%s: %v, want ErrUnusable naming %q", name, err, want)
		}
	}
}
