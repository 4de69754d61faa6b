package verify

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"time"

	"spinecert.dev/dimacs"
)

// Placeholders in an External command line.
const (
	ArgCNF    = "{cnf}"    // path of the DIMACS CNF input
	ArgProof  = "{proof}"  // path where the solver writes its proof
	ArgResult = "{result}" // path where the solver writes its answer (minisat style)
)

// External runs a solver program in its own process group. It reads the
// SAT competition conventions from the program's standard output (see
// parseSolverOutput) and its exit status (10 SAT, 20 UNSAT), or, when Argv
// holds ArgResult, a result file in the minisat style ("SAT" then the model
// ended by 0, or "UNSAT"). A time-out or cancellation kills the whole
// process group. A crash, a time-out, output that breaks the conventions
// and an exit status that contradicts the printed answer are all Unknown.
type External struct {
	Label       string   // backend name, used to tell backends apart
	Argv        []string // program and arguments, with the Arg* placeholders
	Env         []string // added to the environment of the process
	ProofFormat string   // format of the proof the program writes at ArgProof
	Version     string   // reported version, if known
}

// Name returns the backend label.
func (e *External) Name() string { return e.Label }

// ParseSolverCmd turns a command line such as "cadical -q" or
// "mysolver --in {cnf} --proof {proof}" into an External. Arguments are
// split at blanks (no shell quoting). Without ArgCNF the CNF path is
// appended as the last argument. The backend is named after the program.
func ParseSolverCmd(cmdline string) (*External, error) {
	argv := strings.Fields(cmdline)
	if len(argv) == 0 {
		return nil, fmt.Errorf("verify: empty solver command")
	}
	hasCNF := false
	for _, a := range argv {
		if strings.Contains(a, ArgCNF) {
			hasCNF = true
		}
	}
	if !hasCNF {
		argv = append(argv, ArgCNF)
	}
	return &External{Label: filepath.Base(argv[0]), Argv: argv}, nil
}

// wantsProof reports whether the command line has a proof placeholder.
func (e *External) wantsProof() bool {
	for _, a := range e.Argv {
		if strings.Contains(a, ArgProof) {
			return true
		}
	}
	return false
}

// killGrace is how long a killed process group may take to release its
// output pipes before Wait gives up on them.
const killGrace = 2 * time.Second

// stderrKeep is how much of a solver's standard error is kept for reports.
const stderrKeep = 2048

// Solve writes cnf to a temporary file and runs the program on it.
func (e *External) Solve(ctx context.Context, cnf *dimacs.CNF, limit time.Duration, proofPath string) (*Result, error) {
	res := &Result{Backend: e.Label, Version: e.Version}
	if len(e.Argv) == 0 {
		return nil, fmt.Errorf("verify: %s: empty command", e.Label)
	}
	dir, err := os.MkdirTemp("", "spinecert-solve-*")
	if err != nil {
		return nil, fmt.Errorf("verify: %w", err)
	}
	defer os.RemoveAll(dir)
	cnfPath := filepath.Join(dir, "input.cnf")
	if err := writeCNFFile(cnfPath, cnf); err != nil {
		return nil, err
	}
	resultPath := filepath.Join(dir, "result.txt")
	if proofPath != "" && e.wantsProof() {
		// Start from an empty proof file: a stale one must never be
		// mistaken for this run's proof.
		if err := os.Remove(proofPath); err != nil && !errors.Is(err, os.ErrNotExist) {
			return nil, fmt.Errorf("verify: %w", err)
		}
	} else {
		proofPath = ""
	}
	argv := make([]string, 0, len(e.Argv))
	useResult := false
	for _, a := range e.Argv {
		if strings.Contains(a, ArgProof) && proofPath == "" {
			a = strings.ReplaceAll(a, ArgProof, os.DevNull)
		}
		if strings.Contains(a, ArgResult) {
			useResult = true
		}
		a = strings.ReplaceAll(a, ArgCNF, cnfPath)
		a = strings.ReplaceAll(a, ArgProof, proofPath)
		a = strings.ReplaceAll(a, ArgResult, resultPath)
		argv = append(argv, a)
	}

	rctx, cancel := withLimit(ctx, limit)
	defer cancel()
	cmd := exec.CommandContext(rctx, argv[0], argv[1:]...)
	cmd.Env = append(os.Environ(), e.Env...)
	cmd.SysProcAttr = &syscall.SysProcAttr{Setpgid: true}
	cmd.Cancel = func() error {
		// The negative pid addresses the whole process group.
		return syscall.Kill(-cmd.Process.Pid, syscall.SIGKILL)
	}
	cmd.WaitDelay = killGrace
	var stdout bytes.Buffer
	stderr := &tailBuffer{max: stderrKeep}
	cmd.Stdout = &stdout
	cmd.Stderr = stderr
	start := time.Now()
	runErr := cmd.Run()
	res.Elapsed = time.Since(start)
	if ps := cmd.ProcessState; ps != nil {
		res.CPU = ps.UserTime() + ps.SystemTime()
	}
	if cmd.Process != nil {
		// Whatever the program left behind in its group goes too.
		_ = syscall.Kill(-cmd.Process.Pid, syscall.SIGKILL)
	}
	if rctx.Err() != nil {
		res.Detail = stopReason(rctx, limit) + ": solver process group killed"
		return settle(cnf, res), nil
	}
	code := 0
	if runErr != nil {
		var ee *exec.ExitError
		if !errors.As(runErr, &ee) {
			res.Detail = fmt.Sprintf("cannot run %s: %v", argv[0], runErr)
			return settle(cnf, res), nil
		}
		if ws, ok := ee.Sys().(syscall.WaitStatus); ok && ws.Signaled() {
			res.Detail = fmt.Sprintf("solver crashed (%v)%s", ws.Signal(), stderr.note())
			return settle(cnf, res), nil
		}
		code = ee.ExitCode()
	}
	var out *solverOutput
	if useResult {
		data, err := os.ReadFile(resultPath)
		if err != nil {
			res.Detail = fmt.Sprintf("no result file (exit status %d)%s", code, stderr.note())
			return settle(cnf, res), nil
		}
		out, err = parseResultFile(data, cnf.Vars)
		if err != nil {
			res.Detail = fmt.Sprintf("unparsable result file: %v", err)
			return settle(cnf, res), nil
		}
	} else {
		out, err = parseSolverOutput(stdout.Bytes(), cnf.Vars)
		if err != nil {
			res.Detail = fmt.Sprintf("unparsable answer (exit status %d): %v%s", code, err, stderr.note())
			return settle(cnf, res), nil
		}
	}
	if byExit, ok := exitAnswer(code); out.answer != Unknown && (!ok || byExit != out.answer) {
		res.Suspect = true
		res.Detail = fmt.Sprintf("exit status %d contradicts the answer %s", code, out.answer)
		return settle(cnf, res), nil
	} else if out.answer == Unknown && ok {
		res.Suspect = true
		res.Detail = fmt.Sprintf("exit status %d contradicts the answer UNKNOWN", code)
		return settle(cnf, res), nil
	}
	res.Answer, res.Model = out.answer, out.model
	if res.Answer == Unknown {
		res.Detail = "solver answered UNKNOWN" + stderr.note()
	}
	if res.Answer == Unsat && proofPath != "" {
		if _, err := os.Stat(proofPath); err == nil {
			res.Proof, res.ProofFormat = proofPath, e.ProofFormat
		} else {
			res.Detail = "solver wrote no proof file"
		}
	}
	return settle(cnf, res), nil
}

// parseResultFile reads a minisat-style result file: "SAT" and the model
// ended by 0, "UNSAT", or "INDET".
func parseResultFile(data []byte, vars int) (*solverOutput, error) {
	first, rest, _ := bytes.Cut(data, []byte("\n"))
	switch string(bytes.TrimSpace(first)) {
	case "SAT":
		text := append([]byte("s SATISFIABLE\nv "), rest...)
		return parseSolverOutput(text, vars)
	case "UNSAT":
		if len(bytes.TrimSpace(rest)) != 0 {
			return nil, fmt.Errorf("text after UNSAT")
		}
		return &solverOutput{answer: Unsat}, nil
	case "INDET":
		return &solverOutput{answer: Unknown}, nil
	}
	return nil, fmt.Errorf("expected SAT, UNSAT or INDET on the first line, found %q", shorten(first))
}

// writeCNFFile writes cnf as DIMACS text to path.
func writeCNFFile(path string, cnf *dimacs.CNF) error {
	f, err := os.Create(path)
	if err != nil {
		return fmt.Errorf("verify: %w", err)
	}
	if _, err := (&dimacs.CNF{Vars: cnf.Vars, Clauses: cnf.Clauses}).WriteTo(f); err != nil {
		f.Close()
		return fmt.Errorf("verify: writing %s: %w", path, err)
	}
	if err := f.Close(); err != nil {
		return fmt.Errorf("verify: writing %s: %w", path, err)
	}
	return nil
}

// tailBuffer keeps the last max bytes written to it.
type tailBuffer struct {
	mu  sync.Mutex
	max int
	buf []byte
}

func (t *tailBuffer) Write(p []byte) (int, error) {
	t.mu.Lock()
	defer t.mu.Unlock()
	t.buf = append(t.buf, p...)
	if len(t.buf) > 2*t.max {
		t.buf = append(t.buf[:0], t.buf[len(t.buf)-t.max:]...)
	}
	return len(p), nil
}

// note renders the kept standard error for a Detail ("" when empty).
func (t *tailBuffer) note() string {
	t.mu.Lock()
	defer t.mu.Unlock()
	s := strings.TrimSpace(string(t.buf))
	if len(s) > t.max {
		s = "..." + s[len(s)-t.max:]
	}
	if s == "" {
		return ""
	}
	return "; stderr: " + s
}

var _ io.Writer = (*tailBuffer)(nil)
