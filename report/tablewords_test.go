package report

import (
	"regexp"
	"strings"
	"testing"
)

// Table cells of the demo wrap only between words: read back by pdftotext, no
// priority, rate-basis tag, date or column title is cut inside a word, and a
// title split for a narrow column is joined again where it fits.
func TestDemoTablesKeepWordsWhole(t *testing.T) {
	all := strings.Join(demoPages(t), "\n")
	for _, cut := range []*regexp.Regexp{
		regexp.MustCompile(`immediat\s*\n`),            // actions: priority
		regexp.MustCompile(`nominal-ba\s`),             // results: governing rate basis
		regexp.MustCompile(`\(\d{4}-\d\d\s*\n`),        // results: date of an earlier reading
		regexp.MustCompile(`(?m)\bThick- ness\b`),      // results: title with room to join
		regexp.MustCompile(`(?m)^\s*e\s+[A-Z]+-[0-9]`), // a lone "e" ahead of an id
		regexp.MustCompile(`\b(cp|dft): [A-Z]`),        // a finding's kind as a code, not in words
		regexp.MustCompile(`iso-9224`),                 // a rate model's key, not the standard's name
		regexp.MustCompile(`remaining life — y`),       // a unit after no value
		regexp.MustCompile(`\\[_*]`),                   // a Markdown escape shown (t\_min)
	} {
		if m := cut.FindString(all); m != "" {
			t.Errorf("a word is cut in a table cell: %q", m)
		}
	}
	for _, whole := range []string{"immediate LOCAL-", "nominal-based", "(2021-06-15)"} {
		if !strings.Contains(all, whole) {
			t.Errorf("the demo's tables lack %q whole", whole)
		}
	}
}

// Every character the demo prints, read back by pdftotext, has a glyph in the
// embedded Go font, and none was replaced by the Undrawable box (a combining
// macron over t was).
func TestDemoPrintsOnlyDrawableCharacters(t *testing.T) {
	for i, p := range demoPages(t) {
		for _, r := range p {
			if r == '\n' || r == '\t' || r == '\f' || r == '\u00a0' {
				continue
			}
			if !drawable(r) || string(r) == Undrawable {
				t.Errorf("page %d prints %q (U+%04X), which the font cannot draw", i+1, r, r)
			}
		}
	}
}

// A CML whose component's local damage is at its limit (the demo's pipe
// bridge girder: Sx loss 15.7 % against the 10 % its engineer allows) never
// reads as fine: the cover counts it, the summary in words puts it under "now", and the
// component's "Governed by" row says the limit is reached beside the wall's
// repair window. Likewise a component without CMLs but with a failing test
// point or a rejected coating does not read as just "no CMLs".
func TestDemoLocalLimitReadsAsNow(t *testing.T) {
	pages := demoPages(t)
	p2 := flat(pages[1])
	if !strings.Contains(p2, "now (local damage at its limit): PB1-01, PB1-02") {
		t.Errorf("the summary in words does not put PB1-01 and PB1-02 under now:\n%s", p2)
	}
	if regexp.MustCompile(`(5 to 10|10 years or more)[^.;]*: [^.;]*PB1-0[12]`).MatchString(p2) {
		t.Errorf("the summary in words lists a girder CML in a later repair window:\n%s", p2)
	}
	// The cover's count of CMLs at or below required adds those at a local limit.
	if !regexp.MustCompile(`and 2 more by local.{0,60}damage at its limit`).MatchString(flat(pages[0])) {
		t.Errorf("the cover does not count PB1-01 and PB1-02 beside the CMLs at or below required:\n%s", flat(pages[0]))
	}
	// The summary table's rows of components without CMLs name their findings.
	summary := flat(pages[1] + "\n" + pages[2])
	for _, want := range []string{`no CMLs;.{0,80}cathodic.{0,40}protection: NOT.{0,40}PROTECTED`, `no CMLs;.{0,80}dry-film.{0,40}thickness:.{0,40}REJECTED`} {
		if !regexp.MustCompile(want).MatchString(summary) { // the cell wraps beside the asset name
			t.Errorf("the summary table lacks %s", want)
		}
	}
	// So does the changes table's repair window.
	changes := regexp.MustCompile(`PB1-01 Pipe bridge PB-1 / Girder — 2026-11-18: 5 to 10 years; local .{0,60}damage: limit reached`)
	if !changes.MatchString(flat(strings.Join(pages, "\n"))) {
		t.Error("the changes table gives PB1-01's repair window without its local damage at the limit")
	}
	all := flat(strings.Join(pages, "\n"))
	if !strings.Contains(all, "Governed by CML PB1-01: 5 to 10 years; local damage: limit reached;") {
		t.Error(`the girder's "Governed by" row does not say its local damage limit is reached`)
	}
}

// The recoat cost of a coating carries the currency of the settings, as every
// other cost does.
func TestRecoatCostCarriesItsCurrency(t *testing.T) {
	needPoppler(t)
	f := demo(t)
	f.Settings.Plan.Costs.Currency = "EUR"
	pdf, _, err := PDF(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if all := flat(strings.Join(pdfPages(t, pdf), "\n")); !strings.Contains(all, "14 m² × 165 EUR per m² = 2 310 EUR") {
		t.Error("the coating's recoat cost is printed without its currency")
	}
}
