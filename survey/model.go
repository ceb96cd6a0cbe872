package survey

import (
	"iter"
	"time"

	"github.com/lossline/lossline/survey/required"
	"github.com/lossline/lossline/survey/wallloss"
)

// Survey is one inspection visit's checklist, with the readings of earlier
// visits that its tables carry. Thicknesses are held in millimetres whatever
// the checklist's display units.
type Survey struct {
	Dir       string    // the survey folder
	File      string    // path of survey.md as given to the reader
	Source    []byte    // survey.md as read, for checks of its text by line
	Title     string    // front matter title
	Site      string    // front matter site
	Date      time.Time // this visit
	Inspector string
	Days      int  // survey days from Date (front matter days:, default 1)
	Units     Unit // display units, and the unit of a bare number
	Assets    []*Asset
	Notes     []Note   // notes before the first heading
	Photos    []*Photo // every usable JPEG found under photos/, sorted by name
	Skipped   []SkippedFile
	Previous  []string  // earlier survey folders named in the front matter, relative to Dir
	PrevLine  int       // line of the previous: key
	History   *History  // what earlier surveys added; nil when there are none
	Problems  []Problem // warnings, sorted, as Load or LoadSeries returned them (errors stop the read)

	// OtherSite lists earlier survey folders named under previous-other-site:,
	// merged although their site differs or they share no asset with this one.
	OtherSite     []string
	OtherSiteLine int
	// VisitScope lists the assets and components this visit covers (front
	// matter scope:); empty when it covers everything its tables list.
	VisitScope []ScopeEntry
	SiteLine   int // line of the site: key
	// Document is the document control and instruments of the front matter.
	Document Document
	// Actions are those written in the checklist, Closures those it closes,
	// Carried the actions of earlier surveys still open when it was made.
	Actions  []WrittenAction
	Closures []ActionClosure
	Carried  []CarriedAction
	// ScopeSince gives, by action id, the date of the earlier survey that
	// first left a scope item not done which this survey leaves not done again.
	ScopeSince map[string]time.Time
}

// Asset is a tank, a piping system, a bridge: a `# heading` in the checklist.
type Asset struct {
	Name       string
	Line       int
	Notes      []Note
	Components []*Component
}

// Component is a shell course, a pipe circuit, a girder flange: a `## heading`.
type Component struct {
	Name   string
	File   string // checklist it was read from
	Line   int
	Asset  string
	Design Design
	CMLs   []*CML
	Scope  []ScopeItem
	Notes  []Note
	// VisitDates lists the dates of the reading table's visit columns, oldest first.
	VisitDates []VisitDate
	// OutOfScope is set when the front matter's scope: leaves the component
	// out of this visit; its results date from earlier visits.
	OutOfScope bool
}

// Design is a component's design data from its `key: value` list.
type Design struct {
	NominalMM   *float64
	RequiredMM  *float64 // written, or set by ComputeRequired from RequiredMethod
	Installed   *VisitDate
	Consequence Consequence
	Lines       map[string]int // key -> line, for messages

	// RequiredMethod is the method written after `required:`, if not a number,
	// and RequiredInputs the items written under it. RequiredCalc is the
	// method's result with every input and step, set by ComputeRequired.
	RequiredMethod string
	RequiredInputs []MethodInput
	RequiredCalc   *required.Calculation

	RateModel         wallloss.RateModel     // "" for the settings' rate model
	AssumedRateMMPerY *float64               // single-visit estimate
	Corrosivity       wallloss.Corrosivity   // ISO 9223 category, single-visit estimate
	Metal             string                 // of the atmospheric estimate; "" for carbon steel
	Rule              *wallloss.IntervalRule // nil for the settings' rule

	// Repair for planning: a cost as written, or a quantity of a priced item
	// of the settings; and the thickness a repair restores (nominal if nil).
	RepairCost        *Money
	RepairQuantity    float64
	RepairItem        string
	RepairThicknessMM *float64

	Instrument string        // serial of the gauge used (instrument:), "" when not named
	Repairs    []RepairEvent // repairs done between visits (repaired:), oldest first
	Electro    *Electro      // coupons, probes, CP, anodes, coating; nil when none
	Local      *LocalDamage  // grids, pits, corroded area, member; nil when none is written
}

// MethodInput is one `name: value` item under a `required:` method, as written.
type MethodInput struct {
	Name  string // lower case, single spaces
	Value string
	Line  int
}

// CML is a condition monitoring location: one row of a reading table.
type CML struct {
	ID        string
	File      string // checklist the row was read from
	Line      int
	Location  string
	GPS       *LatLon
	PhotoRefs []string // names relative to photos/, as written
	Was       []string // ids this CML had in earlier surveys
	Remarks   string   // the remarks cell, as written
	Visits    []Visit  // oldest first; only visits with at least one reading
}

// Visit is the readings taken at one CML on one date.
type Visit struct {
	Date       VisitDate
	ReadingsMM []float64
	File       string // checklist the readings come from
	Line       int
}

// Governing returns the governing (minimum) reading of the visit in mm.
func (v Visit) Governing() float64 {
	m := v.ReadingsMM[0]
	for _, r := range v.ReadingsMM[1:] {
		m = min(m, r)
	}
	return m
}

// VisitDate is a visit's date and the precision it was written with.
type VisitDate struct {
	Time      time.Time
	MonthOnly bool // written as YYYY-MM; Time is then the 15th of that month
}

// String writes the date back as it was written.
func (d VisitDate) String() string {
	if d.MonthOnly {
		return d.Time.Format("2006-01")
	}
	return d.Time.Format("2006-01-02")
}

// LatLon is a WGS 84 position in decimal degrees.
type LatLon struct{ Lat, Lon float64 }

// ScopeItem is one entry of a component's scope checklist (a task list item).
type ScopeItem struct {
	Text string // Markdown inline text as written
	Done bool
	Line int
}

// Note is a paragraph or bullet carried into the report as written.
type Note struct {
	Markdown string // inline Markdown source
	Bullet   bool
	Line     int
}

// Consequence is the consequence-of-failure class written in the design list.
type Consequence int

// Consequence classes, lowest first. ConsequenceUnknown sorts below VeryLow.
const (
	ConsequenceUnknown Consequence = iota
	ConsequenceVeryLow
	ConsequenceLow
	ConsequenceMedium
	ConsequenceHigh
	ConsequenceVeryHigh
)

var consequenceNames = []string{"", "very low", "low", "medium", "high", "very high"}

// String returns the class as written in checklists ("" when unknown).
func (c Consequence) String() string { return consequenceNames[c] }

// Photo is a JPEG under photos/ and what its EXIF header says.
type Photo struct {
	Name        string // slash-separated path relative to photos/
	Path        string // path on disk
	Taken       *time.Time
	GPS         *LatLon
	Orientation int      // EXIF orientation 1..8; 1 when absent
	CMLs        []string // CMLs whose rows name this photo
	Problem     string   // why the file could not be read, if it could not
	Hash        string   // SHA-256 of the file, hex
	Width       int      // pixels, as stored (before orientation)
	Height      int
	Placement   Placement
}

// SkippedFile is a file in photos/ that is not used, and why.
type SkippedFile struct {
	Name, Path, Reason string
}

// AllCMLs returns every CML in checklist order with its asset and component.
// Code that only walks them ranges over CMLs instead, which builds no list.
func (s *Survey) AllCMLs() []Located {
	out := make([]Located, 0, s.CMLCount())
	for loc := range s.CMLs() {
		out = append(out, loc)
	}
	return out
}

// CMLs yields every CML in checklist order with its asset and component.
func (s *Survey) CMLs() iter.Seq[Located] {
	return func(yield func(Located) bool) {
		for _, a := range s.Assets {
			for _, c := range a.Components {
				for _, m := range c.CMLs {
					if !yield(Located{Asset: a, Component: c, CML: m}) {
						return
					}
				}
			}
		}
	}
}

// CMLCount is the number of CMLs of the survey.
func (s *Survey) CMLCount() int {
	n := 0
	for _, a := range s.Assets {
		for _, c := range a.Components {
			n += len(c.CMLs)
		}
	}
	return n
}

// Located is a CML with the asset and component it belongs to.
type Located struct {
	Asset     *Asset
	Component *Component
	CML       *CML
}
