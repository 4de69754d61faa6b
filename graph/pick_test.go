package graph

import (
	"errors"
	"strings"
	"testing"
)

// TestPick: graph6 holds one graph per line (McKay, formats.txt); K4 is "C~"
// and K5 is "D~{" (from the format's definition, as in REFERENCES).
func TestPick(t *testing.T) {
	res, err := Read(strings.NewReader("C~\nD~{\n"), "two.g6", FormatGraph6)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		index, n int
		err      string
	}{
		{1, 4, ""}, {2, 5, ""},
		{0, 0, "two.g6 holds 2 graphs: choose one with --index 1..2"},
		{3, 0, "--index 3 out of range 1..2"},
		{-1, 0, "--index -1 out of range 1..2"},
	} {
		g, err := res.Pick("two.g6", c.index)
		switch {
		case c.err == "" && (err != nil || g.N() != c.n):
			t.Errorf("Pick(%d): %v, %v; want %d vertices", c.index, g, err, c.n)
		case c.err != "" && (!errors.Is(err, ErrIndex) || !strings.Contains(err.Error(), c.err)):
			t.Errorf("Pick(%d): error %v, want ErrIndex with %q", c.index, err, c.err)
		}
	}
}
