package main

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/pdfcpu/pdfcpu/pkg/api"

	"beamledger/budget/setup"
	"beamledger/limits"
)

func TestCheckBadInputExit2(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "lab.toml")
	src := "[[laser]]\nname = \"l\"\nwavelength = \"780 nm\"\npower = \"5 mm\"\nwaist = \"1 mm\"\n"
	if err := os.WriteFile(bad, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errOut, code := runCLI(t, "check", bad)
	if code != exitBadInput {
		t.Errorf("exit %d, want %d", code, exitBadInput)
	}
	if out != "" {
		t.Errorf("wrote to stdout on bad input: %q", out)
	}
	want := bad + `:4: laser "l": power: "5 mm" is a length, want a power`
	if !strings.Contains(errOut, want) {
		t.Errorf("stderr %q, want it to contain %q", errOut, want)
	}
}

func TestCheckUsage(t *testing.T) {
	if _, _, code := runCLI(t, "check"); code != exitBadInput {
		t.Errorf("check without a file: exit %d, want %d", code, exitBadInput)
	}
	if _, errOut, code := runCLI(t, "check", "/no/such/file.toml"); code != exitBadInput || !strings.Contains(errOut, "no such file") {
		t.Errorf("missing file: exit %d, stderr %q", code, errOut)
	}
}

func TestInitWritesLoadableStarterAndNeverOverwrites(t *testing.T) {
	name := filepath.Join(t.TempDir(), "mylab.toml")
	if _, errOut, code := runCLI(t, "init", name); code != exitOK {
		t.Fatalf("init: exit %d: %s", code, errOut)
	}
	s, err := setup.Load(name)
	if err != nil {
		t.Fatalf("the starter file does not load: %v", err)
	}
	if len(s.Lasers) == 0 || len(s.Paths) == 0 || s.Meta.Title == "Elongated cloud, table C" {
		t.Errorf("starter should be its own invented scenario with a laser and a path")
	}
	if _, _, code := runCLI(t, "check", name); code == exitBadInput {
		t.Errorf("check on the starter file: exit %d", code)
	}
	before, _ := os.ReadFile(name)
	os.WriteFile(name, []byte("# mine\n"), 0o644)
	_, errOut, code := runCLI(t, "init", name)
	if code != exitBadInput || !strings.Contains(errOut, "already exists") {
		t.Errorf("second init: exit %d, stderr %q", code, errOut)
	}
	if after, _ := os.ReadFile(name); string(after) != "# mine\n" {
		t.Errorf("init overwrote the file (had %d bytes)", len(before))
	}
}

func TestVersion(t *testing.T) {
	for _, args := range [][]string{{"version"}, {"--version"}} {
		out, _, code := runCLI(t, args...)
		if code != exitOK || out != "beamledger "+version+"\n" {
			t.Errorf("%v: %d %q", args, code, out)
		}
	}
}

// completion writes a script for a shell it knows and refuses any other
// with exit 2, not a help page and exit 0.
func TestCompletion(t *testing.T) {
	for _, sh := range shells {
		if out, errOut, code := runCLI(t, "completion", sh); code != exitOK || !strings.Contains(out, "beamledger") {
			t.Errorf("completion %s: exit %d, %q", sh, code, errOut)
		}
	}
	for _, args := range [][]string{{"completion", "tcsh"}, {"completion"}} {
		if out, errOut, code := runCLI(t, args...); code != exitBadInput || out != "" || !strings.Contains(errOut, "bash, zsh, fish, powershell") {
			t.Errorf("%v: exit %d, stdout %q, stderr %q", args, code, out, errOut)
		}
	}
}

func TestTransitionsListsEverySource(t *testing.T) {
	out, _, code := runCLI(t, "transitions")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{"Rb87 D2", "Rb87 D1", "Rb85 D2", "Cs133 D2", "Cs133 D1", "Na23 D2", "K39 D2", "Li6 D2",
		"Sr88 461 nm", "Sr88 689 nm", "Yb174 399 nm", "Yb174 556 nm", "I_sat = 1.66933 mW/cm²", "isotropic 3.57713 mW/cm²", "source: D. A. Steck"} {
		if !strings.Contains(out, want) {
			t.Errorf("transitions output lacks %q", want)
		}
	}
}

func TestLimitsJSONKeys(t *testing.T) {
	out, errOut, code := runCLI(t, "limits", "--wavelength", "780 nm", "--power", "50 mW", "--beam-diameter", "2 mm", "--divergence", "1 mrad", "--json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var doc map[string]any
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	eye := doc["eye"].(map[string]any)
	ael := doc["ael_w"].(map[string]any)
	for _, k := range []string{"mpe_irradiance_w_m2", "mpe_radiant_exposure_j_m2", "aperture_diameter_m"} {
		if _, ok := eye[k].(float64); !ok {
			t.Errorf("eye.%s missing", k)
		}
	}
	if ael["class_2"] != nil {
		t.Errorf("ael_w.class_2 at 780 nm = %v, want null", ael["class_2"])
	}
	for _, k := range []string{"wavelength_m", "duration_s", "nohd_m", "od_required"} {
		if _, ok := doc[k].(float64); !ok {
			t.Errorf("%s missing", k)
		}
	}
	// 780 nm defaults to 10 s: 10 C4 C7 W/m² for a small source, C4 =
	// 10^(0.002·80), C7 = 1 (IEC 60825-1:2014 Annex A, eye from 10 s,
	// 400–1400 nm, α ≤ 1.5 mrad; from memory).
	if got, want := eye["mpe_irradiance_w_m2"].(float64), 10*math.Pow(10, 0.16); math.Abs(got-want) > 1e-9*want {
		t.Errorf("eye MPE %g, want %g", got, want)
	}
	prov, _ := eye["provenance"].(map[string]any)
	if prov["status"] != string(limits.StatusFromMemory) || prov["table"] == "" || prov["standard"] == "" {
		t.Errorf("eye.provenance = %v", prov)
	}
	if _, ok := prov["checked_against"].([]any); !ok {
		t.Errorf("eye.provenance.checked_against is not a list: %v", prov["checked_against"])
	}
	if doc["class"] != "3B" {
		t.Errorf("class of 50 mW at 780 nm = %v, want 3B", doc["class"])
	}
}

// limits prints both sets side by side and which governs: 532 nm pulses of
// 10 ps, where Directive 2006/25/EC Annex II Table 2.2 prints 2.7e4 t^0.75
// C_E J/m² (1.52e-4 J/m² at 10 ps) below Edition 3's 2e-3 J/m² plateau
// (from memory).
func TestLimitsBothSets(t *testing.T) {
	args := []string{"limits", "--wavelength", "532 nm", "--pulse-duration", "10 ps", "--repetition-rate", "1 Hz", "--duration", "1 s", "--json"}
	for _, c := range []struct {
		flag, set string
		perPulse  float64
	}{{"", "2006/25/EC", 2.7e4 * math.Pow(1e-11, 0.75)}, {"IEC 60825-1:2014", "IEC 60825-1:2014", 2e-3}} {
		a := args
		if c.flag != "" {
			a = append(append([]string{}, args...), "--limits", c.flag)
		}
		out, errOut, code := runCLI(t, a...)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errOut)
		}
		var doc map[string]any
		if err := json.Unmarshal([]byte(out), &doc); err != nil {
			t.Fatal(err)
		}
		p := doc["pulsed"].(map[string]any)
		if got := p["mpe_per_pulse_j_m2"].(float64); math.Abs(got-c.perPulse) > 1e-9*c.perPulse || p["set"] != c.set {
			t.Errorf("--limits %q: %g J/m² per pulse from %v, want %g from %s", c.flag, got, p["set"], c.perPulse, c.set)
		}
		sets := doc["sets"].(map[string]any)
		iec := sets["iec_60825_1_2014"].(map[string]any)
		dir := sets["directive_2006_25_ec"].(map[string]any)
		if iec["mpe_per_pulse_j_m2"].(float64) != 2e-3 || math.Abs(dir["mpe_per_pulse_j_m2"].(float64)-2.7e4*math.Pow(1e-11, 0.75)) > 1e-12 {
			t.Errorf("side by side: IEC %v, directive %v", iec["mpe_per_pulse_j_m2"], dir["mpe_per_pulse_j_m2"])
		}
	}
	text, _, _ := runCLI(t, args[:len(args)-1]...)
	for _, want := range []string{"IEC 60825-1:2014:", "2006/25/EC:", "the single pulse rule of 2006/25/EC governs"} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q:\n%s", want, text)
		}
	}
}

func TestLimitsErrors(t *testing.T) {
	for _, args := range [][]string{
		{"limits"},
		{"limits", "--wavelength", "100 nm"},
		{"limits", "--wavelength", "780 nm", "--duration", "1e5 s"},
		{"limits", "--wavelength", "5 mW"},
		{"limits", "--wavelength", "780 nm", "--power", "1 W"},
		{"limits", "--wavelength", "780 nm", "--pulse-duration", "1 ns"},
	} {
		out, errOut, code := runCLI(t, args...)
		if code != exitBadInput || out != "" || errOut == "" {
			t.Errorf("%v: exit %d, stdout %q, stderr %q", args, code, out, errOut)
		}
	}
}

func runCLIEnv(t *testing.T, vars map[string]string, args ...string) (string, string, int) {
	t.Helper()
	var out, errOut bytes.Buffer
	e := &env{stdout: &out, stderr: &errOut,
		now:    func() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) },
		getenv: func(k string) string { return vars[k] }, interrupts: noInterrupts}
	code := e.execute(args)
	return out.String(), errOut.String(), code
}

func TestReportWritesReproduciblePDF(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a.pdf"), filepath.Join(dir, "b.pdf")
	env := map[string]string{"SOURCE_DATE_EPOCH": "1767225600"} // 2026-01-01
	for _, out := range []string{a, b} {
		stdout, errOut, code := runCLIEnv(t, env, "report", "../../testdata/examples/table-c.toml", "-o", out)
		if code != exitOK || !strings.Contains(stdout, "2026-01-01") {
			t.Fatalf("report: exit %d, %q, %q", code, stdout, errOut)
		}
	}
	pa, _ := os.ReadFile(a)
	pb, _ := os.ReadFile(b)
	if len(pa) < 1000 || !bytes.Equal(pa, pb) || !bytes.HasPrefix(pa, []byte("%PDF-")) {
		t.Errorf("two runs with the same SOURCE_DATE_EPOCH differ or are not PDFs (%d, %d bytes)", len(pa), len(pb))
	}
	// An existing file is replaced only with --force.
	if _, errOut, code := runCLIEnv(t, env, "report", "../../testdata/examples/table-c.toml", "-o", a); code != exitBadInput || !strings.Contains(errOut, "--force") {
		t.Errorf("overwrite without --force: exit %d, %q", code, errOut)
	}
	if _, _, code := runCLIEnv(t, env, "report", "../../testdata/examples/table-c.toml", "-o", a, "--force", "--date", "2026-03-04"); code != exitOK {
		t.Errorf("--force: exit %d", code)
	}
	if pc, _ := os.ReadFile(a); bytes.Equal(pc, pa) {
		t.Error("--force with another date left the old file")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 2 {
		t.Errorf("temporary files left behind: %v", entries)
	}
}

func TestReportBadInputWritesNothing(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.toml")
	os.WriteFile(bad, []byte("[[laser]]\nname = 1\n"), 0o644)
	out := filepath.Join(dir, "out.pdf")
	for _, args := range [][]string{
		{"report", bad, "-o", out},
		{"report", "../../testdata/examples/table-c.toml", "-o", out, "--date", "yesterday"},
		{"report", "../../testdata/examples/table-c.toml"},
	} {
		if _, _, code := runCLIEnv(t, nil, args...); code != exitBadInput {
			t.Errorf("%v: exit %d", args, code)
		}
	}
	if _, _, code := runCLIEnv(t, map[string]string{"SOURCE_DATE_EPOCH": "soon"}, "report", "../../testdata/examples/table-c.toml", "-o", out); code != exitBadInput {
		t.Errorf("bad SOURCE_DATE_EPOCH: exit %d", code)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("files written on bad input: %v", entries)
	}
}

// The report never replaces its own setup, a directory or a device; an
// existing name, a dangling link included, needs --force; a long output name
// still works.
func TestReportOutputTargets(t *testing.T) {
	dir := t.TempDir()
	setup := filepath.Join(dir, "setup.toml")
	src, err := os.ReadFile("../../testdata/examples/weak-probe.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(setup, src, 0o644); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "to-setup.pdf")
	if err := os.Symlink(setup, link); err != nil {
		t.Fatal(err)
	}
	dangling := filepath.Join(dir, "dangling.pdf")
	if err := os.Symlink(filepath.Join(dir, "nowhere"), dangling); err != nil {
		t.Fatal(err)
	}
	long := filepath.Join(dir, strings.Repeat("r", 251)+".pdf") // 255 bytes, the usual limit of a name
	tests := []struct {
		name   string
		args   []string
		code   int
		stderr string
	}{
		{"setup as its own output", []string{"-o", setup, "--force"}, exitBadInput, "is the setup file"},
		{"link to the setup", []string{"-o", link, "--force"}, exitBadInput, "is the setup file"},
		{"directory", []string{"-o", dir, "--force"}, exitBadInput, "is a directory; give the name of the PDF to write"},
		{"device", []string{"-o", os.DevNull, "--force"}, exitBadInput, "is not a regular file"},
		{"dangling link without --force", []string{"-o", dangling}, exitBadInput, "use --force to replace the link"},
		{"dangling link with --force", []string{"-o", dangling, "--force"}, exitOK, ""},
		{"255-byte name", []string{"-o", long}, exitOK, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, errOut, code := runCLI(t, append([]string{"report", setup, "--date", "2026-01-02"}, tc.args...)...)
			if code != tc.code || !strings.Contains(errOut, tc.stderr) {
				t.Errorf("exit %d, stderr %q; want exit %d with %q", code, errOut, tc.code, tc.stderr)
			}
		})
	}
	if got, _ := os.ReadFile(setup); !bytes.Equal(got, src) {
		t.Error("the setup file was changed")
	}
	if fi, err := os.Lstat(dangling); err != nil || !fi.Mode().IsRegular() {
		t.Errorf("the dangling link was not replaced by the PDF: %v", err)
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".") {
			t.Errorf("temporary file left: %s", e.Name())
		}
	}
}

// A signal while the report is written removes the temporary file and
// writes nothing.
func TestReportInterrupted(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "r.pdf")
	sig := make(chan os.Signal, 1)
	started, release := make(chan struct{}), make(chan struct{})
	go func() {
		<-started
		sig <- os.Interrupt
	}()
	err := writeAtomically(out, func() (<-chan os.Signal, func()) { return sig, func() {} }, func(f *os.File) error {
		close(started)
		<-release
		_, err := f.WriteString("%PDF-")
		return err
	})
	close(release)
	if !errors.Is(err, errInterrupted) {
		t.Fatalf("got %v, want errInterrupted", err)
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Errorf("left behind: %v", entries)
	}
}

// SOURCE_DATE_EPOCH past the year 9999 is refused, as --date is.
func TestSourceDateEpochRange(t *testing.T) {
	out := filepath.Join(t.TempDir(), "r.pdf")
	_, errOut, code := runCLIEnv(t, map[string]string{"SOURCE_DATE_EPOCH": "253402300800"}, "report", "../../testdata/examples/weak-probe.toml", "-o", out)
	if code != exitBadInput || !strings.Contains(errOut, "after the year 9999") {
		t.Errorf("exit %d, %q", code, errOut)
	}
}

// verify's exit statuses: 0 for the document and its own setup, 1 for
// another setup, 2 for a file that is not a document.
func TestVerifyExitStatus(t *testing.T) {
	dir := t.TempDir()
	doc := filepath.Join(dir, "c.pdf")
	if _, errOut, code := runCLI(t, "report", "../../testdata/examples/table-c.toml", "-o", doc, "--date", "2026-01-02"); code == exitBadInput {
		t.Fatalf("report: %s", errOut)
	}
	if out, errOut, code := runCLI(t, "verify", doc, "../../testdata/examples/table-c.toml"); code != exitOK || !strings.Contains(out, "The document matches") {
		t.Errorf("its own setup: exit %d, stdout %q, stderr %q", code, out, errOut)
	}
	if out, _, code := runCLI(t, "verify", doc, "../../testdata/examples/table-d.toml"); code != exitFindings || !strings.Contains(out, "differs from the attached setup") {
		t.Errorf("another setup: exit %d, stdout %q", code, out)
	}
	if _, errOut, code := runCLI(t, "verify", "../../testdata/examples/table-c.toml"); code != exitBadInput || !strings.Contains(errOut, "not a readable PDF") {
		t.Errorf("a setup given as the document: exit %d, stderr %q", code, errOut)
	}
	if _, _, code := runCLI(t, "verify", doc, "/no/such/setup.toml"); code != exitBadInput {
		t.Errorf("a missing setup file: exit %d", code)
	}
	if _, errOut, code := runCLI(t, "verify", "/dev/zero"); code != exitBadInput || !strings.Contains(errOut, "not a regular file") {
		t.Errorf("/dev/zero: exit %d, stderr %q", code, errOut)
	}
	// The pages of table C carrying another setup under its name.
	other, err := os.ReadFile("../../testdata/examples/table-c-rev4.toml")
	if err != nil {
		t.Fatal(err)
	}
	swapped := filepath.Join(dir, "swapped.pdf")
	if err := api.RemoveAttachmentsFile(doc, swapped, []string{"table-c.toml"}, nil); err != nil {
		t.Fatal(err)
	}
	renamed := filepath.Join(t.TempDir(), "table-c.toml")
	if err := os.WriteFile(renamed, other, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := api.AddAttachmentsFile(swapped, swapped, []string{renamed}, false, nil); err != nil {
		t.Fatal(err)
	}
	if out, errOut, code := runCLI(t, "verify", swapped, renamed); code != exitFindings || !strings.Contains(out, "its pages and its attachments disagree") {
		t.Errorf("pages of one setup, another attached: exit %d, stdout %q, stderr %q", code, out, errOut)
	}
}

// diff's exit statuses: 0 for a file against itself, 1 for the shipped
// revision that raises a power, 2 for a file that does not load.
func TestDiffExitStatus(t *testing.T) {
	c, c4 := "../../testdata/examples/table-c.toml", "../../testdata/examples/table-c-rev4.toml"
	if out, errOut, code := runCLI(t, "diff", c, c); code != exitOK || !strings.Contains(out, "No change affects safety") {
		t.Errorf("a file against itself: exit %d, stdout %q, stderr %q", code, out, errOut)
	}
	if out, _, code := runCLI(t, "diff", c, c4); code != exitFindings || !strings.Contains(out, "needs a new sign-off") {
		t.Errorf("the shipped revision: exit %d, stdout %q", code, out)
	}
	out, _, code := runCLI(t, "diff", "--json", c, c4)
	var back struct {
		AffectsSafety bool `json:"affects_safety"`
	}
	if code != exitFindings || json.Unmarshal([]byte(out), &back) != nil || !back.AffectsSafety {
		t.Errorf("--json: exit %d, %q", code, out)
	}
	bad := filepath.Join(t.TempDir(), "bad.toml")
	if err := os.WriteFile(bad, []byte("[[laser]]\nname = 1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if out, errOut, code := runCLI(t, "diff", c, bad); code != exitBadInput || out != "" || !strings.Contains(errOut, "bad.toml") {
		t.Errorf("a setup that does not load: exit %d, stdout %q, stderr %q", code, out, errOut)
	}
}

// report --diagram writes the drawing as SVG beside the PDF; a name shared
// with the PDF, or a setup that does not load, writes neither.
func TestReportDiagram(t *testing.T) {
	dir := t.TempDir()
	doc, svg := filepath.Join(dir, "c.pdf"), filepath.Join(dir, "c.svg")
	if _, errOut, code := runCLI(t, "report", "../../testdata/examples/table-c.toml", "-o", doc, "--diagram", svg, "--date", "2026-01-02"); code == exitBadInput {
		t.Fatalf("report --diagram: %s", errOut)
	}
	data, err := os.ReadFile(svg)
	if err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(bytes.NewReader(data))
	for {
		if _, err := dec.Token(); err != nil {
			if !errors.Is(err, io.EOF) {
				t.Fatalf("the SVG does not parse: %v", err)
			}
			break
		}
	}
	if !bytes.Contains(data, []byte("1 aom")) {
		t.Error("the SVG lacks the demo's first element")
	}
	other := filepath.Join(dir, "d.pdf")
	if _, errOut, code := runCLI(t, "report", "../../testdata/examples/table-c.toml", "-o", other, "--diagram", other); code != exitBadInput || !strings.Contains(errOut, "name of its own") {
		t.Errorf("--diagram as the PDF's name: exit %d, %s", code, errOut)
	}
	bad := filepath.Join(dir, "bad.toml")
	if err := os.WriteFile(bad, []byte("[[laser]]\nname = 1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, _, code := runCLI(t, "report", bad, "-o", other, "--diagram", filepath.Join(dir, "e.svg")); code != exitBadInput {
		t.Errorf("bad setup: exit %d", code)
	}
	for _, f := range []string{other, filepath.Join(dir, "e.svg")} {
		if _, err := os.Stat(f); err == nil {
			t.Errorf("%s was written", f)
		}
	}
}

// schema prints a JSON document that names the draft; init --schema writes
// the line editors read first, and the file still loads.
func TestSchemaAndInitSchemaLine(t *testing.T) {
	out, errOut, code := runCLI(t, "schema")
	var doc map[string]any
	if code != exitOK || json.Unmarshal([]byte(out), &doc) != nil || doc["$schema"] != setup.SchemaDraft {
		t.Fatalf("schema: exit %d, stderr %q, $schema %v", code, errOut, doc["$schema"])
	}
	name := filepath.Join(t.TempDir(), "lab.toml")
	if _, errOut, code := runCLI(t, "init", "--schema", "beamledger.schema.json", name); code != exitOK {
		t.Fatalf("init --schema: exit %d, %s", code, errOut)
	}
	data, err := os.ReadFile(name)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(string(data), "#:schema beamledger.schema.json\n#") {
		t.Errorf("first lines %q", strings.SplitN(string(data), "\n", 3)[:2])
	}
	if _, err := setup.Load(name); err != nil {
		t.Errorf("the starter with its schema line does not load: %v", err)
	}
	if _, _, code := runCLI(t, "init", "--schema", "a\nb", filepath.Join(t.TempDir(), "x.toml")); code != exitBadInput {
		t.Errorf("a schema path with a line break: exit %d", code)
	}
}

// report --html writes one self-contained HTML page, alone (no -o) or
// beside the PDF; two runs with the same date give the same bytes; the
// page carries the setup's SHA-256 the command prints.
func TestReportWritesReproducibleHTML(t *testing.T) {
	dir := t.TempDir()
	env := map[string]string{"SOURCE_DATE_EPOCH": "1767225600"} // 2026-01-01
	var pages [][]byte
	for _, args := range [][]string{{"--html", filepath.Join(dir, "a.html")}, {"--html", filepath.Join(dir, "b.html"), "-o", filepath.Join(dir, "b.pdf")}} {
		stdout, errOut, code := runCLIEnv(t, env, append([]string{"report", "../../testdata/examples/table-c.toml"}, args...)...)
		if code != exitOK || !strings.Contains(stdout, "one HTML page") {
			t.Fatalf("report %v: exit %d, %q, %q", args, code, stdout, errOut)
		}
		b, err := os.ReadFile(args[1])
		if err != nil {
			t.Fatal(err)
		}
		sha := regexp.MustCompile(`SHA-256 ([0-9a-f]{64})`).FindStringSubmatch(stdout)
		if !bytes.HasPrefix(b, []byte("<!DOCTYPE html>")) || sha == nil || !bytes.Contains(b, []byte(sha[1])) {
			t.Errorf("%s is not the page of the setup printed", args[1])
		}
		pages = append(pages, b)
	}
	if !bytes.Equal(pages[0], pages[1]) {
		t.Error("two runs with the same SOURCE_DATE_EPOCH give different pages")
	}
	if _, err := os.Stat(filepath.Join(dir, "b.pdf")); err != nil {
		t.Error("the PDF beside the page was not written")
	}
	if _, _, code := runCLIEnv(t, env, "report", "../../testdata/examples/table-c.toml"); code != exitBadInput {
		t.Errorf("report without -o or --html: exit %d", code)
	}
}

// No output is ever lost or replaced by another: an output named twice
// under two spellings (an absolute path, a linked folder), or naming the
// setup or the --since setup, is refused before anything is written; a
// failed output (a folder that does not exist) leaves every existing file
// as it was.
func TestReportNeverLosesAFile(t *testing.T) {
	dir := t.TempDir()
	setupFile := filepath.Join(dir, "s.toml")
	old := filepath.Join(dir, "old.toml")
	data, _ := os.ReadFile("../../testdata/examples/table-c.toml")
	os.WriteFile(setupFile, data, 0o644)
	os.WriteFile(old, data, 0o644)
	pdf := filepath.Join(dir, "out.pdf")
	os.WriteFile(pdf, []byte("the previous PDF"), 0o644)
	link := filepath.Join(dir, "link")
	if err := os.Symlink(dir, link); err != nil {
		t.Skip("no symbolic links here")
	}
	cwd, _ := os.Getwd()
	rel, err := filepath.Rel(cwd, pdf)
	if err != nil {
		t.Fatal(err)
	}
	for _, args := range [][]string{
		{"-o", pdf, "--diagram", rel, "--force"},
		{"-o", pdf, "--diagram", filepath.Join(link, "out.pdf"), "--force"},
		{"-o", pdf, "--html", filepath.Join(dir, ".", "out.pdf"), "--force"},
		{"-o", old, "--since", old, "--force"},
		{"-o", pdf, "--diagram", filepath.Join(dir, "missing", "d.svg"), "--force"},
	} {
		_, errOut, code := runCLI(t, append([]string{"report", setupFile}, args...)...)
		if code != exitBadInput {
			t.Errorf("%v: exit %d (%s)", args, code, errOut)
		}
		if b, _ := os.ReadFile(pdf); string(b) != "the previous PDF" {
			t.Fatalf("%v: the previous PDF was replaced or removed", args)
		}
		if b, _ := os.ReadFile(old); !bytes.Equal(b, data) {
			t.Fatalf("%v: the --since setup was replaced", args)
		}
	}
}

// A document written with --since is written again and compared page by
// page when verify is given the same previous revision; without it, verify
// says the pages were not compared; with another file, exit 2 naming both
// hashes.
func TestVerifySince(t *testing.T) {
	doc := filepath.Join(t.TempDir(), "rev4.pdf")
	old, rev4 := "../../testdata/examples/table-c.toml", "../../testdata/examples/table-c-rev4.toml"
	if _, errOut, code := runCLI(t, "report", rev4, "-o", doc, "--date", "2026-01-02", "--since", old); code == exitBadInput {
		t.Fatalf("report: %s", errOut)
	}
	if out, errOut, code := runCLI(t, "verify", doc, "--since", old); code != exitOK || !strings.Contains(out, "read word for word as this version writes them") {
		t.Errorf("with its previous revision: exit %d, stdout %q, stderr %q", code, out, errOut)
	}
	if out, _, code := runCLI(t, "verify", doc); code != exitOK || !strings.Contains(out, "were not compared") || !strings.Contains(out, "with --since to compare them") {
		t.Errorf("without it: exit %d, stdout %q", code, out)
	}
	if _, errOut, code := runCLI(t, "verify", doc, "--since", "../../testdata/examples/table-d.toml"); code != exitBadInput || !strings.Contains(errOut, "the document compares with") {
		t.Errorf("another previous revision: exit %d, stderr %q", code, errOut)
	}
}
