package proof

import (
	"bytes"
	"strings"
	"testing"
)

// The binary DRAT example of Wetzler, Heule and Hunt (SAT 2014): the steps
// "d -63 -8193 0" and "129 -8191 0" are the bytes
// 64 7f 83 80 01 00 61 82 02 ff 7f 00.
func TestDRATToBinaryPaperExample(t *testing.T) {
	var out bytes.Buffer
	if err := TextToBinary(strings.NewReader("c comment\nd -63 -8193 0\n129 -8191 0\n"), &out, "p"); err != nil {
		t.Fatal(err)
	}
	want := []byte{0x64, 0x7f, 0x83, 0x80, 0x01, 0x00, 0x61, 0x82, 0x02, 0xff, 0x7f, 0x00}
	if !bytes.Equal(out.Bytes(), want) {
		t.Fatalf("got % x, want % x", out.Bytes(), want)
	}
}

func TestDRATToBinaryErrors(t *testing.T) {
	for in, want := range map[string]string{
		"1 2":           "missing final 0",
		"1 x 0\n":       "p:1:3: unexpected 'x'",
		"1 -0\n":        `"-0" is not a literal`,
		"-\n":           "expected a digit",
		"99999999999 0": "out of range",
	} {
		err := TextToBinary(strings.NewReader(in), &bytes.Buffer{}, "p")
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%q: got %v, want %q", in, err, want)
		}
	}
}
