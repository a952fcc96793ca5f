package engine

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

// TestTreeCodecRoundTrip: every type results hold comes back with its
// Go type, its nil-ness and its floats bit for bit (NaN, −0, ±Inf
// included); an unknown type is refused; damaged data is an error, not
// a panic.
func TestTreeCodecRoundTrip(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	var gen func(depth int) any
	gen = func(depth int) any {
		k := r.IntN(26)
		if depth > 3 {
			k %= 6
		}
		switch k {
		case 0:
			return nil
		case 1:
			return r.IntN(2) == 0
		case 2:
			return r.IntN(2000) - 1000
		case 3:
			return []float64{math.Copysign(0, -1), math.Inf(1), math.Inf(-1), 1e-300, r.NormFloat64()}[r.IntN(5)]
		case 4:
			return []string{"", "x", "é\x00\"", "long string with spaces"}[r.IntN(4)]
		case 5:
			return math.Ldexp(r.Float64(), r.IntN(100)-50)
		case 6:
			return []any(nil)
		case 7, 8:
			out := make([]any, r.IntN(4))
			for i := range out {
				out[i] = gen(depth + 1)
			}
			return out
		case 9:
			return map[string]any(nil)
		case 10, 11:
			m := map[string]any{}
			for i := r.IntN(4); i > 0; i-- {
				m[string(rune('a'+r.IntN(26)))] = gen(depth + 1)
			}
			return m
		case 12:
			return []map[string]any{{"a": 1.5}, nil, {}}
		case 13:
			return []float64{}
		case 14:
			return []float64{1, 2.5, -3}
		case 15:
			return []string{"a", ""}
		case 16:
			return []int{-1, 0, 1 << 40}
		case 17:
			return []bool{true, false}
		case 18:
			return [][]float64{{1}, nil, {}}
		case 19:
			return map[string]float64{"a": 1, "b": -0.5}
		case 20:
			return []int(nil)
		case 21:
			return [][]float64(nil)
		case 22:
			return []string{}
		case 23:
			return map[string]float64(nil)
		case 24:
			if r.IntN(2) == 0 {
				return r.Uint64() >> r.IntN(64)
			}
			return []bool(nil)
		default:
			return []map[string]any(nil)
		}
	}
	for i := 0; i < 2000; i++ {
		v := gen(0)
		b, err := appendTree(nil, v)
		if err != nil {
			t.Fatal(err)
		}
		rd := treeReader{b: b}
		got := rd.value()
		if rd.err != nil || len(rd.b) != 0 || !reflect.DeepEqual(got, v) {
			t.Fatalf("case %d: %#v came back as %#v (%v)", i, v, got, rd.err)
		}
		// damaged: every truncation is an error, never a panic
		for cut := 0; cut < len(b); cut++ {
			rd := treeReader{b: b[:cut]}
			rd.value()
			if rd.err == nil {
				t.Fatalf("case %d: a truncation at %d of %d bytes decoded", i, cut, len(b))
			}
		}
	}
	// floats bit for bit, NaN included (DeepEqual cannot see NaN)
	nan := math.Float64frombits(0x7ff8000000000123)
	b, _ := appendTree(nil, []any{nan, []float64{nan}, map[string]float64{"x": nan}})
	rd := treeReader{b: b}
	l := rd.value().([]any)
	if math.Float64bits(l[0].(float64)) != 0x7ff8000000000123 || math.Float64bits(l[1].([]float64)[0]) != 0x7ff8000000000123 ||
		math.Float64bits(l[2].(map[string]float64)["x"]) != 0x7ff8000000000123 {
		t.Error("NaN payload lost")
	}
	if _, err := appendTree(nil, map[string]any{"x": struct{}{}}); err != errTreeType {
		t.Errorf("unknown type: %v", err)
	}
}
