package proof

import (
	"bytes"
	"slices"
	"strconv"
)

// Detect names the format of a proof from its first bytes (after any
// decompression): DRATBinary, LRAT or DRAT. Binary DRAT is recognised as
// DetectFormat does. Otherwise the first line that is neither empty nor a
// comment decides: an LRAT line starts with a positive step number followed
// by "d" (a deletion) or by a clause and its hints, each ended by 0 (LRAT
// text: Cruz-Filipe, Heule, Hunt, Kaufmann, Schneider-Kamp, "Efficient
// certified RAT verification", CADE 2017). A text DRAT lemma holds a single
// 0 and a DRAT deletion starts with "d", so neither is taken for LRAT. A
// DRAT proof with several lemmas on its first line reads as LRAT; such a
// proof must be named as DRAT by the caller. When the prefix ends inside
// that line (a clause or hint list longer than the prefix), the part seen
// decides: LRAT when a 0 is followed by more fields; a line cut before its
// first 0 reads as DRAT.
func Detect(prefix []byte) string {
	if DetectFormat(prefix) == DRATBinary {
		return DRATBinary
	}
	for line := range bytes.Lines(prefix) {
		fields := bytes.Fields(line)
		if len(fields) == 0 || fields[0][0] == 'c' {
			continue
		}
		if !bytes.HasSuffix(line, []byte("\n")) {
			// The prefix ends inside this line: its last field may be cut,
			// and its end is not seen.
			return detectedAs(lratShape(fields[:len(fields)-1], false))
		}
		return detectedAs(lratShape(fields, true))
	}
	return DRAT
}

func detectedAs(lrat bool) string {
	if lrat {
		return LRAT
	}
	return DRAT
}

// lratLine reports whether the fields of one proof line have LRAT's shape.
func lratLine(fields [][]byte) bool { return lratShape(fields, true) }

// lratShape reports whether fields, the whole line or (whole false) the
// start of a line that the prefix cuts short, have LRAT's shape: a step
// number, then "d", or a clause ended by 0 with more fields after it (the
// hints), the whole line ending in 0. A text DRAT lemma holds its single 0
// at the end, so its 0 is never followed by more fields; a line cut
// before its first 0 cannot be told apart, and counts as DRAT.
func lratShape(fields [][]byte, whole bool) bool {
	if len(fields) < 2 {
		return false
	}
	if id, err := strconv.ParseInt(string(fields[0]), 10, 64); err != nil || id <= 0 {
		return false
	}
	if string(fields[1]) == "d" {
		return true
	}
	zero := slices.IndexFunc(fields[1:], func(f []byte) bool { return string(f) == "0" }) + 1
	followed := zero > 0 && zero < len(fields)-1
	return followed && (!whole || string(fields[len(fields)-1]) == "0")
}
