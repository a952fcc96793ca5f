// Package checksum is galley's one fast checksum: CRC-32C (Castagnoli),
// which the hardware computes at several GB/s, for files galley writes
// itself and checks against accident (a torn file, a hand edit), not
// forgery. Inputs are identified by SHA-256 instead.
package checksum

import (
	"encoding/binary"
	"encoding/hex"
	"hash"
	"hash/crc32"
	"sync"
)

// table is made on first use (making it at start-up cost every command
// 0.1 ms).
var table = sync.OnceValue(func() *crc32.Table { return crc32.MakeTable(crc32.Castagnoli) })

// Size is the length of Hex's result.
const Size = 2 * crc32.Size

// Hex is the CRC-32C of b as 8 hexadecimal digits (big-endian).
func Hex(b []byte) string {
	return hex.EncodeToString(binary.BigEndian.AppendUint32(nil, crc32.Checksum(b, table())))
}

// New returns a running CRC-32C; hex.EncodeToString(h.Sum(nil)) equals
// Hex of what was written.
func New() hash.Hash { return crc32.New(table()) }
