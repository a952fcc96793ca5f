package engine

import "testing"

// TestPackBlobs: figure bytes stored in the pack's byte section come
// back in place, nil and empty kept apart; offsets outside the section
// make the entry unreadable.
func TestPackBlobs(t *testing.T) {
	res := &Result{ID: "f", Figure: &Figure{Caption: "c", SVG: []byte("<svg/>"), PDF: []byte{}, PNG: nil}}
	e := gobEntry("v", "s", "k", nil, nil, res)
	if e.Result.Figure.SVG != nil || res.Figure.SVG == nil {
		t.Fatal("the entry must hold the bytes apart, the result keep them")
	}
	var blob []byte
	for _, b := range e.blobs {
		if b == nil {
			e.Blobs = append(e.Blobs, 0, -1)
			continue
		}
		e.Blobs = append(e.Blobs, len(blob), len(b))
		blob = append(blob, b...)
	}
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
