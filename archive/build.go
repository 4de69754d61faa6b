package archive

import (
	"bufio"
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"os"
	"slices"
	"strings"

	"spinecert.dev/atomicfile"
	"spinecert.dev/cert"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/planar/planarcert"
	"spinecert.dev/proof"
)

// Member names spinecert gives the parts of a bundle.
const (
	memberCanonical  = "graph/canonical.txt"
	memberLayout     = "layout.json"
	memberPlanarity  = "planarity.json"
	memberCNF        = "cnf/claim.cnf"
	memberForeignCNF = "cnf/foreign.cnf"
	memberSubgraph   = "graph/subgraph.txt"
	memberSubCNF     = "cnf/sub.cnf"
	memberSubVars    = "cnf/sub-vars.txt"
)

// Evidence is what goes into a bundle.
type Evidence struct {
	Graph       *graph.Graph
	Name        string       // optional short name of the graph, e.g. "K7"
	Input       []byte       // the graph file as given
	InputFormat graph.Format // its format (not FormatAuto)
	Kind        cert.Kind    // Stack, Queue or Mixed
	PageKinds   []cert.Kind  // Mixed only: the K layout pages (at_most) or K-1 refuted pages (at_least)
	Bound       string       // AtMost, AtLeast or Exact
	K           int

	Layout     *cert.Layout     // AtMost, Exact: a layout with at most K pages
	Refutation *RefutationInput // AtLeast, Exact
	Planarity  *planarcert.Cert // optional

	ToolVersion string
	Tool        string
	Created     string // RFC 3339, or "" to record no time
	IncludeCNF  bool
}

// RefutationInput is the evidence that K-1 pages do not suffice.
type RefutationInput struct {
	Options     dimacs.Options // encoder options, Pages = K-1
	Runs        []Run          // the solver runs that gave the proof (may be empty); their Seconds are not recorded
	Proof       string         // path of the proof file
	ProofFormat string         // drat, drat-binary or lrat; "" = detect
	ForeignCNF  string         // path of a CNF made elsewhere that the proof refutes, or ""
	// Subgraph, when not nil, is the subgraph of the claim's graph that the
	// proof refutes (labelled as in the graph; graph.CheckSubgraph must hold).
	Subgraph *graph.Graph
	// Sub, when not nil, is a sub-formula of the on-demand formulation that
	// the proof refutes (instead of the default encoding).
	Sub *dimacs.Sub
	// Cubes, when not nil, splits the refutation of spinecert's own CNF
	// into cubes (Proof, ProofFormat, ForeignCNF and Sub are then unused).
	Cubes *CubesInput
}

func inputExt(f graph.Format) string {
	switch f {
	case graph.FormatDIMACS:
		return "dimacs"
	case graph.FormatGraph6:
		return "g6"
	case graph.FormatSparse6:
		return "s6"
	}
	return "txt"
}

func proofExt(format string) string {
	switch format {
	case "drat-binary":
		return "drat"
	case "drat":
		return "drat.txt"
	}
	return "lrat"
}

// Build checks the evidence and returns the manifest and the members of its
// bundle (the manifest member included). The layout is validated with
// cert.Validate; the CNF is made by enc from the graph and the recorded
// options (or, for a foreign CNF, compared with that encoding by hash); the
// proof is checked with CheckProof. Evidence that fails returns an error
// wrapping ErrRejected. tmpDir holds temporary files: LRAT output, and the
// binary form of a text proof, which the returned members read, so the
// caller removes tmpDir only after writing the bundle.
func Build(ctx context.Context, ev *Evidence, enc Encoder, tmpDir string) (*Manifest, []Source, error) {
	g := ev.Graph
	m := &Manifest{
		Format: FormatName, FormatVersion: FormatVersion,
		ToolVersion: ev.ToolVersion, Tool: ev.Tool, Created: ev.Created,
		Compression: Compression{Module: CompressModule, Version: CompressVersion(), Settings: Settings},
		Claim: Claim{GraphID: g.ID(), Name: ev.Name, Vertices: g.N(), Edges: g.M(),
			Kind: ev.Kind.String(), Bound: ev.Bound, K: ev.K},
	}
	if ev.Kind == cert.Mixed {
		for _, k := range ev.PageKinds {
			m.Claim.PageKinds = append(m.Claim.PageKinds, k.String())
		}
	}
	var srcs []Source
	add := func(s Source) { srcs = append(srcs, s) }

	inputName := "graph/input." + inputExt(ev.InputFormat)
	m.Graph = GraphFiles{Input: inputName, InputFormat: ev.InputFormat.String(), Canonical: memberCanonical}
	if inputName == memberCanonical {
		m.Graph.Input = "graph/input.edges.txt"
	}
	add(BytesSource(m.Graph.Input, ev.Input))
	var canon bytes.Buffer
	if err := graph.WriteEdgeList(&canon, g); err != nil {
		return nil, nil, fmt.Errorf("archive: %w", err)
	}
	add(BytesSource(memberCanonical, canon.Bytes()))

	if ev.Bound == AtMost || ev.Bound == Exact {
		if ev.Layout == nil {
			return nil, nil, fmt.Errorf("archive: a %s claim needs a layout", ev.Bound)
		}
		l := *ev.Layout
		if l.Pages() > ev.K {
			return nil, nil, fmt.Errorf("%w: the layout has %d pages, the claim is at most %d", ErrRejected, l.Pages(), ev.K)
		}
		// A layout on fewer pages is also one on K pages: add empty pages.
		for len(l.PageKinds) < ev.K {
			l.PageKinds = append(slices.Clone(l.PageKinds), pad(l.Kind, ev.PageKinds, len(l.PageKinds)))
		}
		if rep := cert.Validate(g, &l); !rep.OK() {
			return nil, nil, fmt.Errorf("%w: %w", ErrRejected, rep.Err())
		}
		var lb bytes.Buffer
		if err := cert.WriteLayoutJSON(&lb, g, &l); err != nil {
			return nil, nil, fmt.Errorf("archive: %w", err)
		}
		add(BytesSource(memberLayout, lb.Bytes()))
		m.Layout = &LayoutRecord{Member: memberLayout, Pages: ev.K, Check: "valid"}
	}
	if ev.Bound == AtLeast || ev.Bound == Exact {
		r, ss, err := buildRefutation(ctx, ev, enc, tmpDir)
		if err != nil {
			return nil, nil, err
		}
		m.Refutation = r
		srcs = append(srcs, ss...)
	}
	if ev.Planarity != nil {
		if err := planarcert.Check(g, ev.Planarity); err != nil {
			return nil, nil, fmt.Errorf("archive: planarity certificate: %w: %w", ErrRejected, err)
		}
		var pb bytes.Buffer
		if err := planarcert.Write(&pb, g, ev.Planarity); err != nil {
			return nil, nil, fmt.Errorf("archive: %w", err)
		}
		add(BytesSource(memberPlanarity, pb.Bytes()))
		m.Planarity = &PlanarityEntry{Member: memberPlanarity, Planar: ev.Planarity.Planar}
	}
	for _, s := range srcs {
		sum, err := hashSource(ctx, s)
		if err != nil {
			return nil, nil, err
		}
		m.Members = append(m.Members, MemberEntry{Name: s.Name, Size: s.Size, SHA256: sum})
	}
	slices.SortFunc(m.Members, func(a, b MemberEntry) int { return strings.Compare(a.Name, b.Name) })
	if err := m.Validate(); err != nil {
		return nil, nil, fmt.Errorf("archive: the manifest would be invalid: %w", err)
	}
	mb, err := m.Marshal()
	if err != nil {
		return nil, nil, err
	}
	return m, append(srcs, BytesSource(ManifestName, mb)), nil
}

// BuildFile is Build followed by WriteFile: it checks the evidence and
// writes the bundle to path atomically, nothing unless every check passed.
// tmpDir holds Build's converted and trimmed proofs until the bundle is
// written; the caller removes it.
func BuildFile(ctx context.Context, ev *Evidence, enc Encoder, tmpDir, path string) (*Manifest, error) {
	m, srcs, err := Build(ctx, ev, enc, tmpDir)
	if err != nil {
		return nil, err
	}
	if err := WriteFile(ctx, path, srcs); err != nil {
		return nil, err
	}
	return m, nil
}

// pad returns the kind of added page i of a layout of kind k.
func pad(k cert.Kind, mixed []cert.Kind, i int) cert.Kind {
	if k == cert.Mixed && i < len(mixed) {
		return mixed[i]
	}
	if k == cert.Mixed {
		return cert.Stack
	}
	return k
}

func hashFile(path string) (string, int64, error) {
	sum, n, err := atomicfile.SHA256(path)
	if err != nil {
		return "", 0, fmt.Errorf("archive: %w", err)
	}
	return sum, n, nil
}

func buildRefutation(ctx context.Context, ev *Evidence, enc Encoder, tmpDir string) (*Refutation, []Source, error) {
	in := ev.Refutation
	if in == nil {
		return nil, nil, fmt.Errorf("archive: a %s claim needs a refutation", ev.Bound)
	}
	opt := in.Options
	if opt.Pages != ev.K-1 {
		return nil, nil, fmt.Errorf("archive: the refutation is of %d pages, the claim needs %d", opt.Pages, ev.K-1)
	}
	kinds, err := cert.PageKinds(opt.Kind, opt.Pages, opt.PageKinds)
	if err != nil {
		return nil, nil, fmt.Errorf("archive: %w", err)
	}
	optJSON, err := MarshalEncoderOptions(opt)
	if err != nil {
		return nil, nil, err
	}
	target := ev.Graph
	var subSrc *Source
	var subEntry *SubgraphEntry
	if h := in.Subgraph; h != nil {
		if err := graph.CheckSubgraph(h, ev.Graph); err != nil {
			return nil, nil, fmt.Errorf("%w: %w", ErrRejected, err)
		}
		var b bytes.Buffer
		if err := graph.WriteEdgeList(&b, h); err != nil {
			return nil, nil, fmt.Errorf("archive: writing the subgraph: %w", err)
		}
		src := BytesSource(memberSubgraph, b.Bytes())
		subSrc, target = &src, h
		subEntry = &SubgraphEntry{Member: memberSubgraph, GraphID: h.ID(), Vertices: h.N(), Edges: h.M()}
	}
	r := &Refutation{Subgraph: subEntry, Pages: opt.Pages, Encoder: EncoderEntry{Version: enc.Version(), Options: optJSON}}
	for _, run := range in.Runs {
		run.Seconds = 0 // run times differ from run to run: they would make rebuilds differ
		r.Runs = append(r.Runs, run)
	}
	for _, k := range kinds {
		r.PageKinds = append(r.PageKinds, k.String())
	}
	var srcs []Source
	if subSrc != nil {
		srcs = append(srcs, *subSrc)
	}
	if in.Cubes != nil && (in.Sub != nil || in.ForeignCNF != "") {
		return nil, nil, fmt.Errorf("archive: a refutation by cubes splits spinecert's own encoding, not a sub-formula or a foreign CNF")
	}
	if in.Sub != nil {
		ss, err := subFormula(r, in, target, opt)
		if err != nil {
			return nil, nil, err
		}
		srcs = append(srcs, ss...)
		ps, err := checkAndStoreProof(ctx, r, in, in.Sub.CNF, tmpDir)
		if err != nil {
			return nil, nil, err
		}
		return r, append(srcs, ps...), nil
	}
	cnf, err := enc.Encode(target, opt)
	if err != nil {
		return nil, nil, fmt.Errorf("archive: encoding the claim: %w", err)
	}
	text, sum, err := CNFText(cnf)
	if err != nil {
		return nil, nil, err
	}
	r.CNF = CNFEntry{SHA256: sum, Vars: cnf.Vars, Clauses: len(cnf.Clauses), Source: CNFOwn}
	if in.Cubes != nil {
		if ev.IncludeCNF {
			srcs = append(srcs, BytesSource(memberCNF, text))
			r.CNF.Member = memberCNF
		}
		r.Runs, r.Proofs = []Run{}, []Proof{}
		cs, err := buildCubes(ctx, r, in.Cubes, cnf, tmpDir)
		if err != nil {
			return nil, nil, err
		}
		return r, append(srcs, cs...), nil
	}
	checkAgainst := cnf
	if in.ForeignCNF != "" {
		fsum, _, err := hashFile(in.ForeignCNF)
		if err != nil {
			return nil, nil, err
		}
		if fsum != sum {
			foreign, err := dimacs.ReadCNFFile(in.ForeignCNF, dimacs.ReadOptions{})
			if err != nil {
				return nil, nil, fmt.Errorf("archive: %w", err)
			}
			src, err := FileSource(memberForeignCNF, in.ForeignCNF)
			if err != nil {
				return nil, nil, err
			}
			srcs = append(srcs, src)
			r.CNF = CNFEntry{SHA256: fsum, Vars: foreign.Vars, Clauses: len(foreign.Clauses), Source: CNFForeign, Member: memberForeignCNF}
			checkAgainst = foreign
		}
	}
	if ev.IncludeCNF && r.CNF.Source == CNFOwn {
		srcs = append(srcs, BytesSource(memberCNF, text))
		r.CNF.Member = memberCNF
	}
	ps, err := checkAndStoreProof(ctx, r, in, checkAgainst, tmpDir)
	if err != nil {
		return nil, nil, err
	}
	return r, append(srcs, ps...), nil
}

// checkAndStoreProof checks the refutation's proof against cnf (converting
// a text DRAT proof to binary first), records it in r and returns its member.
func checkAndStoreProof(ctx context.Context, r *Refutation, in *RefutationInput, checkAgainst *dimacs.CNF, tmpDir string) ([]Source, error) {
	p, src, err := storeProof(ctx, checkAgainst, in.Proof, in.ProofFormat, "proofs/refutation", tmpDir)
	if err != nil {
		return nil, err
	}
	r.Proofs = []Proof{p}
	return []Source{src}, nil
}

// storeProof checks the proof at path against cnf (converting a text DRAT
// proof to binary first, and keeping the trimmed proof when it passes
// again and is smaller) and returns its record and its member, named
// stem plus the format's extension.
func storeProof(ctx context.Context, checkAgainst *dimacs.CNF, path, format, stem, tmpDir string) (Proof, Source, error) {
	var err error
	if format == "" || format == proof.RUP {
		format, err = detectFormat(path)
		if err != nil {
			return Proof{}, Source{}, err
		}
	}
	proofPath, converted := path, ""
	if format == proof.DRAT {
		// Store text proofs as binary DRAT: smaller, and compresses better.
		bin, err := convertProof(path, tmpDir)
		if err != nil {
			return Proof{}, Source{}, err
		}
		proofPath, format, converted = bin, proof.DRATBinary, proof.DRAT
	}
	trimmed := ""
	if format == proof.DRATBinary {
		tf, err := os.CreateTemp(tmpDir, "spinecert-trimmed-*.drat")
		if err != nil {
			return Proof{}, Source{}, fmt.Errorf("archive: %w", err)
		}
		trimmed = tf.Name()
		tf.Close()
	}
	sum, out, err := checkProofFile(ctx, checkAgainst, proofPath, path, format, trimmed, tmpDir)
	if err != nil {
		return Proof{}, Source{}, err
	}
	checker := CheckerDRAT
	if format == "lrat" {
		checker = CheckerLRAT
	}
	p := Proof{Format: format, SHA256: sum, Checker: checker, Result: ResultVerified, ConvertedFrom: converted}
	if trimmed != "" && out.Core < out.Lemmas {
		// The trimmed proof is kept only if the same checkers accept it
		// again, from scratch, and it is smaller.
		tsum, tout, err := checkProofFile(ctx, checkAgainst, trimmed, path+" (trimmed)", format, "", tmpDir)
		if err == nil && tout.OK() {
			if ts, ps := fileSize(trimmed), fileSize(proofPath); ts >= 0 && ts < ps {
				p.TrimmedFrom = &TrimmedFrom{Format: format, Size: ps, SHA256: sum, Lemmas: out.Lemmas, CoreLemmas: out.Core}
				proofPath, p.SHA256 = trimmed, tsum
			}
		} else if cerr := ctx.Err(); cerr != nil {
			return Proof{}, Source{}, cerr
		}
	}
	src, err := FileSource(stem+"."+proofExt(format), proofPath)
	if err != nil {
		return Proof{}, Source{}, err
	}
	p.Member, p.Size = src.Name, src.Size
	return p, src, nil
}

// checkProofFile checks the proof in path against cnf with
// proof.CheckRefutation and returns the SHA-256 of the whole file and the
// outcome; a proof the checkers reject is an error wrapping ErrRejected.
// trimmed, when not empty, receives the trimmed proof (unchecked).
func checkProofFile(ctx context.Context, cnf *dimacs.CNF, path, name, format, trimmed, tmpDir string) (string, proof.Outcome, error) {
	f, err := os.Open(path)
	if err != nil {
		return "", proof.Outcome{}, fmt.Errorf("archive: %w", err)
	}
	defer f.Close()
	psum := sha256.New()
	out := proof.CheckRefutation(ctx, cnf, io.TeeReader(bufio.NewReaderSize(f, 1<<20), psum), proof.RefutationOptions{Format: format, Name: name, TempDir: tmpDir, TrimmedPath: trimmed})
	if err := ctx.Err(); err != nil {
		return "", out, err
	}
	if out.Err != nil {
		return "", out, fmt.Errorf("archive: checking %s: %w", name, out.Err)
	}
	if !out.OK() {
		return "", out, fmt.Errorf("%w: %s: %s", ErrRejected, name, out.Detail)
	}
	// The checker may stop before the end of the proof (after the empty clause).
	if _, err := io.Copy(psum, f); err != nil {
		return "", out, fmt.Errorf("archive: %w", err)
	}
	return hex.EncodeToString(psum.Sum(nil)), out, nil
}

// fileSize returns the size of the file at path, or -1.
func fileSize(path string) int64 {
	fi, err := os.Stat(path)
	if err != nil {
		return -1
	}
	return fi.Size()
}

// subFormula checks that the sub-formula of the refutation is part of the
// on-demand formulation of the claim about target, records it in r, and
// returns its two members: the CNF and the names of its variables.
func subFormula(r *Refutation, in *RefutationInput, target *graph.Graph, opt dimacs.Options) ([]Source, error) {
	f, err := dimacs.NewOnDemand(target, opt)
	if err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	if err := dimacs.CheckMembership(f, in.Sub); err != nil {
		return nil, fmt.Errorf("%w: %w", ErrRejected, err)
	}
	text, sum, err := CNFText(in.Sub.CNF)
	if err != nil {
		return nil, err
	}
	var names bytes.Buffer
	if err := dimacs.WriteVars(&names, in.Sub.Vars); err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	r.Encoder.Version = dimacs.OnDemandVersion
	r.CNF = CNFEntry{SHA256: sum, Vars: in.Sub.CNF.Vars, Clauses: len(in.Sub.CNF.Clauses), Source: CNFSub, Member: memberSubCNF, VarNames: memberSubVars}
	return []Source{BytesSource(memberSubCNF, text), BytesSource(memberSubVars, names.Bytes())}, nil
}

func detectFormat(path string) (string, error) {
	f, err := os.Open(path)
	if err != nil {
		return "", fmt.Errorf("archive: %w", err)
	}
	defer f.Close()
	head := make([]byte, 1024)
	n, _ := io.ReadFull(f, head)
	return proof.Detect(head[:n]), nil
}

// convertProof writes the binary form of a DRAT text proof to a temporary
// file in tmpDir and returns its path.
func convertProof(path, tmpDir string) (string, error) {
	in, err := os.Open(path)
	if err != nil {
		return "", fmt.Errorf("archive: %w", err)
	}
	defer in.Close()
	out, err := os.CreateTemp(tmpDir, "spinecert-proof-*.drat")
	if err != nil {
		return "", fmt.Errorf("archive: %w", err)
	}
	dr, err := dimacs.Decompress(in)
	if err == nil {
		err = proof.TextToBinary(dr, out, path)
		dr.Close()
	}
	if cerr := out.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		os.Remove(out.Name())
		return "", err
	}
	return out.Name(), nil
}
