package verify

import (
	"os/exec"
	"strings"
)

// Auto is the backend list name that stands for AutoSolvers.
const Auto = "auto"

// DefaultSolvers are the backends used when none are named: Auto.
var DefaultSolvers = []string{Auto}

// testOnlyLookPath finds a program on PATH for AutoSolvers; tests replace it.
var testOnlyLookPath = exec.LookPath

// AutoSolvers returns the two backends Auto stands for on this machine: a
// proof writer and a second, independent solver. The proof writer is
// cadical when it is on PATH (its binary DRAT passes spinecert's checker;
// it is the fastest of the proof-writing backends on the Kleetope claims
// of scripts/backends.sh), else the in-process gophersat. The second is
// cryptominisat when cryptominisat5 is on PATH (the fastest of all on those
// claims, so never the one waited for), else the in-process gini. Without
// the outside tools this is gophersat and gini, which need nothing.
func AutoSolvers() []string {
	prover, second := "gophersat", "gini"
	if _, err := testOnlyLookPath("cadical"); err == nil {
		prover = "cadical"
	}
	if _, err := testOnlyLookPath(knownExternals["cryptominisat"].program); err == nil {
		second = "cryptominisat"
	}
	return []string{prover, second}
}

// ExpandAuto turns a list of backend names, such as a --solvers value
// split at commas, into the names to run: blanks are trimmed, empty names
// dropped, and Auto replaced by those AutoSolvers names that the list does
// not name itself. Other names, repeated ones included, are kept as given
// for ByName and the caller to judge.
func ExpandAuto(names []string) []string {
	explicit := map[string]bool{}
	for _, n := range names {
		explicit[strings.TrimSpace(n)] = true
	}
	var out []string
	added := map[string]bool{}
	for _, n := range names {
		n = strings.TrimSpace(n)
		switch {
		case n == "":
		case n == Auto:
			for _, a := range AutoSolvers() {
				if !explicit[a] && !added[a] {
					out = append(out, a)
					added[a] = true
				}
			}
		default:
			out = append(out, n)
		}
	}
	return out
}
