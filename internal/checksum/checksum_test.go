package checksum

import (
	"encoding/hex"
	"testing"
)

// TestHex: the CRC-32C of "123456789" is e3069283, the "check" value
// listed for CRC-32/ISCSI (Castagnoli) in the catalogue of parametrised
// CRC algorithms (common practice; the value written down from memory,
// and Go's hash/crc32 agrees); the running form agrees with Hex.
func TestHex(t *testing.T) {
	if got := Hex([]byte("123456789")); got != "e3069283" {
		t.Errorf("Hex = %s, want e3069283", got)
	}
	h := New()
	h.Write([]byte("1234"))
	h.Write([]byte("56789"))
	if got := hex.EncodeToString(h.Sum(nil)); got != "e3069283" || len(got) != Size {
		t.Errorf("running = %s", got)
	}
}
