package cube

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
)

// Write writes cubes in the format Read reads, after the comment lines
// given (each prefixed with "c "). The output is byte-stable: the same
// cubes and comments always give the same bytes.
func Write(w io.Writer, cubes []Cube, comments ...string) error {
	bw := bufio.NewWriter(w)
	for _, c := range comments {
		bw.WriteString("c ")
		bw.WriteString(c)
		bw.WriteByte('\n')
	}
	var buf []byte
	for _, c := range cubes {
		buf = append(buf[:0], 'a')
		for _, l := range c {
			buf = append(buf, ' ')
			buf = strconv.AppendInt(buf, int64(l), 10)
		}
		buf = append(buf, " 0\n"...)
		bw.Write(buf)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("cube: writing cubes: %w", err)
	}
	return nil
}
