package series

import (
	"errors"
	"math"
	"math/big"
	"math/bits"
	"strconv"
	"sync"
)

// plainNumber reads a plain decimal number — [+-]? (d+ (. d*)? | . d+)
// ([eE] [+-]? d+)?, nothing else: no hexadecimal, no underscores, no
// infinities or NaN — as the float64 nearest to it (ties to even), the
// value strconv.ParseFloat(s, 64) gives. plain is false if s is not one;
// err says that a plain number is too large for a float64.
func plainNumber(s string) (v float64, plain bool, err error) {
	v, ok, plain := parseDecimal(s)
	if !plain || ok {
		return v, plain, nil
	}
	v, err = strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) {
		return 0, true, errTooLarge
	}
	return v, true, nil
}

var errTooLarge = errors.New("too large for a 64-bit float")

// parseDecimal is plainNumber's grammar and fast path: plain reports
// whether s is a plain decimal number; if it is, ok reports whether f
// was settled here — always, but for more than 19 significant digits, a
// result that overflows or is subnormal, or one of the rare cases the
// algorithm below cannot decide, which are left to strconv. A correctly
// rounded conversion has one answer, so whenever ok is true the bits are
// ParseFloat's (tested against it on millions of strings).
//
// Why not strconv alone: a data file of numbers written with 17
// significant digits (the shortest exact form of most doubles) costs
// ParseFloat ~90 ns a number, most of it in branches taken character by
// character; here the digits before and after the point are read as two
// runs, eight digits at a time (eightDigits), and converted in ~56 ns.
// The conversion is the Eisel–Lemire algorithm (Lemire, "Number parsing
// at a gigabyte per second", Software: Practice and Experience 51(8),
// 2021; the form here follows the one in Go's own strconv, which credits
// Nigel Tao's write-up), after the exact conversion for small mantissas
// and exponents (Clinger, "How to read floating point numbers
// accurately", PLDI 1990) that ParseFloat tries first too.
func parseDecimal(s string) (f float64, ok, plain bool) {
	i := 0
	neg := false
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		neg = s[i] == '-'
		i++
	}
	// the digits before and after the point, as two runs
	a0 := i
	for i < len(s) && '0' <= s[i] && s[i] <= '9' {
		i++
	}
	a := s[a0:i]
	var b string
	if i < len(s) && s[i] == '.' {
		i++
		b0 := i
		for i < len(s) && '0' <= s[i] && s[i] <= '9' {
			i++
		}
		b = s[b0:i]
	}
	if len(a)+len(b) == 0 {
		return 0, false, false // no digit: not a number
	}
	dp := 0 // the exponent: the value is 0.(significant digits) × 10^dp
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		esign := 1
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			if s[i] == '-' {
				esign = -1
			}
			i++
		}
		e, e0 := 0, i
		for ; i < len(s) && '0' <= s[i] && s[i] <= '9'; i++ {
			if e < 10000 {
				e = e*10 + int(s[i]-'0')
			}
		}
		if i == e0 {
			return 0, false, false // an exponent without digits
		}
		dp = e * esign
	}
	if i != len(s) {
		return 0, false, false // something else follows
	}
	// Leading zeros are not significant: those of the integer part drop
	// out, and if it is all zeros, those after the point move the point.
	for len(a) > 0 && a[0] == '0' {
		a = a[1:]
	}
	if len(a) == 0 {
		n := len(b)
		for len(b) > 0 && b[0] == '0' {
			b = b[1:]
		}
		dp -= n - len(b)
	} else {
		dp += len(a)
	}
	// Up to 19 significant digits are exact in man; a non-zero digit
	// beyond them leaves the value to strconv.
	var man uint64
	ndMant := 0
	for _, run := range [2]string{a, b} {
		if k := 19 - ndMant; len(run) > k {
			for j := k; j < len(run); j++ {
				if run[j] != '0' {
					return 0, false, true
				}
			}
			run = run[:k]
		}
		man = digitRun(man, run)
		ndMant += len(run)
	}
	if man == 0 {
		if neg {
			return math.Copysign(0, -1), true, true
		}
		return 0, true, true
	}
	exp := dp - ndMant
	// Exact: a mantissa of at most 53 bits times or over an exactly
	// representable power of ten is rounded once.
	if man>>52 == 0 {
		f := float64(man)
		if neg {
			f = -f
		}
		switch {
		case exp == 0:
			return f, true, true
		case exp > 0 && exp <= 15+22:
			e := exp
			if e > 22 { // some of the zeros move into the integer
				f *= exactPow10[e-22]
				e = 22
			}
			if f <= 1e15 && f >= -1e15 {
				return f * exactPow10[e], true, true
			}
		case exp < 0 && exp >= -22:
			return f / exactPow10[-exp], true, true
		}
	}
	f, ok = eiselLemire(man, exp, neg)
	return f, ok, true
}

// digitRun appends the decimal digits of run (at most 19 in all) to man.
func digitRun(man uint64, run string) uint64 {
	for len(run) >= 8 {
		v, _ := eightDigits(run[:8])
		man = man*100000000 + v
		run = run[8:]
	}
	for j := 0; j < len(run); j++ {
		man = man*10 + uint64(run[j]-'0')
	}
	return man
}

// eightDigits reads eight ASCII digits as one number, or reports false
// if any of the eight bytes is not a digit. It works on the eight bytes
// as one 64-bit word (the method of Lemire's fast_float library): a
// digit loop costs a multiplication per digit, one after another, and
// was most of the time of reading a number.
func eightDigits(s string) (uint64, bool) {
	v := uint64(s[0]) | uint64(s[1])<<8 | uint64(s[2])<<16 | uint64(s[3])<<24 |
		uint64(s[4])<<32 | uint64(s[5])<<40 | uint64(s[6])<<48 | uint64(s[7])<<56
	// every byte 0x30..0x39: its high nibble is 3, and adding 6 keeps it 3
	if (v&0xF0F0F0F0F0F0F0F0)|(((v+0x0606060606060606)&0xF0F0F0F0F0F0F0F0)>>4) != 0x3333333333333333 {
		return 0, false
	}
	v &= 0x0F0F0F0F0F0F0F0F                                // digit values, first digit in the low byte
	v = (v * (1 + 10<<8)) >> 8                             // pairs: 10·d0 + d1 in every other byte
	v = ((v & 0x00FF00FF00FF00FF) * (1 + 100<<16)) >> 16   // quads
	v = ((v & 0x0000FFFF0000FFFF) * (1 + 10000<<32)) >> 32 // all eight
	return v & 0xFFFFFFFF, true
}

var exactPow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// eiselLemire converts man × 10^exp10 (man ≠ 0) to the nearest float64,
// or reports ok false where it cannot decide or the result would not be
// a normal number. 10^exp10 is taken as a 128-bit mantissa, rounded
// down, and a binary exponent (pow10); the product man × mantissa is
// the value to 64 bits and more, and its upper bits round to the
// result unless they sit on a rounding boundary that the truncation of
// 10^exp10 leaves undecided.
func eiselLemire(man uint64, exp10 int, neg bool) (float64, bool) {
	const bias = -1023
	hiP, loP, exp2, ok := pow10(exp10)
	if !ok {
		return 0, false
	}
	clz := bits.LeadingZeros64(man)
	man <<= uint(clz)
	retExp2 := uint64(exp2+63-bias) - uint64(clz)
	xHi, xLo := bits.Mul64(man, hiP)
	if xHi&0x1FF == 0x1FF && xLo+man < man {
		// the low 64 bits of 10^exp10's mantissa may carry into xHi
		yHi, yLo := bits.Mul64(man, loP)
		mergedHi, mergedLo := xHi, xLo+yHi
		if mergedLo < xLo {
			mergedHi++
		}
		if mergedHi&0x1FF == 0x1FF && mergedLo+1 == 0 && yLo+man < man {
			return 0, false
		}
		xHi, xLo = mergedHi, mergedLo
	}
	msb := xHi >> 63
	retMantissa := xHi >> (msb + 9) // 54 bits
	retExp2 -= 1 ^ msb
	if xLo == 0 && xHi&0x1FF == 0 && retMantissa&3 == 1 {
		return 0, false // exactly half way: the truncation hides which side
	}
	retMantissa += retMantissa & 1 // round to 53 bits
	retMantissa >>= 1
	if retMantissa>>53 > 0 {
		retMantissa >>= 1
		retExp2++
	}
	if retExp2-1 >= 0x7FF-1 { // subnormal, zero, infinite
		return 0, false
	}
	b := retExp2<<52 | retMantissa&(1<<52-1)
	if neg {
		b |= 1 << 63
	}
	return math.Float64frombits(b), true
}

// The powers of ten a conversion can need, 10^-348 … 10^347: each as
// the 128 bits below its leading one bit, rounded down (hi, lo), made
// exactly with math/big on first use, one power at a time (a data file
// uses a handful of exponents; making all 696 cost a millisecond).
const (
	pow10Min = -348
	pow10Max = 347
)

var pow10Tab [pow10Max - pow10Min + 1]struct {
	once   sync.Once
	hi, lo uint64
}

// pow10 returns 10^e as mantissa hi·2^64 + lo (its top bit set) and
// exponent: 10^e = (hi·2^64 + lo) / 2^128 · 2^exp2, to within the
// mantissa's rounding down.
func pow10(e int) (hi, lo uint64, exp2 int, ok bool) {
	if e < pow10Min || e > pow10Max {
		return 0, 0, 0, false
	}
	p := &pow10Tab[e-pow10Min]
	p.once.Do(func() { p.hi, p.lo = pow10Mantissa(e) })
	// floor(e·log2(10)), exact for |e| ≤ 500 (checked in the tests)
	return p.hi, p.lo, 1 + (e*108853)>>15, true
}

// pow10Mantissa is floor(10^e · 2^k) for the k that puts it in
// [2^127, 2^128).
func pow10Mantissa(e int) (hi, lo uint64) {
	ten := big.NewInt(10)
	var m *big.Int
	if e >= 0 {
		n := new(big.Int).Exp(ten, big.NewInt(int64(e)), nil)
		if l := n.BitLen(); l >= 128 {
			m = n.Rsh(n, uint(l-128))
		} else {
			m = n.Lsh(n, uint(128-l))
		}
	} else {
		d := new(big.Int).Exp(ten, big.NewInt(int64(-e)), nil)
		// 2^(L−1) < d < 2^L, so 2^(127+L)/d lies in (2^127, 2^128)
		num := new(big.Int).Lsh(big.NewInt(1), uint(127+d.BitLen()))
		m = num.Quo(num, d)
	}
	words := m.Bits() // little-endian words
	var w [2]uint64
	for i, x := range words {
		if bits.UintSize == 64 {
			w[i] = uint64(x)
		} else { // 32-bit words
			w[i/2] |= uint64(x) << (32 * (i % 2))
		}
	}
	return w[1], w[0]
}
