package engine

import (
	"bytes"
	"encoding/gob"
	"reflect"
	"testing"

	"github.com/galley-econ/galley/engine/contract"
)

// TestPackBlobs: figure bytes stored in the pack's byte section come
// back in place, nil and empty kept apart; offsets outside the section
// make the entry unreadable.
func TestPackBlobs(t *testing.T) {
	res := &Result{ID: "f", Figure: &Figure{Caption: "c", SVG: []byte("<svg/>"), PDF: []byte{}, PNG: nil}}
	e := gobEntry("v", "s", "k", nil, nil, res)
	if e.Result.Figure.SVG != nil || res.Figure.SVG == nil {
		t.Fatal("the entry must hold the bytes apart, the result keep them")
	}
	blob := placeBlobs([]*cacheEntry{e}, 0)
	got := &cacheEntry{Blobs: e.Blobs, Result: &Result{Figure: &Figure{}}}
	if !got.takeBlobs(blob) {
		t.Fatal("blobs refused")
	}
	if string(got.blobs[0]) != "<svg/>" || got.blobs[1] == nil || len(got.blobs[1]) != 0 || got.blobs[2] != nil {
		t.Errorf("blobs %q", got.blobs)
	}
	bad := &cacheEntry{Blobs: []int{0, 7, 0, 0, 0, -1}, Result: &Result{Figure: &Figure{}}}
	if bad.takeBlobs(blob) {
		t.Error("a blob past the section was accepted")
	}
}

// TestPackBreaks: a result whose test carries break dates (as
// gregory-hansen's does, in Outcome.Extra) can be stored and comes back
// with them; gob refused the type before it was registered, and the
// whole pack then went unwritten.
func TestPackBreaks(t *testing.T) {
	registerGob() // as the pack's reader and writer do before gob runs
	breaks := []contract.Break{{Label: "ADF*", Date: "1990Q3", Index: 17}}
	res := &Result{ID: "gh", Values: map[string]any{"stat": -5.1}, Test: &contract.Outcome{Extra: map[string]any{contract.BreaksKey: breaks}}}
	var buf bytes.Buffer
	if err := gob.NewEncoder(&buf).Encode(gobEntry("v", "s", "k", nil, nil, res)); err != nil {
		t.Fatal(err)
	}
	var e cacheEntry
	if err := gob.NewDecoder(&buf).Decode(&e); err != nil {
		t.Fatal(err)
	}
	if got := e.Result.Test.Breaks(); len(got) != 1 || got[0] != breaks[0] {
		t.Errorf("breaks %v", got)
	}
}

// TestDecodeTrees: an entry's trees decoded ahead of its lookup give the
// result's values, spec and test extras; damaged ones (every
// truncation, a trailing byte) are marked so that the lookup refuses
// the entry and the directive runs again.
func TestDecodeTrees(t *testing.T) {
	res := &Result{ID: "a", Values: map[string]any{"stat": -3.5, "lags": 2, "dates": []string{"2001-01", "2001-02"}},
		Spec: map[string]any{"y": "log(x)"}, Test: &contract.Outcome{Extra: map[string]any{"k": []float64{1, 2}}}}
	trees, ok := encodeTrees(res)
	if !ok {
		t.Fatal("not encodable")
	}
	e := &cacheEntry{Trees: trees}
	e.decodeTrees(map[string]string{})
	if !e.trees.ok || !reflect.DeepEqual(e.trees.values, res.Values) || !reflect.DeepEqual(e.trees.spec, res.Spec) || !reflect.DeepEqual(e.trees.extra, res.Test.Extra) {
		t.Fatalf("decoded %+v", e.trees)
	}
	for cut := 0; cut < len(trees); cut++ {
		e := &cacheEntry{Trees: trees[:cut]}
		e.decodeTrees(map[string]string{})
		if e.trees.ok {
			t.Fatalf("a tree cut at %d of %d bytes was accepted", cut, len(trees))
		}
	}
	e = &cacheEntry{Trees: append(append([]byte{}, trees...), 0)}
	e.decodeTrees(nil)
	if e.trees.ok {
		t.Error("a trailing byte was accepted")
	}
}
