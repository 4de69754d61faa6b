package main

import (
	"fmt"
	"io"
	"os"

	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

// Values of proof --format beside the formats package proof names.
const (
	proofAuto = "auto"
	proofLRAT = proof.LRAT
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
	case proof.DRAT, proof.DRATBinary, proof.RUP:
		return o.format, false, nil
	case proofLRAT:
		format = proofLRAT
	default:
		return "", false, usageErr(fmt.Errorf("--format must be %s, %s, %s, %s or %s, got %q",
			proofAuto, proof.DRAT, proof.DRATBinary, proof.RUP, proofLRAT, o.format))
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
// reads as LRAT, by proof.Detect on its first bytes.
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
	return proof.Detect(head) == proof.LRAT, nil
}
