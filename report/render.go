package report

import (
	"fmt"
	"strings"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
)

// Output file names.
const (
	PDFFile  = "report.pdf"
	JSONFile = "results.json"
	CSVFile  = "results.csv"
)

// Render produces every output in memory. The warnings returned are those
// raised while rendering (the survey's own are in Survey.Problems). A panic
// while rendering comes back as a RenderPanic naming the output.
func Render(f *findings.Findings, opts Options) ([]File, survey.ProblemList, error) {
	s := f.Survey
	var (
		pdf, js, csv, geo []byte
		warnings          survey.ProblemList
		res               Results
	)
	err := stage(PDFFile, func() (err error) {
		pdf, warnings, err = PDF(f, opts)
		return err
	})
	if err != nil {
		return nil, nil, err
	}
	all := append(append(survey.ProblemList{}, s.Problems...), warnings...)
	if err := stage(JSONFile, func() (err error) {
		res = BuildResults(f, all)
		js, err = JSON(res)
		return err
	}); err != nil {
		return nil, nil, err
	}
	if err := stage(CSVFile, func() (err error) {
		csv, err = CSV(res, opts.Display.resolve(s.Units))
		return err
	}); err != nil {
		return nil, nil, err
	}
	if err := stage(GeoJSONFile, func() (err error) {
		geo, err = GeoJSON(f)
		return err
	}); err != nil {
		return nil, nil, err
	}
	var electro []byte
	if err := stage(ElectroCSVFile, func() (err error) {
		electro, err = ElectroCSV(res)
		return err
	}); err != nil {
		return nil, nil, err
	}
	return []File{{PDFFile, pdf}, {JSONFile, js}, {CSVFile, csv}, {GeoJSONFile, geo}, actionsFile(res), {ElectroCSVFile, electro}}, warnings, nil
}

// RenderPanic is a panic raised while rendering, caught so that the command
// ends with a one-line message instead of a stack trace.
type RenderPanic struct {
	Stage string // what was being rendered: an output file, or a photo
	Value any    // what was passed to panic
}

func (e RenderPanic) Error() string {
	msg := strings.Join(strings.Fields(fmt.Sprint(e.Value)), " ")
	if r := []rune(msg); len(r) > 300 {
		msg = string(r[:300]) + "…"
	}
	return fmt.Sprintf("internal error while rendering %s: %s", e.Stage, msg)
}

// stage runs one rendering step and turns a panic in it into a RenderPanic
// naming the step (or the inner step, when the panic already is one).
func stage(name string, step func() error) (err error) {
	defer func() {
		if v := recover(); v != nil {
			if rp, ok := v.(RenderPanic); ok {
				err = rp
				return
			}
			err = RenderPanic{Stage: name, Value: v}
		}
	}()
	return step()
}
