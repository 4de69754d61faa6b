package main

import (
	"context"
	"errors"
)

// errInterrupted is what a command returns when it stops because of an
// interrupt; run reports it with exit status 130 (exitInterrupted).
var errInterrupted = &exitError{exitInterrupted, errors.New("interrupted")}

// interruption returns errInterrupted once ctx is cancelled, so that a
// command stops before it writes an output file or prints a report of work
// the interrupt cut short.
func interruption(ctx context.Context) error {
	if ctx != nil && ctx.Err() != nil {
		return errInterrupted
	}
	return nil
}
