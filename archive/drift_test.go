package archive

import (
	"context"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/internal/fixture"
)

// changedEncoder simulates a later encoder: a new version whose output
// differs (here: one symmetry-breaking option switched).
type changedEncoder struct {
	version string
	change  func(o *dimacs.Options)
}

func (c changedEncoder) Version() string { return c.version }
func (c changedEncoder) Encode(g *graph.Graph, o dimacs.Options) (*dimacs.CNF, error) {
	c.change(&o)
	return CurrentEncoder{}.Encode(g, o)
}

func resolveWithCadical(t *testing.T) func(ctx context.Context, cnf *dimacs.CNF) (*Resolution, error) {
	return func(ctx context.Context, cnf *dimacs.CNF) (*Resolution, error) {
		return &Resolution{Answer: "unsat", Proof: proofByCadical(t, cnf), ProofFormat: "drat-binary"}, nil
	}
}

func TestEncoderDrift(t *testing.T) {
	b := k5Exact(t)
	noRot := func(o *dimacs.Options) { o.NoRotation = true }
	t.Run("new version", func(t *testing.T) {
		r := verifyBytes(b, VerifyOptions{Encoder: changedEncoder{"spinecert-enc-999", noRot}})
		if r.Verified {
			t.Fatal("verified under a changed encoder")
		}
		d := r.Drift
		if d == nil || !d.VersionChanged || !d.CNFChanged || d.Resolved || d.BundleEncoder != dimacs.EncoderVersion || d.CurrentEncoder != "spinecert-enc-999" {
			t.Fatalf("drift %+v", d)
		}
		if !strings.Contains(d.Summary, "encoder changed since the bundle was made") {
			t.Errorf("summary %q", d.Summary)
		}
		// The stored proof could not be checked against anything: it is not reported as passed.
		for _, c := range r.Checks {
			if strings.HasPrefix(c.Name, "proof") && c.Status == StatusPass {
				t.Errorf("proof reported as passed: %+v", c)
			}
		}
	})
	t.Run("same version", func(t *testing.T) {
		r := verifyBytes(b, VerifyOptions{Encoder: changedEncoder{dimacs.EncoderVersion, noRot}})
		if r.Verified || r.Drift == nil || r.Drift.VersionChanged || !r.Drift.CNFChanged {
			t.Fatalf("verified=%v drift %+v", r.Verified, r.Drift)
		}
	})
	t.Run("same output", func(t *testing.T) {
		r := verifyBytes(b, VerifyOptions{Encoder: changedEncoder{"spinecert-enc-999", func(*dimacs.Options) {}}})
		if !r.Verified || r.Drift == nil || r.Drift.CNFChanged {
			t.Fatalf("verified=%v drift %+v\n%s", r.Verified, r.Drift, failNames(r))
		}
	})
	t.Run("resolve", func(t *testing.T) {
		r := verifyBytes(b, VerifyOptions{Encoder: changedEncoder{"spinecert-enc-999", noRot}, Resolve: resolveWithCadical(t)})
		if !r.Verified || r.Drift == nil || !r.Drift.Resolved {
			t.Fatalf("verified=%v drift %+v\n%s", r.Verified, r.Drift, failNames(r))
		}
	})
	t.Run("resolve sat", func(t *testing.T) {
		r := verifyBytes(b, VerifyOptions{Encoder: changedEncoder{"spinecert-enc-999", noRot},
			Resolve: func(ctx context.Context, cnf *dimacs.CNF) (*Resolution, error) {
				return &Resolution{Answer: "sat"}, nil
			}})
		if r.Verified || !strings.Contains(failNames(r), "satisfiable") {
			t.Fatalf("verified=%v\n%s", r.Verified, failNames(r))
		}
	})
	t.Run("stored cnf", func(t *testing.T) {
		ev := evidence(t, fixture.WithBase(fixture.Complete(5), 1), "K5", cert.Stack, nil, AtLeast, 3)
		ev.IncludeCNF = true
		sb := bundleBytes(t, ev)
		r := verifyBytes(sb, VerifyOptions{Encoder: changedEncoder{"spinecert-enc-999", noRot}})
		if r.Verified || r.Drift == nil || !r.Drift.StoredCNFChecked {
			t.Fatalf("verified=%v drift %+v", r.Verified, r.Drift)
		}
	})
}

// A proof made elsewhere for a CNF that is not spinecert's encoding is bundled
// as foreign; it does not establish the claim unless re-solved.
func TestForeignCNF(t *testing.T) {
	g := fixture.WithBase(fixture.Complete(5), 1)
	opt := dimacs.Options{Kind: cert.Stack, Pages: 2}
	cnf, err := CurrentEncoder{}.Encode(g, opt)
	if err != nil {
		t.Fatal(err)
	}
	cnf.Comments = []string{"made by another tool"}
	text, _, _ := CNFText(cnf)
	dir := t.TempDir()
	path := filepath.Join(dir, "other.cnf")
	os.WriteFile(path, text, 0o644)
	ev := evidence(t, g, "K5", cert.Stack, nil, AtMost, 3)
	ev.Bound = Exact
	ev.Refutation = &RefutationInput{Options: opt, Proof: proofByCadical(t, cnf), ForeignCNF: path}
	m, srcs, err := Build(context.Background(), ev, CurrentEncoder{}, dir)
	if err != nil {
		t.Fatal(err)
	}
	if m.Refutation.CNF.Source != CNFForeign || m.Refutation.CNF.Member == "" {
		t.Fatalf("cnf entry %+v", m.Refutation.CNF)
	}
	b := writeBytes(t, srcs)
	r := verifyBytes(b, VerifyOptions{})
	if r.Verified || !strings.Contains(failNames(r), "made elsewhere") {
		t.Fatalf("verified=%v\n%s", r.Verified, failNames(r))
	}
	r = verifyBytes(b, VerifyOptions{Resolve: resolveWithCadical(t)})
	if !r.Verified {
		t.Fatalf("not verified after re-solving:\n%s", failNames(r))
	}
	// A proof given for a CNF that equals spinecert's encoding is recorded as spinecert's.
	same := filepath.Join(dir, "same.cnf")
	cnf.Comments = nil
	real, _ := CurrentEncoder{}.Encode(g, opt)
	text, _, _ = CNFText(real)
	os.WriteFile(same, text, 0o644)
	ev.Refutation.ForeignCNF = same
	if m, _, err = Build(context.Background(), ev, CurrentEncoder{}, dir); err != nil || m.Refutation.CNF.Source != CNFOwn {
		t.Fatalf("err %v, cnf %+v", err, m.Refutation.CNF)
	}
}

// Every field of dimacs.Options is recorded in the manifest's encoder
// options, so a recorded object determines the encoding.
func TestEncoderOptionsCoverAllFields(t *testing.T) {
	ot := reflect.TypeOf(dimacs.Options{})
	jt := reflect.TypeOf(encoderOptionsJSON{})
	for i := 0; i < ot.NumField(); i++ {
		if _, ok := jt.FieldByName(ot.Field(i).Name); !ok {
			t.Errorf("dimacs.Options.%s is not recorded in manifests", ot.Field(i).Name)
		}
	}
	o := dimacs.Options{Kind: cert.Mixed, Pages: 2, PageKinds: []cert.Kind{cert.Stack, cert.Queue}, NoDirect: true, NoLeaves: true}
	raw, _ := MarshalEncoderOptions(o)
	back, err := UnmarshalEncoderOptions(raw)
	if err != nil || !reflect.DeepEqual(o, back) {
		t.Fatalf("round trip %+v -> %s -> %+v (%v)", o, raw, back, err)
	}
	if _, err := UnmarshalEncoderOptions([]byte(`{"kind":"stack","pages":2,"symmetry":true}`)); err == nil {
		t.Fatal("unknown option accepted")
	}
}
