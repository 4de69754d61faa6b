package cert

import (
	"strconv"
	"testing"
)

// TestSmallDecimal compares the number parser of the fast paths with
// strconv on numbers up to 10^7 (sampled) followed by every kind of byte,
// and on leading zeros and longer numbers.
func TestSmallDecimal(t *testing.T) {
	var ends []string
	for c := 0; c < 256; c++ {
		if c < '0' || c > '9' {
			ends = append(ends, string([]byte{byte(c)})+"1234567")
		}
	}
	ends = append(ends, "", "7", "1234567")
	check := func(in string) {
		b := []byte(in)
		n, q, ok := smallDecimal(b, 0)
		digits := 0
		for digits < len(b) && b[digits] >= '0' && b[digits] <= '9' {
			digits++
		}
		want, err := strconv.Atoi(in[:digits])
		canonical := err == nil && strconv.Itoa(want) == in[:digits]
		switch {
		case digits <= 7 && canonical:
			if !ok || n != want || q != digits {
				t.Fatalf("%q: smallDecimal = %d, %d, %v; want %d, %d, true", in, n, q, ok, want, digits)
			}
		case digits > 7:
			// the caller rejects the number by the digit after the seventh
			if ok && (q != 7 || q >= len(b) || b[q] < '0' || b[q] > '9') {
				t.Fatalf("%q: smallDecimal = %d, %d, %v; want it refused or stopped at a digit", in, n, q, ok)
			}
		case ok:
			t.Fatalf("%q: smallDecimal = %d, %d, true; want false", in, n, q)
		}
	}
	for k := 0; k < 10000000; k += 1 + k/100 {
		for _, e := range ends {
			check(strconv.Itoa(k) + e)
		}
	}
	for _, s := range []string{"", "0", "00", "01,", "007]", "12345678", "99999999,", "-1,", "+1,", " 1,"} {
		check(s)
	}
}
