package main

import (
	"fmt"
	"os"
	"os/exec"
	"strings"
	"testing"

	"spinecert.dev/internal/testtools"

	"github.com/rogpeppe/go-internal/testscript"
)

// TestMain lets the test binary act as the spinecert command inside scripts.
func TestMain(m *testing.M) {
	testscript.Main(m, map[string]func(){
		"spinecert": func() { os.Exit(run(os.Args[1:])) },
	})
}

// TestScripts runs the end-to-end scenarios in testdata/script: each file runs
// spinecert commands and states their exit status, stdout and stderr.
func TestScripts(t *testing.T) {
	testscript.Run(t, testscript.Params{
		Dir:  "testdata/script",
		Cmds: scriptCmds,
		// [tool:NAME] is true when NAME is on PATH; when it is not and
		// SPINECERT_REQUIRE_TOOLS=1, the scenario fails instead of skipping.
		Condition: func(cond string) (bool, error) {
			name, ok := strings.CutPrefix(cond, "tool:")
			if !ok {
				return false, fmt.Errorf("unknown condition %q", cond)
			}
			if _, err := exec.LookPath(name); err != nil {
				if os.Getenv(testtools.RequireEnv) == "1" {
					return false, fmt.Errorf("%s not found on PATH and %s=1 requires it", name, testtools.RequireEnv)
				}
				return false, nil
			}
			return true, nil
		},
		Setup: func(env *testscript.Env) error {
			env.Setenv("SPINECERT_REQUIRE_TOOLS", os.Getenv("SPINECERT_REQUIRE_TOOLS"))
			return nil
		},
	})
}
