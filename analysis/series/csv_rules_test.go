package series

import (
	"math"
	"testing"
)

// Each case is a small file written for the rule it checks; the
// expected values follow from the rule by hand.
func TestReadCSVGood(t *testing.T) {
	tests := []struct {
		name, in    string
		freq        Freq
		names       []string
		first, last string
		lines       []int
		col         string
		vals        []float64 // NaN = missing
	}{
		{"annual comma", "date,x\n1990,1\n1991,2\n", Annual, []string{"x"}, "1990", "1991", []int{2, 3}, "x", []float64{1, 2}},
		{"quarterly Q", "date,x\n1990Q4,1\n1991Q1,2\n", Quarterly, []string{"x"}, "1990Q4", "1991Q1", nil, "x", []float64{1, 2}},
		{"quarterly -Q", "period,x\n1990-Q4,1\n1991-q1,2\n", Quarterly, []string{"x"}, "1990Q4", "1991Q1", nil, "x", []float64{1, 2}},
		{"quarterly lower", "date,x\n1990q1,1\n1990q2,2\n", Quarterly, []string{"x"}, "1990Q1", "1990Q2", nil, "x", []float64{1, 2}},
		{"monthly dash", "date,x\n1990-12,1\n1991-01,2\n", Monthly, []string{"x"}, "1990-12", "1991-01", nil, "x", []float64{1, 2}},
		{"monthly M", "date,x\n1990M11,1\n1990m12,2\n1991M1,3\n", Monthly, []string{"x"}, "1990-11", "1991-01", nil, "x", []float64{1, 2, 3}},
		{"daily skips days", "date,x\n2020-02-28,1\n2020-03-02,2\n", Daily, []string{"x"}, "2020-02-28", "2020-03-02", nil, "x", []float64{1, 2}},
		{"semicolon", "date;x;y\n1990;1;2\n1991;3;4\n", Annual, []string{"x", "y"}, "1990", "1991", nil, "y", []float64{2, 4}},
		{"tab", "date\tx\ty\n1990\t1\t2\n1991\t3\t4\n", Annual, []string{"x", "y"}, "1990", "1991", nil, "x", []float64{1, 3}},
		{"BOM and CRLF", "\xEF\xBB\xBFdate,x\r\n1990,1\r\n1991,2\r\n", Annual, []string{"x"}, "1990", "1991", nil, "x", []float64{1, 2}},
		{"missing marks", "date,x\n1990,\n1991,NA\n1992,na\n1993,.\n1994,NaN\n1995,nan\n1996, 7 \n", Annual, []string{"x"}, "1990", "1996", nil, "x", []float64{nan, nan, nan, nan, nan, nan, 7}},
		{"numbers", "date,x\n1990,-1.5e3\n1991,+.25\n1992,3.\n1993,1E-2\n", Annual, []string{"x"}, "1990", "1993", nil, "x", []float64{-1500, 0.25, 3, 0.01}},
		{"date column not first", "x,Date,y\n1,1990Q1,2\n3,1990Q2,4\n", Quarterly, []string{"x", "y"}, "1990Q1", "1990Q2", nil, "y", []float64{2, 4}},
		{"TIME any case", "x,TIME\n1,1990\n3,1991\n", Annual, []string{"x"}, "1990", "1991", nil, "x", []float64{1, 3}},
		{"unnamed first column", ",x\n1990,1\n1991,2\n", Annual, []string{"x"}, "1990", "1991", nil, "x", []float64{1, 2}},
		{"first column quarterly by value", "when,x\n1990Q1,1\n1990Q2,2\n", Quarterly, []string{"x"}, "1990Q1", "1990Q2", nil, "x", []float64{1, 2}},
		{"undated", "x,y\n1990,5\n1,6\n3,7\n", Undated, []string{"x", "y"}, "1", "3", []int{2, 3, 4}, "x", []float64{1990, 1, 3}},
		{"blank lines skipped", "date,x\n\n1990,1\n\n1991,2\n\n", Annual, []string{"x"}, "1990", "1991", []int{3, 5}, "x", []float64{1, 2}},
		{"quoted fields", "\"date\",\"a,b\"\n\"1990\",\"1\"\n", Annual, []string{"a,b"}, "1990", "1990", nil, "a,b", []float64{1}},
		{"no final newline", "date,x\n1990,1", Annual, []string{"x"}, "1990", "1990", nil, "x", []float64{1}},
		{"comma wins tie", "date,x;y\n1990,1\n", Annual, []string{"x;y"}, "1990", "1990", nil, "x;y", []float64{1}},
	}
	for _, tc := range tests {
		f, err := readString(t, tc.in)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		if f.Freq != tc.freq || !equalStrings(f.Names, tc.names) {
			t.Errorf("%s: freq %v names %q", tc.name, f.Freq, f.Names)
		}
		if f.Dates[0].String() != tc.first || f.Dates[f.Len()-1].String() != tc.last {
			t.Errorf("%s: dates %v…%v", tc.name, f.Dates[0], f.Dates[f.Len()-1])
		}
		if tc.lines != nil && !equalInts(f.Lines, tc.lines) {
			t.Errorf("%s: lines %v, want %v", tc.name, f.Lines, tc.lines)
		}
		v, ok := f.Column(tc.col)
		if !ok || !equalFloats(v, tc.vals) {
			t.Errorf("%s: %s = %v, want %v", tc.name, tc.col, v, tc.vals)
		}
	}
}

func TestReadCSVBad(t *testing.T) {
	tests := []struct{ name, in, want string }{
		{"empty", "", "t.csv: empty file: expected a header row naming the columns"},
		{"only BOM", "\xEF\xBB\xBF", "t.csv: empty file: expected a header row naming the columns"},
		{"header only", "date,x\n", "t.csv: no data rows below the header"},
		{"header not UTF-8", "date,gr\xf6sse\n1990,1\n", "t.csv:1: header: column 2: name is not valid UTF-8 text (save the file as UTF-8)"},
		{"unnamed column", "date,,y\n1990,1,2\n", "t.csv:1: header: column 2 has no name"},
		{"duplicate name", "date,x,y,x\n1990,1,2,3\n", `t.csv:1: header: name "x" is used by columns 2 and 4`},
		{"too few fields", "date,x,y\n1990,1,2\n1991,1\n", "t.csv:3: row has 2 fields but the header (line 1) has 3"},
		{"too many fields", "date,x\n1990,1,2\n", "t.csv:2: row has 3 fields but the header (line 1) has 2"},
		{"text value", "date,x,y\n1990,1,2\n1991,1,abc\n", `t.csv:3: column y: not a number: "abc"`},
		{"thousands separator", "date;x\n1990;1,000\n", `t.csv:2: column x: not a number: "1,000"`},
		{"hex", "date,x\n1990,0x10\n", `t.csv:2: column x: not a number: "0x10"`},
		{"underscore digits", "date,x\n1990,1_000\n", `t.csv:2: column x: not a number: "1_000"`},
		{"Inf", "date,x\n1990,Inf\n", `t.csv:2: column x: infinite value "Inf" (write an empty cell or NA for a missing value)`},
		{"-infinity", "date,x\n1990,-Infinity\n", `t.csv:2: column x: infinite value "-Infinity" (write an empty cell or NA for a missing value)`},
		{"overflow", "date,x\n1990,1\n1991,1e999\n", "t.csv:3: column x: value 1e999 is too large for a 64-bit float"},
		{"bad date", "date,x\n1990,1\n199x,2\n", `t.csv:3: column date: invalid date "199x": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
		{"missing date", "date,x\n1990,1\n,2\n", "t.csv:3: column date: date is missing"},
		{"impossible day", "date,x\n2021-02-29,1\n", `t.csv:2: column date: invalid date "2021-02-29": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
		{"quarter 5", "date,x\n1990Q5,1\n", `t.csv:2: column date: invalid date "1990Q5": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
		{"mixed frequency", "date,x\n1990Q1,1\n1990Q2,2\n1990-07,3\n", "t.csv:4: column date: date 1990-07 is monthly but the dates above are quarterly (first on line 2)"},
		{"skipped quarter", "date,x\n1990Q1,1\n1990Q3,2\n", "t.csv:3: column date: date 1990Q3 follows 1990Q1 (line 2): 1990Q2 is missing"},
		{"skipped months", "date,x\n1990-01,1\n1990-05,2\n", "t.csv:3: column date: date 1990-05 follows 1990-01 (line 2): 1990-02 to 1990-04 (3 periods) is missing"},
		{"skipped year", "date,x\n1990,1\n1992,2\n", "t.csv:3: column date: date 1992 follows 1990 (line 2): 1991 is missing"},
		{"duplicate adjacent", "date,x\n1990Q1,1\n1990Q2,2\n1990Q2,3\n", "t.csv:4: column date: date 1990Q2 appears twice, on lines 3 and 4"},
		{"duplicate earlier", "date,x\n1990,1\n1991,2\n1990,3\n", "t.csv:4: column date: date 1990 appears twice, on lines 2 and 4"},
		{"decreasing daily", "date,x\n2020-01-02,1\n2020-01-05,2\n2020-01-03,3\n", "t.csv:4: column date: date 2020-01-03 comes after 2020-01-05 (line 3): dates must increase"},
		{"duplicate daily", "date,x\n2020-01-02,1\n2020-01-02,2\n", "t.csv:3: column date: date 2020-01-02 appears twice, on lines 2 and 3"},
		{"unclosed quote", "date,x\n1990,1\n1991,\"2\n", "t.csv:3: malformed row: extraneous or missing \" in quoted-field"},
		{"bare quote", "date,x\n1990,1\n1991,2\"\n", "t.csv:3: malformed row: bare \" in non-quoted-field"},
		{"unnamed date column", ",x\n1990,1\nabc,2\n", `t.csv:3: column 1 (dates): invalid date "abc": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
	}
	for _, tc := range tests {
		_, err := readString(t, tc.in)
		if err == nil {
			t.Errorf("%s: no error, want %s", tc.name, tc.want)
			continue
		}
		if _, ok := err.(*DataError); !ok {
			t.Errorf("%s: error is %T, want *DataError", tc.name, err)
		}
		if err.Error() != tc.want {
			t.Errorf("%s:\n got %s\nwant %s", tc.name, err, tc.want)
		}
	}
}

func TestDataErrorFormat(t *testing.T) {
	tests := []struct {
		e    DataError
		want string
	}{
		{DataError{"a.csv", 7, "x", "bad"}, "a.csv:7: column x: bad"},
		{DataError{"a.csv", 7, "", "bad"}, "a.csv:7: bad"},
		{DataError{"a.csv", 0, "x", "bad"}, "a.csv: column x: bad"},
		{DataError{"", 7, "x", "bad"}, "line 7: column x: bad"},
		{DataError{"", 0, "", "bad"}, "bad"},
	}
	for _, tc := range tests {
		if got := tc.e.Error(); got != tc.want {
			t.Errorf("got %q, want %q", got, tc.want)
		}
	}
}

func TestFrameLookup(t *testing.T) {
	f, err := readString(t, "date,GDP,cons_real,infl\n1990,1,2,3\n1991,4,5,6\n")
	if err != nil {
		t.Fatal(err)
	}
	if !f.Has("GDP") || f.Has("gdp") || f.Len() != 2 {
		t.Error("Has/Len")
	}
	if _, ok := f.Column("nope"); ok {
		t.Error("Column of unknown name")
	}
	v, _ := f.Column("infl")
	v[0] = 99
	if w, _ := f.Column("infl"); w[0] != 3 {
		t.Error("Column must return a copy")
	}
	for _, tc := range []struct{ in, want string }{
		{"gdp", "GDP"}, {"gpd", "GDP"}, {"cons_rael", "cons_real"}, {"consreal", "cons_real"},
		{"inlf", "infl"}, {"population", ""}, {"zz", ""},
	} {
		if got := f.Closest(tc.in); got != tc.want {
			t.Errorf("Closest(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
	if f.LineOf(f.Dates[1]) != 3 || f.LineOf(Date{Freq: Annual, Year: 2000, Sub: 1}) != 0 {
		t.Error("LineOf")
	}
}

var nan = math.NaN()

func equalFloats(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.IsNaN(a[i]) != math.IsNaN(b[i]) || (!math.IsNaN(a[i]) && a[i] != b[i]) {
			return false
		}
	}
	return true
}

func equalStrings(a, b []string) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
