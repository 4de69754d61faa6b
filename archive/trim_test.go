package archive

import (
	"bytes"
	"context"
	"os"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/internal/fixture"
)

// The Petersen graph has no 2-page stack layout: it is not planar, and
// bt <= 2 iff subhamiltonian planar (Bernhart and Kainen, "The book thickness
// of a graph", JCTB 27, 1979). cadical's proof of that has lemmas the
// refutation does not need; the bundle stores the trimmed proof, records the
// proof it came from, and the bundle verifies, the trimmed proof being
// checked from scratch against the CNF re-encoded from the graph.
func TestBuildStoresTrimmedProof(t *testing.T) {
	g := fixture.Petersen()
	ev := evidence(t, g, "Petersen", cert.Stack, nil, AtLeast, 3)
	given, err := os.Stat(ev.Refutation.Proof)
	if err != nil {
		t.Fatal(err)
	}
	m, srcs, err := Build(context.Background(), ev, CurrentEncoder{}, t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	p := m.Refutation.Proofs[0]
	tf := p.TrimmedFrom
	if tf == nil {
		t.Fatal("the proof was stored untrimmed")
	}
	if tf.Size != given.Size() || p.Size >= tf.Size || tf.CoreLemmas >= tf.Lemmas || tf.SHA256 == p.SHA256 {
		t.Fatalf("trimmed %d bytes from %+v (given %d bytes): want a smaller proof of fewer lemmas", p.Size, tf, given.Size())
	}
	var buf bytes.Buffer
	if err := Write(context.Background(), &buf, srcs); err != nil {
		t.Fatal(err)
	}
	b := buf.Bytes()
	r := verifyBytes(b, VerifyOptions{})
	if !r.Verified {
		t.Fatalf("not verified:\n%s", failNames(r))
	}
	t.Logf("proof %d bytes, %d lemmas; trimmed %d bytes, %d lemmas; bundle %d bytes", tf.Size, tf.Lemmas, p.Size, tf.CoreLemmas, len(b))
}
