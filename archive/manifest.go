package archive

import (
	"bytes"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"slices"
	"strings"

	"spinecert.dev/textpos"
)

// ManifestName is the member holding the manifest.
const ManifestName = "manifest.json"

// FormatName and FormatVersion identify the manifest schema described here.
const (
	FormatName    = "spinecert-bundle"
	FormatVersion = 1
)

// Bounds a claim can state about the number of pages K.
const (
	AtMost  = "at_most"  // a layout with K pages exists (evidence: the layout)
	AtLeast = "at_least" // no layout with K-1 pages exists (evidence: a refutation)
	Exact   = "exact"    // both
)

// Proof checker results recorded in a manifest.
const (
	ResultVerified = "verified"
	ResultRejected = "rejected"
)

// CNF sources: made by spinecert's encoder from the claim, or supplied from
// elsewhere with a hash that does not match spinecert's encoding.
const (
	CNFOwn     = "spinecert"
	CNFForeign = "foreign"
	// CNFSub is a sub-formula of spinecert's on-demand formulation, stored
	// with the names of its variables; verify checks its membership.
	CNFSub = "on-demand"
)

// maxManifestSize bounds the manifest member: a few KiB, and under 1 KiB
// per cube of a refutation split into cubes.
const maxManifestSize = 1<<20 + MaxCubes<<10

// Manifest is the contents of manifest.json, schema version 1. Every field
// is required unless marked omitempty. No wall-clock time is recorded
// unless Created is set by the caller, so that the same evidence gives the
// same bytes; for the same reason solver run times are not recorded.
type Manifest struct {
	Format        string          `json:"format"`         // FormatName
	FormatVersion int             `json:"format_version"` // FormatVersion
	ToolVersion   string          `json:"tool_version"`   // version of spinecert that made the bundle
	Tool          string          `json:"tool"`           // the command that made it, e.g. "spinecert bundle"
	Created       string          `json:"created,omitempty"`
	Compression   Compression     `json:"compression"`
	Claim         Claim           `json:"claim"`
	Graph         GraphFiles      `json:"graph"`
	Layout        *LayoutRecord   `json:"layout,omitempty"`     // at_most and exact
	Refutation    *Refutation     `json:"refutation,omitempty"` // at_least and exact
	Planarity     *PlanarityEntry `json:"planarity,omitempty"`
	Members       []MemberEntry   `json:"members"` // every member but manifest.json and SHA256SUMS, sorted by name
}

// MemberEntry binds a member's contents to the manifest.
type MemberEntry struct {
	Name   string `json:"name"`
	Size   int64  `json:"size"`
	SHA256 string `json:"sha256"`
}

// Compression records the compressor that wrote the bundle.
type Compression struct {
	Module   string `json:"module"`
	Version  string `json:"version"`
	Settings string `json:"settings"`
}

// Claim is what the bundle asserts about a graph.
type Claim struct {
	GraphID   string   `json:"graph_id"` // graph.Graph.ID of the graph
	Name      string   `json:"name,omitempty"`
	Vertices  int      `json:"vertices"`
	Edges     int      `json:"edges"`
	Kind      string   `json:"kind"`  // stack, queue or mixed
	Bound     string   `json:"bound"` // at_most, at_least or exact
	K         int      `json:"k"`
	PageKinds []string `json:"page_kinds,omitempty"` // mixed only: the K pages of the layout, or the K-1 refuted pages
}

// GraphFiles names the graph members.
type GraphFiles struct {
	Input       string `json:"input"`        // the graph file as it was given
	InputFormat string `json:"input_format"` // edgelist, dimacs, graph6, sparse6
	Canonical   string `json:"canonical"`    // spinecert's edge list of the graph in canonical order
}

// LayoutRecord names the layout member (spinecert's layout JSON) and what was
// found when it was checked at bundling time.
type LayoutRecord struct {
	Member string `json:"member"`
	Pages  int    `json:"pages"`
	Check  string `json:"check"` // "valid"
}

// Refutation is the evidence that no layout with Pages pages exists.
type Refutation struct {
	// Subgraph, when present, names the subgraph of the claim's graph that
	// the CNF encodes: its refutation refutes the graph, since every layout
	// restricts to its subgraphs. Absent, the CNF encodes the graph itself.
	Subgraph  *SubgraphEntry `json:"subgraph,omitempty"`
	Pages     int            `json:"pages"` // K-1
	PageKinds []string       `json:"page_kinds"`
	Encoder   EncoderEntry   `json:"encoder"`
	CNF       CNFEntry       `json:"cnf"`
	Runs      []Run          `json:"runs"`
	Proofs    []Proof        `json:"proofs"`
	// Cubes, when present, splits the refutation: every cube's proof
	// refutes the CNF with the cube's literals as units, and the cubes
	// cover every assignment; Runs and Proofs are then empty. Manifests
	// with cubes are not read by spinecert versions before it.
	Cubes *CubeSplit `json:"cubes,omitempty"`
}

// SubgraphEntry is the subgraph a refutation is about: an edge list member
// whose labels are labels of the claim's graph.
type SubgraphEntry struct {
	Member   string `json:"member"`
	GraphID  string `json:"graph_id"`
	Vertices int    `json:"vertices"`
	Edges    int    `json:"edges"`
}

// EncoderEntry records the encoder that made the CNF; Options is the encoder's
// own options object, read back strictly by the encoder.
type EncoderEntry struct {
	Version string          `json:"version"`
	Options json.RawMessage `json:"options"`
}

// CNFEntry identifies the CNF the proofs refute.
type CNFEntry struct {
	SHA256  string `json:"sha256"` // of the DIMACS text as written
	Vars    int    `json:"vars"`
	Clauses int    `json:"clauses"`
	Source  string `json:"source"`           // CNFOwn, CNFForeign or CNFSub
	Member  string `json:"member,omitempty"` // present with --include-cnf, for foreign CNFs and sub-formulas
	// VarNames names the member that names every variable of a sub-formula
	// (CNFSub only; dimacs.WriteVars format).
	VarNames string `json:"var_names,omitempty"`
}

// Run is one solver run on the CNF.
type Run struct {
	Backend string `json:"backend"`
	Version string `json:"version"`
	Answer  string `json:"answer"` // sat, unsat or unknown
	// Seconds is the run time. Build does not record it (0, omitted), so
	// that building the same claim twice gives the same bytes; bundles made
	// by earlier versions carry it, and it is read and kept as it is.
	Seconds float64 `json:"seconds,omitempty"`
}

// Proof is one proof member and the result of checking it when bundled.
type Proof struct {
	Member  string `json:"member"`
	Format  string `json:"format"` // drat, drat-binary or lrat
	Size    int64  `json:"size"`
	SHA256  string `json:"sha256"`
	Checker string `json:"checker"`
	Result  string `json:"result"`
	// ConvertedFrom is "drat" when the proof was given as DRAT text and
	// stored as the equivalent binary DRAT (the stored form was checked).
	ConvertedFrom string `json:"converted_from,omitempty"`
	// TrimmedFrom, when present, describes the proof that was checked when
	// bundling and then trimmed to the lemmas its backward check used; the
	// stored proof is that trimmed proof, checked again from scratch.
	TrimmedFrom *TrimmedFrom `json:"trimmed_from,omitempty"`
}

// TrimmedFrom is the proof a stored proof was trimmed from.
type TrimmedFrom struct {
	Format     string `json:"format"` // as checked: drat-binary (a text proof is converted first)
	Size       int64  `json:"size"`
	SHA256     string `json:"sha256"`
	Lemmas     int64  `json:"lemmas"`      // lemmas of that proof
	CoreLemmas int64  `json:"core_lemmas"` // lemmas kept: those its backward check used
}

// PlanarityEntry names a planarity certificate member.
type PlanarityEntry struct {
	Member string `json:"member"`
	Planar bool   `json:"planar"`
}

// Marshal returns the manifest as indented JSON with a final newline.
// The encoder options are compacted first so the bytes are stable.
func (m *Manifest) Marshal() ([]byte, error) {
	c := *m
	if c.Refutation != nil {
		r := *c.Refutation
		var buf bytes.Buffer
		if err := json.Compact(&buf, r.Encoder.Options); err != nil {
			return nil, fmt.Errorf("archive: encoder options: %w", err)
		}
		r.Encoder.Options = buf.Bytes()
		c.Refutation = &r
	}
	b, err := json.MarshalIndent(&c, "", "  ")
	if err != nil {
		return nil, fmt.Errorf("archive: %w", err)
	}
	return append(b, '\n'), nil
}

// ReadManifest reads and validates a manifest strictly: one JSON object, no
// unknown fields, nothing after it, then every rule of Validate.
func ReadManifest(data []byte) (*Manifest, error) {
	merr := func(format string, args ...any) error {
		return &BundleError{Member: ManifestName, Kind: ErrManifest, Detail: fmt.Sprintf(format, args...)}
	}
	if len(data) > maxManifestSize {
		return nil, merr("%d bytes (at most %d)", len(data), maxManifestSize)
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var m Manifest
	if err := dec.Decode(&m); err != nil {
		return nil, merr("%s", jsonErr(data, err, dec.InputOffset()))
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, merr("%s: data after the manifest object", position(data, dec.InputOffset()))
	}
	if err := checkKeys(data, &m); err != nil {
		return nil, merr("%s", err)
	}
	if err := m.Validate(); err != nil {
		return nil, err
	}
	return &m, nil
}

// position turns a byte offset into "line:col" (1-based).
func position(data []byte, off int64) string {
	off = min(max(off, 0), int64(len(data)))
	line := 1 + bytes.Count(data[:off], []byte{'\n'})
	col := off - int64(bytes.LastIndexByte(data[:off], '\n'))
	return fmt.Sprintf("%d:%d", line, col)
}

// checkKeys applies textpos.CheckJSONKeys to data, to be decoded into v, and
// returns its finding as "line:col: message".
func checkKeys(data []byte, v any) error {
	var te *textpos.Error
	if err := textpos.CheckJSONKeys(data, "", v); errors.As(err, &te) {
		return fmt.Errorf("%d:%d: %s", te.Line, te.Col, te.Msg)
	}
	return nil
}

func jsonErr(data []byte, err error, off int64) string {
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	switch {
	case errors.As(err, &se):
		return fmt.Sprintf("%s: %v", position(data, se.Offset-1), se)
	case errors.As(err, &te):
		return fmt.Sprintf("%s: field %q: expected %s, found %s", position(data, te.Offset), te.Field, te.Type, te.Value)
	case errors.Is(err, io.EOF):
		return "empty (expected a JSON object)"
	case errors.Is(err, io.ErrUnexpectedEOF):
		return "the JSON object is cut short"
	}
	return fmt.Sprintf("%s: %v", position(data, off), strings.TrimPrefix(err.Error(), "json: "))
}

func isHex64(s string) bool {
	if len(s) != 64 {
		return false
	}
	_, err := hex.DecodeString(s)
	return err == nil && strings.ToLower(s) == s
}

var (
	kinds     = []string{"stack", "queue", "mixed"}
	pageKinds = []string{"stack", "queue"}
	bounds    = []string{AtMost, AtLeast, Exact}
	answers   = []string{"sat", "unsat", "unknown"}
	formats   = []string{"drat", "drat-binary", "lrat"}
	results   = []string{ResultVerified, ResultRejected}
)

// Validate checks the manifest against the schema and its own consistency:
// the evidence fits the bound, page counts fit K, hashes are well formed and
// every member it names is listed in Members and vice versa. All problems
// are reported, joined.
func (m *Manifest) Validate() error {
	var errs []string
	bad := func(format string, args ...any) { errs = append(errs, fmt.Sprintf(format, args...)) }
	if m.Format != FormatName {
		bad("format is %q, expected %q", m.Format, FormatName)
	}
	if m.FormatVersion != FormatVersion {
		bad("format_version is %d, this spinecert reads version %d", m.FormatVersion, FormatVersion)
	}
	if m.ToolVersion == "" {
		bad("tool_version is empty")
	}
	if m.Tool == "" {
		bad("tool is empty")
	}
	if m.Compression.Module == "" || m.Compression.Version == "" || m.Compression.Settings == "" {
		bad("compression: module, version and settings are required")
	}
	c := m.Claim
	if !isHex64(c.GraphID) {
		bad("claim.graph_id %q is not 64 lowercase hex digits", c.GraphID)
	}
	if c.Vertices < 0 || c.Edges < 0 {
		bad("claim: negative vertex or edge count")
	}
	for _, e := range c.Problems() {
		bad("%s", e)
	}
	named := map[string]string{} // member -> field naming it
	name := func(field, member string) {
		if err := ValidName(member); err != nil {
			bad("%s: %v", field, err)
			return
		}
		if member == ManifestName || member == SumsName {
			bad("%s names the reserved member %s", field, member)
			return
		}
		if prev, dup := named[member]; dup {
			bad("%s and %s name the same member %q", prev, field, member)
			return
		}
		named[member] = field
	}
	name("graph.input", m.Graph.Input)
	name("graph.canonical", m.Graph.Canonical)
	if !slices.Contains([]string{"edgelist", "dimacs", "graph6", "sparse6"}, m.Graph.InputFormat) {
		bad("graph.input_format %q is not edgelist, dimacs, graph6 or sparse6", m.Graph.InputFormat)
	}
	wantLayout := c.Bound == AtMost || c.Bound == Exact
	wantRef := c.Bound == AtLeast || c.Bound == Exact
	switch l := m.Layout; {
	case wantLayout && l == nil:
		bad("layout is required for a %s claim", c.Bound)
	case !wantLayout && l != nil:
		bad("layout is given for an at_least claim")
	case l != nil:
		name("layout.member", l.Member)
		if l.Pages != c.K {
			bad("layout.pages is %d, the claim has k=%d", l.Pages, c.K)
		}
		if l.Check != "valid" {
			bad("layout.check is %q, expected \"valid\"", l.Check)
		}
	}
	switch r := m.Refutation; {
	case wantRef && r == nil:
		bad("refutation is required for a %s claim", c.Bound)
	case !wantRef && r != nil:
		bad("refutation is given for an at_most claim")
	case r != nil:
		if r.Pages != c.K-1 {
			bad("refutation.pages is %d, the claim has k-1=%d", r.Pages, c.K-1)
		}
		if len(r.PageKinds) != r.Pages {
			bad("refutation.page_kinds has %d entries for %d pages", len(r.PageKinds), r.Pages)
		}
		for i, pk := range r.PageKinds {
			switch {
			case c.Kind == "mixed" && i < len(c.PageKinds) && pk != c.PageKinds[i]:
				bad("refutation.page_kinds[%d] is %q, the claim says %q", i, pk, c.PageKinds[i])
			case c.Kind != "mixed" && pk != c.Kind:
				bad("refutation.page_kinds[%d] is %q in a %s claim", i, pk, c.Kind)
			}
		}
		if r.Encoder.Version == "" {
			bad("refutation.encoder.version is empty")
		}
		if sg := r.Subgraph; sg != nil {
			name("refutation.subgraph.member", sg.Member)
			if !strings.HasPrefix(sg.Member, "graph/") {
				bad("refutation.subgraph.member %q is not under graph/", sg.Member)
			}
			if !isHex64(sg.GraphID) || sg.Vertices < 0 || sg.Edges < 0 {
				bad("refutation.subgraph: a graph_id of 64 lowercase hex digits and counts >= 0 are required")
			}
			if sg.Vertices > c.Vertices || sg.Edges > c.Edges {
				bad("refutation.subgraph has n=%d m=%d, more than the claim's graph (n=%d m=%d)", sg.Vertices, sg.Edges, c.Vertices, c.Edges)
			}
		}
		if t := bytes.TrimSpace(r.Encoder.Options); len(t) == 0 || t[0] != '{' {
			bad("refutation.encoder.options must be a JSON object")
		}
		if !isHex64(r.CNF.SHA256) {
			bad("refutation.cnf.sha256 %q is not 64 lowercase hex digits", r.CNF.SHA256)
		}
		if r.CNF.Vars < 0 || r.CNF.Clauses < 0 {
			bad("refutation.cnf: negative counts")
		}
		switch r.CNF.Source {
		case CNFOwn:
		case CNFForeign:
			if r.CNF.Member == "" {
				bad("refutation.cnf: a foreign CNF must be included as a member")
			}
		case CNFSub:
			if r.CNF.Member == "" || r.CNF.VarNames == "" {
				bad("refutation.cnf: a sub-formula must be included as a member, with its var_names member")
			}
		default:
			bad("refutation.cnf.source %q is not spinecert, foreign or on-demand", r.CNF.Source)
		}
		if r.CNF.VarNames != "" {
			if r.CNF.Source != CNFSub {
				bad("refutation.cnf.var_names is only for on-demand sub-formulas")
			}
			name("refutation.cnf.var_names", r.CNF.VarNames)
			if !strings.HasPrefix(r.CNF.VarNames, "cnf/") {
				bad("refutation.cnf.var_names %q is not under cnf/", r.CNF.VarNames)
			}
		}
		if r.CNF.Member != "" {
			name("refutation.cnf.member", r.CNF.Member)
			if !strings.HasPrefix(r.CNF.Member, "cnf/") {
				bad("refutation.cnf.member %q is not under cnf/", r.CNF.Member)
			}
		}
		for i, run := range r.Runs {
			if run.Backend == "" || !slices.Contains(answers, run.Answer) || run.Seconds < 0 {
				bad("refutation.runs[%d]: backend, an answer (sat, unsat, unknown) and seconds >= 0 are required", i)
			}
		}
		switch {
		case r.Cubes == nil && len(r.Proofs) == 0:
			bad("refutation.proofs is empty")
		case r.Cubes != nil && (len(r.Proofs) > 0 || len(r.Runs) > 0):
			bad("refutation.proofs and refutation.runs must be empty when the refutation is split into cubes")
		case r.Cubes != nil:
			validateCubes(r.Cubes, bad, name, func(f string, p Proof) { validateProof(f, p, bad, name) })
		}
		for i, p := range r.Proofs {
			validateProof(fmt.Sprintf("refutation.proofs[%d]", i), p, bad, name)
		}
	}
	if p := m.Planarity; p != nil {
		name("planarity.member", p.Member)
	}
	if !slices.IsSortedFunc(m.Members, func(a, b MemberEntry) int { return strings.Compare(a.Name, b.Name) }) {
		bad("members are not sorted by name")
	}
	listed := map[string]bool{}
	for i, e := range m.Members {
		n := e.Name
		if !isHex64(e.SHA256) || e.Size < 0 {
			bad("members[%d]: a size >= 0 and a sha256 of 64 lowercase hex digits are required", i)
		}
		if listed[n] {
			bad("members lists %q twice", n)
		}
		listed[n] = true
		if _, ok := named[n]; !ok && ValidName(n) == nil {
			bad("members lists %q, which no field of the manifest names", n)
		}
	}
	for n, f := range named {
		if !listed[n] {
			bad("%s names %q, which is not in members", f, n)
		}
	}
	if len(errs) == 0 {
		return nil
	}
	slices.Sort(errs)
	return &BundleError{Member: ManifestName, Kind: ErrManifest, Detail: strings.Join(errs, "; ")}
}

// Checker names recorded in manifests for spinecert's own checkers.
const (
	CheckerDRAT = "spinecert drat + lrat re-check"
	CheckerLRAT = "spinecert lrat"
)

// Problems checks the claim's own rules — kind, bound, K, and the page kinds
// of a mixed claim — and returns every problem found, each naming the
// manifest field. The manifest check (Manifest.Validate) and the command
// that makes a bundle both apply these rules, so a claim the tool would
// refuse to verify is refused before any work is done.
func (c Claim) Problems() []string {
	var errs []string
	bad := func(format string, args ...any) { errs = append(errs, fmt.Sprintf(format, args...)) }
	if !slices.Contains(kinds, c.Kind) {
		bad("claim.kind %q is not stack, queue or mixed", c.Kind)
	}
	if !slices.Contains(bounds, c.Bound) {
		bad("claim.bound %q is not at_most, at_least or exact", c.Bound)
	}
	if c.K < 1 || c.K > 1<<16 {
		bad("claim.k %d is outside 1..65536", c.K)
	}
	if (c.Bound == AtLeast || c.Bound == Exact) && c.K < 2 {
		bad("claim.k %d: a lower bound needs k of at least 2 (the refutation is of k-1 pages)", c.K)
	}
	for _, pk := range c.PageKinds {
		if !slices.Contains(pageKinds, pk) {
			bad("claim.page_kinds: %q is not stack or queue", pk)
		}
	}
	switch {
	case c.Kind == "mixed" && c.Bound == Exact:
		bad("claim: an exact bound is not defined for mixed layouts (state at_most or at_least)")
	case c.Kind == "mixed" && c.Bound == AtMost && len(c.PageKinds) != c.K:
		bad("claim.page_kinds has %d entries, a mixed at_most claim needs k=%d", len(c.PageKinds), c.K)
	case c.Kind == "mixed" && c.Bound == AtLeast && len(c.PageKinds) != c.K-1:
		bad("claim.page_kinds has %d entries, a mixed at_least claim needs k-1=%d", len(c.PageKinds), c.K-1)
	case c.Kind != "mixed" && len(c.PageKinds) != 0:
		bad("claim.page_kinds is only for mixed claims")
	}
	return errs
}

// Validate returns an error wrapping ErrBadClaim that lists every problem
// Problems finds, or nil.
func (c Claim) Validate() error {
	if p := c.Problems(); len(p) > 0 {
		return fmt.Errorf("%w: %s", ErrBadClaim, strings.Join(p, "; "))
	}
	return nil
}

// validateProof applies the rules of a proof record named f.
func validateProof(f string, p Proof, bad func(string, ...any), name func(string, string)) {
	name(f+".member", p.Member)
	if !strings.HasPrefix(p.Member, "proofs/") {
		bad("%s.member %q is not under proofs/", f, p.Member)
	}
	if !slices.Contains(formats, p.Format) {
		bad("%s.format %q is not drat, drat-binary or lrat", f, p.Format)
	}
	if p.Size < 0 {
		bad("%s.size is negative", f)
	}
	if !isHex64(p.SHA256) {
		bad("%s.sha256 %q is not 64 lowercase hex digits", f, p.SHA256)
	}
	if p.ConvertedFrom != "" && (p.ConvertedFrom != "drat" || p.Format != "drat-binary") {
		bad("%s.converted_from %q: only drat text converted to drat-binary is recorded", f, p.ConvertedFrom)
	}
	if t := p.TrimmedFrom; t != nil {
		if p.Format != "drat-binary" || t.Format != "drat-binary" {
			bad("%s.trimmed_from: only drat-binary trimmed to drat-binary is recorded", f)
		}
		if t.Size < 0 || !isHex64(t.SHA256) || t.Lemmas < 0 || t.CoreLemmas < 0 || t.CoreLemmas > t.Lemmas {
			bad("%s.trimmed_from: size, sha256 (64 lowercase hex digits), lemmas and core_lemmas (at most lemmas) are required", f)
		}
	}
	if p.Checker == "" || !slices.Contains(results, p.Result) {
		bad("%s: checker and result (verified or rejected) are required", f)
	}
}
