package archive

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"os"
	"slices"
	"strings"
	"sync"
	"time"

	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
	"spinecert.dev/planar/planarcert"
	"spinecert.dev/proof"
)

// maxHeld bounds the bytes of members other than proofs that Verify holds
// in memory (the graph, layout, manifest and a stored CNF).
const maxHeld = 1 << 30

// Check statuses.
const (
	StatusPass = "pass" // checked and found right
	StatusFail = "fail" // checked and found wrong, or could not be checked when it had to be
	StatusNote = "note" // information; neither passes nor fails the bundle
)

// Check is one finding of Verify.
type Check struct {
	Name   string `json:"name"`
	Status string `json:"status"`
	Detail string `json:"detail"`
}

// Drift says what happened when the encoder that made a bundle's CNF and
// the current encoder do not give the same CNF for the claim.
type Drift struct {
	BundleEncoder       string `json:"bundle_encoder"`
	CurrentEncoder      string `json:"current_encoder"`
	VersionChanged      bool   `json:"version_changed"`
	CNFChanged          bool   `json:"cnf_changed"`
	OldEncoderAvailable bool   `json:"old_encoder_available"`
	StoredCNFChecked    bool   `json:"stored_cnf_checked"` // the proof was checked against the CNF stored in the bundle
	Resolved            bool   `json:"resolved"`           // the claim was re-established by solving the current encoding
	Summary             string `json:"summary"`
}

// Report is the outcome of verifying one bundle.
type Report struct {
	Bundle     string    `json:"bundle"`
	Verified   bool      `json:"verified"`
	Unreadable bool      `json:"unreadable,omitempty"` // the file could not be read (not a verdict on the bundle)
	Claim      string    `json:"claim,omitempty"`
	Label      string    `json:"label,omitempty"` // claim.name as the bundle gives it: not checked
	Checks     []Check   `json:"checks"`
	Drift      *Drift    `json:"encoder_drift,omitempty"`
	Seconds    float64   `json:"seconds"`
	Manifest   *Manifest `json:"-"`
}

// Failures returns the failed checks.
func (r *Report) Failures() []Check {
	var out []Check
	for _, c := range r.Checks {
		if c.Status == StatusFail {
			out = append(out, c)
		}
	}
	return out
}

func (r *Report) add(name, status, format string, args ...any) {
	r.Checks = append(r.Checks, Check{Name: name, Status: status, Detail: fmt.Sprintf(format, args...)})
}

// Resolution is what a re-solve returned: an answer and, for unsat, a proof.
type Resolution struct {
	Answer      string // sat, unsat or unknown
	Runs        []Run
	Proof       string // path of the proof (unsat)
	ProofFormat string // drat, drat-binary or lrat ("" = detect)
}

// VerifyOptions configures Verify.
type VerifyOptions struct {
	Encoder Encoder // nil = CurrentEncoder{}
	Limits  Limits  // zero = DefaultLimits()
	TempDir string  // for LRAT files ("" = the system default)
	// Resolve, when non-nil, is called with the current encoding of the
	// refuted claim when the stored proof cannot establish it (the encoder
	// drifted or the CNF is foreign); it decides the CNF and returns a proof.
	Resolve func(ctx context.Context, cnf *dimacs.CNF) (*Resolution, error)
	// Jobs is the number of proofs of a refutation by cubes checked at
	// once (0 = 1); each waiting proof is copied to a file in TempDir.
	Jobs int
	// CubeOutcome, when not nil, may supply the outcome of a cube's proof
	// check made elsewhere (by a Slurm array task of this spinecert, from
	// its record); it is given the 0-based cube and the SHA-256 of the
	// proof member, and the proof is then not checked again here.
	CubeOutcome func(cube int, proofSHA256 string) (proof.Outcome, bool)
	// CubeFilter, when not nil, limits the cube proofs checked here to the
	// cubes it accepts (an array task's slice); the others count as not
	// checked.
	CubeFilter func(cube int) bool
	// CubeChecked, when not nil, is called after each cube proof checked
	// here, possibly from several goroutines at once.
	CubeChecked func(cube int, proofSHA256 string, out proof.Outcome)
}

// VerifyFile verifies the bundle at path (see Verify).
func VerifyFile(ctx context.Context, path string, opt VerifyOptions) *Report {
	f, err := os.Open(path)
	if err != nil {
		r := &Report{Bundle: path, Unreadable: true}
		r.add("read", StatusFail, "%v", err)
		return r
	}
	defer f.Close()
	return Verify(ctx, f, path, opt)
}

// Verify re-checks a bundle from scratch, streaming it once: the integrity
// of every member (Walk), the manifest schema, the graph against the claimed
// identity, the layout with cert.Check, and each proof against the CNF the
// current encoder makes from the graph and the recorded options, with
// spinecert's DRAT checker and the LRAT re-check. When the encoder's output
// for the claim changed (encoder drift) it reports what changed and what
// was checked instead. The bundle is verified only if every required check
// passed.
func Verify(ctx context.Context, r io.Reader, name string, opt VerifyOptions) *Report {
	start := time.Now()
	if opt.Encoder == nil {
		opt.Encoder = CurrentEncoder{}
	}
	if opt.Limits == (Limits{}) {
		opt.Limits = DefaultLimits()
	}
	v := &verifier{ctx: ctx, opt: opt, rep: &Report{Bundle: name}, files: map[string][]byte{}, outcomes: map[string]proof.Outcome{},
		sem: make(chan struct{}, max(1, opt.Jobs))}
	c, err := Walk(ctx, r, name, opt.Limits, v.member)
	v.wg.Wait()
	v.finish(c, err)
	v.rep.Seconds = time.Since(start).Seconds()
	return v.rep
}

type verifier struct {
	ctx context.Context
	opt VerifyOptions
	rep *Report

	files    map[string][]byte // members other than proofs, as read
	held     int64             // bytes in files
	sums     map[string]string // member -> SHA-256 from SHA256SUMS
	prepared bool
	m        *Manifest
	g        *graph.Graph
	cur      *dimacs.CNF // the current encoding of the refuted claim
	target   *dimacs.CNF // what proofs are checked against to establish the claim (nil = nothing)
	stored   *dimacs.CNF // a CNF stored in the bundle, checked only for information
	layoutOK bool
	outcomes map[string]proof.Outcome // proof member -> outcome against target or stored

	// A refutation by cubes.
	cubes     []cube.Cube
	cubeIdx   map[string]int // proof member -> 0-based cube (-1: the coverage proof)
	coverOK   bool           // coverage established by shape, or by its proof (see finishCubes)
	elsewhere int            // cube outcomes taken from CubeOutcome
	mu        sync.Mutex     // guards outcomes while cube proofs are checked in parallel
	wg        sync.WaitGroup
	sem       chan struct{}
}

func (v *verifier) member(m Member, r io.Reader) error {
	if v.sums == nil {
		v.sums = map[string]string{}
	}
	v.sums[m.Name] = m.SHA256
	if !strings.HasPrefix(m.Name, "proofs/") {
		// Members other than proofs are held in memory, within a budget.
		if m.Size > maxHeld-v.held {
			return &BundleError{Member: m.Name, Kind: ErrTooLarge, Detail: fmt.Sprintf("%d bytes; members other than proofs may hold %d bytes in all", m.Size, int64(maxHeld))}
		}
		data, err := io.ReadAll(io.LimitReader(r, m.Size))
		if err != nil {
			return err
		}
		v.held += int64(len(data))
		v.files[m.Name] = data
		return nil
	}
	v.prepare()
	if v.m == nil || v.m.Refutation == nil {
		return nil
	}
	if v.m.Refutation.Cubes != nil {
		return v.cubeMember(m, r)
	}
	i := slices.IndexFunc(v.m.Refutation.Proofs, func(p Proof) bool { return p.Member == m.Name })
	if i < 0 {
		return nil // reported as an unlisted member in finish
	}
	p := v.m.Refutation.Proofs[i]
	if p.SHA256 != m.SHA256 || p.Size != m.Size {
		v.rep.add("proof record "+m.Name, StatusFail, "the manifest records size %d and SHA-256 %s, the member has size %d and SHA-256 %s", p.Size, p.SHA256, m.Size, m.SHA256)
		return nil
	}
	against := v.target
	if against == nil {
		against = v.stored
	}
	if against == nil {
		return nil
	}
	v.outcomes[m.Name] = proof.CheckRefutation(v.ctx, against, r, proof.RefutationOptions{Format: p.Format, Name: m.Name, TempDir: v.opt.TempDir})
	return nil
}

// prepare runs the checks that need the manifest, once, when the first
// proof arrives or at the end.
func (v *verifier) prepare() {
	if v.prepared {
		return
	}
	v.prepared = true
	data, ok := v.files[ManifestName]
	if !ok {
		v.rep.add("manifest", StatusFail, "no %s before the proofs", ManifestName)
		return
	}
	m, err := ReadManifest(data)
	if err != nil {
		v.rep.add("manifest", StatusFail, "%v", err)
		return
	}
	v.m, v.rep.Manifest = m, m
	v.rep.Claim, v.rep.Label = ClaimText(m), m.Claim.Name
	v.rep.add("manifest", StatusPass, "schema version %d, made by %s %s", m.FormatVersion, m.Tool, m.ToolVersion)
	if !v.checkGraph() {
		return
	}
	if m.Layout != nil {
		v.checkLayout()
	}
	if m.Refutation != nil {
		v.prepareRefutation()
		if m.Refutation.Cubes != nil {
			v.prepareCubes()
		}
	}
	if m.Planarity != nil {
		v.checkPlanarity()
	}
}

// checkPlanarity re-checks a stored planarity certificate against the graph.
func (v *verifier) checkPlanarity() {
	p := v.m.Planarity
	data, ok := v.files[p.Member]
	if !ok {
		v.rep.add("planarity", StatusFail, "member %s is missing", p.Member)
		return
	}
	c, err := planarcert.Read(bytes.NewReader(data), p.Member, v.g)
	if err == nil {
		err = planarcert.Check(v.g, c)
	}
	switch {
	case err != nil:
		v.rep.add("planarity", StatusFail, "%v", err)
	case c.Planar != p.Planar:
		v.rep.add("planarity", StatusFail, "the certificate says planar=%v, the manifest planar=%v", c.Planar, p.Planar)
	case c.Planar:
		v.rep.add("planarity", StatusPass, "planar: the embedding in %s was re-checked", p.Member)
	default:
		v.rep.add("planarity", StatusPass, "not planar: the Kuratowski subgraph in %s was re-checked", p.Member)
	}
}

func (v *verifier) readGraph(member, format string) (*graph.Graph, error) {
	data, ok := v.files[member]
	if !ok {
		return nil, fmt.Errorf("member %s is missing", member)
	}
	f, err := graph.ParseFormat(format)
	if err != nil {
		return nil, err
	}
	res, err := graph.Read(bytes.NewReader(data), member, f)
	if err != nil {
		return nil, err
	}
	if len(res.Graphs) != 1 {
		return nil, fmt.Errorf("%s holds %d graphs, expected one", member, len(res.Graphs))
	}
	return res.Graphs[0], nil
}

func (v *verifier) checkGraph() bool {
	m := v.m
	g, err := v.readGraph(m.Graph.Input, m.Graph.InputFormat)
	if err != nil {
		v.rep.add("graph", StatusFail, "%v", err)
		return false
	}
	cg, err := v.readGraph(m.Graph.Canonical, "edgelist")
	if err != nil {
		v.rep.add("graph", StatusFail, "%v", err)
		return false
	}
	switch {
	case g.ID() != m.Claim.GraphID:
		v.rep.add("graph", StatusFail, "%s has identity %s, the claim names %s", m.Graph.Input, g.ID(), m.Claim.GraphID)
		return false
	case cg.ID() != g.ID():
		v.rep.add("graph", StatusFail, "%s has identity %s, the input graph %s", m.Graph.Canonical, cg.ID(), g.ID())
		return false
	case g.N() != m.Claim.Vertices || g.M() != m.Claim.Edges:
		v.rep.add("graph", StatusFail, "the graph has n=%d m=%d, the claim says n=%d m=%d", g.N(), g.M(), m.Claim.Vertices, m.Claim.Edges)
		return false
	}
	v.g = g
	v.rep.add("graph", StatusPass, "identity %s (n=%d, m=%d) matches the claim", g.ID(), g.N(), g.M())
	return true
}

func (v *verifier) checkLayout() {
	m := v.m
	data, ok := v.files[m.Layout.Member]
	if !ok {
		v.rep.add("layout", StatusFail, "member %s is missing", m.Layout.Member)
		return
	}
	raw, err := cert.ReadLayoutJSON(bytes.NewReader(data), m.Layout.Member)
	if err != nil {
		v.rep.add("layout", StatusFail, "%v", err)
		return
	}
	if raw.Kind.String() != m.Claim.Kind {
		v.rep.add("layout", StatusFail, "the layout is a %s layout, the claim is about %s layouts", raw.Kind, m.Claim.Kind)
		return
	}
	if m.Claim.Kind == "mixed" {
		kinds, err := cert.PageKinds(raw.Kind, raw.Pages, raw.PageKinds)
		if err != nil || len(kinds) != len(m.Claim.PageKinds) {
			v.rep.add("layout", StatusFail, "the layout's page kinds do not match the claim's")
			return
		}
		for i, k := range kinds {
			if k.String() != m.Claim.PageKinds[i] {
				v.rep.add("layout", StatusFail, "page %d of the layout is a %s page, the claim says %s", i+1, k, m.Claim.PageKinds[i])
				return
			}
		}
	}
	rep := cert.Check(v.g, raw, cert.CheckOptions{MaxPages: m.Claim.K})
	if !rep.OK() {
		v.rep.add("layout", StatusFail, "%v", rep.Err())
		return
	}
	v.layoutOK = true
	v.rep.add("layout", StatusPass, "a valid %s layout on %d pages, re-checked directly", raw.Kind, m.Claim.K)
}

func (v *verifier) prepareRefutation() {
	m, r := v.m, v.m.Refutation
	opts, err := UnmarshalEncoderOptions(r.Encoder.Options)
	if err != nil {
		v.rep.add("cnf", StatusFail, "%v", err)
		return
	}
	kinds, err := cert.PageKinds(opts.Kind, opts.Pages, opts.PageKinds)
	if err != nil || opts.Pages != r.Pages || len(kinds) != len(r.PageKinds) {
		v.rep.add("cnf", StatusFail, "the encoder options (%s, %d pages) do not describe the refuted claim (%d pages of kinds %s)", opts.Kind, opts.Pages, r.Pages, strings.Join(r.PageKinds, ","))
		return
	}
	for i, k := range kinds {
		if k.String() != r.PageKinds[i] || (m.Claim.Kind != "mixed" && opts.Kind.String() != m.Claim.Kind) {
			v.rep.add("cnf", StatusFail, "the encoder options describe %s pages, the claim %s", opts.Kind, m.Claim.Kind)
			return
		}
	}
	refuted := v.g
	if r.Subgraph != nil {
		if refuted = v.subgraph(r.Subgraph); refuted == nil {
			return
		}
	}
	if r.CNF.Source == CNFSub {
		v.prepareSub(refuted, opts)
		return
	}
	enc := v.opt.Encoder
	cur, err := enc.Encode(refuted, opts)
	if err != nil {
		v.rep.add("cnf", StatusFail, "encoding the claim with %s: %v", enc.Version(), err)
		return
	}
	_, curSum, err := CNFText(cur)
	if err != nil {
		v.rep.add("cnf", StatusFail, "%v", err)
		return
	}
	v.cur = cur
	if r.CNF.Member != "" {
		v.loadStored(r.CNF)
	}
	if r.CNF.Source == CNFForeign {
		v.rep.add("cnf", StatusFail, "the proof refutes a CNF made elsewhere (SHA-256 %s); %s encodes the claim as %s, so the proof does not establish the claim", r.CNF.SHA256, enc.Version(), curSum)
		return
	}
	sameVersion := r.Encoder.Version == enc.Version()
	if curSum == r.CNF.SHA256 {
		v.target = cur
		if sameVersion {
			v.rep.add("cnf", StatusPass, "re-encoded the claim with %s: SHA-256 %s as recorded", enc.Version(), curSum)
		} else {
			v.rep.Drift = &Drift{BundleEncoder: r.Encoder.Version, CurrentEncoder: enc.Version(), VersionChanged: true,
				Summary: fmt.Sprintf("encoder changed since the bundle was made (%s, now %s), but it gives the same CNF for this claim; the proof is checked against it", r.Encoder.Version, enc.Version())}
			v.rep.add("cnf", StatusPass, "re-encoded the claim with %s (bundle made with %s): SHA-256 %s as recorded", enc.Version(), r.Encoder.Version, curSum)
		}
		return
	}
	d := &Drift{BundleEncoder: r.Encoder.Version, CurrentEncoder: enc.Version(), VersionChanged: !sameVersion, CNFChanged: true}
	v.rep.Drift = d
	if ve, ok := enc.(VersionedEncoder); ok && !sameVersion {
		old, err := ve.EncodeAs(refuted, opts, r.Encoder.Version)
		if err == nil {
			d.OldEncoderAvailable = true
			_, oldSum, err := CNFText(old)
			if err == nil && oldSum == r.CNF.SHA256 {
				v.target = old
				d.Summary = fmt.Sprintf("encoder changed since the bundle was made (bundle %s, this spinecert %s; the claim's CNF is now SHA-256 %s); %s is still available and rebuilds the recorded CNF (SHA-256 %s), so the proof is checked against it", r.Encoder.Version, enc.Version(), curSum, r.Encoder.Version, oldSum)
				v.rep.add("cnf", StatusPass, "re-encoded the claim with %s as recorded: SHA-256 %s", r.Encoder.Version, oldSum)
				v.rep.add("encoder drift", StatusNote, "%s", d.Summary)
				return
			}
			if err == nil {
				d.Summary = fmt.Sprintf("encoder changed since the bundle was made (bundle %s, this spinecert %s), and %s as this spinecert reproduces it gives SHA-256 %s, not the recorded %s: the bundle was altered or the old encoder is not reproduced faithfully", r.Encoder.Version, enc.Version(), r.Encoder.Version, oldSum, r.CNF.SHA256)
				v.rep.add("encoder drift", StatusFail, "%s", d.Summary)
				return
			}
		}
	}
	if sameVersion {
		d.Summary = fmt.Sprintf("the CNF recorded (SHA-256 %s) is not what encoder %s gives for this claim (SHA-256 %s): the encoder's output changed without a version change, or the bundle was altered", r.CNF.SHA256, enc.Version(), curSum)
	} else {
		d.Summary = fmt.Sprintf("encoder changed since the bundle was made: bundle %s, this spinecert %s; the CNF for the claim is now SHA-256 %s, the bundle's %s; encoder %s is not available in this spinecert", r.Encoder.Version, enc.Version(), curSum, r.CNF.SHA256, r.Encoder.Version)
	}
	v.rep.add("encoder drift", StatusFail, "%s", d.Summary)
}

// prepareSub reads a stored sub-formula of the on-demand formulation and
// its variable names, and checks that every clause is a clause of the
// formulation of the refuted claim (dimacs.CheckMembership); the proofs are
// then checked against it.
func (v *verifier) prepareSub(refuted *graph.Graph, opts dimacs.Options) {
	r := v.m.Refutation
	if r.Encoder.Version != dimacs.OnDemandVersion {
		v.rep.add("membership", StatusFail, "the sub-formula is of formulation %q; this spinecert checks %s", r.Encoder.Version, dimacs.OnDemandVersion)
		return
	}
	cdata, ok1 := v.files[r.CNF.Member]
	ndata, ok2 := v.files[r.CNF.VarNames]
	if !ok1 || !ok2 {
		v.rep.add("membership", StatusFail, "members %s and %s are needed", r.CNF.Member, r.CNF.VarNames)
		return
	}
	cnf, err := dimacs.ReadCNF(bytes.NewReader(cdata), r.CNF.Member, dimacs.ReadOptions{})
	if err != nil {
		v.rep.add("membership", StatusFail, "%v", err)
		return
	}
	if _, sum, err := CNFText(cnf); err != nil || sum != r.CNF.SHA256 {
		v.rep.add("membership", StatusFail, "%s does not read back as the CNF the manifest records (SHA-256 %s)", r.CNF.Member, r.CNF.SHA256)
		return
	}
	names, err := dimacs.ReadVars(bytes.NewReader(ndata), r.CNF.VarNames)
	if err != nil {
		v.rep.add("membership", StatusFail, "%v", err)
		return
	}
	f, err := dimacs.NewOnDemand(refuted, opts)
	if err != nil {
		v.rep.add("membership", StatusFail, "%v", err)
		return
	}
	if err := dimacs.CheckMembership(f, &dimacs.Sub{Vars: names, CNF: cnf}); err != nil {
		v.rep.add("membership", StatusFail, "%v", err)
		return
	}
	v.target = cnf
	v.rep.add("membership", StatusPass, "all %d clauses of %s are clauses of the on-demand formulation %s of the claim (checked from %s), so a refutation of it refutes the claim", len(cnf.Clauses), r.CNF.Member, dimacs.OnDemandVersion, r.CNF.VarNames)
}

// subgraph reads the subgraph a refutation is about and checks that it is
// a subgraph of the claim's graph with the identity the manifest records;
// nil when it is not (the failure is reported).
func (v *verifier) subgraph(e *SubgraphEntry) *graph.Graph {
	data, ok := v.files[e.Member]
	if !ok {
		v.rep.add("subgraph", StatusFail, "member %s is missing", e.Member)
		return nil
	}
	res, err := graph.Read(bytes.NewReader(data), e.Member, graph.FormatEdgeList)
	if err != nil || len(res.Graphs) != 1 {
		v.rep.add("subgraph", StatusFail, "%s is not one graph in an edge list: %v", e.Member, err)
		return nil
	}
	h := res.Graphs[0]
	switch {
	case h.ID() != e.GraphID || h.N() != e.Vertices || h.M() != e.Edges:
		v.rep.add("subgraph", StatusFail, "%s has identity %s (n=%d, m=%d), the manifest records %s (n=%d, m=%d)", e.Member, h.ID(), h.N(), h.M(), e.GraphID, e.Vertices, e.Edges)
		return nil
	}
	if err := graph.CheckSubgraph(h, v.g); err != nil {
		v.rep.add("subgraph", StatusFail, "%s: %v", e.Member, err)
		return nil
	}
	v.rep.add("subgraph", StatusPass, "%s (n=%d, m=%d) is a subgraph of the claim's graph, re-checked; a refutation of it refutes the graph, since every layout restricts to its subgraphs", e.Member, h.N(), h.M())
	return h
}

// heldMember returns a member held in memory if it is there with the SHA-256 the
// manifest records; otherwise it reports the failure under check (why, if
// not empty, says more about a missing member).
func (v *verifier) heldMember(check, member, sum, why string) ([]byte, bool) {
	data, ok := v.files[member]
	switch {
	case !ok:
		v.rep.add(check, StatusFail, "member %s is missing%s", member, why)
	case sha256Hex(data) != sum:
		v.rep.add(check, StatusFail, "%s has SHA-256 %s, the manifest records %s", member, sha256Hex(data), sum)
	default:
		return data, true
	}
	return nil, false
}

// loadStored reads a CNF stored in the bundle, if its hash is the recorded one.
func (v *verifier) loadStored(e CNFEntry) {
	data, ok := v.heldMember("stored cnf", e.Member, e.SHA256, "")
	if !ok {
		return
	}
	cnf, err := dimacs.ReadCNF(bytes.NewReader(data), e.Member, dimacs.ReadOptions{})
	if err != nil {
		v.rep.add("stored cnf", StatusFail, "%v", err)
		return
	}
	v.stored = cnf
}

func (v *verifier) finish(c *Contents, walkErr error) {
	if walkErr != nil {
		v.rep.Unreadable = !IsBadBundle(walkErr) && v.ctx.Err() == nil
		v.rep.add("integrity", StatusFail, "%v", walkErr)
		v.rep.Verified = false
		return
	}
	v.rep.add("integrity", StatusPass, "%d members, every SHA-256 in %s matches", len(c.Members), SumsName)
	v.prepare()
	m := v.m
	if m == nil {
		return
	}
	v.checkMembers(c)
	switch {
	case m.Compression.Version != CompressVersion() || m.Compression.Settings != Settings || m.Compression.Module != CompressModule:
		v.rep.add("compression", StatusNote, "written with %s %s, this spinecert has %s: the compressed bytes were not compared with a re-compression", m.Compression.Module, m.Compression.Version, CompressVersion())
	case !c.Canonical:
		v.rep.add("compression", StatusFail, "the compressed bytes differ from what %s %s makes of the contents, from byte %d on: the file was altered", CompressModule, CompressVersion(), c.DiffersAt)
	default:
		v.rep.add("compression", StatusPass, "the file is byte for byte what spinecert writes for these contents")
	}
	refuted := v.finishProofs()
	need := 0
	have := 0
	if m.Layout != nil {
		need++
		if v.layoutOK {
			have++
		}
	}
	if m.Refutation != nil {
		need++
		if refuted {
			have++
		}
	}
	v.rep.Verified = need > 0 && have == need && len(v.rep.Failures()) == 0
}

// checkMembers compares the archive's members with the manifest's list.
func (v *verifier) checkMembers(c *Contents) {
	want := map[string]MemberEntry{}
	for _, e := range v.m.Members {
		want[e.Name] = e
	}
	ok := true
	for _, mem := range c.Members {
		if mem.Name == ManifestName {
			continue
		}
		e, listed := want[mem.Name]
		delete(want, mem.Name)
		switch {
		case !listed:
			v.rep.add("members", StatusFail, "%s is in the archive but not in the manifest", mem.Name)
			ok = false
		case e.SHA256 != mem.SHA256 || e.Size != mem.Size:
			v.rep.add("members", StatusFail, "%s: the manifest records size %d and SHA-256 %s, the member has size %d and SHA-256 %s", mem.Name, e.Size, e.SHA256, mem.Size, mem.SHA256)
			ok = false
		}
	}
	for _, e := range v.m.Members {
		if _, missing := want[e.Name]; missing {
			v.rep.add("members", StatusFail, "%s is in the manifest but not in the archive", e.Name)
			ok = false
		}
	}
	if ok {
		v.rep.add("members", StatusPass, "every member the manifest lists is present with the size and SHA-256 it records")
	}
}

// finishProofs reports the proof outcomes, re-solves if asked and needed,
// and tells whether the refutation is established.
func (v *verifier) finishProofs() bool {
	r := v.m.Refutation
	if r == nil || v.g == nil {
		return false
	}
	established := false
	if r.Cubes != nil {
		// The cube proofs establish the claim, or else a re-solve of the
		// current encoding may (below), as for a single proof.
		if established = v.finishCubes(); established || v.cur == nil || v.opt.Resolve == nil {
			return established
		}
	}
	for _, p := range r.Proofs { // none when the refutation is split into cubes
		out, ok := v.outcomes[p.Member]
		switch {
		case !ok && v.target == nil && v.stored == nil:
			v.rep.add("proof "+p.Member, StatusNote, "not checked: there is no CNF it could establish the claim against")
		case !ok:
			// already reported (hash mismatch) or missing
		case v.target == nil:
			if v.rep.Drift != nil {
				v.rep.Drift.StoredCNFChecked = true
			}
			st := StatusNote
			if !out.OK() {
				st = StatusFail
			}
			v.rep.add("proof "+p.Member, st, "checked against the CNF stored in the bundle only (which this spinecert cannot derive from the claim): %s", describe(out))
		case out.OK():
			established = true
			v.rep.add("proof "+p.Member, StatusPass, "%s: %s", p.Format, describe(out))
		default:
			v.rep.add("proof "+p.Member, StatusFail, "%s: %s", p.Format, describe(out))
		}
	}
	if established || v.cur == nil || v.opt.Resolve == nil {
		return established
	}
	res, err := v.opt.Resolve(v.ctx, v.cur)
	d := v.rep.Drift
	switch {
	case err != nil:
		v.rep.add("resolve", StatusFail, "re-solving the current encoding: %v", err)
	case res.Answer == "sat":
		v.rep.add("resolve", StatusFail, "the current encoding of %d pages is satisfiable: the lower bound does not hold", r.Pages)
	case res.Answer != "unsat" || res.Proof == "":
		v.rep.add("resolve", StatusFail, "re-solving gave no proof of unsatisfiability (answer %s)", res.Answer)
	default:
		format := res.ProofFormat
		if format == "" || format == "rup" {
			if format, err = detectFormat(res.Proof); err != nil {
				v.rep.add("resolve", StatusFail, "%v", err)
				return false
			}
		}
		f, err := os.Open(res.Proof)
		if err != nil {
			v.rep.add("resolve", StatusFail, "%v", err)
			return false
		}
		defer f.Close()
		out := proof.CheckRefutation(v.ctx, v.cur, f, proof.RefutationOptions{Format: format, Name: res.Proof, TempDir: v.opt.TempDir})
		if !out.OK() {
			v.rep.add("resolve", StatusFail, "the new proof: %s", describe(out))
			return false
		}
		if d != nil {
			d.Resolved = true
		}
		// The stored proof's CNF no longer matters: the claim stands on the new proof.
		for i, c := range v.rep.Checks {
			if c.Status == StatusFail && (c.Name == "encoder drift" || c.Name == "cnf" || c.Name == "cubes" && strings.HasPrefix(c.Detail, cubesUnchecked)) {
				v.rep.Checks[i].Status = StatusNote
				v.rep.Checks[i].Detail += " (superseded by re-solving)"
			}
		}
		v.rep.add("resolve", StatusPass, "re-established: the current encoder's CNF was solved again (unsat) and the new proof passed: %s", describe(out))
		return true
	}
	return false
}

func describe(o proof.Outcome) string {
	if o.OK() {
		if o.Format == "lrat" {
			return "spinecert's LRAT checker accepted it"
		}
		return fmt.Sprintf("spinecert's DRAT checker accepted it (%d lemmas) and the LRAT it wrote passed the LRAT checker", o.Lemmas)
	}
	return o.Detail
}

// ClaimText states a manifest's claim for people, e.g.
// "stack layouts of graph 5f0e4d2a91c3 (n=7, m=21): exactly 4 pages". It
// names the graph by its identity, which verification checks, and never by
// claim.name, which nothing checks: show that apart, with LabelText.
func ClaimText(m *Manifest) string {
	c := m.Claim
	g := fmt.Sprintf("graph %s", short(c.GraphID))
	kind := c.Kind + " layouts"
	if c.Kind == "mixed" {
		kind = "mixed layouts with pages " + strings.Join(c.PageKinds, ",")
	}
	var b string
	switch c.Bound {
	case AtMost:
		b = fmt.Sprintf("at most %d pages", c.K)
	case AtLeast:
		b = fmt.Sprintf("at least %d pages", c.K)
	default:
		b = fmt.Sprintf("exactly %d pages", c.K)
	}
	return fmt.Sprintf("%s of %s (n=%d, m=%d): %s", kind, g, c.Vertices, c.Edges, b)
}

// LabelText returns claim.name quoted and marked as unchecked, e.g.
// `"K7" (the bundle's name for the graph, not checked)`, or "" when the claim
// has no name.
func LabelText(name string) string {
	if name == "" {
		return ""
	}
	return fmt.Sprintf("%+q (the bundle's name for the graph, not checked)", name)
}

func short(id string) string {
	if len(id) > 12 {
		return id[:12]
	}
	return id
}
