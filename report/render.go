package report

import "github.com/lossline/lossline/survey"

// Output file names.
const (
	PDFFile  = "report.pdf"
	JSONFile = "results.json"
	CSVFile  = "results.csv"
)

// Render produces every output in memory. The warnings returned are those
// raised while rendering (the survey's own are in s.Problems).
func Render(s *survey.Survey, items []*survey.Assessed, opts Options) ([]File, survey.ProblemList, error) {
	pdf, warnings, err := PDF(s, items, opts)
	if err != nil {
		return nil, nil, err
	}
	all := append(append(survey.ProblemList{}, s.Problems...), warnings...)
	res := BuildResults(s, items, survey.Changes(s, items, opts.Policy, opts.AccelerationPct), all)
	js, err := JSON(res)
	if err != nil {
		return nil, nil, err
	}
	csv, err := CSV(res, opts.Display.resolve(s.Units))
	if err != nil {
		return nil, nil, err
	}
	geo, err := GeoJSON(s, items)
	if err != nil {
		return nil, nil, err
	}
	return []File{{PDFFile, pdf}, {JSONFile, js}, {CSVFile, csv}, {GeoJSONFile, geo}}, warnings, nil
}
