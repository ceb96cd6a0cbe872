package intake

import (
	"bytes"
	"encoding/binary"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
)

// FuzzReadCSV: any bytes given as a CSV file give readings or problems,
// never a panic; every problem is at a line of the file; every reading has
// an id and values in the survey's bounds, each written as text that the
// survey's own reader reads back as the same thickness.
func FuzzReadCSV(f *testing.F) {
	for _, s := range []string{
		"CML,Date,Thickness,Note\nA-1,2026-05-20,12.05,\"coat \"\"ok\"\"\nweld\"\nB-2,2026-05-20,9.5,\n",
		"CML;Date;Thickness (in)\nA;2026-05-20;0,375\n", "sep=;\nCML;2026-05-20;2021-05\nA;12,1 12,0;9\n",
		"TML\t12:00\t3:00\t6:00\t9:00\nE-2\t6.1\t6.2\t5.4\t6.0\n", "id,reading,unit\nA,9.1mm,\nB,0.4,in\nC,NaN,\nD,1e30,\n",
		"Gauge\n\nLocation ID,Value,Date\nN,8.12,2026-05-20T10:31:22\n", "CML,A1,A2\nP,\"1\n2\",3\n", "CML,x\n\"A,1\n",
		"CML,Thickness\n,12\nA,-\nB,LOS\n", "CML,2026-13-01\nA,1\n", "\xff\xfeC\x00M\x00L\x00", "CML,date,reading\nA,1899-12-31,5\n",
	} {
		f.Add([]byte(s))
	}
	f.Add(utf16With(binary.BigEndian, []byte{0xFE, 0xFF}, "CML;Datum;Wand\nA;2026-05-20;7,5\n"))
	date := visitDate("2026-05-20")
	f.Fuzz(func(t *testing.T, data []byte) {
		file, problems := Read("f.csv", data, Options{Units: survey.MM, Date: date})
		text, _, _, why := decodeText(data)
		lines := strings.Count(text, "\n") + 2 // a last line without an ending, and one after
		if why != "" {
			lines = bytes.Count(data, []byte("\n")) + 2
		}
		for _, p := range problems {
			if p.Place.File != "f.csv" || p.Place.Sheet != "" || p.Place.Row < 0 || p.Place.Row > lines {
				t.Fatalf("problem outside the file's %d lines: %v", lines, p)
			}
		}
		if file == nil {
			return
		}
		for _, r := range file.Readings {
			if strings.TrimSpace(r.CML) == "" || len(r.Values) == 0 || r.Place.Row < 1 || r.Place.Row > lines {
				t.Fatalf("reading %+v", r)
			}
			for _, v := range r.Values {
				if !(v.MM > 0 && v.MM <= survey.MaxThicknessMM) {
					t.Fatalf("%s: %v mm is out of bounds", r.Place, v.MM)
				}
				back, err := survey.ParseThicknesses(v.Text, survey.MM)
				if err != nil || len(back) != 1 || back[0] != v.MM {
					t.Fatalf("%s: %q written for %v mm reads back as %v (%v)", r.Place, v.Text, v.MM, back, err)
				}
			}
		}
	})
}
