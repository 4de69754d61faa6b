// Package testtools lets tests find outside reference tools (Debian's SAT
// solvers, nauty) and skip when they are absent, unless SPINECERT_REQUIRE_TOOLS=1
// asks for a failure instead (CI sets it after installing the tools).
package testtools

import (
	"os"
	"os/exec"
	"testing"
)

// RequireEnv is the environment variable that turns missing-tool skips into failures.
const RequireEnv = "SPINECERT_REQUIRE_TOOLS"

// Require returns the path of program on PATH. When it is absent the test is
// skipped with a message naming the Debian package, or fails when
// SPINECERT_REQUIRE_TOOLS=1.
func Require(t testing.TB, program, debianPackage string) string {
	t.Helper()
	path, err := exec.LookPath(program)
	if err == nil {
		return path
	}
	if os.Getenv(RequireEnv) == "1" {
		t.Fatalf("%s not found on PATH (install the Debian package %s); %s=1 requires it", program, debianPackage, RequireEnv)
	}
	t.Skipf("%s not found on PATH: install the Debian package %s to run this test", program, debianPackage)
	return ""
}
