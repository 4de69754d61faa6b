package verify

import (
	"bufio"
	"bytes"
	"fmt"
	"strconv"
)

// solverOutput is what a solver printed, read by the SAT competition output
// rules (SAT Competition 2009+ "Output format"; common practice): every line
// is a comment "c ...", exactly one status line "s SATISFIABLE",
// "s UNSATISFIABLE" or "s UNKNOWN", and for SAT the model as "v" lines of
// literals ended by 0. Exit status 10 means SAT and 20 UNSAT.
type solverOutput struct {
	answer Answer
	model  []bool
}

// parseSolverOutput reads out for a formula with vars variables. Any line
// that breaks the rules, a second status line, an "s UNKNOWN" with a model,
// a model without a SAT status, a literal twice with both signs, a variable
// beyond vars or a model not ended by 0 is an error: the output is not an
// answer at all.
func parseSolverOutput(out []byte, vars int) (*solverOutput, error) {
	res := &solverOutput{}
	status := ""
	var model []bool
	var seen []bool
	ended := false
	sc := bufio.NewScanner(bytes.NewReader(out))
	sc.Buffer(make([]byte, 0, 64<<10), 1<<30)
	line := 0
	for sc.Scan() {
		line++
		text := bytes.TrimRight(sc.Bytes(), "\r")
		if len(bytes.TrimSpace(text)) == 0 {
			continue
		}
		switch {
		case text[0] == 'c' && (len(text) == 1 || text[1] == ' ' || text[1] == '\t'):
			continue
		case bytes.HasPrefix(text, []byte("s ")):
			if status != "" {
				return nil, fmt.Errorf("output line %d: second status line %q", line, shorten(text))
			}
			status = string(bytes.TrimSpace(text[2:]))
			switch status {
			case "SATISFIABLE", "UNSATISFIABLE", "UNKNOWN":
			default:
				return nil, fmt.Errorf("output line %d: expected status SATISFIABLE, UNSATISFIABLE or UNKNOWN, found %q", line, shorten(text))
			}
		case text[0] == 'v' && (len(text) == 1 || text[1] == ' ' || text[1] == '\t'):
			if ended {
				return nil, fmt.Errorf("output line %d: model values after the closing 0", line)
			}
			if model == nil {
				model = make([]bool, vars)
				seen = make([]bool, vars)
			}
			for _, f := range bytes.Fields(text[1:]) {
				n, err := strconv.ParseInt(string(f), 10, 32)
				if err != nil {
					return nil, fmt.Errorf("output line %d: expected a literal in the model, found %q", line, shorten(f))
				}
				if ended {
					return nil, fmt.Errorf("output line %d: model values after the closing 0", line)
				}
				if n == 0 {
					ended = true
					continue
				}
				v := n
				if v < 0 {
					v = -v
				}
				if v > int64(vars) {
					return nil, fmt.Errorf("output line %d: model literal %d beyond the %d variables of the formula", line, n, vars)
				}
				if seen[v-1] && model[v-1] != (n > 0) {
					return nil, fmt.Errorf("output line %d: model assigns variable %d both values", line, v)
				}
				seen[v-1] = true
				model[v-1] = n > 0
			}
		default:
			return nil, fmt.Errorf("output line %d: expected a line starting with c, s or v, found %q", line, shorten(text))
		}
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("reading solver output: %w", err)
	}
	switch status {
	case "":
		return nil, fmt.Errorf("no status line (s SATISFIABLE / s UNSATISFIABLE / s UNKNOWN) in the output")
	case "SATISFIABLE":
		if model == nil && vars > 0 {
			return nil, fmt.Errorf("status SATISFIABLE without a model (v lines)")
		}
		if model != nil && !ended {
			return nil, fmt.Errorf("model (v lines) not ended by 0")
		}
		if model == nil {
			model = []bool{}
		}
		res.answer, res.model = Sat, model
	case "UNSATISFIABLE":
		if model != nil {
			return nil, fmt.Errorf("status UNSATISFIABLE with a model (v lines)")
		}
		res.answer = Unsat
	case "UNKNOWN":
		if model != nil {
			return nil, fmt.Errorf("status UNKNOWN with a model (v lines)")
		}
		res.answer = Unknown
	}
	return res, nil
}

// shorten cuts b for an error message.
func shorten(b []byte) string {
	if len(b) > 60 {
		return string(b[:60]) + "..."
	}
	return string(b)
}

// exitAnswer is the answer an exit status stands for (10 SAT, 20 UNSAT).
func exitAnswer(code int) (Answer, bool) {
	switch code {
	case 10:
		return Sat, true
	case 20:
		return Unsat, true
	}
	return Unknown, false
}
