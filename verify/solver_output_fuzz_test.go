package verify

import (
	"testing"
)

// FuzzParseSolverOutput: the solver-output reader never panics, and what it
// accepts is consistent: a SAT answer has a model of exactly the formula's
// variables, other answers none. The same holds for minisat result files.
func FuzzParseSolverOutput(f *testing.F) {
	for _, s := range []string{
		"s SATISFIABLE\nv 1 -2 3 0\n",
		"c comment\ns UNSATISFIABLE\n",
		"s UNKNOWN\n",
		"s SATISFIABLE\nv 1 -1 0\n",
		"v 1 0\ns SATISFIABLE\n",
		"SAT\n1 -2 3 0\n",
		"UNSAT\n",
		"INDET\n",
		"garbage\n",
	} {
		f.Add([]byte(s), uint8(3))
	}
	f.Fuzz(func(t *testing.T, data []byte, vars uint8) {
		for _, parse := range []func([]byte, int) (*solverOutput, error){parseSolverOutput, parseResultFile} {
			out, err := parse(data, int(vars))
			if err != nil {
				continue
			}
			switch out.answer {
			case Sat:
				if len(out.model) != int(vars) {
					t.Fatalf("SAT with a model of %d values for %d variables", len(out.model), vars)
				}
			default:
				if out.model != nil {
					t.Fatalf("%s with a model", out.answer)
				}
			}
		}
	})
}
