package main

import (
	"os"

	"spinecert.dev/verify"
)

// The gophersat backend runs in a child spinecert process so that a time-out can
// kill it (see verify.Gophersat).
func init() {
	childHandlers[verify.GophersatChild] = func(_ contextT, args []string) int {
		return verify.RunGophersatChild(args, os.Stdout, os.Stderr)
	}
}
