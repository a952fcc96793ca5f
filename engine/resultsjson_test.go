package engine

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"github.com/galley-econ/galley/resultsfile"
)

// TestResultsWriterMatchesEncodingJSON: the direct writer gives the
// bytes of JsonSafe and json.MarshalIndent(rf, "", " ") (the standard
// library is the reference) for files of random records: every type
// results hold, nil and empty lists and maps, non-finite numbers,
// numbers of every size, strings that need escaping; and gives up on a
// type it does not know. readerFile gives what resultsfile.Parse reads
// back from those bytes, and gives up where the writer does.
func TestResultsWriterMatchesEncodingJSON(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	strs := []string{"", "plain", `q"b\s`, "<&>", "tab\tnl\ncr\r", "\x00\x01\x1f\x7f", "\b\f", "é ü ∆", "\u2028\u2029", "bad\xff\xfeutf8", "Δlog(north)ₜ₋₁"}
	num := func() float64 {
		switch r.IntN(8) {
		case 0:
			return math.NaN()
		case 1:
			return math.Inf(1 - 2*r.IntN(2))
		case 2:
			return math.Copysign(0, -1)
		case 3:
			return float64(r.IntN(100))
		default:
			return math.Ldexp(r.NormFloat64(), r.IntN(160)-80)
		}
	}
	var gen func(depth int, safe bool) any
	gen = func(depth int, safe bool) any {
		k := r.IntN(20)
		if depth > 3 {
			k %= 5
		}
		switch k {
		case 0:
			return nil
		case 1:
			return r.IntN(2) == 0
		case 2:
			switch r.IntN(3) {
			case 0:
				return int64(r.Uint64() >> r.IntN(64))
			case 1:
				return r.Uint64() >> r.IntN(64) // seeds: up to 2⁶⁴ − 1
			}
			return r.IntN(20001) - 10000
		case 3:
			return strs[r.IntN(len(strs))]
		case 4:
			if !safe {
				return math.Ldexp(r.NormFloat64(), r.IntN(160)-80)
			}
			return num()
		case 5:
			if !safe {
				return []float64{1.5, 1e-7, 1e22}
			}
			x := make([]float64, r.IntN(4))
			for i := range x {
				x[i] = num()
			}
			return x
		case 6:
			return []float64(nil)
		case 7, 8:
			x := make([]any, r.IntN(4))
			for i := range x {
				x[i] = gen(depth+1, safe)
			}
			return x
		case 9:
			return []any(nil)
		case 10, 11:
			m := map[string]any{}
			for i := r.IntN(4); i > 0; i-- {
				m[strs[r.IntN(len(strs))]+string(rune('a'+r.IntN(26)))] = gen(depth+1, safe)
			}
			return m
		case 12:
			return map[string]any(nil)
		case 13:
			return []map[string]any{{"a": gen(depth+1, safe)}, nil, {}}
		case 14:
			return []map[string]any(nil)
		case 15:
			return []string{"a", strs[r.IntN(len(strs))]}
		case 16:
			return []string(nil)
		case 17:
			return []int{-3, 0, 7}
		case 18:
			switch r.IntN(3) {
			case 0:
				return []bool(nil)
			case 1:
				return []bool{true, false, r.IntN(2) == 0}
			}
			return []int(nil)
		default:
			return []string{}
		}
	}
	for n := 0; n < 300; n++ {
		rf := resultsfile.File{Galley: "0.1.0 <x>", Manuscript: strs[r.IntN(len(strs))], Inputs: []resultsfile.Input{}}
		if r.IntN(2) == 0 {
			rf.Vintage = "v1"
			rf.Inputs = append(rf.Inputs, resultsfile.Input{Path: "d.csv", SHA256: "ab", Alias: strs[r.IntN(len(strs))]}, resultsfile.Input{Path: "e.csv"})
		}
		for i := r.IntN(4); i >= 0; i-- {
			rec := resultsfile.Record{ID: "t" + string(rune('a'+i)), Kind: "adf", Line: r.IntN(300), Number: r.IntN(3), Label: strs[r.IntN(3)], Caption: strs[r.IntN(len(strs))],
				Spec: map[string]any{"series": gen(1, false), "lags": r.IntN(5)}, Values: map[string]any{}}
			if r.IntN(2) == 0 {
				rec.Hidden = []string{"a", "b"}
			}
			if r.IntN(3) == 0 {
				rec.Quoted = []string{}
			}
			for j := r.IntN(5); j >= 0; j-- {
				rec.Values[string(rune('a'+r.IntN(26)))] = gen(0, true)
			}
			if r.IntN(10) == 0 {
				rec.Values = nil
			}
			rf.Results = append(rf.Results, rec)
		}
		got, ok := appendResultsFile(nil, &rf)
		if !ok {
			t.Fatalf("file %d: the writer gave up", n)
		}
		ref := rf
		ref.Results = append([]resultsfile.Record(nil), rf.Results...)
		for i := range ref.Results {
			ref.Results[i].Values = JsonSafe(ref.Results[i].Values).(map[string]any)
		}
		want, err := json.MarshalIndent(ref, "", " ")
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got, want) {
			t.Fatalf("file %d:\n got %s\nwant %s", n, got, want)
		}
		// the reader's form made directly: what Parse reads back
		if rf.Galley != "" && len(rf.Results) > 0 {
			back, err := resultsfile.Parse(got, "f")
			if err != nil {
				t.Fatal(err)
			}
			direct, ok := readerFile(&rf)
			if !ok {
				t.Fatalf("file %d: readerFile gave up where the writer did not", n)
			}
			direct.Path = "f"
			if !reflect.DeepEqual(direct, back) {
				t.Fatalf("file %d: readerFile\n%#v\nread back\n%#v", n, direct, back)
			}
		}
	}
	for _, v := range []any{[][]float64{{1}}, map[string]float64{"a": 1}, int32(3), struct{}{}} {
		rf := resultsfile.File{Results: []resultsfile.Record{{Values: map[string]any{"x": v}}}}
		if _, ok := appendResultsFile(nil, &rf); ok {
			t.Errorf("%T: written, should be left to encoding/json", v)
		}
		if _, ok := readerFile(&rf); ok {
			t.Errorf("%T: readerFile did not give up", v)
		}
	}
	rf := resultsfile.File{Results: []resultsfile.Record{{Spec: map[string]any{"x": math.NaN()}}}}
	if _, ok := appendResultsFile(nil, &rf); ok {
		t.Error("a NaN in a spec was written")
	}
	if _, ok := readerFile(&rf); ok {
		t.Error("readerFile took a NaN in a spec")
	}
}

// TestResultsWriterLongLists: lists of numbers and strings long enough to
// be written in runs on several goroutines (writeLeaves) give the bytes
// of json.MarshalIndent, for one to three runs and lengths on both sides
// of the cuts; a non-finite number in a list that must stay finite (a
// spec) makes the writer give up whichever run holds it.
func TestResultsWriterLongLists(t *testing.T) {
	defer func(f func() int) { leafRuns = f }(leafRuns)
	r := rand.New(rand.NewPCG(11, 12))
	strs := []string{"2001-03", "<&>", "q\"b", "é"}
	for _, runs := range []int{1, 2, 3} {
		leafRuns = func() int { return runs }
		for _, n := range []int{longList - 1, 2 * longList, 3*longList + 1} {
			x, s := make([]float64, n), make([]string, n)
			for i := range x {
				x[i] = math.Ldexp(r.NormFloat64(), r.IntN(100)-50)
				s[i] = strs[r.IntN(len(strs))]
			}
			x[n-1], x[n/2] = math.NaN(), math.Inf(-1)
			rf := resultsfile.File{Galley: "v", Inputs: []resultsfile.Input{}, Results: []resultsfile.Record{{ID: "a", Kind: "k",
				Spec: map[string]any{"dates": s}, Values: map[string]any{"x": x, "dates": s, "y": []any{x[:n-2]}}}}}
			got, ok := appendResultsFile(nil, &rf)
			if !ok {
				t.Fatalf("runs %d, n %d: the writer gave up", runs, n)
			}
			ref := rf
			ref.Results = []resultsfile.Record{rf.Results[0]}
			ref.Results[0].Values = JsonSafe(rf.Results[0].Values).(map[string]any)
			want, err := json.MarshalIndent(ref, "", " ")
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.Equal(got, want) {
				t.Fatalf("runs %d, n %d: not the bytes of json.MarshalIndent", runs, n)
			}
			rf.Results[0].Spec = map[string]any{"x": x}
			if _, ok := appendResultsFile(nil, &rf); ok {
				t.Fatalf("runs %d, n %d: a NaN in the spec was written", runs, n)
			}
		}
	}
}
