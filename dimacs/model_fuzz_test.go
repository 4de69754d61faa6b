package dimacs

import (
	"bytes"
	"errors"
	"slices"
	"strconv"
	"strings"
	"testing"

	"spinecert.dev/textpos"
)

// FuzzReadModel checks that reading solver answers never panics, that every
// failure is a *textpos.Error, and that a model read, written back in the
// SAT competition output format (common practice, no source) with every
// variable given, reads to the same model.
func FuzzReadModel(f *testing.F) {
	for _, s := range []string{
		"c cadical\ns SATISFIABLE\nv 1 -2 3 0\n",
		"s SATISFIABLE\nv 1 -2\nv 3\nv 0\n",
		"s UNSATISFIABLE\n",
		"s UNKNOWN\n",
		"SAT\n1 -2 3 0\n",
		"UNSAT\n",
		"INDET\n",
		"s SATISFIABLE\nv 1 1 0\n",
		"s SATISFIABLE\nv -2147483648 0\n",
		"s SATISFIABLE\ns UNKNOWN\n",
		"x\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		status, model, err := ReadModel(bytes.NewReader(data), "m.out")
		if err != nil {
			var pe *textpos.Error
			if !errors.As(err, &pe) && !strings.Contains(err.Error(), "reading") {
				t.Fatalf("error %T %v", err, err)
			}
			return
		}
		if (status == StatusSat) != (model != nil) {
			t.Fatalf("status %s with model %v", status, model)
		}
		if model == nil || len(model) > 1<<16 {
			return
		}
		out := []byte("s SATISFIABLE\nv")
		for v := 1; v < len(model); v++ {
			out = append(out, ' ')
			if !model[v] {
				out = append(out, '-')
			}
			out = strconv.AppendInt(out, int64(v), 10)
		}
		out = append(out, " 0\n"...)
		status2, model2, err := ReadModel(bytes.NewReader(out), "again.out")
		if err != nil || status2 != StatusSat {
			t.Fatalf("re-reading %q: %s %v", out, status2, err)
		}
		if !slices.Equal(model, model2) {
			t.Fatalf("model changed in the round trip: %v then %v", model, model2)
		}
	})
}
