package engine

import (
	"bytes"
	"reflect"
	"strings"
	"testing"
	"time"

	"github.com/galley-econ/galley/analysis/simulate"
)

// TestSimStoreRoundTrip: encode/decode keeps every field, and a table is
// refused for another spec.
func TestSimStoreRoundTrip(t *testing.T) {
	sp := simulate.Spec{Test: "eg", Case: "ct", N: 3, T: 80, Lags: 1, Reps: 300, Seed: 9, Workers: 1}
	r, err := simulate.Run(t.Context(), sp, nil)
	if err != nil {
		t.Fatal(err)
	}
	got, err := decodeSim(encodeSim(r), sp)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got, r) {
		t.Errorf("round trip changed the result")
	}
	other := sp
	other.Seed = 10
	if _, err := decodeSim(encodeSim(r), other); err == nil {
		t.Error("a table was accepted for another seed")
	}
}

// TestSimProgress: a short run is quiet; a long one prints plain lines at
// the quarters (when the output is not a terminal) and a last line.
func TestSimProgress(t *testing.T) {
	var lines []string
	sink := func(s string) { lines = append(lines, s) }
	p := newSimProgress("sim", sink, nil)
	for d := 128; d <= 1000; d += 128 {
		p.update(d, 1000)
	}
	p.update(1000, 1000)
	p.finish(nil)
	if len(lines) != 0 {
		t.Errorf("short run printed %q", lines)
	}
	p = newSimProgress("sim", sink, nil)
	p.start = time.Now().Add(-2 * time.Second)
	for d := 100; d <= 1000; d += 100 {
		p.update(d, 1000)
	}
	p.finish(nil)
	// 10% (the first line once past the quiet second), then 30%, 50% and
	// 80% as each new quarter is entered, then the last line.
	if len(lines) < 3 || len(lines) > 5 || !strings.HasPrefix(lines[0], "sim: 10% after") || !strings.Contains(lines[len(lines)-1], "done in") {
		t.Errorf("long run printed %q", lines)
	}
	var buf bytes.Buffer
	p = newSimProgress("sim", nil, &buf)
	p.start = time.Now().Add(-2 * time.Second)
	p.update(500, 1000)
	p.finish(nil)
	if !strings.Contains(buf.String(), "sim: 50% after") || strings.Contains(buf.String(), "\r") {
		t.Errorf("plain output %q", buf.String())
	}
}
