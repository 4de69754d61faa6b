package archive

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"spinecert.dev/dimacs"
)

// Altered bundles of a refutation split into cubes: each alteration below
// is re-hashed so that the integrity checks pass, and verify must still
// refuse the claim, naming what is wrong. The bundle is the Petersen one of
// testdata/bundles (bt(Petersen) ≥ 3: not planar; Bernhart and Kainen 1979).
func TestCubeBundleTampering(t *testing.T) {
	orig, err := os.ReadFile(filepath.Join("..", "testdata", "bundles", "petersen-cubes.spinecert.tar.zst"))
	if err != nil {
		t.Fatal(err)
	}
	if r := Verify(context.Background(), bytes.NewReader(orig), "orig", VerifyOptions{}); !r.Verified {
		t.Fatalf("the original does not verify: %s", failNames(r))
	}
	resync := func(m *Manifest, files map[string][]byte) {
		syncHashes(m, files)
		cs := m.Refutation.Cubes
		for i, e := range cs.Entries {
			cs.Entries[i].Proof.SHA256, cs.Entries[i].Proof.Size = sum(files[e.Proof.Member]), int64(len(files[e.Proof.Member]))
		}
		cs.SHA256 = sum(files[cs.Member])
		syncHashes(m, files)
	}
	cases := []struct {
		name  string
		edit  func(m *Manifest, files map[string][]byte)
		check string // the failing check
		want  string // in its detail
	}{
		{"a cube dropped", func(m *Manifest, files map[string][]byte) {
			cs := m.Refutation.Cubes
			lines := strings.SplitAfter(string(files[cs.Member]), "\n")
			files[cs.Member] = []byte(strings.Join(lines[1:], ""))
			delete(files, cs.Entries[0].Proof.Member)
			cs.Entries = cs.Entries[1:]
			for i := range cs.Entries {
				cs.Entries[i].Cube = i + 1
			}
			cs.Count--
			var kept []MemberEntry
			for _, e := range m.Members {
				if _, ok := files[e.Name]; ok {
					kept = append(kept, e)
				}
			}
			m.Members = kept
		}, "coverage", "no cube continues with"},
		{"a truncated proof", func(m *Manifest, files map[string][]byte) {
			p := m.Refutation.Cubes.Entries[4].Proof.Member
			files[p] = files[p][:len(files[p])/2]
		}, "cube 5", "cube "},
		{"one proof named for two cubes", func(m *Manifest, files map[string][]byte) {
			cs := m.Refutation.Cubes
			delete(files, cs.Entries[1].Proof.Member)
			cs.Entries[1].Proof = cs.Entries[0].Proof
			var kept []MemberEntry
			for _, e := range m.Members {
				if _, ok := files[e.Name]; ok {
					kept = append(kept, e)
				}
			}
			m.Members = kept
		}, "manifest", "name the same member"},
		{"a cube's literal negated", func(m *Manifest, files map[string][]byte) {
			cs := m.Refutation.Cubes
			text := string(files[cs.Member])
			i := strings.Index(text, "\na ") + 3
			j := i + strings.IndexByte(text[i:], ' ')
			lit := text[i:j]
			if strings.HasPrefix(lit, "-") {
				lit = lit[1:]
			} else {
				lit = "-" + lit
			}
			files[cs.Member] = []byte(text[:i] + lit + text[j:])
		}, "coverage", ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			files := members(t, orig)
			editManifest(t, files, func(m *Manifest) {
				c.edit(m, files)
				resync(m, files)
			})
			r := Verify(context.Background(), bytes.NewReader(repack(t, files)), c.name, VerifyOptions{})
			if r.Verified {
				t.Fatal("an altered bundle verified")
			}
			found := false
			for _, f := range r.Failures() {
				if f.Name == c.check && strings.Contains(f.Detail, c.want) {
					found = true
				}
			}
			if !found {
				t.Fatalf("no failing check %q with %q:\n%s", c.check, c.want, failNames(r))
			}
		})
	}
}

// TestCubeBundleDrift: under an encoder that gives another CNF, the cube
// proofs cannot be checked and the bundle fails, unless a re-solve of the
// current encoding re-establishes the claim (Resolve, verify --resolve).
func TestCubeBundleDrift(t *testing.T) {
	orig, err := os.ReadFile(filepath.Join("..", "testdata", "bundles", "petersen-cubes.spinecert.tar.zst"))
	if err != nil {
		t.Fatal(err)
	}
	enc := changedEncoder{"spinecert-enc-999", func(o *dimacs.Options) { o.NoRotation = true }}
	r := Verify(context.Background(), bytes.NewReader(orig), "drift", VerifyOptions{Encoder: enc})
	if r.Verified || r.Drift == nil {
		t.Fatalf("verified %v, drift %+v under a changed encoder", r.Verified, r.Drift)
	}
	r = Verify(context.Background(), bytes.NewReader(orig), "drift", VerifyOptions{Encoder: enc, Resolve: resolveWithCadical(t)})
	if !r.Verified || r.Drift == nil || !r.Drift.Resolved {
		t.Fatalf("not re-established by re-solving: %s", failNames(r))
	}
}
