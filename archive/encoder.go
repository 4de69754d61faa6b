package archive

import (
	"bytes"
	"encoding/json"
	"fmt"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
)

// Encoder turns a claim into CNF. The current encoder is CurrentEncoder;
// tests substitute others to simulate an encoder that changed.
type Encoder interface {
	// Version names the encoder's output (dimacs.EncoderVersion).
	Version() string
	// Encode returns the CNF that is satisfiable iff g has the layout opt describes.
	Encode(g *graph.Graph, opt dimacs.Options) (*dimacs.CNF, error)
}

// VersionedEncoder is an Encoder that can also reproduce the output of
// earlier versions. EncodeAs returns an error wrapping
// dimacs.ErrUnknownVersion for a version it cannot reproduce.
type VersionedEncoder interface {
	Encoder
	EncodeAs(g *graph.Graph, opt dimacs.Options, version string) (*dimacs.CNF, error)
}

// CurrentEncoder is the encoder built into this program.
type CurrentEncoder struct{}

// EncodeAs calls dimacs.EncodeVersion.
func (CurrentEncoder) EncodeAs(g *graph.Graph, opt dimacs.Options, version string) (*dimacs.CNF, error) {
	e, err := dimacs.EncodeVersion(g, opt, version)
	if err != nil {
		return nil, err
	}
	return e.CNF(), nil
}

// Version returns dimacs.EncoderVersion.
func (CurrentEncoder) Version() string { return dimacs.EncoderVersion }

// Encode calls dimacs.Encode.
func (CurrentEncoder) Encode(g *graph.Graph, opt dimacs.Options) (*dimacs.CNF, error) {
	e, err := dimacs.Encode(g, opt)
	if err != nil {
		return nil, err
	}
	return e.CNF(), nil
}

// CNFText returns the DIMACS text of cnf as spinecert writes it, and its SHA-256.
// This is the text whose hash a manifest records.
func CNFText(cnf *dimacs.CNF) ([]byte, string, error) {
	var buf bytes.Buffer
	if _, err := cnf.WriteTo(&buf); err != nil {
		return nil, "", fmt.Errorf("archive: writing cnf: %w", err)
	}
	return buf.Bytes(), sha256Hex(buf.Bytes()), nil
}

// encoderOptionsJSON is dimacs.Options as recorded in a manifest. Every
// field of dimacs.Options has a counterpart (a test checks this), so a
// recorded options object determines the encoding for a given encoder
// version.
type encoderOptionsJSON struct {
	Kind           string   `json:"kind"`
	Pages          int      `json:"pages"`
	PageKinds      []string `json:"page_kinds,omitempty"`
	Baseline       bool     `json:"baseline"`
	NoRotation     bool     `json:"no_rotation"`
	NoReflection   bool     `json:"no_reflection"`
	NoPageSymmetry bool     `json:"no_page_symmetry"`
	NoBlocks       bool     `json:"no_blocks"`
	NoLeaves       bool     `json:"no_leaves"`
	NoIsolated     bool     `json:"no_isolated"`
	NoBetweenness  bool     `json:"no_betweenness"`
	NoDirect       bool     `json:"no_direct"`
	NoTwins        bool     `json:"no_twins"`
}

// MarshalEncoderOptions returns the manifest form of opt.
func MarshalEncoderOptions(opt dimacs.Options) (json.RawMessage, error) {
	j := encoderOptionsJSON{
		Kind: opt.Kind.String(), Pages: opt.Pages,
		Baseline: opt.Baseline, NoRotation: opt.NoRotation, NoReflection: opt.NoReflection,
		NoPageSymmetry: opt.NoPageSymmetry, NoBlocks: opt.NoBlocks, NoLeaves: opt.NoLeaves,
		NoIsolated: opt.NoIsolated, NoBetweenness: opt.NoBetweenness, NoDirect: opt.NoDirect, NoTwins: opt.NoTwins,
	}
	for _, k := range opt.PageKinds {
		j.PageKinds = append(j.PageKinds, k.String())
	}
	b, err := json.Marshal(j)
	if err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	return b, nil
}

// UnmarshalEncoderOptions reads the manifest form of encoder options strictly.
func UnmarshalEncoderOptions(raw json.RawMessage) (dimacs.Options, error) {
	var j encoderOptionsJSON
	dec := json.NewDecoder(bytes.NewReader(raw))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&j); err != nil {
		return dimacs.Options{}, fmt.Errorf("archive: encoder options: %s", jsonErr(raw, err, dec.InputOffset()))
	}
	if err := checkKeys(raw, &j); err != nil {
		return dimacs.Options{}, fmt.Errorf("archive: encoder options: %w", err)
	}
	k, err := cert.ParseKind(j.Kind)
	if err != nil {
		return dimacs.Options{}, fmt.Errorf("archive: encoder options: %w", err)
	}
	opt := dimacs.Options{
		Kind: k, Pages: j.Pages,
		Baseline: j.Baseline, NoRotation: j.NoRotation, NoReflection: j.NoReflection,
		NoPageSymmetry: j.NoPageSymmetry, NoBlocks: j.NoBlocks, NoLeaves: j.NoLeaves,
		NoIsolated: j.NoIsolated, NoBetweenness: j.NoBetweenness, NoDirect: j.NoDirect, NoTwins: j.NoTwins,
	}
	for _, s := range j.PageKinds {
		pk, err := cert.ParseKind(s)
		if err != nil {
			return dimacs.Options{}, fmt.Errorf("archive: encoder options: %w", err)
		}
		opt.PageKinds = append(opt.PageKinds, pk)
	}
	return opt, nil
}
