package verify

import (
	"errors"
	"os/exec"
	"slices"
	"testing"
)

// onPath makes AutoSolvers see only the named programs on PATH.
func onPath(t *testing.T, programs ...string) {
	t.Helper()
	saved := testOnlyLookPath
	t.Cleanup(func() { testOnlyLookPath = saved })
	testOnlyLookPath = func(p string) (string, error) {
		if slices.Contains(programs, p) {
			return "/usr/bin/" + p, nil
		}
		return "", exec.ErrNotFound
	}
}

// TestAutoSolvers: the four machines auto has to serve, each with a proof
// writer spinecert's checker reads (cadical's binary DRAT or gophersat's
// RUP) and a second backend of another name.
func TestAutoSolvers(t *testing.T) {
	for _, tc := range []struct {
		path []string
		want []string
	}{
		{nil, []string{"gophersat", "gini"}},
		{[]string{"cadical"}, []string{"cadical", "gini"}},
		{[]string{"cryptominisat5"}, []string{"gophersat", "cryptominisat"}},
		{[]string{"cadical", "cryptominisat5", "minisat"}, []string{"cadical", "cryptominisat"}},
	} {
		onPath(t, tc.path...)
		if got := AutoSolvers(); !slices.Equal(got, tc.want) {
			t.Errorf("PATH with %v: auto is %v, want %v", tc.path, got, tc.want)
		}
	}
}

func TestExpandAuto(t *testing.T) {
	onPath(t)
	for _, tc := range []struct {
		in, want []string
	}{
		{[]string{"auto"}, []string{"gophersat", "gini"}},
		{[]string{" auto ", ""}, []string{"gophersat", "gini"}},
		{[]string{"auto", "gini"}, []string{"gophersat", "gini"}},
		{[]string{"gini", "auto", "auto"}, []string{"gini", "gophersat"}},
		{[]string{"minisat", "auto"}, []string{"minisat", "gophersat", "gini"}},
		{[]string{"gini", "gini"}, []string{"gini", "gini"}}, // repeats are the caller's to refuse
		{[]string{""}, nil},
	} {
		if got := ExpandAuto(tc.in); !slices.Equal(got, tc.want) {
			t.Errorf("ExpandAuto(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

// TestAutoSolversExist: whatever is on this machine, auto names two
// distinct backends that ByName can start.
func TestAutoSolversExist(t *testing.T) {
	child, err := SelfChild(GophersatChild)
	if err != nil {
		t.Fatal(err)
	}
	names := AutoSolvers()
	if len(names) != 2 || names[0] == names[1] {
		t.Fatalf("auto is %v, want two distinct backends", names)
	}
	for _, n := range names {
		if _, err := ByName(n, child); err != nil {
			t.Errorf("auto names %s: %v", n, err)
		}
	}
	if _, err := ByName(Auto, child); !errors.Is(err, ErrNoSolver) {
		t.Errorf("ByName(%q): %v, want ErrNoSolver (a list name, not a backend)", Auto, err)
	}
}
