// Package layers holds a test that keeps spinecert's packages layered. Data
// flows one way:
//
//	textpos, atomicfile → graph → cert, planar/planarcert → planar, toughcert →
//	heuristic, draw → dimacs → proof → verify → pagenumber; archive beside
//	verify; evidence on verify, pagenumber and archive
//
// with cmd/spinecert on top. The planarity certificate checker
// (planar/planarcert) imports only the graph model and the position errors,
// so the compiler keeps it apart from the planarity test that produces the
// certificates; the toughness certificate checker (toughcert) imports only
// the graph model and planarcert, so it shares no code with the search for
// its sets in pagenumber; archive re-checks proofs with proof and imports no solver
// code; the command-line library stays in cmd.
package layers

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

const module = "spinecert.dev/"

// allowed lists, for each package (its path in the module), the project
// packages its non-test files may import.
var allowed = map[string][]string{
	"textpos":           {},
	"atomicfile":        {},
	"graph":             {"textpos"},
	"cert":              {"graph", "textpos"},
	"planar/planarcert": {"graph", "textpos"},
	"planar":            {"graph", "planar/planarcert"},
	"toughcert":         {"graph", "planar/planarcert"},
	"heuristic":         {"graph", "cert", "planar", "planar/planarcert"},
	"draw":              {"graph", "cert"},
	"dimacs":            {"graph", "cert", "textpos"},
	"proof":             {"dimacs", "textpos"},
	"cube":              {"dimacs", "textpos"},
	"verify":            {"graph", "cert", "dimacs", "proof"},
	"pagenumber":        {"graph", "cert", "dimacs", "planar", "planar/planarcert", "toughcert", "heuristic", "proof", "verify"},
	"archive":           {"atomicfile", "graph", "cert", "cube", "dimacs", "planar/planarcert", "proof", "textpos"},
	"cubejob":           {"atomicfile", "graph", "cert", "cube", "dimacs", "proof", "verify", "archive", "textpos"},
	"evidence":          {"graph", "cert", "dimacs", "planar", "planar/planarcert", "verify", "pagenumber", "archive"},
}

// testOnly lists what test files may import besides their package's own
// allowance: the shared fixtures and tool finders, and for a few packages
// the stages that make the inputs their tests need.
var testOnly = map[string][]string{
	"planar/planarcert": {"planar"},
	"toughcert":         {"planar"},
	"archive":           {"verify", "planar"},
	"cube":              {"cert"},
}

func TestPackagesImportOnlyEarlierStages(t *testing.T) {
	root := filepath.Join("..", "..")
	for pkg, ok := range allowed {
		files, _ := filepath.Glob(filepath.Join(root, filepath.FromSlash(pkg), "*.go"))
		if len(files) == 0 {
			t.Errorf("package %s has no Go files: the table is out of date", pkg)
			continue
		}
		for _, f := range files {
			test := strings.HasSuffix(f, "_test.go")
			for _, imp := range imports(t, f) {
				if strings.HasPrefix(imp, "github.com/spf13/cobra") {
					t.Errorf("%s imports cobra; the command-line library belongs in cmd/spinecert only", f)
				}
				dep, own := strings.CutPrefix(imp, module)
				if !own || dep == pkg {
					continue
				}
				if strings.HasPrefix(dep, "internal/") {
					if !test {
						t.Errorf("%s imports %s: only tests may use the internal packages", f, imp)
					}
					continue
				}
				if slices.Contains(ok, dep) || test && slices.Contains(testOnly[pkg], dep) {
					continue
				}
				t.Errorf("%s imports %s: %s may import only %v", f, imp, pkg, ok)
			}
		}
	}
}

// TestEveryPackageIsListed keeps the table complete: a new package must say
// where it stands.
func TestEveryPackageIsListed(t *testing.T) {
	root := filepath.Join("..", "..")
	err := filepath.WalkDir(root, func(path string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(root, path)
		rel = filepath.ToSlash(rel)
		if d.IsDir() && (rel == "cmd" || rel == "internal" || rel == "scripts" || strings.HasPrefix(d.Name(), ".") || d.Name() == "testdata") {
			return filepath.SkipDir
		}
		if d.IsDir() || !strings.HasSuffix(path, ".go") {
			return nil
		}
		if _, ok := allowed[filepath.ToSlash(filepath.Dir(rel))]; !ok {
			t.Errorf("%s: package %s is not in the layer table", rel, filepath.Dir(rel))
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
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
