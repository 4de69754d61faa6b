package dimacs

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"

	"spinecert.dev/textpos"
)

// Solver answers as ReadModel reports them.
const (
	StatusSat     = "SATISFIABLE"
	StatusUnsat   = "UNSATISFIABLE"
	StatusUnknown = "UNKNOWN"
)

// ReadModel reads a solver's answer in the SAT competition output format:
// "c" comment lines, one "s SATISFIABLE", "s UNSATISFIABLE" or
// "s UNKNOWN" line and, when satisfiable, "v" lines of literals ended by 0.
// It also reads MiniSat's result file ("SAT"/"UNSAT"/"INDET" on the first
// line, then the literals). model[v] is the value of variable v (model[0]
// is unused); it is nil unless the status is satisfiable.
func ReadModel(r io.Reader, name string) (status string, model []bool, err error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64<<10), 1<<30)
	line := 0
	ended := false
	minisat := false
	perr := func(format string, a ...any) error {
		return &textpos.Error{File: name, Line: line, Msg: fmt.Sprintf(format, a...)}
	}
	set := make(map[int]bool)
	maxVar := 0
	lits := func(fields []string) error {
		for _, f := range fields {
			if ended {
				return perr("literal %q after the terminating 0", f)
			}
			v, err := strconv.ParseInt(f, 10, 32)
			if err != nil || v == -1<<31 {
				return perr("expected a literal (signed integer), found %q", f)
			}
			if v == 0 {
				ended = true
				continue
			}
			a := int(max(v, -v))
			if _, dup := set[a]; dup {
				return perr("variable %d is given twice", a)
			}
			set[a] = v > 0
			maxVar = max(maxVar, a)
		}
		return nil
	}
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		fields := strings.Fields(text)
		switch {
		case text == "":
			continue
		case line == 1 && (text == "SAT" || text == "UNSAT" || text == "INDET"):
			minisat = true
			status = map[string]string{"SAT": StatusSat, "UNSAT": StatusUnsat, "INDET": StatusUnknown}[text]
		case minisat:
			if err := lits(fields); err != nil {
				return "", nil, err
			}
		case fields[0] == "c":
			continue
		case fields[0] == "s":
			if status != "" {
				return "", nil, perr("second status line")
			}
			s := strings.Join(fields[1:], " ")
			switch s {
			case StatusSat, StatusUnsat, StatusUnknown:
				status = s
			default:
				return "", nil, perr("unknown status %q (expected SATISFIABLE, UNSATISFIABLE or UNKNOWN)", s)
			}
		case fields[0] == "v":
			if err := lits(fields[1:]); err != nil {
				return "", nil, err
			}
		default:
			return "", nil, perr("expected a line starting with c, s or v, found %q", truncate(text, 40))
		}
	}
	if err := sc.Err(); err != nil {
		return "", nil, fmt.Errorf("dimacs: reading %s: %w", name, err)
	}
	line++
	switch {
	case status == "":
		return "", nil, perr("no status line (\"s SATISFIABLE\" or similar)")
	case status != StatusSat && len(set) > 0:
		return "", nil, perr("values given for a %s answer", strings.ToLower(status))
	case status != StatusSat:
		return status, nil, nil
	case !ended:
		return "", nil, perr("the model is not ended by 0")
	}
	model = make([]bool, maxVar+1)
	for v, val := range set {
		model[v] = val
	}
	return status, model, nil
}

func truncate(s string, n int) string {
	if len(s) > n {
		return s[:n] + "..."
	}
	return s
}
