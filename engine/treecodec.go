package engine

import (
	"encoding/binary"
	"errors"
	"math"
)

// The tree codec stores the free-form values of a result (Values, Spec,
// Test.Extra: trees of maps, lists and scalars) in the result cache
// faster than gob, which looks up the type of every interface value it
// decodes. It keeps each value's Go type and nil-ness exactly (a nil
// list stays nil, an empty one empty; floats bit for bit), and knows the
// types results hold; a tree with any other type is refused
// (errTreeType), and the cache then stores that entry through gob as
// before.

var errTreeType = errors.New("engine: a value of a type the tree codec does not know")

const (
	tagNil = iota
	tagFalse
	tagTrue
	tagInt
	tagFloat
	tagString
	tagList     // []any
	tagMap      // map[string]any
	tagMaps     // []map[string]any
	tagFloats   // []float64
	tagStrings  // []string
	tagInts     // []int
	tagBools    // []bool
	tagMatrix   // [][]float64
	tagFloatMap // map[string]float64
	tagNilOf    // a nil list or map: the tag of its type follows
	tagUint     // uint64 (a bootstrap's seed)
)

// appendTree appends the encoding of v to b.
func appendTree(b []byte, v any) ([]byte, error) {
	var err error
	switch x := v.(type) {
	case nil:
		return append(b, tagNil), nil
	case bool:
		if x {
			return append(b, tagTrue), nil
		}
		return append(b, tagFalse), nil
	case int:
		return binary.AppendVarint(append(b, tagInt), int64(x)), nil
	case uint64:
		return binary.AppendUvarint(append(b, tagUint), x), nil
	case float64:
		return binary.LittleEndian.AppendUint64(append(b, tagFloat), math.Float64bits(x)), nil
	case string:
		return appendStr(append(b, tagString), x), nil
	case []any:
		if x == nil {
			return append(b, tagNilOf, tagList), nil
		}
		b = binary.AppendUvarint(append(b, tagList), uint64(len(x)))
		for _, e := range x {
			if b, err = appendTree(b, e); err != nil {
				return nil, err
			}
		}
		return b, nil
	case map[string]any:
		if x == nil {
			return append(b, tagNilOf, tagMap), nil
		}
		b = binary.AppendUvarint(append(b, tagMap), uint64(len(x)))
		for k, e := range x {
			b = appendStr(b, k)
			if b, err = appendTree(b, e); err != nil {
				return nil, err
			}
		}
		return b, nil
	case []map[string]any:
		if x == nil {
			return append(b, tagNilOf, tagMaps), nil
		}
		b = binary.AppendUvarint(append(b, tagMaps), uint64(len(x)))
		for _, e := range x {
			if b, err = appendTree(b, e); err != nil {
				return nil, err
			}
		}
		return b, nil
	case []float64:
		if x == nil {
			return append(b, tagNilOf, tagFloats), nil
		}
		return appendFloats(append(b, tagFloats), x), nil
	case []string:
		if x == nil {
			return append(b, tagNilOf, tagStrings), nil
		}
		b = binary.AppendUvarint(append(b, tagStrings), uint64(len(x)))
		for _, s := range x {
			b = appendStr(b, s)
		}
		return b, nil
	case []int:
		if x == nil {
			return append(b, tagNilOf, tagInts), nil
		}
		b = binary.AppendUvarint(append(b, tagInts), uint64(len(x)))
		for _, n := range x {
			b = binary.AppendVarint(b, int64(n))
		}
		return b, nil
	case []bool:
		if x == nil {
			return append(b, tagNilOf, tagBools), nil
		}
		b = binary.AppendUvarint(append(b, tagBools), uint64(len(x)))
		for _, t := range x {
			if t {
				b = append(b, 1)
			} else {
				b = append(b, 0)
			}
		}
		return b, nil
	case [][]float64:
		if x == nil {
			return append(b, tagNilOf, tagMatrix), nil
		}
		b = binary.AppendUvarint(append(b, tagMatrix), uint64(len(x)))
		for _, r := range x {
			if r == nil {
				b = append(b, 0)
				continue
			}
			b = appendFloats(append(b, 1), r)
		}
		return b, nil
	case map[string]float64:
		if x == nil {
			return append(b, tagNilOf, tagFloatMap), nil
		}
		b = binary.AppendUvarint(append(b, tagFloatMap), uint64(len(x)))
		for k, f := range x {
			b = binary.LittleEndian.AppendUint64(appendStr(b, k), math.Float64bits(f))
		}
		return b, nil
	}
	return nil, errTreeType
}

func appendStr(b []byte, s string) []byte {
	return append(binary.AppendUvarint(b, uint64(len(s))), s...)
}

func appendFloats(b []byte, x []float64) []byte {
	b = binary.AppendUvarint(b, uint64(len(x)))
	for _, f := range x {
		b = binary.LittleEndian.AppendUint64(b, math.Float64bits(f))
	}
	return b
}

// treeReader decodes what appendTree wrote; a malformed input sets err
// (a damaged cache entry is then ignored).
type treeReader struct {
	b   []byte
	err error
	// strs, if not nil, holds the short strings read so far, so that a
	// key or value met again (field names, dates) is not allocated again
	strs map[string]string
}

var errTreeData = errors.New("engine: malformed tree data")

func (r *treeReader) fail() {
	if r.err == nil {
		r.err = errTreeData
	}
	r.b = nil
}

func (r *treeReader) byte() byte {
	if len(r.b) == 0 {
		r.fail()
		return 0
	}
	c := r.b[0]
	r.b = r.b[1:]
	return c
}

// count reads a length, bounded by the bytes left (each element takes
// at least min bytes), so that damaged data cannot ask for a huge slice.
func (r *treeReader) count(min int) int {
	n, k := binary.Uvarint(r.b)
	if k <= 0 || n > uint64(len(r.b)-k)/uint64(min) {
		r.fail()
		return 0
	}
	r.b = r.b[k:]
	return int(n)
}

func (r *treeReader) int() int {
	n, k := binary.Varint(r.b)
	if k <= 0 {
		r.fail()
		return 0
	}
	r.b = r.b[k:]
	return int(n)
}

func (r *treeReader) float() float64 {
	if len(r.b) < 8 {
		r.fail()
		return 0
	}
	f := math.Float64frombits(binary.LittleEndian.Uint64(r.b))
	r.b = r.b[8:]
	return f
}

func (r *treeReader) str() string {
	n := r.count(1)
	if r.err != nil {
		return ""
	}
	b := r.b[:n]
	r.b = r.b[n:]
	if r.strs == nil || n > 32 {
		return string(b)
	}
	if s, ok := r.strs[string(b)]; ok {
		return s
	}
	s := string(b)
	r.strs[s] = s
	return s
}

func (r *treeReader) floats() []float64 {
	n := r.count(8)
	out := make([]float64, n)
	for i := range out {
		out[i] = r.float()
	}
	return out
}

func (r *treeReader) value() any {
	if r.err != nil {
		return nil
	}
	switch tag := r.byte(); tag {
	case tagNil:
		return nil
	case tagFalse:
		return false
	case tagTrue:
		return true
	case tagInt:
		return r.int()
	case tagUint:
		n, k := binary.Uvarint(r.b)
		if k <= 0 {
			r.fail()
			return nil
		}
		r.b = r.b[k:]
		return n
	case tagFloat:
		return r.float()
	case tagString:
		return r.str()
	case tagList:
		out := make([]any, r.count(1))
		for i := range out {
			out[i] = r.value()
		}
		return out
	case tagMap:
		return r.mapValue()
	case tagMaps:
		out := make([]map[string]any, r.count(1))
		for i := range out {
			m, ok := r.value().(map[string]any)
			if !ok {
				r.fail()
				return nil
			}
			out[i] = m
		}
		return out
	case tagFloats:
		return r.floats()
	case tagStrings:
		out := make([]string, r.count(1))
		for i := range out {
			out[i] = r.str()
		}
		return out
	case tagInts:
		out := make([]int, r.count(1))
		for i := range out {
			out[i] = r.int()
		}
		return out
	case tagBools:
		out := make([]bool, r.count(1))
		for i := range out {
			out[i] = r.byte() == 1
		}
		return out
	case tagMatrix:
		out := make([][]float64, r.count(1))
		for i := range out {
			if r.byte() == 1 {
				out[i] = r.floats()
			}
		}
		return out
	case tagFloatMap:
		n := r.count(9)
		out := make(map[string]float64, n)
		for i := 0; i < n; i++ {
			k := r.str()
			out[k] = r.float()
		}
		return out
	case tagNilOf:
		switch r.byte() {
		case tagList:
			return []any(nil)
		case tagMap:
			return map[string]any(nil)
		case tagMaps:
			return []map[string]any(nil)
		case tagFloats:
			return []float64(nil)
		case tagStrings:
			return []string(nil)
		case tagInts:
			return []int(nil)
		case tagBools:
			return []bool(nil)
		case tagMatrix:
			return [][]float64(nil)
		case tagFloatMap:
			return map[string]float64(nil)
		}
	}
	r.fail()
	return nil
}

func (r *treeReader) mapValue() map[string]any {
	n := r.count(2)
	out := make(map[string]any, n)
	for i := 0; i < n && r.err == nil; i++ {
		k := r.str()
		out[k] = r.value()
	}
	return out
}
