//go:build unix

package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// TestInterruptConquer interrupts conquer while a cube's solver runs (a
// script that never answers) and checks that it exits with status 130,
// says so, and leaves neither a result nor scratch space behind: the cube
// simply stays to be decided.
func TestInterruptConquer(t *testing.T) {
	bin, err := exec.LookPath("spinecert")
	if err != nil {
		t.Fatalf("spinecert is not on PATH (testscript.Main puts it there): %v", err)
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "g.edges"), []byte(completeGraph(7)), 0o644); err != nil {
		t.Fatal(err)
	}
	work := filepath.Join(dir, "work")
	if out, err := exec.Command(bin, "split", filepath.Join(dir, "g.edges"), "--pages", "3", "--cubes", "4", "-o", work).CombinedOutput(); err != nil {
		t.Fatalf("split: %v\n%s", err, out)
	}
	hang, started := hangingSolver(t, dir)
	tmp := filepath.Join(dir, "tmp")
	if err := os.Mkdir(tmp, 0o755); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(bin, "conquer", work, "--jobs", "1", "--solvers", "gini", "--solver-cmd", hang)
	cmd.Env = append(os.Environ(), "TMPDIR="+tmp)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if got := signalWhenStarted(t, cmd, started, syscall.SIGINT, &stderr); got != exitInterrupted {
		t.Fatalf("exit status %d, want %d; stderr:\n%s", got, exitInterrupted, &stderr)
	}
	if got := stderr.String(); !strings.HasSuffix(got, "spinecert: interrupted\n") {
		t.Errorf("stderr does not end in \"spinecert: interrupted\":\n%s", got)
	}
	for _, sub := range []string{"results", "tmp"} {
		if left, _ := os.ReadDir(filepath.Join(work, sub)); len(left) > 0 {
			t.Errorf("left in %s after the interrupt: %s", sub, left[0].Name())
		}
	}
	if left, _ := os.ReadDir(tmp); len(left) > 0 {
		t.Errorf("left in TMPDIR after the interrupt: %s", left[0].Name())
	}
}
