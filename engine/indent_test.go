package engine

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"testing"
)

// TestIndentJSON: indentJSON writes the bytes json.MarshalIndent(v, "",
// " ") writes (the standard library is the reference), for nested
// objects and arrays, empty ones, strings with quotes, backslashes,
// brackets, commas and colons inside, escaped HTML and Unicode, and
// numbers of every size.
func TestIndentJSON(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	var gen func(depth int) any
	gen = func(depth int) any {
		switch k := r.IntN(8); {
		case depth > 4 || k == 0:
			return math.Ldexp(r.NormFloat64(), r.IntN(200)-100)
		case k == 1:
			return []string{`a"b`, `c\d`, `{[,:]}`, "<&>", "é\u2028", "", `\"`}[r.IntN(7)]
		case k == 2:
			return nil
		case k == 3:
			return map[string]any{}
		case k == 4:
			return []any{}
		case k == 5:
			return r.IntN(2) == 0
		case k == 6:
			m := map[string]any{}
			for i := r.IntN(4); i >= 0; i-- {
				m[string(rune('a'+r.IntN(26)))+`"k`] = gen(depth + 1)
			}
			return m
		default:
			s := make([]any, r.IntN(4))
			for i := range s {
				s[i] = gen(depth + 1)
			}
			return s
		}
	}
	var deep any = 1.5
	for i := 0; i < 140; i++ {
		deep = []any{deep, map[string]any{"k": i}}
	}
	want, _ := json.MarshalIndent(deep, "", " ")
	compact, _ := json.Marshal(deep)
	if got := indentJSON(nil, compact); !bytes.Equal(got, want) {
		t.Fatal("140 levels deep: not the bytes of json.MarshalIndent")
	}
	for i := 0; i < 500; i++ {
		v := map[string]any{"x": gen(0), "list": []any{gen(0), gen(0)}}
		want, err := json.MarshalIndent(v, "", " ")
		if err != nil {
			t.Fatal(err)
		}
		compact, _ := json.Marshal(v)
		if got := indentJSON(nil, compact); !bytes.Equal(got, want) {
			t.Fatalf("case %d:\n got %s\nwant %s", i, got, want)
		}
	}
}
