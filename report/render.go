package report

import (
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
// raised while rendering (the survey's own are in Survey.Problems).
func Render(f *findings.Findings, opts Options) ([]File, survey.ProblemList, error) {
	s := f.Survey
	pdf, warnings, err := PDF(f, opts)
	if err != nil {
		return nil, nil, err
	}
	all := append(append(survey.ProblemList{}, s.Problems...), warnings...)
	res := BuildResults(f, all)
	js, err := JSON(res)
	if err != nil {
		return nil, nil, err
	}
	csv, err := CSV(res, opts.Display.resolve(s.Units))
	if err != nil {
		return nil, nil, err
	}
	geo, err := GeoJSON(f)
	if err != nil {
		return nil, nil, err
	}
	return []File{{PDFFile, pdf}, {JSONFile, js}, {CSVFile, csv}, {GeoJSONFile, geo}}, warnings, nil
}
