package verify

import (
	"bufio"
	"context"
	"fmt"
	"io"
	"os"
	"slices"
	"time"

	"github.com/crillab/gophersat/solver"

	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

// gophersatVersion is the gophersat release spinecert is built against (see go.mod).
const gophersatVersion = "v1.4.0"

// ChildEnv is the environment variable that makes a spinecert process run one
// hidden child job; GophersatChild is the job that runs gophersat.
const (
	ChildEnv       = "SPINECERT_CHILD"
	GophersatChild = "gophersat"
)

// ChildCommand says how to start a child process that runs a hidden job:
// the program and the environment entries that select the job.
type ChildCommand struct {
	Path string
	Env  []string
}

// SelfChild starts the running executable itself as a child running job.
// The program must dispatch on ChildEnv before anything else (spinecert's main
// does; a test binary does in its TestMain).
func SelfChild(job string) (ChildCommand, error) {
	exe, err := os.Executable()
	if err != nil {
		return ChildCommand{}, fmt.Errorf("verify: cannot find the running program: %w", err)
	}
	return ChildCommand{Path: exe, Env: []string{ChildEnv + "=" + job}}, nil
}

// Gophersat is gophersat (github.com/crillab/gophersat) run in a child
// process, because its Solve cannot be interrupted: the child is killed
// with its process group at the time limit. The child writes the RUP
// lemmas of gophersat's certificate as a DRAT text proof without deletions.
type Gophersat struct {
	ext External
}

// NewGophersat returns the gophersat backend started through child, which
// must run RunGophersatChild.
func NewGophersat(child ChildCommand) *Gophersat {
	return &Gophersat{ext: External{
		Label:       "gophersat",
		Argv:        []string{child.Path, ArgCNF, ArgProof},
		Env:         child.Env,
		ProofFormat: proof.RUP,
		Version:     gophersatVersion,
	}}
}

// Name returns "gophersat".
func (g *Gophersat) Name() string { return "gophersat" }

// Solve runs the child on cnf.
func (g *Gophersat) Solve(ctx context.Context, cnf *dimacs.CNF, limit time.Duration, proofPath string) (*Result, error) {
	return g.ext.Solve(ctx, cnf, limit, proofPath)
}

// RunGophersatChild is the child side of the gophersat backend: args are
// the CNF path and the proof path (which may be the null device). It
// prints the answer by the SAT competition conventions on stdout and
// returns the exit status (10 SAT, 20 UNSAT, 0 unknown, 2 bad input).
func RunGophersatChild(args []string, stdout, stderr io.Writer) int {
	if len(args) != 2 {
		fmt.Fprintf(stderr, "verify: gophersat child: expected CNF and PROOF paths, got %d arguments\n", len(args))
		return 2
	}
	cnf, err := dimacs.ReadCNFFile(args[0], dimacs.ReadOptions{})
	if err != nil {
		fmt.Fprintf(stderr, "verify: gophersat child: %v\n", err)
		return 2
	}
	pf, err := os.Create(args[1])
	if err != nil {
		fmt.Fprintf(stderr, "verify: gophersat child: %v\n", err)
		return 2
	}
	pw := bufio.NewWriterSize(pf, 256<<10)
	status, model := gophersatSolve(cnf, pw)
	err = pw.Flush()
	if err == nil && args[1] != os.DevNull {
		err = pf.Sync()
	}
	if cerr := pf.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		fmt.Fprintf(stderr, "verify: gophersat child: writing proof: %v\n", err)
		return 0
	}
	out := bufio.NewWriter(stdout)
	defer out.Flush()
	switch status {
	case solver.Sat:
		fmt.Fprintln(out, "s SATISFIABLE")
		line := []byte("v")
		for i, b := range model {
			lit := i + 1
			if !b {
				lit = -lit
			}
			line = fmt.Appendf(line, " %d", lit)
			if len(line) > 70 {
				out.Write(append(line, '\n'))
				line = append(line[:0], 'v')
			}
		}
		out.Write(append(line, " 0\n"...))
		return 10
	case solver.Unsat:
		fmt.Fprintln(out, "s UNSATISFIABLE")
		return 20
	}
	fmt.Fprintln(out, "s UNKNOWN")
	return 0
}

// gophersatSolve runs gophersat on cnf, writing its certificate lemmas to
// proof, and returns the status and, for Sat, a model of cnf.Vars values.
func gophersatSolve(cnf *dimacs.CNF, proof io.Writer) (solver.Status, []bool) {
	// gophersat expects clauses without repeated literals and tautologies;
	// removing them keeps the formula equivalent, and unit propagation on
	// it is the same as on the original, so the lemmas stay RUP there.
	clauses := make([][]int, 0, len(cnf.Clauses))
	for _, cl := range cnf.Clauses {
		c := make([]int, 0, len(cl))
		taut := false
		for _, l := range cl {
			if slices.Contains(c, int(-l)) {
				taut = true
				break
			}
			if !slices.Contains(c, int(l)) {
				c = append(c, int(l))
			}
		}
		if taut {
			continue
		}
		if len(c) == 0 {
			fmt.Fprintln(proof, "0")
			return solver.Unsat, nil
		}
		clauses = append(clauses, c)
	}
	pb := solver.ParseSliceNb(clauses, cnf.Vars)
	s := solver.New(pb)
	s.Certified = true
	lines := make(chan string, 4096)
	s.CertChan = lines
	done := make(chan bool)
	go func() {
		last := ""
		for l := range lines {
			io.WriteString(proof, l)
			io.WriteString(proof, "\n")
			last = l
		}
		done <- last == "0"
	}()
	status := s.Solve()
	close(lines)
	endsEmpty := <-done
	if status == solver.Unsat && !endsEmpty {
		// gophersat found the conflict while reading the problem; the
		// empty clause then follows by unit propagation alone.
		fmt.Fprintln(proof, "0")
	}
	if status != solver.Sat {
		return status, nil
	}
	m := s.Model()
	model := make([]bool, cnf.Vars)
	copy(model, m)
	return status, model
}
