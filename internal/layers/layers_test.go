// Package layers holds a test that keeps spinecert's packages layered: data flows
// one way, cert → dimacs → verify → archive, with cmd/spinecert on top, and the
// command-line library stays in cmd.
package layers

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// allowed lists, for each package, the project packages it may import.
var allowed = map[string][]string{
	"cert":      {},
	"heuristic": {"cert"},
	"draw":      {"cert"},
	"dimacs":    {"cert"},
	"verify":    {"cert", "dimacs", "heuristic"},
	"archive":   {"cert", "dimacs", "verify", "heuristic"},
}

func TestPackagesImportOnlyEarlierStages(t *testing.T) {
	root := filepath.Join("..", "..")
	for pkg, ok := range allowed {
		dir := filepath.Join(root, pkg)
		files, _ := filepath.Glob(filepath.Join(dir, "*.go"))
		if len(files) == 0 {
			continue // not written yet
		}
		for _, f := range files {
			for _, imp := range imports(t, f) {
				if strings.HasPrefix(imp, "github.com/spf13/cobra") {
					t.Errorf("%s imports cobra; the command-line library belongs in cmd/spinecert only", f)
				}
				if !strings.HasPrefix(imp, "spinecert.dev/") || strings.HasPrefix(imp, "spinecert.dev/internal/") {
					continue
				}
				dep := strings.SplitN(strings.TrimPrefix(imp, "spinecert.dev/"), "/", 2)[0]
				if dep == pkg {
					continue
				}
				found := false
				for _, a := range ok {
					found = found || a == dep
				}
				if !found {
					t.Errorf("%s imports %s: %s may import only %v", f, imp, pkg, ok)
				}
			}
		}
	}
}

func imports(t *testing.T, path string) []string {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	f, err := parser.ParseFile(token.NewFileSet(), path, src, parser.ImportsOnly)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, s := range f.Imports {
		p, _ := strconv.Unquote(s.Path.Value)
		out = append(out, p)
	}
	return out
}
