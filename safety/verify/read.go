package verify

import (
	"bytes"
	"compress/zlib"
	"fmt"
	"io"
	"os"
)

// MaxDocumentBytes is the largest sign-off document verify reads, bytes
// (the report of the largest setup the loader accepts is a few megabytes).
const MaxDocumentBytes = 64 << 20

// MaxInflatedBytes bounds what the document's compressed streams may
// expand to, all together, bytes: a document that would expand further is
// refused before the PDF reader sees it.
const MaxInflatedBytes = 256 << 20

// maxInflatedBytes is the bound in force (tests lower it to build a small
// document past it).
var maxInflatedBytes int64 = MaxInflatedBytes

// ReadDocument reads a sign-off document from a regular file of at most
// MaxDocumentBytes (a device, a pipe or a directory is refused before it
// is read from).
func ReadDocument(name string) ([]byte, error) {
	fi, err := os.Stat(name)
	if err != nil {
		return nil, err
	}
	if !fi.Mode().IsRegular() {
		return nil, fmt.Errorf("%s: %w: not a regular file (%s); verify reads a PDF file", name, ErrUnusable, modeName(fi.Mode()))
	}
	f, err := os.Open(name)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	// The file may have been replaced between the two looks.
	if fi, err = f.Stat(); err != nil {
		return nil, err
	}
	if !fi.Mode().IsRegular() {
		return nil, fmt.Errorf("%s: %w: not a regular file (%s); verify reads a PDF file", name, ErrUnusable, modeName(fi.Mode()))
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxDocumentBytes+1))
	if err != nil {
		return nil, err
	}
	if len(data) > MaxDocumentBytes {
		return nil, fmt.Errorf("%s: %w: more than the %d bytes (%d MiB) a sign-off document may have", name, ErrUnusable, MaxDocumentBytes, MaxDocumentBytes>>20)
	}
	return data, nil
}

func modeName(m os.FileMode) string {
	switch {
	case m.IsDir():
		return "a directory"
	case m&os.ModeNamedPipe != 0:
		return "a named pipe"
	case m&os.ModeCharDevice != 0:
		return "a character device"
	case m&os.ModeDevice != 0:
		return "a device"
	case m&os.ModeSocket != 0:
		return "a socket"
	}
	return m.Type().String()
}

// foreignFilters are the stream filters a sign-off never uses (it writes
// Flate streams only), with their abbreviations: a document naming one is
// refused before the PDF reader decodes anything, so that no filter can
// expand without the bound below.
var foreignFilters = [][]byte{
	[]byte("/LZWDecode"), []byte("/RunLengthDecode"), []byte("/ASCIIHexDecode"), []byte("/ASCII85Decode"),
	[]byte("/CCITTFaxDecode"), []byte("/JBIG2Decode"), []byte("/DCTDecode"), []byte("/JPXDecode"), []byte("/Crypt"),
}

// checkStreams bounds the work the PDF reader will do on pdf: every
// stream that inflates as zlib data is inflated (to nowhere) and the total
// held to maxInflatedBytes, and no filter but Flate may be named, in the
// file or in what its streams inflate to (an object stream may hold the
// name a stream's dictionary refers to).
func checkStreams(pdf []byte) error {
	if err := noForeignFilter(pdf, "the file"); err != nil {
		return err
	}
	var total int64
	for rest := pdf; ; {
		i := bytes.Index(rest, []byte("stream"))
		if i < 0 {
			return nil
		}
		data := rest[i+len("stream"):]
		rest = data
		switch {
		case bytes.HasPrefix(data, []byte("\r\n")):
			data = data[2:]
		case bytes.HasPrefix(data, []byte("\n")):
			data = data[1:]
		default:
			continue // "endstream", or the word inside other data
		}
		zr, err := zlib.NewReader(bytes.NewReader(data))
		if err != nil {
			continue // not zlib data: the reader takes it as it is
		}
		w := &filterScan{}
		n, _ := io.Copy(w, io.LimitReader(zr, maxInflatedBytes-total+1))
		zr.Close()
		total += n
		if total > maxInflatedBytes {
			return fmt.Errorf("%w: its compressed streams expand to more than the %d bytes (%d MiB) verify allows", ErrUnusable, maxInflatedBytes, maxInflatedBytes>>20)
		}
		if w.found != nil {
			return w.found
		}
	}
}

func noForeignFilter(b []byte, where string) error {
	for _, f := range foreignFilters {
		if bytes.Contains(b, f) {
			return fmt.Errorf("%w: %s names the stream filter %s, which a sign-off document never uses", ErrUnusable, where, f[1:])
		}
	}
	return nil
}

// filterScan looks for a foreign filter's name in what a stream inflates
// to, keeping the tail of each write so that a name split between two is
// found.
type filterScan struct {
	tail  []byte
	found error
}

func (s *filterScan) Write(p []byte) (int, error) {
	if s.found == nil {
		buf := append(s.tail, p...)
		s.found = noForeignFilter(buf, "a compressed stream")
		keep := min(len(buf), 20)
		s.tail = append(s.tail[:0], buf[len(buf)-keep:]...)
	}
	return len(p), nil
}
