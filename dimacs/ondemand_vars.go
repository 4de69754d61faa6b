package dimacs

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"strconv"

	"spinecert.dev/textpos"
)

// maxVarLine bounds one line of a variables file; a valid line is two
// letters and two numbers.
const maxVarLine = 256

// WriteVars writes the names of a sub-formula's variables, one per line:
// line i (not counting comment lines, which start with "c") names variable i
// as "o A B" (vertex A before vertex B, A < B) or "p E P" (edge E on page P).
func WriteVars(w io.Writer, vars []VarName) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	fmt.Fprintf(bw, "c %s variables: line i names variable i (o A B: vertex A before B; p E P: edge E on page P)\n", OnDemandVersion)
	var buf []byte
	for _, v := range vars {
		buf = append(buf[:0], byte(v.Kind), ' ')
		buf = strconv.AppendInt(buf, int64(v.A), 10)
		buf = append(buf, ' ')
		buf = strconv.AppendInt(buf, int64(v.B), 10)
		buf = append(buf, '\n')
		bw.Write(buf)
	}
	return bw.Flush()
}

// ReadVars reads a variables file written by WriteVars. Errors are
// *textpos.Error values with the line and column; the names are not
// checked against a graph here (CheckMembership does that).
func ReadVars(r io.Reader, name string) ([]VarName, error) {
	br := bufio.NewReaderSize(r, 1<<16)
	var out []VarName
	for line := 1; ; line++ {
		text, err := br.ReadSlice('\n')
		if err == bufio.ErrBufferFull || len(text) > maxVarLine {
			return nil, &textpos.Error{File: name, Line: line, Col: 1, Msg: fmt.Sprintf("line longer than %d bytes: expected \"o A B\" or \"p E P\"", maxVarLine)}
		}
		if err != nil && err != io.EOF {
			return nil, fmt.Errorf("dimacs: %s: %w", name, err)
		}
		if len(text) == 0 && err == io.EOF {
			return out, nil
		}
		body := bytes.TrimRight(text, "\r\n")
		if len(body) > 0 && body[0] == 'c' && (len(body) == 1 || body[1] == ' ' || body[1] == '\t') {
			if err == io.EOF {
				return out, nil
			}
			continue
		}
		v, col, msg := parseVarLine(body)
		if msg != "" {
			return nil, &textpos.Error{File: name, Line: line, Col: col, Msg: msg}
		}
		out = append(out, v)
		if err == io.EOF {
			return out, nil
		}
	}
}

// parseVarLine reads "o A B" or "p E P"; on error it returns the column and
// what was expected.
func parseVarLine(b []byte) (VarName, int, string) {
	fields := make([][]byte, 0, 3)
	cols := make([]int, 0, 3)
	for i := 0; i < len(b); {
		for i < len(b) && (b[i] == ' ' || b[i] == '\t') {
			i++
		}
		if i == len(b) {
			break
		}
		start := i
		for i < len(b) && b[i] != ' ' && b[i] != '\t' {
			i++
		}
		if len(fields) == 3 {
			return VarName{}, start + 1, "expected the end of the line after three fields"
		}
		fields, cols = append(fields, b[start:i]), append(cols, start+1)
	}
	if len(fields) == 0 {
		return VarName{}, 1, `empty line: expected "o A B" or "p E P"`
	}
	var v VarName
	switch string(fields[0]) {
	case "o":
		v.Kind = OrderVar
	case "p":
		v.Kind = PageVar
	default:
		return VarName{}, cols[0], fmt.Sprintf(`expected "o" (order) or "p" (page), found %q`, fields[0])
	}
	if len(fields) < 3 {
		return VarName{}, len(b) + 1, "expected two non-negative numbers after the kind"
	}
	for i, dst := range []*int32{&v.A, &v.B} {
		x, err := strconv.ParseInt(string(fields[i+1]), 10, 32)
		if err != nil || x < 0 || (len(fields[i+1]) > 1 && fields[i+1][0] == '0') || fields[i+1][0] == '+' {
			return VarName{}, cols[i+1], fmt.Sprintf("expected a non-negative decimal number below 2^31, found %q", fields[i+1])
		}
		*dst = int32(x)
	}
	return v, 0, ""
}
