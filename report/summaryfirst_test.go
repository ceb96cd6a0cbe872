package report

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/internal/scalesurvey"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// needPoppler skips (or with LOSSLINE_REQUIRE_POPPLER fails) without poppler.
func needPoppler(t *testing.T) {
	t.Helper()
	for _, tool := range []string{"pdftotext", "pdfinfo"} {
		if _, err := exec.LookPath(tool); err != nil {
			if os.Getenv("LOSSLINE_REQUIRE_POPPLER") != "" {
				t.Fatal(tool + " not installed (poppler-utils)")
			}
			t.Skip(tool + " not installed (poppler-utils)")
		}
	}
}

// pdfText reads a PDF back with poppler's pdftotext, after pdfinfo has
// accepted it; it returns the text and the page count.
func pdfText(t *testing.T, pdf []byte) (string, int) {
	t.Helper()
	file := filepath.Join(t.TempDir(), "x.pdf")
	if err := os.WriteFile(file, pdf, 0o644); err != nil {
		t.Fatal(err)
	}
	info, err := exec.Command("pdfinfo", file).CombinedOutput()
	if err != nil || bytes.Contains(info, []byte("Syntax Error")) {
		t.Fatalf("pdfinfo: %v\n%s", err, info)
	}
	m := regexp.MustCompile(`Pages:\s+(\d+)`).FindSubmatch(info)
	pages := 0
	if m != nil {
		pages, _ = strconv.Atoi(string(m[1]))
	}
	text, err := exec.Command("pdftotext", file, "-").CombinedOutput()
	if err != nil || bytes.Contains(text, []byte("Syntax Error")) {
		t.Fatalf("pdftotext: %v\n%s", err, text)
	}
	return string(text), pages
}

// generated reads and assesses a generated survey (invented data) of n
// CMLs on units × circuits components.
func generated(t *testing.T, n, units, circuits int) *findings.Findings {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "survey")
	if err := scalesurvey.Write(dir, scalesurvey.Size{CMLs: n, Units: units, Circuits: circuits}); err != nil {
		t.Fatal(err)
	}
	s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	return findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
}

// Markers of the two kinds of report.
const (
	fullMark    = "Ranked list of CMLs"
	summaryMark = "What needs attention"
	leftMark    = "What this report leaves to the exports"
)

// A survey one CML or one component over a threshold is reported
// summary-first; at the threshold, in full.
func TestThresholdsSwitchMode(t *testing.T) {
	needPoppler(t)
	f := generated(t, 24, 2, 3) // 6 components of 4 CMLs
	for _, c := range []struct {
		name    string
		limits  Limits
		summary bool
	}{
		{"at the CML threshold", Limits{FullDetailMaxCMLs: 24, FullDetailMaxComponents: 25, DetailWindowYears: 5, ListMaxRows: 500}, false},
		{"one CML over", Limits{FullDetailMaxCMLs: 23, FullDetailMaxComponents: 25, DetailWindowYears: 5, ListMaxRows: 500}, true},
		{"at the component threshold", Limits{FullDetailMaxCMLs: 1000, FullDetailMaxComponents: 6, DetailWindowYears: 5, ListMaxRows: 500}, false},
		{"one component over", Limits{FullDetailMaxCMLs: 1000, FullDetailMaxComponents: 5, DetailWindowYears: 5, ListMaxRows: 500}, true},
	} {
		t.Run(c.name, func(t *testing.T) {
			opts := testOptions()
			opts.Limits = c.limits
			pdf, _, err := PDF(f, opts)
			if err != nil {
				t.Fatal(err)
			}
			text, _ := pdfText(t, pdf)
			if got := strings.Contains(text, summaryMark); got != c.summary {
				t.Errorf("summary-first = %v, want %v", got, c.summary)
			}
			if got := strings.Contains(text, fullMark); got == c.summary {
				t.Errorf("full ranked list printed = %v in a report summary-first = %v", got, c.summary)
			}
			if got := strings.Contains(text, leftMark); got != c.summary {
				t.Errorf("statement of what is left to the exports printed = %v, want %v", got, c.summary)
			}
			if c.summary && !strings.Contains(text, "the report is summary-first (this report is summary-first)") {
				t.Error("the methods appendix does not state the thresholds and the mode")
			}
		})
	}
}

// attentionFromResults picks the CMLs needing attention from results.json's
// fields, independently of the PDF code: at or below required (remaining life
// 0 with the below-required flag), remaining life within the window,
// accelerating, not re-measured, next inspection before the survey date.
func attentionFromResults(r Results, window float64) []string {
	var ids []string
	for _, it := range r.Items {
		need := slices.Contains(it.Flags, string(wallloss.FlagBelowRequired)) ||
			it.RemainingLifeY != nil && *it.RemainingLifeY <= window ||
			slices.Contains(it.Change, "accelerating") ||
			slices.Contains(it.Flags, string(wallloss.FlagNotMeasuredLatest)) ||
			it.NextInspection != nil && *it.NextInspection < r.Survey.Date
		if need {
			ids = append(ids, it.CML)
		}
	}
	return ids
}

// The list of what needs attention holds exactly the CMLs results.json says
// need it, in rank order; a list longer than list-max-rows says how many
// rows it left out.
func TestAttentionListHoldsTheRightCMLs(t *testing.T) {
	needPoppler(t)
	f := generated(t, 300, 3, 4)
	for _, window := range []float64{0, 5, 20} {
		opts := testOptions()
		opts.Limits = Limits{FullDetailMaxCMLs: 100, FullDetailMaxComponents: 3, DetailWindowYears: window, ListMaxRows: 1000}
		d := newDoc(f, opts)
		d.attn = d.findAttention()
		var got []string
		for _, it := range d.attn.items {
			got = append(got, it.CML.ID)
		}
		want := attentionFromResults(BuildResults(f, nil), window)
		if !slices.Equal(got, want) {
			t.Errorf("window %g y: attention list\n%v\nwant\n%v", window, got, want)
		}
		if d.attn.nDetail > 3 || d.attn.nDetail == 0 {
			t.Errorf("window %g y: %d components in full, want 1 to 3", window, d.attn.nDetail)
		}
		if window == 5 && (len(want) < 10 || len(want) > 290) {
			t.Fatalf("the generated survey should have some but not all CMLs needing attention, has %d", len(want))
		}
	}
	opts := testOptions()
	opts.Limits = Limits{FullDetailMaxCMLs: 100, FullDetailMaxComponents: 3, DetailWindowYears: 5, ListMaxRows: 7}
	pdf, _, err := PDF(f, opts)
	if err != nil {
		t.Fatal(err)
	}
	text, pages := pdfText(t, pdf)
	want := attentionFromResults(BuildResults(f, nil), 5)
	i := strings.Index(text, summaryMark)
	if i < 0 {
		t.Fatal("no list of what needs attention")
	}
	list := text[i:]
	for _, id := range want[:7] {
		if !strings.Contains(list, id) {
			t.Errorf("%s needs attention and is not in the list", id)
		}
	}
	if n := len(want); !strings.Contains(text, "The first 7 of "+strconv.Itoa(n)+" rows are shown (list-max-rows); the other "+strconv.Itoa(n-7)+" are in") {
		t.Errorf("the cut list does not say how many rows it left out")
	}
	if pages > 60 {
		t.Errorf("summary-first report of 300 CMLs has %d pages", pages)
	}
}

// --detail assets writes one detail PDF per asset with all its components;
// a later run without it leaves none behind in the swapped folder.
func TestDetailFilesWrittenAndReplaced(t *testing.T) {
	needPoppler(t)
	f := generated(t, 40, 2, 3)
	opts := testOptions()
	opts.Limits = Limits{FullDetailMaxCMLs: 10, FullDetailMaxComponents: 1, DetailWindowYears: 5, ListMaxRows: 500}
	opts.Detail = true
	out := filepath.Join(t.TempDir(), "out")
	files, _ := Streams(f, opts)
	if err := WriteFolder(out, files, WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	for i, a := range f.Survey.Assets {
		name := DetailFiles(f.Survey.Assets)[i]
		b, err := os.ReadFile(filepath.Join(out, name))
		if err != nil {
			t.Fatalf("%s: %v", a.Name, err)
		}
		text, _ := pdfText(t, b)
		for _, c := range a.Components {
			if !strings.Contains(text, c.Name) {
				t.Errorf("%s lacks component %s", name, c.Name)
			}
			for _, m := range c.CMLs {
				if !strings.Contains(text, m.ID) {
					t.Errorf("%s lacks CML %s", name, m.ID)
				}
			}
		}
		if !strings.Contains(text, "Screening calculations") {
			t.Errorf("%s lacks the cautions", name)
		}
	}
	main, _ := os.ReadFile(filepath.Join(out, PDFFile))
	if text, _ := pdfText(t, main); !strings.Contains(text, "detail-unit-001.pdf") {
		t.Error("report.pdf does not name the detail files")
	}
	opts.Detail = false
	files, _ = Streams(f, opts)
	if err := WriteFolder(out, files, WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	if left, _ := filepath.Glob(filepath.Join(out, "detail-*.pdf")); len(left) > 0 {
		t.Errorf("detail files of the earlier run left: %v", left)
	}
}

func TestDetailFileNames(t *testing.T) {
	// A file name is at most 255 bytes on common file systems (ext4, NTFS,
	// APFS): a 300-letter asset name is cut to 80.
	long := strings.Repeat("x", 300)
	assets := []*survey.Asset{{Name: "Tank T-101"}, {Name: "tank t 101"}, {Name: "Δ"}, {Name: "Bridge FB2 / deck"}, {Name: long}}
	want := []string{"detail-tank-t-101.pdf", "detail-tank-t-101-2.pdf", "detail-asset.pdf", "detail-bridge-fb2-deck.pdf", "detail-" + long[:80] + ".pdf"}
	if got := DetailFiles(assets); !slices.Equal(got, want) {
		t.Errorf("got %v, want %v", got, want)
	}
}

// --photos separate puts the demo's photos in photos.pdf; report.pdf holds
// no image and says where they are.
func TestPhotosSeparate(t *testing.T) {
	needPoppler(t)
	f := demo(t)
	opts := testOptions()
	opts.PhotosApart = true
	files, _, err := Render(f, opts)
	if err != nil {
		t.Fatal(err)
	}
	byName := map[string][]byte{}
	for _, file := range files {
		byName[file.Name] = file.Data
	}
	main, photos := byName[PDFFile], byName[PhotosFile]
	if photos == nil {
		t.Fatal("no photos.pdf")
	}
	if bytes.Contains(main, []byte("/DCTDecode")) {
		t.Error("report.pdf still holds photos")
	}
	if n := bytes.Count(photos, []byte("/DCTDecode")); n < len(f.Survey.Photos)-2 {
		t.Errorf("photos.pdf holds %d JPEG images for %d photos", n, len(f.Survey.Photos))
	}
	text, _ := pdfText(t, main)
	if !strings.Contains(text, "The photos are in photos.pdf") {
		t.Error("report.pdf does not refer to photos.pdf")
	}
	ptext, _ := pdfText(t, photos)
	for _, ph := range f.Survey.Photos {
		if ph.Placement.CML != "" && !strings.Contains(ptext, ph.Name) {
			t.Errorf("photos.pdf lacks %s", ph.Name)
		}
	}
}

// results.json and results.csv written as streams are byte for byte the
// documents built whole.
func TestStreamedExportsEqualWhole(t *testing.T) {
	for _, f := range []*findings.Findings{demo(t), generated(t, 50, 2, 2)} {
		warnings := survey.ProblemList{{File: "survey.md", Line: 3, Message: "a warning"}}
		whole, err := JSON(BuildResults(f, warnings))
		if err != nil {
			t.Fatal(err)
		}
		var streamed bytes.Buffer
		if err := WriteJSON(&streamed, f, warnings); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(whole, streamed.Bytes()) {
			t.Errorf("%s: streamed results.json differs from the whole document", f.Survey.Title)
		}
		disp := Display{}.resolve(f.Survey.Units)
		wholeCSV, err := CSV(BuildResults(f, nil), disp)
		if err != nil {
			t.Fatal(err)
		}
		streamed.Reset()
		if err := WriteCSV(&streamed, f, disp); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(wholeCSV, streamed.Bytes()) {
			t.Errorf("%s: streamed results.csv differs", f.Survey.Title)
		}
	}
}

// The pages compressed by the one reused compressor read back as the same
// text as fpdf's own compression writes them, and the file is smaller than
// without compression.
func TestPageCompressionKeepsThePDF(t *testing.T) {
	needPoppler(t)
	f := demo(t)
	opts := testOptions()
	opts.PreparePhotos = nil
	opts.PhotosApart = true // no photos: the page streams dominate
	d := newDoc(f, opts)
	if err := d.sections(); err != nil {
		t.Fatal(err)
	}
	var plain bytes.Buffer
	if err := d.pdf.Output(&plain); err != nil {
		t.Fatal(err)
	}
	var ours bytes.Buffer
	if _, err := (&pageCompressor{w: &ours}).Write(plain.Bytes()); err != nil {
		t.Fatal(err)
	}
	d2 := newDoc(f, opts)
	d2.pdf.SetCompression(true)
	if err := d2.sections(); err != nil {
		t.Fatal(err)
	}
	var theirs bytes.Buffer
	if err := d2.pdf.Output(&theirs); err != nil {
		t.Fatal(err)
	}
	checkXref(t, ours.Bytes())
	a, pa := pdfText(t, ours.Bytes())
	b, pb := pdfText(t, theirs.Bytes())
	if a != b || pa != pb || pa < 10 {
		t.Errorf("text differs from fpdf's own compression (%d and %d pages)", pa, pb)
	}
	if ours.Len() >= plain.Len()/2 {
		t.Errorf("compressed %d bytes of %d", ours.Len(), plain.Len())
	}
	if r := float64(ours.Len()) / float64(theirs.Len()); r < 0.9 || r > 1.1 {
		t.Errorf("size %d against fpdf's %d", ours.Len(), theirs.Len())
	}
}

// checkXref checks, without a PDF reader's repairs, that startxref points at
// the cross-reference table and each of its entries at its object's header
// (PDF 32000-1:2008 §7.5.4, §7.5.5).
func checkXref(t *testing.T, pdf []byte) {
	t.Helper()
	m := regexp.MustCompile(`startxref\n(\d+)\n%%EOF\n$`).FindSubmatch(pdf)
	if m == nil {
		t.Fatal("no startxref at the end")
	}
	at, _ := strconv.Atoi(string(m[1]))
	if !bytes.HasPrefix(pdf[at:], []byte("xref\n0 ")) {
		t.Fatalf("startxref %d does not point at the xref table", at)
	}
	lines := strings.Split(string(pdf[at:]), "\n")
	n, _ := strconv.Atoi(strings.Fields(lines[1])[1])
	for obj := 1; obj < n; obj++ {
		off, _ := strconv.Atoi(strings.Fields(lines[2+obj])[0])
		if want := strconv.Itoa(obj) + " 0 obj\n"; !bytes.HasPrefix(pdf[off:], []byte(want)) {
			t.Fatalf("xref entry of object %d points at %q", obj, pdf[off:min(off+20, len(pdf))])
		}
	}
}
