package main

import (
	"os"

	"quire/verify"
)

// The gophersat backend runs in a child quire process so that a time-out can
// kill it (see verify.Gophersat).
func init() {
	childHandlers[verify.GophersatChild] = func(_ contextT, args []string) int {
		return verify.RunGophersatChild(args, os.Stdout, os.Stderr)
	}
}
