package verify

import (
	"context"
	"fmt"
	"os/exec"
	"strings"
	"sync"
	"time"

	"spinecert.dev/proof"
)

// knownExternal describes how to run a solver program spinecert knows by name.
type knownExternal struct {
	program     string   // name looked up on PATH, when it differs from the backend name
	argv        []string // after the program path
	proofFormat string
	versionArg  string
	versionCut  string // removed from the front of the version line
}

// knownExternals are the external solvers spinecert runs by name when they are
// on PATH. Debian's cadical and kissat write binary DRAT to their second
// argument by default; minisat writes no proof and its answer to a file.
// Debian's cryptominisat5 (package cryptominisat) answers in the SAT
// competition style; the proof it can write is FRAT, which spinecert does not
// read, so it runs without one (see cryptominisatArgv).
var knownExternals = map[string]knownExternal{
	"cadical":       {argv: []string{"-q", ArgCNF, ArgProof}, proofFormat: proof.DRATBinary, versionArg: "--version"},
	"kissat":        {argv: []string{"-q", ArgCNF, ArgProof}, proofFormat: proof.DRATBinary, versionArg: "--version"},
	"minisat":       {argv: []string{"-verb=0", ArgCNF, ArgResult}},
	"cryptominisat": {program: "cryptominisat5", argv: cryptominisatArgv, versionArg: "--version", versionCut: "c CryptoMiniSat version "},
}

// KnownSolvers returns the backend names ByName accepts (Auto is a list
// name, expanded by ExpandAuto, not a backend).
func KnownSolvers() []string {
	return []string{"gophersat", "gini", "cadical", "kissat", "minisat", "cryptominisat"}
}

// ByName returns the backend called name. gophersat is started through
// child. An external solver must be on PATH; otherwise the error wraps
// ErrNoSolver.
func ByName(name string, child ChildCommand) (Solver, error) {
	switch name {
	case "gophersat":
		if child.Path == "" {
			return nil, fmt.Errorf("%w: gophersat needs a child command", ErrNoSolver)
		}
		return NewGophersat(child), nil
	case "gini":
		return Gini{}, nil
	}
	k, ok := knownExternals[name]
	if !ok {
		return nil, fmt.Errorf("%w: unknown solver %q (known: %s)", ErrNoSolver, name, strings.Join(KnownSolvers(), ", "))
	}
	program := name
	if k.program != "" {
		program = k.program
	}
	path, err := exec.LookPath(program)
	if err != nil {
		return nil, fmt.Errorf("%w: solver %s not found on PATH (program %s)", ErrNoSolver, name, program)
	}
	ext := &External{
		Label:       name,
		Argv:        append([]string{path}, k.argv...),
		ProofFormat: k.proofFormat,
	}
	if k.versionArg != "" {
		ext.Version = strings.TrimPrefix(programVersion(path, k.versionArg), k.versionCut)
	}
	return ext, nil
}

var versionCache sync.Map // path → version string

// programVersion runs "path arg" once and returns the first line it prints.
func programVersion(path, arg string) string {
	if v, ok := versionCache.Load(path); ok {
		return v.(string)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Second)
	defer cancel()
	out, err := exec.CommandContext(ctx, path, arg).Output()
	v := ""
	if err == nil {
		v, _, _ = strings.Cut(strings.TrimSpace(string(out)), "\n")
	}
	versionCache.Store(path, v)
	return v
}
