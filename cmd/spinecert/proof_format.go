package main

import (
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"spinecert.dev/dimacs"
	"spinecert.dev/verify"
)

// Values of proof --format beside the DRAT formats the verify package names.
const (
	proofAuto = "auto"
	proofLRAT = "lrat"
)

// proofFormat resolves --format: the format to check PROOF in, and whether
// it was detected. For a DRAT proof under auto the format is left empty, so
// that the DRAT checker tells text from binary itself (and says it did).
func proofFormat(o *proofOptions) (format string, detected bool, err error) {
	switch o.format {
	case proofAuto:
		lrat, err := looksLikeLRAT(o.proof)
		if err != nil {
			return "", false, usageErr(err)
		}
		if !lrat {
			return "", true, nil
		}
		format, detected = proofLRAT, true
	case verify.ProofDRAT, verify.ProofDRATBinary, verify.ProofRUP:
		return o.format, false, nil
	case proofLRAT:
		format = proofLRAT
	default:
		return "", false, usageErr(fmt.Errorf("--format must be %s, %s, %s, %s or %s, got %q",
			proofAuto, verify.ProofDRAT, verify.ProofDRATBinary, verify.ProofRUP, proofLRAT, o.format))
	}
	if o.forward || o.lrat != "" {
		how := "--format lrat"
		if detected {
			how = "detected as LRAT"
		}
		return "", false, usageErr(fmt.Errorf("--forward and --lrat apply to DRAT proofs; %s is %s", o.proof, how))
	}
	return format, detected, nil
}

// lratWindow is how much of a proof LRAT detection reads.
const lratWindow = 64 << 10

// looksLikeLRAT reports whether the proof at path (plain, gzip or zstd)
// reads as LRAT. Binary DRAT is recognised as verify.DetectProofFormat does
// and is not LRAT. Otherwise the first line that is neither empty nor a
// comment decides: an LRAT line starts with a step number, followed by "d"
// (a deletion) or by a clause and its hints, each ended by 0 (Cruz-Filipe,
// Heule, Hunt, Kaufmann, Schneider-Kamp, "Efficient certified RAT
// verification", CADE 2017; from memory). A text DRAT lemma holds a single 0, and a
// deletion starts with "d". Several DRAT lemmas on one line read as LRAT:
// such a proof needs --format drat.
func looksLikeLRAT(path string) (bool, error) {
	f, err := os.Open(path)
	if err != nil {
		return false, err
	}
	defer f.Close()
	r, err := dimacs.Decompress(f)
	if err != nil {
		return false, fmt.Errorf("%s: %w", path, err)
	}
	defer r.Close()
	head, err := io.ReadAll(io.LimitReader(r, lratWindow))
	if err != nil {
		return false, fmt.Errorf("%s: %w", path, err)
	}
	if verify.DetectProofFormat(head) == verify.ProofDRATBinary {
		return false, nil
	}
	for line := range strings.Lines(string(head)) {
		fields := strings.Fields(line)
		if len(fields) == 0 || strings.HasPrefix(fields[0], "c") {
			continue
		}
		return lratLine(fields), nil
	}
	return false, nil
}

// lratLine reports whether the fields of one proof line have LRAT's shape.
func lratLine(fields []string) bool {
	if len(fields) < 2 {
		return false
	}
	if id, err := strconv.ParseInt(fields[0], 10, 64); err != nil || id <= 0 {
		return false
	}
	if fields[1] == "d" {
		return true
	}
	zeros := 0
	for _, f := range fields[1:] {
		if f == "0" {
			zeros++
		}
	}
	return zeros >= 2 && fields[len(fields)-1] == "0"
}
