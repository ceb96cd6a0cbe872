package report

import (
	"bytes"
	"fmt"
	"io"
	"strings"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
)

// Output file names.
const (
	PDFFile    = "report.pdf"
	JSONFile   = "results.json"
	CSVFile    = "results.csv"
	PhotosFile = "photos.pdf" // the photos, with Options.PhotosApart
)

// Render produces every output in memory. The warnings returned are those
// raised while rendering (the survey's own are in Survey.Problems). A panic
// while rendering comes back as a RenderPanic naming the output.
func Render(f *findings.Findings, opts Options) ([]File, survey.ProblemList, error) {
	files, warnings := Streams(f, opts)
	for i := range files {
		var b bytes.Buffer
		if err := files[i].Write(&b); err != nil {
			return nil, nil, err
		}
		files[i].Data, files[i].Write = b.Bytes(), nil
	}
	return files, warnings(), nil
}

// Streams are the outputs as files that WriteFolder writes straight to
// their place, in order: report.pdf, photos.pdf (Options.PhotosApart), one
// detail PDF per asset (Options.Detail), results.json, results.csv and
// locations.geojson. Nothing is rendered until a file is written. warnings
// returns those raised while rendering the files written so far; results.json
// lists those of the PDFs before it.
func Streams(f *findings.Findings, opts Options) (files []File, warnings func() survey.ProblemList) {
	s := f.Survey
	var raised survey.ProblemList
	pdf := func(name string, write func(io.Writer) (survey.ProblemList, error)) File {
		return File{Name: name, Write: func(w io.Writer) error {
			return stage(name, func() error {
				ws, err := write(w)
				raised = append(raised, ws...)
				return err
			})
		}}
	}
	files = append(files, pdf(PDFFile, func(w io.Writer) (survey.ProblemList, error) { return WritePDF(w, f, opts) }))
	if opts.PhotosApart {
		files = append(files, pdf(PhotosFile, func(w io.Writer) (survey.ProblemList, error) { return WritePhotosPDF(w, f, opts) }))
	}
	if opts.Detail {
		names := DetailFiles(s.Assets)
		for i, a := range s.Assets {
			name := names[i]
			files = append(files, pdf(name, func(w io.Writer) (survey.ProblemList, error) {
				return nil, WriteAssetPDF(w, f, opts, a)
			}))
		}
	}
	files = append(files,
		File{Name: JSONFile, Write: func(w io.Writer) error {
			return stage(JSONFile, func() error {
				return WriteJSON(w, f, append(append(survey.ProblemList{}, s.Problems...), raised...))
			})
		}},
		File{Name: CSVFile, Write: func(w io.Writer) error {
			return stage(CSVFile, func() error { return WriteCSV(w, f, opts.Display.resolve(s.Units)) })
		}},
		File{Name: GeoJSONFile, Write: func(w io.Writer) error {
			return stage(GeoJSONFile, func() error { return writeBytes(w)(GeoJSON(f)) })
		}},
		File{Name: ActionsCSVFile, Write: func(w io.Writer) error {
			return stage(ActionsCSVFile, func() error { return writeBytes(w)(ActionsCSV(Results{Actions: actionsOf(f)})) })
		}},
		File{Name: ElectroCSVFile, Write: func(w io.Writer) error {
			return stage(ElectroCSVFile, func() error {
				var r Results
				r.Electro, _ = electroResults(f)
				return writeBytes(w)(ElectroCSV(r))
			})
		}},
	)
	return files, func() survey.ProblemList { return raised }
}

// writeBytes writes what a renderer returned, or its error.
func writeBytes(w io.Writer) func([]byte, error) error {
	return func(b []byte, err error) error {
		if err == nil {
			_, err = w.Write(b)
		}
		return err
	}
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
