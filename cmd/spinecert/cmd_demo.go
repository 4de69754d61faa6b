package main

import (
	"embed"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"spinecert.dev/cert"
	"spinecert.dev/graph"
)

//go:embed demodata/*.edges
var demoData embed.FS

type demoOptions struct {
	dir string
}

// demoStep is one command of the demonstration, with the exit status it must give.
type demoStep struct {
	title string
	args  []string
	want  int
	look  string // what the user should look at afterwards
	prep  func(dir string) error
}

func newDemoCmd() *cobra.Command {
	var o demoOptions
	cmd := &cobra.Command{
		Use:   "demo",
		Short: "Run spinecert's main job end to end on invented demo data",
		Long: `Run spinecert's main job end to end on invented demo data.

The fictional Kestrel Works robotics workshop routes the wires of its
backplanes on stacked routing layers: connectors sit in a row (the spine),
each wire runs on one layer (a page), and two wires of one layer must not
cross. The demo finds and checks layouts, rejects a bad one with a witness,
draws one, proves a lower bound and an exact page number with checked
proofs, certifies planarity, and bundles the evidence and re-verifies it.
Every command it runs is printed so that you can run it yourself.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error { return runDemo(cmd, &o) },
	}
	cmd.Flags().StringVar(&o.dir, "dir", "", "directory for the demo's files (default: a new temporary directory, kept)")
	return cmd
}

func runDemo(cmd *cobra.Command, o *demoOptions) error {
	out := cmd.OutOrStdout()
	dir := o.dir
	if dir == "" {
		d, err := os.MkdirTemp("", "spinecert-demo-")
		if err != nil {
			return fmt.Errorf("demo: %w", err)
		}
		dir = d
	} else if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("demo: %w", err)
	}
	names, err := demoData.ReadDir("demodata")
	if err != nil {
		return fmt.Errorf("demo: %w", err)
	}
	for _, n := range names {
		data, err := demoData.ReadFile("demodata/" + n.Name())
		if err != nil {
			return fmt.Errorf("demo: %w", err)
		}
		if err := os.WriteFile(filepath.Join(dir, n.Name()), data, 0o644); err != nil {
			return fmt.Errorf("demo: %w", err)
		}
	}
	fmt.Fprintf(out, "Kestrel Works (an invented workshop) routes backplane wires on layers: connectors in a row\n"+
		"are the spine, each layer is a page, and wires of one layer must not cross.\n"+
		"Demo files are in %s\n", dir)

	steps := demoSteps()
	failed := 0
	for i, s := range steps {
		fmt.Fprintf(out, "\n== %d. %s\n$ spinecert %s\n", i+1, s.title, strings.Join(s.args, " "))
		if s.prep != nil {
			if err := s.prep(dir); err != nil {
				return fmt.Errorf("demo: preparing step %d: %w", i+1, err)
			}
		}
		code := runDemoCommand(dir, s.args, out, cmd.ErrOrStderr())
		if code != s.want {
			failed++
			fmt.Fprintf(out, "!! this step ended with exit status %d, expected %d\n", code, s.want)
			continue
		}
		fmt.Fprintf(out, "(exit status %d, as expected)\n", code)
		if s.look != "" {
			fmt.Fprintf(out, "-> %s\n", s.look)
		}
	}
	fmt.Fprintf(out, "\nAll files of the demo are in %s\n", dir)
	if failed > 0 {
		return refuted(fmt.Errorf("demo: %d step(s) did not behave as expected", failed))
	}
	return nil
}

// runDemoCommand runs one spinecert command inside dir and returns its exit status.
func runDemoCommand(dir string, args []string, stdout, stderr io.Writer) int {
	old, err := os.Getwd()
	if err != nil {
		return exitUsage
	}
	if err := os.Chdir(dir); err != nil {
		return exitUsage
	}
	defer os.Chdir(old)
	root := newRootCmd()
	root.SetArgs(args)
	root.SetOut(stdout)
	root.SetErr(stderr)
	err = root.Execute()
	if err != nil {
		var ee *exitError
		if !errors.As(err, &ee) || ee.err != nil {
			fmt.Fprintf(stderr, "spinecert: %v\n", err)
		}
	}
	return exitCode(err)
}

// oneLayerPlan writes a layout that puts every wire of the controller on
// layer 1 in the spine order spinecert found: a claim that must be rejected.
func oneLayerPlan(dir string) error {
	res, err := graph.ReadFile(filepath.Join(dir, "controller.edges"), graph.FormatAuto)
	if err != nil {
		return err
	}
	g := res.Graphs[0]
	raw, err := cert.ReadLayoutFile(filepath.Join(dir, "controller.layout.json"))
	if err != nil {
		return err
	}
	l, rep := cert.Resolve(g, raw)
	if !rep.OK() {
		return rep.Err()
	}
	l.Kind, l.PageKinds = cert.Stack, []cert.Kind{cert.Stack}
	for e := range l.Page {
		l.Page[e] = 1
	}
	f, err := os.Create(filepath.Join(dir, "controller.one-layer.json"))
	if err != nil {
		return err
	}
	if err := cert.WriteLayoutJSON(f, g, l); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

func demoSteps() []demoStep {
	return []demoStep{
		{title: "find a layer plan for the controller backplane without SAT",
			args: []string{"layout", "controller.edges", "-o", "controller.layout.json"},
			look: "controller.layout.json holds the spine order and a layer for every wire"},
		{title: "check the plan directly (every connector once, every wire once, no crossing on a layer)",
			args: []string{"check", "controller.edges", "controller.layout.json"}},
		{title: "draw it as an arc diagram",
			args: []string{"draw", "controller.edges", "controller.layout.json", "-o", "controller.svg", "--title", "Kestrel Works controller backplane"},
			look: "open controller.svg in a browser: one colour per layer, layers alternate above and below the row"},
		{title: "a claim that everything fits on one layer is rejected, with the two crossing wires as witness",
			args: []string{"check", "controller.edges", "controller.one-layer.json"}, want: exitRefuted,
			prep: oneLayerPlan},
		{title: "the controller board is planar: an embedding is found and checked by an independent checker",
			args: []string{"planar", "controller.edges", "-o", "controller.planar.json"}},
		{title: "the sensor ring is not planar: a Kuratowski subgraph is found and checked",
			args: []string{"planar", "sensor-ring.edges", "-o", "sensor-ring.kuratowski.json"}, want: exitRefuted},
		{title: "lower bound: the arm harness (every controller wired to every other) has no 3-layer plan",
			args: []string{"solve", "arm-harness.edges", "--pages", "3", "--proof-out", "proofs"}, want: exitRefuted,
			look: "two solvers said UNSAT and the proof in proofs/ was accepted by spinecert's DRAT and LRAT checkers"},
		{title: "exact page number of the sensor ring, with evidence on both sides",
			args: []string{"pagenumber", "sensor-ring.edges"},
			look: "the lower bound needs no solver: a checked Kuratowski subgraph rules out 2 layers; the upper bound is a 3-layer plan checked directly"},
		{title: "the same exact page number, with the lower bound proved by solvers instead",
			args: []string{"pagenumber", "sensor-ring.edges", "--unsat-lower", "-o", "sensor-ring.layout.json"},
			look: "no 2-layer plan: two solvers said UNSAT and spinecert's DRAT and LRAT checkers accepted a proof; sensor-ring.layout.json is the 3-layer plan"},
		{title: "bundle the arm harness's exact page number (4) as evidence to archive",
			args: []string{"bundle", "arm-harness.edges", "--exact", "4", "-o", "arm-harness.spinecert.tar.zst"},
			look: "arm-harness.spinecert.tar.zst opens with tar --zstd -xf; its SHA256SUMS works with sha256sum -c"},
		{title: "re-verify the bundle from scratch, as a reviewer would",
			args: []string{"verify", "arm-harness.spinecert.tar.zst"}},
	}
}
