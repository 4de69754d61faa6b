package archive

import (
	"bytes"
	"encoding/json"
	"errors"
	"strings"
	"testing"
)

const zeroHash = "0000000000000000000000000000000000000000000000000000000000000000"

func sampleManifest() *Manifest {
	return &Manifest{
		Format: FormatName, FormatVersion: FormatVersion, ToolVersion: "0.1.0", Tool: "spinecert bundle",
		Compression: Compression{Module: CompressModule, Version: "v1.20.4", Settings: Settings},
		Claim:       Claim{GraphID: zeroHash, Vertices: 7, Edges: 21, Kind: "stack", Bound: Exact, K: 4},
		Graph:       GraphFiles{Input: "graph/input.txt", InputFormat: "edgelist", Canonical: "graph/canonical.txt"},
		Layout:      &LayoutRecord{Member: "layout.json", Pages: 4, Check: "valid"},
		Refutation: &Refutation{
			Pages: 3, PageKinds: []string{"stack", "stack", "stack"},
			Encoder: EncoderEntry{Version: "1", Options: json.RawMessage(`{ "symmetry": true }`)},
			CNF:     CNFEntry{SHA256: zeroHash, Vars: 10, Clauses: 20, Source: CNFOwn},
			Runs:    []Run{{Backend: "cadical", Version: "1.5.3", Answer: "unsat", Seconds: 0.5}},
			Proofs:  []Proof{{Member: "proofs/refutation.drat", Format: "drat-binary", Size: 10, SHA256: zeroHash, Checker: "spinecert drat", Result: ResultVerified}},
		},
		Members: []MemberEntry{{"graph/canonical.txt", 1, zeroHash}, {"graph/input.txt", 1, zeroHash}, {"layout.json", 1, zeroHash}, {"proofs/refutation.drat", 10, zeroHash}},
	}
}

func TestManifestRoundTrip(t *testing.T) {
	m := sampleManifest()
	b, err := m.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	other := sampleManifest()
	other.Refutation.Encoder.Options = json.RawMessage("{\"symmetry\":\n true}")
	if ob, _ := other.Marshal(); !bytes.Equal(ob, b) {
		t.Errorf("options spacing changes the bytes:\n%s\n%s", b, ob)
	}
	m2, err := ReadManifest(b)
	if err != nil {
		t.Fatal(err)
	}
	b2, _ := m2.Marshal()
	if !bytes.Equal(b, b2) {
		t.Fatalf("marshal not stable:\n%s\n%s", b, b2)
	}
}

func TestManifestRejects(t *testing.T) {
	tests := []struct {
		name string
		edit func(m *Manifest)
		raw  string
		want string
	}{
		{name: "version", edit: func(m *Manifest) { m.FormatVersion = 2 }, want: "format_version is 2"},
		{name: "graph id", edit: func(m *Manifest) { m.Claim.GraphID = "xyz" }, want: "claim.graph_id"},
		{name: "k mismatch", edit: func(m *Manifest) { m.Claim.K = 5 }, want: "layout.pages is 4, the claim has k=5"},
		{name: "bound", edit: func(m *Manifest) { m.Claim.Bound = "maybe" }, want: "claim.bound"},
		{name: "no layout", edit: func(m *Manifest) { m.Layout = nil }, want: "layout is required"},
		{name: "no refutation", edit: func(m *Manifest) { m.Refutation = nil }, want: "refutation is required"},
		{name: "proof hash", edit: func(m *Manifest) { m.Refutation.Proofs[0].SHA256 = "ABC" }, want: "proofs[0].sha256"},
		{name: "trimmed lrat", edit: func(m *Manifest) {
			m.Refutation.Proofs[0].Format = "lrat"
			m.Refutation.Proofs[0].TrimmedFrom = &TrimmedFrom{Format: "drat-binary", Size: 20, SHA256: zeroHash, Lemmas: 5, CoreLemmas: 3}
		}, want: "trimmed_from: only drat-binary trimmed to drat-binary"},
		{name: "trimmed core", edit: func(m *Manifest) {
			m.Refutation.Proofs[0].TrimmedFrom = &TrimmedFrom{Format: "drat-binary", Size: 20, SHA256: zeroHash, Lemmas: 3, CoreLemmas: 5}
		}, want: "core_lemmas (at most lemmas)"},
		{name: "unlisted", edit: func(m *Manifest) { m.Members = m.Members[1:] }, want: `names "graph/canonical.txt", which is not in members`},
		{name: "extra", edit: func(m *Manifest) { m.Members = append(m.Members, MemberEntry{"z", 0, zeroHash}) }, want: `lists "z", which no field`},
		{name: "unsafe", edit: func(m *Manifest) { m.Layout.Member = "../x" }, want: "layout.member"},
		{name: "foreign no member", edit: func(m *Manifest) { m.Refutation.CNF.Source = CNFForeign }, want: "foreign CNF must be included"},
		{name: "unknown field", raw: `{"format":"spinecert-bundle","extra":1}`, want: `unknown field "extra"`},
		{name: "type", raw: "{\n\"format_version\": \"1\"}", want: "2:22: field \"format_version\": expected int"},
		{name: "syntax", raw: "{\n  \"format\": ,}", want: "2:13: invalid character ','"},
		{name: "trailing", raw: `{} {}`, want: "data after the manifest object"},
		{name: "empty", raw: ``, want: "empty"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			data := []byte(tc.raw)
			if tc.edit != nil {
				m := sampleManifest()
				tc.edit(m)
				data, _ = m.Marshal()
			}
			_, err := ReadManifest(data)
			if err == nil {
				t.Fatal("accepted")
			}
			if !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("error %q, want %q", err, tc.want)
			}
		})
	}
}

// FuzzReadManifest: the reader never panics, and what it accepts marshals
// to bytes it reads back to the same value.
func FuzzReadManifest(f *testing.F) {
	b, _ := sampleManifest().Marshal()
	f.Add(b)
	f.Add([]byte(`{}`))
	f.Add([]byte(`{"format":"spinecert-bundle","format_version":1}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		m, err := ReadManifest(data)
		if err != nil {
			if !IsBadBundle(err) {
				t.Fatalf("error %v is not a bundle error", err)
			}
			return
		}
		out, err := m.Marshal()
		if err != nil {
			t.Fatal(err)
		}
		m2, err := ReadManifest(out)
		if err != nil {
			t.Fatalf("re-read: %v", err)
		}
		out2, _ := m2.Marshal()
		if !bytes.Equal(out, out2) {
			t.Fatal("marshal not stable")
		}
	})
}

// FuzzWalk: the bundle reader never panics and rejects with a bundle error.
func FuzzWalk(f *testing.F) {
	f.Add(writeBytes(f, sampleMembers()))
	ok := reg("manifest.json", []byte("{}\n"))
	f.Add(rawBundle(f, sumsFor(ok), ok))
	f.Add(rawBundle(f, sumsFor(ok), reg("../x", nil)))
	f.Fuzz(func(t *testing.T, data []byte) {
		lim := DefaultLimits()
		lim.Grace = 1 << 20
		lim.TotalSize = 64 << 20
		_, err := Walk(t.Context(), bytes.NewReader(data), "fuzz", lim, nil)
		if err != nil && !IsBadBundle(err) {
			t.Fatalf("error %v is not a bundle error", err)
		}
	})
}

// A manifest must mean the same to spinecert as to other JSON readers:
// encoding/json matches keys without regard to case and lets a later key
// win, while jq and Python's json keep the last key as written.
func TestManifestRejectsAmbiguousKeys(t *testing.T) {
	b, err := sampleManifest().Marshal()
	if err != nil {
		t.Fatal(err)
	}
	fake := `"Claim": {"graph_id": "` + zeroHash + `", "name": "fake", "vertices": 7, "edges": 21, "kind": "stack", "bound": "exact", "k": 4},` + "\n  "
	for _, tc := range []struct {
		name, data, want string
	}{
		{"case", strings.Replace(string(b), `"members":`, fake+`"members":`, 1), `keys "claim" and "Claim" differ only in case`},
		{"case first", strings.Replace(string(b), `"claim":`, `"Claim":`, 1), `key "Claim" is not "claim"`},
		{"twice", strings.Replace(string(b), `"members":`, strings.Replace(fake, "Claim", "claim", 1)+`"members":`, 1), `key "claim" appears twice`},
		{"inner", strings.Replace(string(b), `"k": 4`, `"k": 4, "K": 3`, 1), `keys "k" and "K" differ only in case`},
		{"options", strings.Replace(string(b), `"symmetry": true`, `"symmetry": true, "Symmetry": false`, 1), `keys "symmetry" and "Symmetry"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.data == string(b) {
				t.Fatal("the edit did not apply")
			}
			_, err := ReadManifest([]byte(tc.data))
			if !errors.Is(err, ErrManifest) || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("error %v, want %q", err, tc.want)
			}
		})
	}
}

func TestEncoderOptionsRejectAmbiguousKeys(t *testing.T) {
	for raw, want := range map[string]string{
		`{"kind":"stack","pages":2,"pages":3}`:    `1:27: key "pages" appears twice`,
		`{"kind":"stack","pages":2,"Pages":3}`:    `keys "pages" and "Pages" differ only in case`,
		`{"kind":"stack","Pages":2}`:              `key "Pages" is not "pages"`,
		`{"kind":"stack","pages":2,"no_twins":1}`: "expected bool",
	} {
		_, err := UnmarshalEncoderOptions([]byte(raw))
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("%s: error %v, want %q", raw, err, want)
		}
	}
}
