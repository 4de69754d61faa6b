package verify

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"

	"spinecert.dev/dimacs"
	"spinecert.dev/internal/fixture/formulas"
	"spinecert.dev/internal/testtools"
	"spinecert.dev/proof"
)

// gophersatForTest runs gophersat in a child copy of the test binary (see TestMain).
func gophersatForTest(t testing.TB) Solver {
	t.Helper()
	child, err := SelfChild(GophersatChild)
	if err != nil {
		t.Fatal(err)
	}
	return NewGophersat(child)
}

// inProcess returns the two always-available backends.
func inProcess(t testing.TB) []Solver {
	return []Solver{gophersatForTest(t), Gini{}}
}

func cadicalForTest(t testing.TB) Solver {
	t.Helper()
	testtools.Require(t, "cadical", "cadical")
	s, err := ByName("cadical", ChildCommand{})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func solveOK(t *testing.T, s Solver, cnf *dimacs.CNF, proof string) *Result {
	t.Helper()
	r, err := s.Solve(context.Background(), cnf, time.Minute, proof)
	if err != nil {
		t.Fatalf("%s: %v", s.Name(), err)
	}
	return r
}

// TestPigeonholeUnsat: PHP(n+1, n) is unsatisfiable (the pigeonhole
// principle; Haken 1985 shows resolution needs exponential size for it).
func TestPigeonholeUnsat(t *testing.T) {
	backends := inProcess(t)
	for _, n := range []int{1, 2, 3, 4, 5, 6} {
		cnf := formulas.Pigeonhole(n)
		// Sizes from the definition: n(n+1) variables, (n+1) + n*C(n+1,2) clauses.
		if cnf.Vars != n*(n+1) || len(cnf.Clauses) != n+1+n*(n+1)*n/2 {
			t.Fatalf("PHP(%d,%d) has %d vars %d clauses", n+1, n, cnf.Vars, len(cnf.Clauses))
		}
		for _, s := range backends {
			proof := filepath.Join(t.TempDir(), "proof")
			r := solveOK(t, s, cnf, proof)
			if r.Answer != Unsat {
				t.Errorf("PHP(%d,%d) with %s: %s (%s), want UNSAT", n+1, n, s.Name(), r.Answer, r.Detail)
				continue
			}
			if s.Name() == "gophersat" {
				checkProofEndsEmpty(t, r)
			}
		}
		t.Run("cadical", func(t *testing.T) {
			s := cadicalForTest(t)
			r := solveOK(t, s, cnf, filepath.Join(t.TempDir(), "proof"))
			if r.Answer != Unsat || r.Proof == "" || r.ProofFormat != proof.DRATBinary {
				t.Errorf("PHP(%d,%d) with cadical: %+v", n+1, n, r)
			}
		})
	}
}

// checkProofEndsEmpty checks that a text proof exists and ends with the empty clause.
func checkProofEndsEmpty(t *testing.T, r *Result) {
	t.Helper()
	if r.Proof == "" {
		t.Fatalf("%s: UNSAT without a proof: %s", r.Backend, r.Detail)
	}
	data, err := os.ReadFile(r.Proof)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(data)), "\n")
	if lines[len(lines)-1] != "0" {
		t.Errorf("%s proof does not end with the empty clause: %q", r.Backend, lines[len(lines)-1])
	}
}

// TestRandom3SATAgree: on random 3-SAT at the threshold ratio m/n ≈ 4.26
// (Mitchell, Selman, Levesque, "Hard and easy distributions of SAT
// problems", AAAI 1992) about half the instances are satisfiable; every
// backend must give the same answer on each, and every model must satisfy
// the formula.
func TestRandom3SATAgree(t *testing.T) {
	const n, m, count = 50, 213, 24
	var cnfs []*dimacs.CNF
	var want []Answer
	sat, unsat := 0, 0
	backends := inProcess(t)
	for seed := range uint64(count) {
		cnf := formulas.Random3SAT(seed+1, n, m)
		cnfs = append(cnfs, cnf)
		var first Answer
		for i, s := range backends {
			r := solveOK(t, s, cnf, filepath.Join(t.TempDir(), "proof"))
			checkUnsatProof(t, cnf, r)
			if r.Answer == Unknown {
				t.Fatalf("seed %d %s: UNKNOWN (%s)", seed+1, s.Name(), r.Detail)
			}
			if r.Answer == Sat {
				if err := CheckModel(cnf, r.Model); err != nil {
					t.Fatalf("seed %d %s: %v", seed+1, s.Name(), err)
				}
			}
			if i == 0 {
				first = r.Answer
			} else if r.Answer != first {
				t.Errorf("seed %d: %s says %s, %s says %s", seed+1, backends[0].Name(), first, s.Name(), r.Answer)
			}
		}
		want = append(want, first)
		if first == Sat {
			sat++
		} else {
			unsat++
		}
	}
	if sat == 0 || unsat == 0 {
		t.Fatalf("batch not mixed: %d SAT, %d UNSAT", sat, unsat)
	}
	t.Logf("%d SAT, %d UNSAT", sat, unsat)
	t.Run("cadical", func(t *testing.T) {
		s := cadicalForTest(t)
		for i, cnf := range cnfs {
			r := solveOK(t, s, cnf, filepath.Join(t.TempDir(), "proof"))
			checkUnsatProof(t, cnf, r)
			if r.Answer != want[i] {
				t.Errorf("seed %d: cadical says %s, in-process backends %s (%s)", i+1, r.Answer, want[i], r.Detail)
			}
			if r.Answer == Sat {
				if err := CheckModel(cnf, r.Model); err != nil {
					t.Errorf("seed %d cadical: %v", i+1, err)
				}
			}
		}
	})
	t.Run("minisat", func(t *testing.T) {
		testtools.Require(t, "minisat", "minisat")
		s, err := ByName("minisat", ChildCommand{})
		if err != nil {
			t.Fatal(err)
		}
		for i, cnf := range cnfs {
			r := solveOK(t, s, cnf, "")
			if r.Answer != want[i] {
				t.Errorf("seed %d: minisat says %s, in-process backends %s (%s)", i+1, r.Answer, want[i], r.Detail)
			}
		}
	})
}

// checkUnsatProof requires the proof of an UNSAT result, when the backend
// wrote one, to pass spinecert's DRAT checker and the LRAT re-check.
func checkUnsatProof(t *testing.T, cnf *dimacs.CNF, r *Result) {
	t.Helper()
	if r.Answer != Unsat || r.Proof == "" {
		return
	}
	checks := CheckProofs(context.Background(), cnf, []*Result{r}, ProofCheckOptions{})
	if len(checks) != 1 || !checks[0].DRAT || !checks[0].LRAT {
		t.Errorf("%s: proof rejected: %+v", r.Backend, checks)
	}
}

// satFormula is satisfiable but not by the all-false assignment.
var satFormula = &dimacs.CNF{Vars: 3, Clauses: [][]int32{{1, 2, 3}, {-1, 2}, {-2, 3}}}

func script(t *testing.T, name string) *External {
	t.Helper()
	path, err := filepath.Abs(filepath.Join("testdata", "solvers", name))
	if err != nil {
		t.Fatal(err)
	}
	return &External{Label: name, Argv: []string{path, ArgCNF, ArgProof}, ProofFormat: proof.DRAT}
}

// TestFaultInjection: solvers that lie, crash, hang or print garbage never
// yield SAT; those that contradict themselves are marked suspect. (A lying
// UNSAT is a claim like any other here; Decide is what refuses to act on it.)
func TestFaultInjection(t *testing.T) {
	tests := []struct {
		script  string
		answer  Answer
		suspect bool
		detail  string
	}{
		{"wrong_model.sh", Unknown, true, "WRONG MODEL"},
		{"crash.sh", Unknown, false, "crashed"},
		{"garbage.sh", Unknown, false, "unparsable answer"},
		{"exit_mismatch.sh", Unknown, true, "exit status 10 contradicts the answer UNSAT"},
		{"unended_model.sh", Unknown, false, "not ended by 0"},
		{"liar_unsat.sh", Unsat, false, ""},
	}
	for _, tt := range tests {
		t.Run(tt.script, func(t *testing.T) {
			r := solveOK(t, script(t, tt.script), satFormula, filepath.Join(t.TempDir(), "proof"))
			if r.Answer != tt.answer || r.Suspect != tt.suspect || !strings.Contains(r.Detail, tt.detail) {
				t.Errorf("got %s suspect=%v detail %q; want %s suspect=%v detail containing %q", r.Answer, r.Suspect, r.Detail, tt.answer, tt.suspect, tt.detail)
			}
			if r.Model != nil {
				t.Errorf("model kept for %s", r.Answer)
			}
		})
	}
}

// TestHangKilled: a solver that never answers is killed with its whole
// process group at the time limit.
func TestHangKilled(t *testing.T) {
	pidfile := filepath.Join(t.TempDir(), "pid")
	t.Setenv("SPINECERT_TEST_PIDFILE", pidfile)
	s := script(t, "hang.sh")
	start := time.Now()
	r, err := s.Solve(context.Background(), satFormula, 300*time.Millisecond, "")
	if err != nil {
		t.Fatal(err)
	}
	if r.Answer != Unknown || !strings.Contains(r.Detail, "time limit") {
		t.Fatalf("got %s %q", r.Answer, r.Detail)
	}
	if el := time.Since(start); el > 10*time.Second {
		t.Errorf("took %v to stop", el)
	}
	data, err := os.ReadFile(pidfile)
	if err != nil {
		t.Fatal(err)
	}
	pid, _ := strconv.Atoi(strings.TrimSpace(string(data)))
	// The grandchild must be gone (reaped by init once killed); poll briefly.
	deadline := time.Now().Add(5 * time.Second)
	for {
		err := syscall.Kill(pid, 0)
		if errors.Is(err, syscall.ESRCH) {
			break
		}
		if time.Now().After(deadline) {
			t.Fatalf("grandchild %d still alive after the time-out (%v)", pid, err)
		}
		time.Sleep(20 * time.Millisecond)
	}
}

// TestTimeoutInProcess: both in-process backends stop at the time limit
// on a formula far beyond it (PHP(13,12) needs exponential resolution
// proofs, Haken 1985) and on cancellation.
func TestTimeoutInProcess(t *testing.T) {
	cnf := formulas.Pigeonhole(12)
	for _, s := range inProcess(t) {
		start := time.Now()
		r, err := s.Solve(context.Background(), cnf, 300*time.Millisecond, filepath.Join(t.TempDir(), "proof"))
		if err != nil {
			t.Fatal(err)
		}
		if r.Answer != Unknown || r.Proof != "" {
			t.Errorf("%s: %s proof %q", s.Name(), r.Answer, r.Proof)
		}
		if el := time.Since(start); el > 10*time.Second {
			t.Errorf("%s took %v to stop", s.Name(), el)
		}
		ctx, cancel := context.WithCancel(context.Background())
		time.AfterFunc(200*time.Millisecond, cancel)
		r, err = s.Solve(ctx, cnf, 0, "")
		if err != nil {
			t.Fatal(err)
		}
		if r.Answer != Unknown || !strings.Contains(r.Detail, "cancelled") {
			t.Errorf("%s after cancel: %s %q", s.Name(), r.Answer, r.Detail)
		}
	}
}

// TestEdgeFormulas: the empty formula is satisfiable, a formula with the
// empty clause is not, and tautologies and repeated literals are handled
// (DIMACS CNF semantics; common practice, no source).
func TestEdgeFormulas(t *testing.T) {
	tests := []struct {
		name string
		cnf  *dimacs.CNF
		want Answer
	}{
		{"empty", &dimacs.CNF{}, Sat},
		{"unused vars", &dimacs.CNF{Vars: 5, Clauses: [][]int32{{2}}}, Sat},
		{"empty clause", &dimacs.CNF{Vars: 1, Clauses: [][]int32{{1}, {}}}, Unsat},
		{"units clash", &dimacs.CNF{Vars: 1, Clauses: [][]int32{{1}, {-1}}}, Unsat},
		{"tautology and repeats", &dimacs.CNF{Vars: 2, Clauses: [][]int32{{1, -1}, {2, 2}, {-2, -2, 1}}}, Sat},
	}
	backends := inProcess(t)
	for _, tt := range tests {
		for _, s := range backends {
			r := solveOK(t, s, tt.cnf, filepath.Join(t.TempDir(), "proof"))
			if r.Answer != tt.want {
				t.Errorf("%s %s: %s (%s), want %s", tt.name, s.Name(), r.Answer, r.Detail, tt.want)
			}
			if r.Answer == Sat && len(r.Model) != tt.cnf.Vars {
				t.Errorf("%s %s: model of %d values for %d vars", tt.name, s.Name(), len(r.Model), tt.cnf.Vars)
			}
		}
	}
}

func TestCheckModel(t *testing.T) {
	if err := CheckModel(satFormula, []bool{true, true, true}); err != nil {
		t.Error(err)
	}
	err := CheckModel(satFormula, []bool{false, false, false})
	if err == nil || !strings.Contains(err.Error(), "violates clause 1 (1 2 3 0)") {
		t.Errorf("got %v", err)
	}
	if err := CheckModel(satFormula, []bool{true}); err == nil {
		t.Error("short model accepted")
	}
}

// TestParseSolverOutput follows the SAT competition output rules (common practice).
func TestParseSolverOutput(t *testing.T) {
	tests := []struct {
		out    string
		answer Answer
		err    string
	}{
		{"c hi\ns SATISFIABLE\nv 1 -2\nv 3 0\n", Sat, ""},
		{"s UNSATISFIABLE\n", Unsat, ""},
		{"s UNKNOWN\n", Unknown, ""},
		{"", Unknown, "no status line"},
		{"s SATISFIABLE\n", Unknown, "without a model"},
		{"s SATISFIABLE\nv 1 2 3\n", Unknown, "not ended by 0"},
		{"s SATISFIABLE\nv 1 -1 0\n", Unknown, "both values"},
		{"s SATISFIABLE\nv 1 4 0\n", Unknown, "beyond the 3 variables"},
		{"s SATISFIABLE\nv 1 x 0\n", Unknown, "expected a literal"},
		{"s SATISFIABLE\nv 1 0 2\n", Unknown, "after the closing 0"},
		{"s UNSATISFIABLE\ns SATISFIABLE\n", Unknown, "second status line"},
		{"s MAYBE\n", Unknown, "expected status"},
		{"hello\n", Unknown, "expected a line starting with c, s or v"},
		{"s UNSATISFIABLE\nv 1 0\n", Unknown, "UNSATISFIABLE with a model"},
	}
	for _, tt := range tests {
		out, err := parseSolverOutput([]byte(tt.out), 3)
		if tt.err != "" {
			if err == nil || !strings.Contains(err.Error(), tt.err) {
				t.Errorf("%q: error %v, want %q", tt.out, err, tt.err)
			}
			continue
		}
		if err != nil {
			t.Errorf("%q: %v", tt.out, err)
			continue
		}
		if out.answer != tt.answer {
			t.Errorf("%q: %s want %s", tt.out, out.answer, tt.answer)
		}
	}
	out, _ := parseSolverOutput([]byte("s SATISFIABLE\nv 1 -2\nv 3 0\n"), 3)
	if got := out.model; len(got) != 3 || !got[0] || got[1] || !got[2] {
		t.Errorf("model %v", got)
	}
}

func TestParseSolverCmd(t *testing.T) {
	e, err := ParseSolverCmd("/usr/bin/mysolver -q")
	if err != nil || e.Name() != "mysolver" || strings.Join(e.Argv, " ") != "/usr/bin/mysolver -q {cnf}" {
		t.Errorf("%v %+v", err, e)
	}
	e, _ = ParseSolverCmd("s --in {cnf} --proof={proof}")
	if strings.Join(e.Argv, " ") != "s --in {cnf} --proof={proof}" || !e.wantsProof() {
		t.Errorf("%+v", e)
	}
	if _, err := ParseSolverCmd("  "); err == nil {
		t.Error("empty command accepted")
	}
	if _, err := ByName("nosuch", ChildCommand{}); !errors.Is(err, ErrNoSolver) {
		t.Errorf("unknown solver: %v", err)
	}
}
