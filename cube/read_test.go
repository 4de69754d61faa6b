package cube

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"spinecert.dev/textpos"
)

func TestReadGood(t *testing.T) {
	cubes, err := ReadFile(filepath.Join("testdata", "good.cubes"), ReadOptions{Vars: 2})
	if err != nil {
		t.Fatal(err)
	}
	want := []Cube{{1, -2}, {-1}, {1, 2}}
	if len(cubes) != len(want) {
		t.Fatalf("got %v, want %v", cubes, want)
	}
	for i := range want {
		if cubes[i].String() != want[i].String() {
			t.Fatalf("cube %d = %v, want %v", i+1, cubes[i], want[i])
		}
	}
	if err := CheckTree(cubes); err != nil {
		t.Fatal(err)
	}
}

// The expected messages of bad cube files: file, line, column, what was expected.
func TestReadBad(t *testing.T) {
	want := map[string]string{
		"after-zero.cubes":  "after-zero.cubes:1:7: expected the end of the line after the closing 0, found \"3\"",
		"beyond-vars.cubes": "beyond-vars.cubes:1:3: literal 9: the formula has 4 variables",
		"both-signs.cubes":  "both-signs.cubes:1:5: literal -3 and its negation are both in the cube: it can never hold",
		"empty.cubes":       "empty.cubes: no cubes: expected lines of the form \"a LIT … 0\"",
		"letter.cubes":      "letter.cubes:1:5: expected a literal (a non-zero integer) or 0, found \"x\"",
		"min-int.cubes":     "min-int.cubes:1:3: expected a literal (a non-zero integer) or 0, found \"-2147483648\"",
		"not-a-cube.cubes":  "not-a-cube.cubes:1:1: expected a cube line \"a LIT … 0\" or a comment, found \"b\"",
		"repeat.cubes":      "repeat.cubes:1:5: literal 2 appears twice in the cube",
		"unclosed.cubes":    "unclosed.cubes:1:6: expected a literal or the closing 0 of the cube, found the end of the line",
	}
	files, _ := filepath.Glob(filepath.Join("testdata", "bad", "*.cubes"))
	if len(files) != len(want) {
		t.Fatalf("%d files in testdata/bad, %d expectations", len(files), len(want))
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		name := filepath.Base(f)
		_, err = Read(bytes.NewReader(data), name, ReadOptions{Vars: 4})
		var pe *textpos.Error
		if !errors.As(err, &pe) {
			t.Errorf("%s: error %v is not a *textpos.Error", name, err)
			continue
		}
		if err.Error() != want[name] {
			t.Errorf("%s:\n got %s\nwant %s", name, err, want[name])
		}
	}
}

func TestReadRefusesLongLines(t *testing.T) {
	line := "a " + strings.Repeat("1 ", MaxLineBytes) + "0\n"
	_, err := Read(strings.NewReader(line), "long", ReadOptions{})
	if err == nil || !strings.Contains(err.Error(), "long:1: line longer than") {
		t.Fatalf("err = %v", err)
	}
}

// FuzzRead: Read never panics, and what it reads writes back to bytes it
// reads again as the same cubes (round trip; the written form is stable).
func FuzzRead(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("testdata", "*.cubes"))
	bad, _ := filepath.Glob(filepath.Join("testdata", "bad", "*.cubes"))
	for _, p := range append(files, bad...) {
		data, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		cubes, err := Read(bytes.NewReader(data), "fuzz", ReadOptions{})
		if err != nil {
			return
		}
		var b bytes.Buffer
		if err := Write(&b, cubes); err != nil {
			t.Fatal(err)
		}
		again, err := Read(bytes.NewReader(b.Bytes()), "again", ReadOptions{})
		if err != nil {
			t.Fatalf("written cubes do not read back: %v\n%s", err, b.Bytes())
		}
		var b2 bytes.Buffer
		if err := Write(&b2, again); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(b.Bytes(), b2.Bytes()) {
			t.Fatal("writing is not stable")
		}
		_ = CheckTree(cubes)
		if len(cubes) <= 64 {
			_ = CheckDisjoint(cubes)
		}
	})
}
