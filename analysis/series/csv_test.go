package series

import (
	"errors"
	"math"
	"os"
	"strings"
	"testing"
)

func readString(t *testing.T, s string) (*Frame, error) {
	t.Helper()
	return ReadCSV(strings.NewReader(s), "t.csv")
}

func TestReadCSVMacrodata(t *testing.T) {
	fh, err := os.Open("../../testdata/data/macrodata.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	f, err := ReadCSV(fh, "macrodata.csv")
	if err != nil {
		t.Fatal(err)
	}
	// The file (exported by testdata/scripts/export_datasets.sh from
	// statsmodels' macrodata) has 203 quarters, 1959Q1–2009Q3, and 12
	// data columns; the first row's realgdp is 2710.349.
	if f.Freq != Quarterly || f.Len() != 203 || len(f.Names) != 12 {
		t.Fatalf("got %v, %d rows, %d columns", f.Freq, f.Len(), len(f.Names))
	}
	if f.Dates[0].String() != "1959Q1" || f.Dates[202].String() != "2009Q3" {
		t.Errorf("dates %v … %v", f.Dates[0], f.Dates[202])
	}
	v, ok := f.Column("realgdp")
	if !ok || v[0] != 2710.349 {
		t.Errorf("realgdp[0] = %v, %v", v, ok)
	}
	if f.Lines[0] != 2 || f.Lines[202] != 204 {
		t.Errorf("lines %d, %d", f.Lines[0], f.Lines[202])
	}
}

func TestReadCSVSmoke(t *testing.T) {
	f, err := readString(t, "date;x;y\r\n1990-01;1;NA\r\n1990-02;2,5;3\r\n")
	if err == nil {
		t.Fatalf("semicolon file with a decimal comma should fail, got %+v", f)
	}
	f, err = readString(t, "\xEF\xBB\xBFdate;x;y\r\n1990-01;1;NA\r\n1990-02;2.5;3\r\n")
	if err != nil {
		t.Fatal(err)
	}
	y, _ := f.Column("y")
	if f.Freq != Monthly || !math.IsNaN(y[0]) || y[1] != 3 {
		t.Errorf("got %v %v", f.Freq, y)
	}
	var de *DataError
	_, err = readString(t, "date,x\n1990Q1,1\n1990Q3,2\n")
	if !errors.As(err, &de) || err.Error() != "t.csv:3: column date: date 1990Q3 follows 1990Q1 (line 2): 1990Q2 is missing" {
		t.Errorf("got %v", err)
	}
}

func TestEvalSmoke(t *testing.T) {
	f, err := readString(t, "date,x,y\n1990,1,2\n1991,2,4\n1992,4,8\n")
	if err != nil {
		t.Fatal(err)
	}
	e, err := ParseExpr("dlog(x) + lag(y, 1)/2")
	if err != nil {
		t.Fatal(err)
	}
	s, err := Eval(e, f)
	if err != nil {
		t.Fatal(err)
	}
	if s.Name != "dlog(x) + lag(y, 1) / 2" || !math.IsNaN(s.Values[0]) || math.Abs(s.Values[1]-(math.Log(2)+1)) > 1e-15 {
		t.Errorf("got %q %v", s.Name, s.Values)
	}
	a, err := Align([]*Series{s})
	if err != nil || a.Len() != 2 || a.Dates[0].String() != "1991" {
		t.Errorf("align %+v %v", a, err)
	}
	w, err := ParseWindow("1991..")
	if err != nil {
		t.Fatal(err)
	}
	r, err := w.Apply(s)
	if err != nil || r.Len() != 2 {
		t.Errorf("window %+v %v", r, err)
	}
}

func stringsReader(s string) *strings.Reader { return strings.NewReader(s) }
