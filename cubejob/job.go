package cubejob

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"path/filepath"

	"spinecert.dev/archive"
	"spinecert.dev/cert"
	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
	"spinecert.dev/graph"
)

// JobFormat and JobVersion identify the job manifest schema.
const (
	JobFormat  = "spinecert-cube-job"
	JobVersion = 1
)

// Job is the contents of job.json: what the work directory sets out to
// refute and the files it rests on, each with its SHA-256.
type Job struct {
	Format        string       `json:"format"`
	FormatVersion int          `json:"format_version"`
	ToolVersion   string       `json:"tool_version"`
	Claim         Claim        `json:"claim"`
	Subgraph      *SubgraphRef `json:"subgraph,omitempty"`
	Encoder       EncoderRef   `json:"encoder"`
	CNF           CNFRef       `json:"cnf"`
	Cubes         CubesRef     `json:"cubes"`
}

// Claim is "the graph has no layout of this kind on Pages pages".
type Claim struct {
	GraphID  string `json:"graph_id"`
	Name     string `json:"name,omitempty"` // a label for people, not checked
	Vertices int    `json:"vertices"`
	Edges    int    `json:"edges"`
	Kind     string `json:"kind"`  // stack or queue
	Pages    int    `json:"pages"` // the refuted number of pages (the bound is Pages+1)
	SHA256   string `json:"graph_sha256"`
}

// SubgraphRef names the subgraph the CNF encodes (its refutation refutes
// the graph: every layout restricts to its subgraphs).
type SubgraphRef struct {
	GraphID  string `json:"graph_id"`
	Vertices int    `json:"vertices"`
	Edges    int    `json:"edges"`
	SHA256   string `json:"sha256"`
}

// EncoderRef records the encoder that made the CNF.
type EncoderRef struct {
	Version string          `json:"version"`
	Options json.RawMessage `json:"options"`
}

// CNFRef identifies the CNF.
type CNFRef struct {
	SHA256  string `json:"sha256"`
	Vars    int    `json:"vars"`
	Clauses int    `json:"clauses"`
}

// CubesRef identifies the cubes.
type CubesRef struct {
	SHA256 string `json:"sha256"`
	Count  int    `json:"count"`
	Rule   string `json:"rule"`  // the split rule, or "given" for a cube file from elsewhere
	Shape  string `json:"shape"` // ShapeTree or ShapeOther
}

// Cube set shapes: ShapeTree cubes passed cube.CheckTree (coverage and
// disjointness by shape); ShapeOther cubes passed cube.CheckDisjoint and
// need a checked refutation of their coverage formula at gather time.
const (
	ShapeTree  = "decision-tree"
	ShapeOther = "other"
)

// Work is an opened, checked work directory.
type Work struct {
	Dir      string
	Job      *Job
	ID       string // SHA-256 of job.json: every result names it
	Graph    *graph.Graph
	Subgraph *graph.Graph     // nil when the CNF encodes Graph itself
	Encoding *dimacs.Encoding // of Subgraph, or of Graph
	CNF      *dimacs.CNF      // nil when opened ForStatus
	Cubes    []cube.Cube
	opts     dimacs.Options
}

// encode builds the encoding of the claim and checks that its CNF is the
// one the job records.
func (w *Work) encode() error {
	enc, err := dimacs.Encode(w.Target(), w.opts)
	if err != nil {
		return fmt.Errorf("cubejob: %w", err)
	}
	cnf := enc.CNF()
	_, sum, err := archive.CNFText(cnf)
	if err != nil {
		return err
	}
	if sum != w.Job.CNF.SHA256 || cnf.Vars != w.Job.CNF.Vars || len(cnf.Clauses) != w.Job.CNF.Clauses {
		return fmt.Errorf("%w: %s: the claim encodes to a CNF with SHA-256 %s, the job records %s", ErrBadWork, filepath.Join(w.Dir, JobFile), sum, w.Job.CNF.SHA256)
	}
	w.Encoding, w.CNF = enc, cnf
	return nil
}

// Target is the graph the CNF encodes.
func (w *Work) Target() *graph.Graph {
	if w.Subgraph != nil {
		return w.Subgraph
	}
	return w.Graph
}

// CreateOptions controls Create.
type CreateOptions struct {
	Graph    *graph.Graph
	Name     string         // optional label of the graph
	Subgraph *graph.Graph   // optional: encode this subgraph of Graph instead
	Encoding dimacs.Options // Kind Stack or Queue, Pages = the refuted pages
	// Cubes, when not nil, are the cubes (from a cube file); otherwise
	// Split makes them.
	Cubes       []cube.Cube
	Split       cube.SplitOptions
	ToolVersion string
}

// Create makes a work directory in dir, which must not exist or be empty:
// the graph, the subgraph, the CNF, the cubes and job.json (written last,
// so a directory without it is not a work directory). Cubes from a cube
// file must pass cube.CheckTree, or else cube.CheckDisjoint (their coverage
// is then proved at gather time).
func Create(ctx context.Context, dir string, opt CreateOptions) (*Work, *cube.SplitStats, error) {
	if opt.Encoding.Kind != cert.Stack && opt.Encoding.Kind != cert.Queue {
		return nil, nil, fmt.Errorf("cubejob: a cube job refutes stack or queue layouts, not %s", opt.Encoding.Kind)
	}
	if entries, err := os.ReadDir(dir); err == nil && len(entries) > 0 {
		return nil, nil, fmt.Errorf("cubejob: %s exists and is not empty", dir)
	}
	target := opt.Graph
	if opt.Subgraph != nil {
		if err := graph.CheckSubgraph(opt.Subgraph, opt.Graph); err != nil {
			return nil, nil, fmt.Errorf("cubejob: %w", err)
		}
		target = opt.Subgraph
	}
	enc, err := dimacs.Encode(target, opt.Encoding)
	if err != nil {
		return nil, nil, fmt.Errorf("cubejob: %w", err)
	}
	cnf := enc.CNF()
	cnfText, cnfSum, err := archive.CNFText(cnf)
	if err != nil {
		return nil, nil, err
	}
	optJSON, err := archive.MarshalEncoderOptions(opt.Encoding)
	if err != nil {
		return nil, nil, err
	}
	cubes, rule, stats := opt.Cubes, "given", (*cube.SplitStats)(nil)
	if cubes == nil {
		if cubes, stats, err = cube.Split(ctx, cnf, opt.Split); err != nil {
			return nil, nil, err
		}
		rule = opt.Split.Rule
		if rule == "" {
			rule = cube.RuleOccurrence
		}
	}
	if len(cubes) > archive.MaxCubes {
		return nil, nil, fmt.Errorf("cubejob: %d cubes; a bundle holds at most %d", len(cubes), archive.MaxCubes)
	}
	shape := ShapeTree
	if err := cube.CheckTree(cubes); err != nil {
		if errors.Is(err, cube.ErrOverlap) {
			return nil, nil, err
		}
		if err := cube.CheckDisjoint(cubes); err != nil {
			return nil, nil, err
		}
		shape = ShapeOther
	}
	for i, c := range cubes {
		for _, l := range c {
			if v := max(l, -l); int(v) > cnf.Vars {
				return nil, nil, fmt.Errorf("cubejob: cube %d has literal %d, the formula has %d variables", i+1, l, cnf.Vars)
			}
		}
	}
	var gtext, stext, ctext bytes.Buffer
	if err := graph.WriteEdgeList(&gtext, opt.Graph); err != nil {
		return nil, nil, fmt.Errorf("cubejob: %w", err)
	}
	if err := cube.Write(&ctext, cubes, fmt.Sprintf("spinecert cubes of %s, rule %s", cnfSum[:16], rule)); err != nil {
		return nil, nil, err
	}
	job := &Job{
		Format: JobFormat, FormatVersion: JobVersion, ToolVersion: opt.ToolVersion,
		Claim: Claim{GraphID: opt.Graph.ID(), Name: opt.Name, Vertices: opt.Graph.N(), Edges: opt.Graph.M(),
			Kind: opt.Encoding.Kind.String(), Pages: opt.Encoding.Pages, SHA256: sha(gtext.Bytes())},
		Encoder: EncoderRef{Version: enc.Version(), Options: optJSON},
		CNF:     CNFRef{SHA256: cnfSum, Vars: cnf.Vars, Clauses: len(cnf.Clauses)},
		Cubes:   CubesRef{SHA256: sha(ctext.Bytes()), Count: len(cubes), Rule: rule, Shape: shape},
	}
	if opt.Subgraph != nil {
		if err := graph.WriteEdgeList(&stext, opt.Subgraph); err != nil {
			return nil, nil, fmt.Errorf("cubejob: %w", err)
		}
		job.Subgraph = &SubgraphRef{GraphID: opt.Subgraph.ID(), Vertices: opt.Subgraph.N(), Edges: opt.Subgraph.M(), SHA256: sha(stext.Bytes())}
	}
	jobText, err := json.MarshalIndent(job, "", "  ")
	if err != nil {
		return nil, nil, fmt.Errorf("cubejob: %w", err)
	}
	jobText = append(jobText, '\n')
	for _, d := range []string{dir, filepath.Join(dir, ResultsDir), filepath.Join(dir, FailuresDir), filepath.Join(dir, TmpDir), filepath.Join(dir, SlurmDir)} {
		if err := os.MkdirAll(d, 0o755); err != nil {
			return nil, nil, fmt.Errorf("cubejob: %w", err)
		}
	}
	files := []struct {
		name string
		data []byte
	}{{GraphFile, gtext.Bytes()}, {CNFFile, cnfText}, {CubesFile, ctext.Bytes()}}
	if opt.Subgraph != nil {
		files = append(files, struct {
			name string
			data []byte
		}{SubgraphFile, stext.Bytes()})
	}
	for _, f := range files {
		if err := writeAtomic(filepath.Join(dir, f.name), f.data); err != nil {
			return nil, nil, err
		}
	}
	if err := writeAtomic(filepath.Join(dir, JobFile), jobText); err != nil {
		return nil, nil, err
	}
	return &Work{Dir: dir, Job: job, ID: sha(jobText), Graph: opt.Graph, Subgraph: opt.Subgraph, Encoding: enc, CNF: cnf, Cubes: cubes, opts: opt.Encoding}, stats, nil
}

// maxJobSize bounds job.json.
const maxJobSize = 1 << 20

// OpenMode says how much of the CNF Open prepares.
type OpenMode int

const (
	// ForCheck encodes the claim again with this spinecert's encoder and
	// compares the CNF with the recorded SHA-256 (gather).
	ForCheck OpenMode = iota
	// ForSolving reads formula.cnf, whose SHA-256 must be the recorded
	// one; the encoding, needed only to decode a model, is built (and
	// compared) when a cube is satisfiable. Results made from it are
	// checked again against the re-encoded claim at gather time.
	ForSolving
	// ForStatus reads no CNF (Work.CNF is nil).
	ForStatus
)

// Open reads and checks a work directory for gathering (OpenAs ForCheck).
func Open(dir string) (*Work, error) { return OpenAs(dir, ForCheck) }

// OpenAs reads and checks a work directory: job.json strictly, the graph
// against the claimed identity, the subgraph against the graph, the CNF as
// mode says, and the cubes file against its SHA-256 and count. Any
// mismatch wraps ErrBadWork and names the file.
func OpenAs(dir string, mode OpenMode) (*Work, error) {
	bad := func(file, format string, args ...any) error {
		return fmt.Errorf("%w: %s: %s", ErrBadWork, filepath.Join(dir, file), fmt.Sprintf(format, args...))
	}
	jobPath := filepath.Join(dir, JobFile)
	st, err := os.Stat(jobPath)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return nil, bad(JobFile, "missing: this is not a work directory made by spinecert split (or the split did not finish)")
	case err != nil:
		return nil, fmt.Errorf("cubejob: %w", err)
	case st.Size() > maxJobSize:
		return nil, bad(JobFile, "%d bytes, at most %d", st.Size(), maxJobSize)
	}
	jobText, err := os.ReadFile(jobPath)
	if err != nil {
		return nil, fmt.Errorf("cubejob: %w", err)
	}
	job, err := parseJob(jobText, jobPath)
	if err != nil {
		return nil, err
	}
	w := &Work{Dir: dir, Job: job, ID: sha(jobText)}
	readGraph := func(file, wantSum string) (*graph.Graph, error) {
		data, err := os.ReadFile(filepath.Join(dir, file))
		if err != nil {
			return nil, bad(file, "%v", err)
		}
		if got := sha(data); got != wantSum {
			return nil, bad(file, "SHA-256 %s, %s records %s", got, JobFile, wantSum)
		}
		res, err := graph.Read(bytes.NewReader(data), filepath.Join(dir, file), graph.FormatEdgeList)
		if err != nil {
			return nil, fmt.Errorf("%w: %w", ErrBadWork, err)
		}
		if len(res.Graphs) != 1 {
			return nil, bad(file, "holds %d graphs, expected one", len(res.Graphs))
		}
		return res.Graphs[0], nil
	}
	if w.Graph, err = readGraph(GraphFile, job.Claim.SHA256); err != nil {
		return nil, err
	}
	if g := w.Graph; g.ID() != job.Claim.GraphID || g.N() != job.Claim.Vertices || g.M() != job.Claim.Edges {
		return nil, bad(GraphFile, "graph %s (n=%d, m=%d), the claim names %s (n=%d, m=%d)", g.ID(), g.N(), g.M(), job.Claim.GraphID, job.Claim.Vertices, job.Claim.Edges)
	}
	if s := job.Subgraph; s != nil {
		if w.Subgraph, err = readGraph(SubgraphFile, s.SHA256); err != nil {
			return nil, err
		}
		if h := w.Subgraph; h.ID() != s.GraphID || h.N() != s.Vertices || h.M() != s.Edges {
			return nil, bad(SubgraphFile, "graph %s, %s records %s", h.ID(), JobFile, s.GraphID)
		}
		if err := graph.CheckSubgraph(w.Subgraph, w.Graph); err != nil {
			return nil, fmt.Errorf("%w: %s: %w", ErrBadWork, filepath.Join(dir, SubgraphFile), err)
		}
	}
	opts, err := archive.UnmarshalEncoderOptions(job.Encoder.Options)
	if err != nil {
		return nil, bad(JobFile, "%v", err)
	}
	if opts.Kind.String() != job.Claim.Kind || opts.Pages != job.Claim.Pages {
		return nil, bad(JobFile, "the encoder options (%s, %d pages) are not the claim (%s, %d pages)", opts.Kind, opts.Pages, job.Claim.Kind, job.Claim.Pages)
	}
	if job.Encoder.Version != dimacs.EncoderVersion {
		return nil, bad(JobFile, "made with encoder %s, this spinecert has %s: split the claim again", job.Encoder.Version, dimacs.EncoderVersion)
	}
	w.opts = opts
	switch mode {
	case ForCheck:
		if err := w.encode(); err != nil {
			return nil, err
		}
		if fsum, _, err := hashFile(filepath.Join(dir, CNFFile)); err != nil || fsum != job.CNF.SHA256 {
			return nil, bad(CNFFile, "not the CNF of the claim (SHA-256 %s, expected %s; %v)", fsum, job.CNF.SHA256, err)
		}
	case ForSolving:
		path := filepath.Join(dir, CNFFile)
		fsum, _, err := hashFile(path)
		if err != nil || fsum != job.CNF.SHA256 {
			return nil, bad(CNFFile, "not the CNF the job records (SHA-256 %s, expected %s; %v)", fsum, job.CNF.SHA256, err)
		}
		if w.CNF, err = dimacs.ReadCNFFile(path, dimacs.ReadOptions{}); err != nil {
			return nil, fmt.Errorf("%w: %w", ErrBadWork, err)
		}
		if w.CNF.Vars != job.CNF.Vars || len(w.CNF.Clauses) != job.CNF.Clauses {
			return nil, bad(CNFFile, "%d variables and %d clauses, the job records %d and %d", w.CNF.Vars, len(w.CNF.Clauses), job.CNF.Vars, job.CNF.Clauses)
		}
	}
	cubeText, err := os.ReadFile(filepath.Join(dir, CubesFile))
	if err != nil {
		return nil, bad(CubesFile, "%v", err)
	}
	if got := sha(cubeText); got != job.Cubes.SHA256 {
		return nil, bad(CubesFile, "SHA-256 %s, %s records %s", got, JobFile, job.Cubes.SHA256)
	}
	if w.Cubes, err = cube.Read(bytes.NewReader(cubeText), filepath.Join(dir, CubesFile), cube.ReadOptions{Vars: job.CNF.Vars}); err != nil {
		return nil, fmt.Errorf("%w: %w", ErrBadWork, err)
	}
	if len(w.Cubes) != job.Cubes.Count {
		return nil, bad(CubesFile, "%d cubes, %s records %d", len(w.Cubes), JobFile, job.Cubes.Count)
	}
	return w, nil
}

// parseJob reads job.json strictly: one JSON object of the schema, no
// unknown, repeated or case-variant keys, nothing after it, this format.
func parseJob(data []byte, path string) (*Job, error) {
	bad := func(format string, args ...any) error {
		return fmt.Errorf("%w: %s: %s", ErrBadWork, path, fmt.Sprintf(format, args...))
	}
	job := &Job{}
	if err := decodeJSON(data, path, job); err != nil {
		return nil, fmt.Errorf("%w: %w", ErrBadWork, err)
	}
	if job.Format != JobFormat || job.FormatVersion != JobVersion {
		return nil, bad("format %q version %d, expected %q version %d", job.Format, job.FormatVersion, JobFormat, JobVersion)
	}
	if job.Claim.Pages < 1 || job.Cubes.Count < 1 || job.Claim.Vertices < 0 || job.Claim.Edges < 0 {
		return nil, bad("the claim needs at least 1 page and the job at least 1 cube")
	}
	return job, nil
}
