//go:build unix

package main

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestInterrupt runs spinecert as a separate process (the copy of the test
// binary that testscript.Main puts on PATH), interrupts it with SIGINT (or
// terminates it with SIGTERM) while a solver is running, and checks that it
// exits with status 130 (143), says "interrupted" ("terminated"), prints nothing on stdout and leaves no output or temporary
// file behind.
//
// The signal is sent only once an extra solver, a script that never answers,
// has started: by then spinecert has installed its signal handling and is
// waiting for that solver, so the command cannot finish before the signal.
func TestInterrupt(t *testing.T) {
	bin, err := exec.LookPath("spinecert")
	if err != nil {
		t.Fatalf("spinecert is not on PATH (testscript.Main puts it there): %v", err)
	}
	cases := []struct {
		name  string
		graph string
		out   string   // the output file that must not appear
		args  []string // the command line, before --solver-cmd HANG
		sig   syscall.Signal
	}{
		// gini finds a layout at once; the command waits for the other solver.
		{"solve-layout", completeGraph(5), "k5.json", []string{"solve", "--quiet", "--heuristic=false", "g.edges", "--pages", "3", "--solvers", "gini", "-o", "k5.json"}, syscall.SIGINT},
		// The in-process solvers are at work on a hard formula (a dense
		// random graph on 4 pages) when the signal comes.
		{"solve-hard", randomGraph(32, 0.5), "g.json", []string{"solve", "--quiet", "g.edges", "--pages", "4", "-o", "g.json"}, syscall.SIGINT},
		// bundle: the refutation of 2 pages waits for the second solver.
		{"bundle", completeGraph(5), "k5.spinecert.tar.zst", []string{"bundle", "g.edges", "--exact", "3", "--solvers", "gini", "-o", "k5.spinecert.tar.zst"}, syscall.SIGINT},
		// SIGTERM, as a batch scheduler sends at a time limit: status 143.
		{"bundle-term", completeGraph(5), "k5.spinecert.tar.zst", []string{"bundle", "g.edges", "--exact", "3", "--solvers", "gini", "-o", "k5.spinecert.tar.zst"}, syscall.SIGTERM},
		{"solve-term", randomGraph(32, 0.5), "g.json", []string{"solve", "--quiet", "g.edges", "--pages", "4", "-o", "g.json"}, syscall.SIGTERM},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			dir := t.TempDir()
			tmp := filepath.Join(dir, "tmp") // TMPDIR of the command: must end empty
			if err := os.Mkdir(tmp, 0o755); err != nil {
				t.Fatal(err)
			}
			hang, started := hangingSolver(t, dir)
			if err := os.WriteFile(filepath.Join(dir, "g.edges"), []byte(c.graph), 0o644); err != nil {
				t.Fatal(err)
			}
			args := append(c.args, "--solver-cmd", hang)
			cmd := exec.Command(bin, args...)
			cmd.Dir = dir
			cmd.Env = append(os.Environ(), "TMPDIR="+tmp)
			var stdout, stderr bytes.Buffer
			cmd.Stdout, cmd.Stderr = &stdout, &stderr
			want, word := exitInterrupted, "interrupted"
			if c.sig == syscall.SIGTERM {
				want, word = exitTerminated, "terminated"
			}
			if got := signalWhenStarted(t, cmd, started, c.sig, &stderr); got != want {
				t.Fatalf("exit status %d, want %d; stderr:\n%s", got, want, &stderr)
			}
			if stdout.Len() != 0 {
				t.Errorf("stdout not empty:\n%s", &stdout)
			}
			if got := stderr.String(); !strings.HasSuffix(got, "spinecert: "+word+"\n") {
				t.Errorf("stderr does not end in \"spinecert: %s\":\n%s", word, got)
			}
			if _, err := os.Stat(filepath.Join(dir, c.out)); !errors.Is(err, os.ErrNotExist) {
				t.Errorf("%s exists after the interrupt (stat: %v)", c.out, err)
			}
			entries, err := os.ReadDir(dir)
			if err != nil {
				t.Fatal(err)
			}
			for _, e := range entries {
				switch e.Name() {
				case "g.edges", "hang.sh", "started", "tmp":
				default:
					t.Errorf("left in the directory after the interrupt: %s", e.Name())
				}
			}
			if left, _ := os.ReadDir(tmp); len(left) > 0 {
				t.Errorf("left in TMPDIR after the interrupt: %s", left[0].Name())
			}
		})
	}
}

// hangingSolver writes into dir a solver command that marks its start in
// a file and then never answers; it returns the command and the mark.
func hangingSolver(t *testing.T, dir string) (script, started string) {
	t.Helper()
	started = filepath.Join(dir, "started")
	script = filepath.Join(dir, "hang.sh")
	if err := os.WriteFile(script, []byte(fmt.Sprintf("#!/bin/sh\n: > '%s'\nexec sleep 120\n", started)), 0o755); err != nil {
		t.Fatal(err)
	}
	return script, started
}

// signalWhenStarted starts cmd, sends it sig once the hanging solver has
// marked its start (by then spinecert has installed its signal handling
// and waits for that solver, so it cannot finish first) and returns its
// exit status. The test fails if cmd ends before, the solver never starts,
// cmd does not stop within a minute, or it is killed by the signal
// instead of exiting.
func signalWhenStarted(t *testing.T, cmd *exec.Cmd, started string, sig syscall.Signal, stderr *bytes.Buffer) int {
	t.Helper()
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	deadline := time.After(2 * time.Minute)
wait:
	for {
		select {
		case err := <-done:
			t.Fatalf("spinecert %s finished before the hanging solver started (%v); stderr:\n%s", strings.Join(cmd.Args[1:], " "), err, stderr)
		case <-deadline:
			cmd.Process.Kill()
			t.Fatalf("the hanging solver never started; stderr:\n%s", stderr)
		case <-time.After(20 * time.Millisecond):
			if _, err := os.Stat(started); err == nil {
				break wait
			}
		}
	}
	if err := cmd.Process.Signal(sig); err != nil {
		t.Fatal(err)
	}
	var werr error
	select {
	case werr = <-done:
	case <-time.After(time.Minute):
		cmd.Process.Kill()
		t.Fatalf("spinecert did not stop within a minute of %v; stderr:\n%s", sig, stderr)
	}
	var ee *exec.ExitError
	if !errors.As(werr, &ee) {
		t.Fatalf("exit: %v, want a non-zero status; stderr:\n%s", werr, stderr)
	}
	if ws, ok := ee.Sys().(syscall.WaitStatus); ok && ws.Signaled() {
		t.Fatalf("spinecert was killed by %v instead of exiting", ws.Signal())
	}
	return ee.ExitCode()
}

// completeGraph is K_n as an edge list.
func completeGraph(n int) string {
	var b strings.Builder
	for i := range n {
		for j := i + 1; j < n; j++ {
			fmt.Fprintf(&b, "v%d v%d\n", i, j)
		}
	}
	return b.String()
}

// randomGraph is a G(n, p) random graph as an edge list, the same on every
// run (fixed seed).
func randomGraph(n int, p float64) string {
	r := rand.New(rand.NewPCG(1, 2))
	var b strings.Builder
	for i := range n {
		for j := i + 1; j < n; j++ {
			if r.Float64() < p {
				fmt.Fprintf(&b, "v%d v%d\n", i, j)
			}
		}
	}
	return b.String()
}

// TestInterruptExtract interrupts extract while it reads a bundle, half of
// which has arrived through a FIFO: it exits with status 130, says
// "interrupted" (not "context canceled", not exit 2) and leaves nothing in
// DIR.
func TestInterruptExtract(t *testing.T) {
	bin, err := exec.LookPath("spinecert")
	if err != nil {
		t.Fatalf("spinecert is not on PATH (testscript.Main puts it there): %v", err)
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "g.edges"), []byte(completeGraph(5)), 0o644); err != nil {
		t.Fatal(err)
	}
	mk := exec.Command(bin, "bundle", "g.edges", "--exact", "3", "--solvers", "gophersat,gini", "-o", "k5.spinecert.tar.zst")
	mk.Dir = dir
	if out, err := mk.CombinedOutput(); err != nil {
		t.Fatalf("bundle: %v\n%s", err, out)
	}
	b, err := os.ReadFile(filepath.Join(dir, "k5.spinecert.tar.zst"))
	if err != nil {
		t.Fatal(err)
	}
	fifo := filepath.Join(dir, "bundle.fifo")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skipf("cannot make a FIFO: %v", err)
	}
	out := filepath.Join(dir, "out")
	cmd := exec.Command(bin, "extract", fifo, out)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	// Opening the FIFO for writing returns once extract has opened it, so
	// its signal handling is in place.
	w, err := os.OpenFile(fifo, os.O_WRONLY, 0)
	if err != nil {
		cmd.Process.Kill()
		t.Fatal(err)
	}
	if _, err := w.Write(b[:len(b)/2]); err != nil {
		t.Fatal(err)
	}
	time.Sleep(200 * time.Millisecond)
	if err := cmd.Process.Signal(syscall.SIGINT); err != nil {
		t.Fatal(err)
	}
	time.Sleep(100 * time.Millisecond)
	w.Close()
	var werr error
	select {
	case werr = <-done:
	case <-time.After(time.Minute):
		cmd.Process.Kill()
		t.Fatalf("extract did not stop within a minute of the interrupt; stderr:\n%s", &stderr)
	}
	var ee *exec.ExitError
	if !errors.As(werr, &ee) || ee.ExitCode() != exitInterrupted {
		t.Fatalf("exit %v, want status %d; stderr:\n%s", werr, exitInterrupted, &stderr)
	}
	if stdout.Len() != 0 {
		t.Errorf("stdout not empty:\n%s", &stdout)
	}
	if got := stderr.String(); got != "spinecert: interrupted\n" {
		t.Errorf("stderr %q, want \"spinecert: interrupted\\n\"", got)
	}
	if left, _ := os.ReadDir(out); len(left) > 0 {
		t.Errorf("left in DIR after the interrupt: %s", left[0].Name())
	}
}
