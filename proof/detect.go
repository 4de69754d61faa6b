package proof

import (
	"bytes"
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
// proof must be named as DRAT by the caller.
func Detect(prefix []byte) string {
	if DetectFormat(prefix) == DRATBinary {
		return DRATBinary
	}
	for line := range bytes.Lines(prefix) {
		fields := bytes.Fields(line)
		if len(fields) == 0 || fields[0][0] == 'c' {
			continue
		}
		if lratLine(fields) {
			return LRAT
		}
		return DRAT
	}
	return DRAT
}

// lratLine reports whether the fields of one proof line have LRAT's shape.
func lratLine(fields [][]byte) bool {
	if len(fields) < 2 {
		return false
	}
	if id, err := strconv.ParseInt(string(fields[0]), 10, 64); err != nil || id <= 0 {
		return false
	}
	if string(fields[1]) == "d" {
		return true
	}
	zeros := 0
	for _, f := range fields[1:] {
		if string(f) == "0" {
			zeros++
		}
	}
	return zeros >= 2 && string(fields[len(fields)-1]) == "0"
}
