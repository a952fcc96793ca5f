package checksum

import (
	"encoding/hex"
	"testing"
)

// TestHex: the CRC-32C check value of "123456789" is e3069283 (the
// standard check of the Castagnoli polynomial, as in RFC 3720's test
// vectors); the running form agrees with Hex.
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
