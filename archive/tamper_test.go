package archive

import (
	"archive/tar"
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"io"
	"slices"
	"strings"
	"sync"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture"
)

var (
	k5Once   sync.Once
	k5Bundle []byte
)

// k5Exact is a bundle for bt(K5) = 3 (Bernhart and Kainen 1979).
func k5Exact(t *testing.T) []byte {
	k5Once.Do(func() {
		k5Bundle = bundleBytes(t, evidence(t, fixture.WithBase(fixture.Complete(5), 1), "K5", cert.Stack, nil, Exact, 3))
	})
	if k5Bundle == nil {
		t.Skip("no bundle")
	}
	return k5Bundle
}

func members(t *testing.T, b []byte) map[string][]byte {
	t.Helper()
	files, err := walkAll(b)
	if err != nil {
		t.Fatal(err)
	}
	return files
}

// repack writes files as a bundle, SHA256SUMS recomputed.
func repack(t *testing.T, files map[string][]byte) []byte {
	t.Helper()
	var srcs []Source
	for n, d := range files {
		srcs = append(srcs, BytesSource(n, d))
	}
	return writeBytes(t, srcs)
}

func editManifest(t *testing.T, files map[string][]byte, edit func(m *Manifest)) {
	t.Helper()
	m, err := ReadManifest(files[ManifestName])
	if err != nil {
		t.Fatal(err)
	}
	edit(m)
	b, err := m.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	files[ManifestName] = b
}

func sum(b []byte) string { h := sha256.Sum256(b); return hex.EncodeToString(h[:]) }

// syncHashes makes the manifest's member and proof hashes match files.
func syncHashes(m *Manifest, files map[string][]byte) {
	for i, e := range m.Members {
		m.Members[i].SHA256, m.Members[i].Size = sum(files[e.Name]), int64(len(files[e.Name]))
	}
	if r := m.Refutation; r != nil {
		for i, p := range r.Proofs {
			r.Proofs[i].SHA256, r.Proofs[i].Size = sum(files[p.Member]), int64(len(files[p.Member]))
		}
	}
}

func mustFail(t *testing.T, b []byte, what ...string) *Report {
	t.Helper()
	r := verifyBytes(b, VerifyOptions{})
	if r.Verified {
		t.Fatal("tampered bundle verified")
	}
	f := failNames(r)
	for _, w := range what {
		if !strings.Contains(f, w) {
			t.Fatalf("failures do not mention %q:\n%s", w, f)
		}
	}
	return r
}

func TestTamperFileBytes(t *testing.T) {
	b := k5Exact(t)
	step := max(1, len(b)/60)
	for i := 0; i < len(b); i += step {
		c := bytes.Clone(b)
		c[i] ^= 0x20
		r := verifyBytes(c, VerifyOptions{})
		if r.Verified || len(r.Failures()) == 0 {
			t.Errorf("flip at byte %d of %d: verified", i, len(b))
		}
	}
}

// Changing one byte of any member, with SHA256SUMS left alone, fails the
// checksum of that member.
func TestTamperMemberSums(t *testing.T) {
	b := k5Exact(t)
	files := members(t, b)
	zb := bytes.Buffer{}
	_ = zb
	for name, data := range files {
		t.Run(name, func(t *testing.T) {
			for _, pos := range []int{0, len(data) / 2, len(data) - 1} {
				es := []rawEntry{}
				names := slices.Sorted(mapsKeys(files))
				var listed []rawEntry
				for _, n := range names {
					d := files[n]
					listed = append(listed, reg(n, d))
					if n == name {
						d = bytes.Clone(d)
						d[pos] ^= 0x01
					}
					es = append(es, reg(n, d))
				}
				raw := rawBundle(t, append([]rawEntry{sumsFor(listed...)}, es...)...)
				mustFail(t, raw, "integrity", name, "checksum mismatch")
			}
		})
	}
}

func mapsKeys(m map[string][]byte) func(func(string) bool) {
	return func(yield func(string) bool) {
		for k := range m {
			if !yield(k) {
				return
			}
		}
	}
}

// Changing a member and SHA256SUMS to match is caught by the hashes in the
// manifest, naming the member.
func TestTamperMemberForged(t *testing.T) {
	files := members(t, k5Exact(t))
	for name, data := range files {
		if name == ManifestName {
			continue
		}
		t.Run(name, func(t *testing.T) {
			c := map[string][]byte{}
			for n, d := range files {
				c[n] = d
			}
			d := bytes.Clone(data)
			d[len(d)/2] ^= 0x01
			c[name] = d
			mustFail(t, repack(t, c), name)
		})
	}
}

// Forged manifests, with every hash made consistent, still fail: the
// claim is re-checked from the graph, layout and proof.
func TestTamperManifestFields(t *testing.T) {
	files := members(t, k5Exact(t))
	tests := []struct {
		name string
		edit func(m *Manifest)
		want []string
	}{
		{"k up", func(m *Manifest) {
			m.Claim.K = 4
			m.Layout.Pages = 4
			m.Refutation.Pages = 3
			m.Refutation.PageKinds = append(m.Refutation.PageKinds, "stack")
		}, []string{"cnf", "do not describe"}},
		{"k up with options", func(m *Manifest) {
			m.Claim.K = 4
			m.Layout.Pages = 4
			m.Refutation.Pages = 3
			m.Refutation.PageKinds = append(m.Refutation.PageKinds, "stack")
			m.Refutation.Encoder.Options = editOptions(t, m.Refutation.Encoder.Options, func(o *dimacs.Options) { o.Pages = 3 })
		}, []string{"encoder drift", "changed without a version change, or the bundle was altered"}},
		{"k down", func(m *Manifest) {
			m.Claim.K = 2
			m.Layout.Pages = 2
			m.Refutation.Pages = 1
			m.Refutation.PageKinds = m.Refutation.PageKinds[:1]
		}, []string{"layout"}},
		{"k alone", func(m *Manifest) { m.Claim.K = 4 }, []string{"manifest", "k=4"}},
		{"graph id", func(m *Manifest) { m.Claim.GraphID = strings.Repeat("ab", 32) }, []string{"graph", "the claim names abab"}},
		{"cnf hash", func(m *Manifest) { m.Refutation.CNF.SHA256 = strings.Repeat("0", 64) }, []string{"encoder drift"}},
		{"proof hash", func(m *Manifest) { m.Refutation.Proofs[0].SHA256 = strings.Repeat("1", 64) }, []string{"proof record proofs/refutation.drat", "the manifest records"}},
		{"member hash", func(m *Manifest) { m.Members[0].SHA256 = strings.Repeat("2", 64) }, []string{"members", m0(files)}},
		{"bound", func(m *Manifest) { m.Claim.Bound = AtLeast }, []string{"manifest", "layout is given for an at_least claim"}},
		{"vertices", func(m *Manifest) { m.Claim.Vertices = 6 }, []string{"graph", "n=6"}},
		{"encoder options", func(m *Manifest) {
			m.Refutation.Encoder.Options = editOptions(t, m.Refutation.Encoder.Options, func(o *dimacs.Options) { o.NoRotation = true })
		}, []string{"encoder drift"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			c := map[string][]byte{}
			for n, d := range files {
				c[n] = d
			}
			editManifest(t, c, tc.edit)
			mustFail(t, repack(t, c), tc.want...)
		})
	}
}

func editOptions(t *testing.T, raw []byte, edit func(o *dimacs.Options)) []byte {
	o, err := UnmarshalEncoderOptions(raw)
	if err != nil {
		t.Fatal(err)
	}
	edit(&o)
	b, err := MarshalEncoderOptions(o)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func m0(files map[string][]byte) string {
	m, _ := ReadManifest(files[ManifestName])
	if m == nil {
		return "?"
	}
	return m.Members[0].Name
}

// A valid archive whose proof refutes some other formula: every hash is
// consistent, the proof is rejected against the claim's CNF.
func TestForeignProof(t *testing.T) {
	// bt(Petersen) = 3 (REFERENCES: not planar, Bernhart and Kainen 1979);
	// the foreign proof refutes K6 on 2 pages, a different formula.
	files := members(t, bundleBytes(t, evidence(t, fixture.Petersen(), "Petersen", cert.Stack, nil, AtLeast, 3)))
	other, err := CurrentEncoder{}.Encode(fixture.WithBase(fixture.Complete(6), 1), dimacs.Options{Kind: cert.Stack, Pages: 2})
	if err != nil {
		t.Fatal(err)
	}
	files["proofs/refutation.drat"] = readFile(t, proofByCadical(t, other))
	editManifest(t, files, func(m *Manifest) { syncHashes(m, files) })
	mustFail(t, repack(t, files), "proof proofs/refutation.drat", "rejected")
}

func readFile(t *testing.T, p string) []byte {
	t.Helper()
	b, err := readAllFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

var _ = io.EOF
var _ = context.Background

// A member other than a proof that claims more bytes than Verify holds in
// memory is rejected before it is read.
func TestVerifyHeldBudget(t *testing.T) {
	files := members(t, k5Exact(t))
	var es []rawEntry
	for _, n := range slices.Sorted(mapsKeys(files)) {
		es = append(es, reg(n, files[n]))
	}
	big := rawEntry{hdr: es[0].hdr}
	big.hdr.Name, big.hdr.Size = "cnf/claim.cnf", maxHeld+1
	listed := append([]rawEntry{reg("cnf/claim.cnf", nil)}, es...)
	// The archive ends right after the big member's header: the claimed
	// size alone must get it rejected.
	var tb bytes.Buffer
	tw := tar.NewWriter(&tb)
	for _, e := range []rawEntry{sumsFor(listed...), big} {
		h := e.hdr
		if err := tw.WriteHeader(&h); err != nil {
			t.Fatal(err)
		}
		tw.Write(e.data)
	}
	raw := compress(t, tb.Bytes())
	r := mustFail(t, raw, "integrity", "cnf/claim.cnf", "size limit exceeded")
	if r.Unreadable {
		t.Fatal("reported as unreadable")
	}
}
