// Command spinecert checks, encodes, solves and bundles claims about the page
// number (book thickness) and queue number of graphs.
package main

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/signal"
	"sync/atomic"
	"syscall"
)

// Exit codes: the one table every command uses.
const (
	exitHolds     = 0 // the claim holds / the check passed
	exitRefuted   = 1 // the claim is refuted / the evidence was rejected
	exitUsage     = 2 // bad usage or unreadable input
	exitUndecided = 3 // undecided: time-out, solver gave up, backends disagree
	// interrupted (SIGINT, Ctrl-C) or terminated (SIGTERM, as batch
	// schedulers send at a time limit): 128 + the signal number, as shells
	// report a process killed by it (common practice, no source)
	exitInterrupted = 130
	exitTerminated  = 143
)

// exitTable is printed in every command's help.
const exitTable = `exit status:
    0  the claim holds / the check passed
    1  the claim is refuted / the evidence was rejected
    2  bad usage or unreadable input
    3  undecided (time-out, solver gave up, solvers disagree)
  130  interrupted (Ctrl-C); no output file is left half-written
  143  terminated (SIGTERM); no output file is left half-written`

// exitError carries an exit status and an optional message to print on stderr.
type exitError struct {
	code int
	err  error
}

func (e *exitError) Error() string {
	if e.err == nil {
		return fmt.Sprintf("exit status %d", e.code)
	}
	return e.err.Error()
}

func (e *exitError) Unwrap() error { return e.err }

// usageErr marks bad usage or unreadable input (exit 2).
func usageErr(err error) error { return &exitError{exitUsage, err} }

// refuted returns exit 1; msg (if non-nil) is printed on stderr.
func refuted(err error) error { return &exitError{exitRefuted, err} }

// undecided returns exit 3.
func undecided(err error) error { return &exitError{exitUndecided, err} }

// exitCode maps an error returned by a command to the process exit status.
// Errors that carry no status are input errors (exit 2).
func exitCode(err error) int {
	if err == nil {
		return exitHolds
	}
	var ee *exitError
	if errors.As(err, &ee) {
		return ee.code
	}
	return exitUsage
}

func main() {
	os.Exit(run(os.Args[1:]))
}

// run executes spinecert with the given arguments and returns the exit status.
func run(args []string) int {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	defer signal.Stop(sigs)
	var caught atomic.Value // the first signal
	go func() {
		s, ok := <-sigs
		if !ok {
			return
		}
		caught.Store(s)
		cancel()
		// After the first signal a second one stops the process at once.
		signal.Stop(sigs)
	}()
	if code, ok := childMain(ctx, args); ok {
		return code
	}
	root := newRootCmd()
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if s, ok := caught.Load().(os.Signal); ok {
		// Whatever the command made of its cancelled work, the signal
		// decides the status.
		if s == syscall.SIGTERM {
			fmt.Fprintln(os.Stderr, "spinecert: terminated")
			return exitTerminated
		}
		fmt.Fprintln(os.Stderr, "spinecert: interrupted")
		return exitInterrupted
	}
	if err != nil {
		var ee *exitError
		if !errors.As(err, &ee) || ee.err != nil {
			fmt.Fprintf(os.Stderr, "spinecert: %v\n", err)
		}
	}
	return exitCode(err)
}
