package dimacs

import (
	"bytes"
	"errors"
	"slices"
	"strings"
	"testing"

	"github.com/klauspost/compress/gzip"
	"github.com/klauspost/compress/zstd"

	"spinecert.dev/textpos"
)

// The DIMACS CNF format follows the SAT competition rules ("p cnf VARS
// CLAUSES", clauses of signed integers ended by 0, "c" comment lines); DIMACS
// Challenge "Satisfiability Suggested Format", 1993.

func TestReadStrict(t *testing.T) {
	in := "c example\nc  two\np cnf 3 3\n1 -2 0\n2 3\n -1 0\n0\n"
	c, err := ReadCNF(strings.NewReader(in), "x.cnf", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if c.Vars != 3 || len(c.Clauses) != 3 {
		t.Fatalf("got vars %d clauses %d", c.Vars, len(c.Clauses))
	}
	want := [][]int32{{1, -2}, {2, 3, -1}, {}}
	for i, cl := range c.Clauses {
		if !slices.Equal(cl, want[i]) {
			t.Errorf("clause %d = %v, want %v", i, cl, want[i])
		}
	}
	if len(c.Comments) != 2 || c.Comments[0] != "example" || c.Comments[1] != " two" {
		t.Errorf("comments %q", c.Comments)
	}
}

func TestReadErrors(t *testing.T) {
	tests := []struct {
		name, in, want string
	}{
		{"empty", "", "x.cnf:1: missing header"},
		{"no header", "1 2 0\n", "x.cnf:1:1: expected header"},
		{"bad header word", "p dnf 1 1\n1 0\n", "x.cnf:1:3: expected \"cnf\""},
		{"header missing count", "p cnf 3\n", "x.cnf:1:8: header: expected clause count, found end of line"},
		{"header negative", "p cnf -3 1\n", "x.cnf:1:7: header: variable count -3 is negative"},
		{"header junk", "p cnf 3 1 7\n", "x.cnf:1:11: header: unexpected \"7\""},
		{"header huge", "p cnf 99999999999999999999 1\n", "x.cnf:1:7: header: variable count too large"},
		{"header not number", "p cnf x 1\n", "x.cnf:1:7: header: expected variable count"},
		{"two headers", "p cnf 1 1\np cnf 1 1\n1 0\n", "x.cnf:2:1: second header"},
		{"too few clauses", "p cnf 2 2\n1 0\n", "x.cnf:3: the header declares 2 clauses, found 1"},
		{"too many clauses", "p cnf 2 1\n1 0\n2 0\n", "x.cnf:3:3: more clauses than the 1"},
		{"out of range", "p cnf 2 1\n1 -3 0\n", "x.cnf:2:3: literal -3 out of range: the header declares 2 variables"},
		{"missing final 0", "p cnf 2 1\n1 2\n", "x.cnf:3:1: unexpected end of input: clause started on line 2 is not ended by 0"},
		{"huge literal", "p cnf 2 1\n1 2147483648 0\n", "x.cnf:2:3: literal out of range"},
		{"huge literal digits", "p cnf 2 1\n1 -123456789012345678901234567890 0\n", "x.cnf:2:3: literal out of range"},
		{"not a number", "p cnf 2 1\n1 x2 0\n", "x.cnf:2:3: expected literal (signed integer) or 0, found \"x2\""},
		{"minus alone", "p cnf 2 1\n1 - 0\n", "x.cnf:2:3: expected literal (signed integer) or 0, found \"-\""},
		{"trailing comment", "p cnf 2 1\n1 2 0 c hi\n", "x.cnf:2:7: expected literal, found \"c\""},
		{"percent", "p cnf 2 1\n1 2 0\n%\n0\n", "x.cnf:3:1: expected literal"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := ReadCNF(strings.NewReader(tt.in), "x.cnf", ReadOptions{})
			if err == nil {
				t.Fatalf("no error, want %q", tt.want)
			}
			var pe *textpos.Error
			if !errors.As(err, &pe) {
				t.Fatalf("error %T %v is not a *textpos.Error", err, err)
			}
			if !strings.HasPrefix(err.Error(), tt.want) {
				t.Fatalf("error %q, want prefix %q", err, tt.want)
			}
		})
	}
}

func TestReadLenient(t *testing.T) {
	tests := []struct {
		name, in string
		vars     int
		clauses  [][]int32
		warns    int
	}{
		{"no header", "1 -2 0\n3 0\n", 3, [][]int32{{1, -2}, {3}}, 2},
		{"wrong counts", "p cnf 1 5\n1 -2 0\n", 2, [][]int32{{1, -2}}, 2},
		{"missing final 0", "p cnf 2 1\n1 2", 2, [][]int32{{1, 2}}, 1},
		{"satlib end", "p cnf 2 1\n1 2 0\n%\n0\n\n", 2, [][]int32{{1, 2}}, 1},
		{"trailing comment", "p cnf 2 1\n1 2 0 c note\n", 2, [][]int32{{1, 2}}, 1},
		{"too many", "p cnf 2 1\n1 0\n2 0\n", 2, [][]int32{{1}, {2}}, 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var warns []string
			c, err := ReadCNF(strings.NewReader(tt.in), "x.cnf", ReadOptions{Lenient: true, Warn: func(m string) { warns = append(warns, m) }})
			if err != nil {
				t.Fatal(err)
			}
			if c.Vars != tt.vars || len(c.Clauses) != len(tt.clauses) {
				t.Fatalf("vars %d clauses %v", c.Vars, c.Clauses)
			}
			for i := range c.Clauses {
				if !slices.Equal(c.Clauses[i], tt.clauses[i]) {
					t.Errorf("clause %d = %v", i, c.Clauses[i])
				}
			}
			if len(warns) != tt.warns {
				t.Errorf("warnings %q, want %d", warns, tt.warns)
			}
			for _, w := range warns {
				if !strings.HasPrefix(w, "x.cnf:") {
					t.Errorf("warning %q has no position", w)
				}
			}
		})
	}
	// Huge numbers stay errors in lenient mode.
	if _, err := ReadCNF(strings.NewReader("1 99999999999 0\n"), "x.cnf", ReadOptions{Lenient: true}); err == nil {
		t.Error("huge literal accepted in lenient mode")
	}
}

func TestCompressed(t *testing.T) {
	plain := "p cnf 3 2\n1 2 0\n-3 0\n"
	var gz, zs bytes.Buffer
	gw := gzip.NewWriter(&gz)
	gw.Write([]byte(plain))
	gw.Close()
	zw, _ := zstd.NewWriter(&zs)
	zw.Write([]byte(plain))
	zw.Close()
	for name, data := range map[string][]byte{"plain": []byte(plain), "gzip": gz.Bytes(), "zstd": zs.Bytes()} {
		c, err := ReadCNF(bytes.NewReader(data), name, ReadOptions{})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		var out bytes.Buffer
		c.WriteTo(&out)
		if out.String() != plain {
			t.Errorf("%s: read back %q", name, out.String())
		}
	}
}

func TestWriter(t *testing.T) {
	var b bytes.Buffer
	w := NewWriter(&b)
	w.Comment("hello\nworld")
	w.Comment("")
	w.Header(12, 2)
	w.Clause(1, -12, 345)
	w.Clause()
	if err := w.Flush(); err != nil {
		t.Fatal(err)
	}
	want := "c hello\nc world\nc\np cnf 12 2\n1 -12 345 0\n0\n"
	if b.String() != want {
		t.Fatalf("got %q want %q", b.String(), want)
	}
	if err := NewWriter(&b).Clause(1, 0); err == nil {
		t.Error("literal 0 accepted")
	}
}

// FuzzParse checks that parsing never panics and that parse → write → parse
// gives the same formula with byte-identical output.
func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"p cnf 3 2\n1 -2 0\n2 3 0\n",
		"c comment\np cnf 1 1\n-1 0\n",
		"p cnf 2 1\n1 2",
		"1 2 0\n",
		"p cnf 0 1\n0\n",
		"p cnf 5 1\n1 2147483648 0\n",
		"p cnf 2 1\n1 2 0\n%\n0\n",
	} {
		f.Add([]byte(s), false)
		f.Add([]byte(s), true)
	}
	f.Fuzz(func(t *testing.T, data []byte, lenient bool) {
		c, err := ReadCNF(bytes.NewReader(data), "f.cnf", ReadOptions{Lenient: lenient})
		if err != nil {
			var pe *textpos.Error
			if !errors.As(err, &pe) && !strings.Contains(err.Error(), "gzip") && !strings.Contains(err.Error(), "zstd") && !strings.Contains(err.Error(), "reading") {
				t.Fatalf("error %T %v", err, err)
			}
			return
		}
		var out1 bytes.Buffer
		if _, err := c.WriteTo(&out1); err != nil {
			t.Fatal(err)
		}
		c2, err := ReadCNF(bytes.NewReader(out1.Bytes()), "g.cnf", ReadOptions{})
		if err != nil {
			t.Fatalf("reading written CNF: %v\n%q", err, out1.Bytes())
		}
		var out2 bytes.Buffer
		c2.WriteTo(&out2)
		if !bytes.Equal(out1.Bytes(), out2.Bytes()) {
			t.Fatalf("not byte-stable:\n%q\n%q", out1.Bytes(), out2.Bytes())
		}
	})
}
