package verify

import (
	"os"
	"testing"
)

// TestMain lets the test binary serve as the child process of the gophersat
// backend, the way spinecert's own main does (see SelfChild).
func TestMain(m *testing.M) {
	if os.Getenv(ChildEnv) == GophersatChild {
		os.Exit(RunGophersatChild(os.Args[1:], os.Stdout, os.Stderr))
	}
	os.Exit(m.Run())
}
