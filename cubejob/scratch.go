package cubejob

import (
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
)

// scratchHost is this host's name as scratch directories carry it.
func scratchHost() string {
	h, err := os.Hostname()
	if err != nil || h == "" {
		return "host"
	}
	return strings.ReplaceAll(h, "-", "_")
}

// CleanScratch removes the scratch directories (tmp/HOST-PID-cube-…) of
// tasks that no longer run: on this host, those whose process is gone; on
// other hosts, only when others is true (the caller knows that no task of
// the directory is in the queue). It returns how many it removed. A
// scratch directory holds only a cube's solver output before its checks;
// results are never in it.
func (w *Work) CleanScratch(others bool) int {
	entries, err := os.ReadDir(filepath.Join(w.Dir, TmpDir))
	if err != nil {
		return 0
	}
	me := scratchHost()
	removed := 0
	for _, e := range entries {
		host, rest, ok := strings.Cut(e.Name(), "-")
		if !ok {
			continue
		}
		pidText, _, _ := strings.Cut(rest, "-")
		pid, err := strconv.Atoi(pidText)
		if err != nil {
			continue
		}
		switch {
		case host == me && (pid == os.Getpid() || alive(pid)):
			continue
		case host != me && !others:
			continue
		}
		if os.RemoveAll(filepath.Join(w.Dir, TmpDir, e.Name())) == nil {
			removed++
		}
	}
	return removed
}

// alive reports whether a process with this pid exists on this host.
func alive(pid int) bool {
	if pid <= 0 {
		return false
	}
	err := syscall.Kill(pid, 0)
	return err == nil || errors.Is(err, syscall.EPERM)
}
