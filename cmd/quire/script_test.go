package main

import (
	"os"
	"testing"

	"github.com/rogpeppe/go-internal/testscript"
)

// TestMain lets the test binary act as the quire command inside scripts.
func TestMain(m *testing.M) {
	testscript.Main(m, map[string]func(){
		"quire": func() { os.Exit(run(os.Args[1:])) },
	})
}

// TestScripts runs the end-to-end scenarios in testdata/script: each file runs
// quire commands and states their exit status, stdout and stderr.
func TestScripts(t *testing.T) {
	testscript.Run(t, testscript.Params{
		Dir: "testdata/script",
		Setup: func(env *testscript.Env) error {
			env.Setenv("QUIRE_REQUIRE_TOOLS", os.Getenv("QUIRE_REQUIRE_TOOLS"))
			return nil
		},
	})
}
