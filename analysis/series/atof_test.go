package series

import (
	"fmt"
	"math"
	"math/rand"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/internal/longtest"
)

// plainGrammar is the grammar of a plain decimal number, written
// independently of parseDecimal as the test's reference.
var plainGrammar = regexp.MustCompile(`^[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)?$`)

// checkDecimal: parseDecimal calls s plain exactly when the grammar
// does; when it settles a value, the bits are strconv.ParseFloat's; and
// plainNumber, which asks strconv for the rest, always gives ParseFloat's
// value or says the number is too large. It reports whether the fast
// path settled s.
func checkDecimal(t *testing.T, s string) bool {
	t.Helper()
	got, ok, plain := parseDecimal(s)
	if plain != plainGrammar.MatchString(s) {
		t.Fatalf("%q: plain %v, the grammar says %v", s, plain, !plain)
	}
	if !plain {
		return false
	}
	want, err := strconv.ParseFloat(s, 64)
	if ok && (err != nil || math.Float64bits(got) != math.Float64bits(want)) {
		t.Fatalf("%q: %v (%#x), strconv %v (%#x, %v)", s, got, math.Float64bits(got), want, math.Float64bits(want), err)
	}
	v, plain2, err2 := plainNumber(s)
	switch {
	case !plain2:
		t.Fatalf("%q: plainNumber says it is not plain", s)
	case err != nil || math.IsInf(want, 0):
		if err2 != errTooLarge {
			t.Fatalf("%q: plainNumber %v, %v; strconv %v, %v", s, v, err2, want, err)
		}
	case err2 != nil || math.Float64bits(v) != math.Float64bits(want):
		t.Fatalf("%q: plainNumber %v (%v), strconv %v", s, v, err2, want)
	}
	return ok
}

// TestParseDecimalAgainstStrconv: bit for bit against strconv on the
// shortest, 17-digit, fixed and exponent forms of random doubles of every
// magnitude, on random digit strings (leading and trailing zeros, a
// point anywhere, exponents up to ±400), and on hand-picked edges; and
// the fast path must answer for nearly all numbers of ordinary size.
func TestParseDecimalAgainstStrconv(t *testing.T) {
	edges := []string{"", ".", "-", "+.", "e5", ".e5", "1e", "1e+", "1.e-", "1..2", "1e5.5", " 1", "1 ", "0x10", "1_000", "inf", "NaN", "1f", "0", "-0", "+0", "0.0", "-0.000e5", ".5", "5.", "-.5e-3", "1e22", "1e23", "9007199254740993",
		"9007199254740992", "4503599627370497", "1e-22", "123456789012345678", "1234567890123456789",
		"12345678901234567890", "0.1", "0.2", "0.3", "2.2250738585072014e-308", "2.2250738585072011e-308",
		"4.9e-324", "1.7976931348623157e308", "1.7976931348623159e308", "1e308", "1e-307", "1e-400", "1e400",
		"7.038531e-26", "1e15", "1e16", "123456e20", "000123.4500", "-0.00001234", "1E5", "1e+05", "1e-05",
		"1000000000000000000000000", "0.000000000000000000000000000000000001"}
	for _, s := range edges {
		checkDecimal(t, s)
	}
	reps := 30000 // 1,000,000 among the long checks (CI)
	if longtest.Enabled() {
		reps = 1000000
	}
	r := rand.New(rand.NewSource(7))
	n, fast := 0, 0
	for i := 0; i < reps; i++ {
		x := math.Float64frombits(r.Uint64())
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		forms := []string{strconv.FormatFloat(x, 'g', -1, 64), strconv.FormatFloat(x, 'g', 17, 64),
			strconv.FormatFloat(x, 'e', r.Intn(20), 64)}
		if math.Abs(x) < 1e30 && math.Abs(x) > 1e-30 {
			forms = append(forms, strconv.FormatFloat(x, 'f', r.Intn(25), 64))
		}
		for _, s := range forms {
			checkDecimal(t, s)
		}
		// ordinary data: a normal draw scaled, with 17 significant digits
		y := r.NormFloat64() * math.Pow(10, float64(r.Intn(13)-6))
		n++
		if checkDecimal(t, strconv.FormatFloat(y, 'g', 17, 64)) {
			fast++
		}
	}
	if fast < n*99/100 {
		t.Errorf("the fast path answered %d of %d ordinary numbers", fast, n)
	}
	digits := "0000123456789"
	for i := 0; i < reps; i++ {
		var b strings.Builder
		if r.Intn(3) == 0 {
			b.WriteByte("+-"[r.Intn(2)])
		}
		nd := 1 + r.Intn(24)
		dot := r.Intn(nd + 2)
		for k := 0; k < nd; k++ {
			if k == dot {
				b.WriteByte('.')
			}
			b.WriteByte(digits[r.Intn(len(digits))])
		}
		if r.Intn(2) == 0 {
			b.WriteByte("eE"[r.Intn(2)])
			if r.Intn(2) == 0 {
				b.WriteByte("+-"[r.Intn(2)])
			}
			b.WriteString(strconv.Itoa(r.Intn(401)))
		}
		checkDecimal(t, b.String())
	}
}

// TestPow10Exponent: the binary exponent pow10 gives is floor(e·log2 10)+1
// for every power in the table, and each mantissa has its top bit set.
func TestPow10Exponent(t *testing.T) {
	for e := pow10Min; e <= pow10Max; e++ {
		hi, _, exp2, ok := pow10(e)
		if !ok || hi>>63 != 1 {
			t.Fatalf("10^%d: mantissa %#x", e, hi)
		}
		if want := 1 + int(math.Floor(float64(e)*math.Log2(10))); exp2 != want {
			t.Errorf("10^%d: exponent %d, want %d", e, exp2, want)
		}
	}
	if _, _, _, ok := pow10(pow10Max + 1); ok {
		t.Error("10^348 is out of the table")
	}
}

// FuzzParseDecimal: on any string, parseDecimal and plainNumber agree
// with the grammar and with strconv.ParseFloat (checkDecimal).
func FuzzParseDecimal(f *testing.F) {
	for _, s := range []string{"0", "-1.5e-3", "2.2250738585072011e-308", "123456789012345678901", "0.000123", "9007199254740993", "1e23"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		checkDecimal(t, s)
	})
}

// TestEightDigits: the word-at-once reader agrees with strconv on every
// eight-byte string of digits it is given and refuses a non-digit in
// any place.
func TestEightDigits(t *testing.T) {
	r := rand.New(rand.NewSource(3))
	for i := 0; i < 50000; i++ {
		s := fmt.Sprintf("%08d", r.Intn(100000000))
		v, ok := eightDigits(s)
		want, _ := strconv.ParseUint(s, 10, 64)
		if !ok || v != want {
			t.Fatalf("%s: %d %v", s, v, ok)
		}
	}
	for _, bad := range []byte{'/', ':', '.', 'e', ' ', 0, 0x80, 0xff, '0' + 0x10, '9' + 0x10} {
		for at := 0; at < 8; at++ {
			b := []byte("12345678")
			b[at] = bad
			if _, ok := eightDigits(string(b)); ok {
				t.Errorf("%q read as digits", b)
			}
		}
	}
}
