package engine

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"errors"
	"math"
	"os"
	"path/filepath"
	"slices"

	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/internal/atomicfile"
)

// crit: simulate — the binary store of simulated tables beside the result
// cache.

// SimStore keeps simulated tables in <cache>/sim/, one file per
// simulate.Spec.Key. It exists only when the document has a result cache
// (with --no-cache nothing is read or written). A table depends only on
// its key, which names the simulation algorithm's version, so the store
// is not cleared when galley itself changes, nor by Cache.Fresh.
type SimStore struct{ Dir string }

// simStoreFor returns the document's store: empty (reading and writing
// nothing) without a result cache.
func simStoreFor(d *Document) SimStore {
	if d.opts.Cache == nil || d.opts.Cache.Dir == "" {
		return SimStore{}
	}
	return SimStore{Dir: filepath.Join(d.opts.Cache.Dir, "sim")}
}

// Path returns the file of the table whose key is key: the hex SHA-256 of
// the key, with the extension .sim.
func (s SimStore) Path(key string) string {
	h := sha256.Sum256([]byte(key))
	return filepath.Join(s.Dir, hex.EncodeToString(h[:])+".sim")
}

const simMagic = "galley-sim-table-1\n"

// encodeSim writes r as: magic, key, lower, nobs, reps, seed, levels,
// values, MCSE, the sorted sample (little-endian), then the SHA-256 of
// all that.
func encodeSim(r *simulate.Result) []byte {
	var b bytes.Buffer
	b.WriteString(simMagic)
	u32 := func(v int) { binary.Write(&b, binary.LittleEndian, uint32(v)) }
	u64 := func(v uint64) { binary.Write(&b, binary.LittleEndian, v) }
	fs := func(x []float64) {
		u32(len(x))
		binary.Write(&b, binary.LittleEndian, x)
	}
	u32(len(r.Key))
	b.WriteString(r.Key)
	lower := uint64(0)
	if r.Lower {
		lower = 1
	}
	u64(lower)
	u64(uint64(r.NObs))
	u64(uint64(r.Reps))
	u64(r.Seed)
	fs(r.Levels)
	fs(r.Values)
	fs(r.MCSE)
	fs(r.Sample)
	sum := sha256.Sum256(b.Bytes())
	b.Write(sum[:])
	return b.Bytes()
}

var errSimCorrupt = errors.New("corrupt simulated table")

// decodeSim reads what encodeSim wrote and returns the table, or
// errSimCorrupt unless it is whole and is the table of sp.
func decodeSim(raw []byte, sp simulate.Spec) (*simulate.Result, error) {
	if len(raw) < len(simMagic)+sha256.Size || string(raw[:len(simMagic)]) != simMagic {
		return nil, errSimCorrupt
	}
	body, sum := raw[:len(raw)-sha256.Size], raw[len(raw)-sha256.Size:]
	if h := sha256.Sum256(body); !bytes.Equal(h[:], sum) {
		return nil, errSimCorrupt
	}
	r, err := readSimFields(bytes.NewReader(body[len(simMagic):]), sp)
	if err != nil || !simTableOf(r, sp) {
		return nil, errSimCorrupt
	}
	return r, nil
}

// readSimFields returns the fields encodeSim wrote after the magic, in
// its order, with Spec set to sp; errSimCorrupt when a length runs past
// the data or anything is left over.
func readSimFields(rd *bytes.Reader, sp simulate.Spec) (*simulate.Result, error) {
	var n32 uint32
	var err error
	u32 := func() int {
		if err == nil {
			err = binary.Read(rd, binary.LittleEndian, &n32)
		}
		return int(n32)
	}
	u64 := func() uint64 {
		var v uint64
		if err == nil {
			err = binary.Read(rd, binary.LittleEndian, &v)
		}
		return v
	}
	fs := func(max int) []float64 {
		n := u32()
		if err != nil || n > max || n*8 > rd.Len() {
			err = errSimCorrupt
			return nil
		}
		x := make([]float64, n)
		err = binary.Read(rd, binary.LittleEndian, x)
		return x
	}
	kl := u32()
	if err != nil || kl > rd.Len() {
		return nil, errSimCorrupt
	}
	kb := make([]byte, kl)
	rd.Read(kb)
	r := &simulate.Result{Spec: sp, Key: string(kb)}
	r.Lower = u64() == 1
	r.NObs = int(u64())
	r.Reps = int(u64())
	r.Seed = u64()
	r.Levels = fs(16)
	r.Values = fs(16)
	r.MCSE = fs(16)
	r.Sample = fs(simulate.MaxReps)
	if err != nil || rd.Len() != 0 {
		return nil, errSimCorrupt
	}
	return r, nil
}

// simTableOf returns whether r is a consistent table of sp: its key,
// replications and seed, the standard levels, one value and MCSE per
// level, and a sorted sample of finite statistics, one per replication.
func simTableOf(r *simulate.Result, sp simulate.Spec) bool {
	if r.Key != sp.Key() || r.Reps != sp.Reps || r.Seed != sp.Seed || len(r.Sample) != r.Reps ||
		!slices.Equal(r.Levels, simulate.Levels) || len(r.Values) != len(r.Levels) || len(r.MCSE) != len(r.Levels) ||
		!slices.IsSorted(r.Sample) {
		return false
	}
	for _, x := range r.Sample {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

// load returns the stored table of sp; a missing, corrupt or foreign
// file is ignored (the simulation runs again and replaces it).
func (s SimStore) load(sp simulate.Spec) (*simulate.Result, bool) {
	if s.Dir == "" {
		return nil, false
	}
	raw, err := os.ReadFile(s.Path(sp.Key()))
	if err != nil {
		return nil, false
	}
	r, err := decodeSim(raw, sp)
	if err != nil {
		return nil, false
	}
	return r, true
}

// save stores r; a failure only costs a rerun next time.
func (s SimStore) save(r *simulate.Result) {
	if s.Dir == "" {
		return
	}
	_ = atomicfile.Write(s.Path(r.Key), encodeSim(r), 0o644)
}
