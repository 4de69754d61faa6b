package main

import (
	"context"
	"os"
)

type contextT = context.Context

// childEnv marks a process started by spinecert itself to run one hidden job.
const childEnv = "SPINECERT_CHILD"

// childMain runs a hidden child job when SPINECERT_CHILD names a registered handler.
func childMain(ctx context.Context, args []string) (int, bool) {
	name := os.Getenv(childEnv)
	if name == "" {
		return 0, false
	}
	h, ok := childHandlers[name]
	if !ok {
		return exitUsage, true
	}
	return h(ctx, args), true
}
