package proof

import (
	"bytes"
	"context"
	"errors"
	"io"
	"testing"
)

// Round trip: whatever the text reader accepts, written back as text, reads
// to the same steps.
func FuzzDRATText(f *testing.F) {
	for _, s := range []string{"1 -2 0\nd 1 -2 0\n0\n", "c x\n-3 4 0\n", "d 1 0", "1 2", "-0\n", "1 x 0"} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		steps, err := fuzzSteps(data, DRAT)
		if err != nil {
			return
		}
		var text bytes.Buffer
		for _, s := range steps {
			text.WriteString(s + "\n")
		}
		again, err := fuzzSteps(text.Bytes(), DRAT)
		if err != nil || len(again) != len(steps) {
			t.Fatalf("re-reading %q: %v", text.String(), err)
		}
		for i := range steps {
			if steps[i] != again[i] {
				t.Fatalf("step %d: %q then %q", i, steps[i], again[i])
			}
		}
	})
}

// Round trip: binary steps re-encoded give the same bytes back.
func FuzzDRATBinary(f *testing.F) {
	f.Add([]byte{0x64, 0x7f, 0x83, 0x80, 0x01, 0x00, 0x61, 0x82, 0x02, 0xff, 0x7f, 0x00})
	f.Add([]byte("a\x02\x05\x00d\x02\x00"))
	f.Add([]byte("a\x80\x00"))
	f.Fuzz(func(t *testing.T, data []byte) {
		pr, _, err := newProofReader(bytes.NewReader(data), "fuzz", DRATBinary)
		if err != nil {
			t.Fatal(err)
		}
		var out []byte
		for {
			del, lits, err := pr.next()
			if err == io.EOF {
				break
			}
			if err != nil {
				return
			}
			if del {
				out = append(out, 'd')
			} else {
				out = append(out, 'a')
			}
			for _, l := range lits {
				u := uint64(2 * int64(max(l, -l)))
				if l < 0 {
					u++
				}
				for u >= 0x80 {
					out = append(out, byte(u)|0x80)
					u >>= 7
				}
				out = append(out, byte(u))
			}
			out = append(out, 0)
		}
		// overlong encodings (0x80 continuation with zero bits) re-encode
		// shorter; compare by decoding again
		a, errA := fuzzSteps(data, DRATBinary)
		b, errB := fuzzSteps(out, DRATBinary)
		if errA != nil || errB != nil || len(a) != len(b) {
			t.Fatalf("round trip: %v %v", errA, errB)
		}
		for i := range a {
			if a[i] != b[i] {
				t.Fatalf("step %d: %q then %q", i, a[i], b[i])
			}
		}
	})
}

func fuzzSteps(data []byte, format string) ([]string, error) {
	pr, _, err := newProofReader(bytes.NewReader(data), "fuzz", format)
	if err != nil {
		return nil, err
	}
	var out []string
	for {
		del, lits, err := pr.next()
		if err == io.EOF {
			return out, nil
		}
		if err != nil {
			return nil, err
		}
		out = append(out, formatStep(del, lits))
	}
}

// Any proof against a small formula: no panic, nothing accepted against a
// satisfiable formula, and whatever the DRAT checker accepts (backward or
// forward), its LRAT passes the separate LRAT checker.
func FuzzDRATCheck(f *testing.F) {
	for _, s := range []string{"-2 0\n1 0\n0\n", "5 1 0\n-5 2 0\n1 0\n0\n", "1 5 0\n0\n", "d 1 2 0\n-2 0\n0\n", "0\n", "3 -3 0\n1 0\n0\n"} {
		f.Add([]byte(s), false)
		f.Add([]byte(s), true)
	}
	f.Fuzz(func(t *testing.T, proof []byte, forward bool) {
		for _, formula := range []string{fourClauses, ratFormula, satText} {
			cnf := parseCNF(t, formula)
			var lrat bytes.Buffer
			res, err := CheckDRAT(context.Background(), cnf, bytes.NewReader(proof), DRATOptions{Forward: forward, LRAT: &lrat})
			if err != nil {
				if errors.Is(err, ErrRejected) && (res == nil || res.Accepted || res.Reason == "") {
					t.Fatalf("rejection without a reason: %+v", res)
				}
				continue
			}
			if formula == satText {
				t.Fatalf("refutation of a satisfiable formula accepted: %q", proof)
			}
			if _, err := CheckLRAT(context.Background(), cnf, &lrat, "lrat"); err != nil {
				t.Fatalf("accepted proof %q, but its LRAT fails: %v\n%s", proof, err, lrat.String())
			}
		}
	})
}

// satText is satisfiable (1 = 2 = true), so no proof may refute it.
const satText = "p cnf 3 3\n1 -2 0\n2 3 0\n1 2 0\n"

// The LRAT reader and checker never panic, and never accept a refutation of
// a satisfiable formula.
func FuzzLRATCheck(f *testing.F) {
	f.Add([]byte(lratExample))
	f.Add([]byte("7 5 1 0 0\n8 -5 2 0 -7 3 4 0\n"))
	f.Add([]byte("5 d 1 0\n5 0 0\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		for _, formula := range []string{fourClauses, ratFormula, satText} {
			cnf := parseCNF(t, formula)
			res, err := CheckLRAT(context.Background(), cnf, bytes.NewReader(data), "fuzz")
			if err == nil && (res == nil || !res.Accepted) {
				t.Fatal("no error but not accepted")
			}
			if err == nil && formula == satText {
				t.Fatalf("refutation of a satisfiable formula accepted: %q", data)
			}
		}
	})
}
