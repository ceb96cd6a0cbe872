package report

import (
	"fmt"
	"strconv"
)

// figure is a photo as placed in the report: its number is its place in
// doc.figures (one-based), in the order the pages show them.
type figure struct {
	shown photoShown
	page  int
}

// figureRange names the next n figures, before they are drawn: "Figure 4",
// "Figures 4–7".
func (d *doc) figureRange(n int) string {
	first := len(d.figures) + 1
	if n == 1 {
		return "Figure " + strconv.Itoa(first)
	}
	return fmt.Sprintf("Figures %d–%d", first, first+n-1)
}

// plannedFigures numbers, before any page is written, the figure each photo
// is first shown in on its component's pages (else before and after, else
// the unplaced photos), in the order the sections draw them: the site plans
// come before the photos and refer to them by these numbers.
func (d *doc) plannedFigures() map[string]int {
	type src struct {
		shown     []photoShown
		component bool
	}
	var order []src
	if pairs := d.beforeAfterPairs(); len(pairs) > 0 {
		order = append(order, src{shown: pairs})
	}
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			order = append(order, src{shown: d.componentPhotos(c), component: true})
		}
	}
	order = append(order, src{shown: d.unplacedPhotos()})
	first := map[string]int{}
	onComponent := map[string]bool{}
	n := 0
	for _, o := range order {
		for _, s := range o.shown {
			n++
			name := s.entry.photo.Name
			if s.label == "Before" {
				continue // an earlier survey's photo, not on this survey's plans
			}
			if _, seen := first[name]; !seen || (o.component && !onComponent[name]) {
				first[name], onComponent[name] = n, o.component
			}
		}
	}
	return first
}

// photoIndex writes the appendix that lists every figure: its number, what
// it shows, its file and its page.
func (d *doc) photoIndex() {
	d.chapter(60)
	d.heading(0, photoIndexTitle)
	if len(d.figures) == 0 {
		d.text("This report shows no photos.")
		return
	}
	d.text("Every photo in this report, by figure number, with the page it is on. A photo shown under several CMLs, " +
		"or before and after, has a figure each time.")
	d.pdf.Ln(1)
	rows := make([][]string, len(d.figures))
	for i, f := range d.figures {
		rows[i] = []string{strconv.Itoa(i + 1), figureShows(f.shown), f.shown.entry.photo.Name, strconv.Itoa(f.page)}
	}
	d.table([]column{{"Figure", 14, "R"}, {"Shows", 70, "L"}, {"File", d.width() - 98, "L"}, {"Page", 14, "R"}}, rows, nil, smallSize)
}

const photoIndexTitle = "Appendix B — Photo index"

// figureShows says what a figure shows: the CML, or where the photo was placed.
func figureShows(s photoShown) string {
	who := "not placed"
	pl := s.entry.photo.Placement
	switch {
	case s.cml != "":
		who = "CML " + s.cml
	case pl.Placed():
		who = placedOn(pl)
	}
	if s.label != "" {
		who += " (" + map[string]string{"Before": "earlier visit", "Now": "this visit"}[s.label] + ")"
	}
	return who
}

// plural writes n with the singular or plural noun.
func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}
