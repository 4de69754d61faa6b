package main

import (
	"context"
	"encoding/xml"
	"fmt"
	"io"
	"os"
	"runtime"
	"strings"
	"sync"

	"github.com/spf13/cobra"

	"spinecert.dev/archive"
	"spinecert.dev/cubejob"
	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
	"spinecert.dev/verify"
)

type verifyOptions struct {
	solver    solveSolverFlags
	slurmDir  string
	sl        slurmFlags
	slurmTask int
	jobs      int
	json      bool
	junit     string
	resolve   bool
	bundles   []string
}

func newVerifyCmd() *cobra.Command {
	var o verifyOptions
	cmd := &cobra.Command{
		Use:   "verify BUNDLE...",
		Short: "Re-check evidence bundles from scratch",
		Long: `Re-check evidence bundles made by "spinecert bundle", trusting nothing in them.

For each bundle: every member's SHA-256, the manifest schema, and that the
archive holds exactly the members the manifest lists (integrity); the graph
against the claimed identity; the layout, re-validated directly; the CNF,
rebuilt from the graph with the current encoder and the options recorded,
compared by hash; each proof, re-checked against that CNF by spinecert's DRAT
checker and the LRAT it writes by the separate LRAT checker.

If the current encoder gives a different CNF for the claim (encoder drift),
the report says so with both encoder versions and what was checked instead;
such a bundle fails unless --resolve re-solves the current encoding (with
--solvers) and the new proof passes both checkers.

Results per bundle and in total as text, as JSON (--json) and as JUnit XML
for CI systems (--junit FILE). A bundle holds when every check passed; the
exit status is 0 only if every bundle holds; 1 if some bundle is rejected
(bad, or it does not establish its claim); 2 if some bundle could not be
read at all.`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.bundles = args
			if o.jobs < 0 {
				return usageErr(fmt.Errorf("--jobs must be positive"))
			}
			if err := o.sl.check(cmd, o.slurmDir != ""); err != nil {
				return err
			}
			if o.slurmDir != "" && len(args) != 1 {
				return usageErr(fmt.Errorf("--slurm verifies one bundle at a time"))
			}
			if o.slurmDir != "" && cmd.Flags().Changed("slurm-task") {
				return runVerifyTask(cmd, &o)
			}
			return runVerify(cmd, &o)
		},
	}
	o.solver.add(cmd)
	cmd.Flags().IntVar(&o.jobs, "jobs", 0, "bundles, or proofs of a bundle split into cubes, checked at the same time (0 = one per CPU)")
	cmd.Flags().BoolVar(&o.json, "json", false, "print one JSON object on stdout")
	cmd.Flags().StringVar(&o.junit, "junit", "", "also write a JUnit XML report to FILE")
	cmd.Flags().BoolVar(&o.resolve, "resolve", false, "when the encoder drifted, re-solve the current encoding to re-establish the claim")
	cmd.Flags().StringVar(&o.slurmDir, "slurm", "", "hand the cube proof checks of a bundle split into cubes to a Slurm job array working in DIR (shared by the nodes), then verify with their records")
	o.sl.add(cmd)
	cmd.Flags().IntVar(&o.slurmTask, "slurm-task", 0, "check one array task's slice of cube proofs (used by the job array)")
	_ = cmd.Flags().MarkHidden("slurm-task")
	return cmd
}

// verifySummary is the --json output.
type verifySummary struct {
	Bundles    []*archive.Report `json:"bundles"`
	Total      int               `json:"total"`
	Verified   int               `json:"verified"`
	Failed     int               `json:"failed"`
	Unreadable int               `json:"unreadable"`
}

func runVerify(cmd *cobra.Command, o *verifyOptions) error {
	ctx := cmd.Context()
	opt := archive.VerifyOptions{}
	if o.resolve {
		solvers, err := o.solver.build()
		if err != nil {
			return err
		}
		opt.Resolve = verifyResolver(solvers, o.solver)
	}
	jobs := o.jobs
	if jobs == 0 {
		jobs = runtime.NumCPU()
	}
	// Several bundles share the jobs; one bundle split into cubes checks
	// its cube proofs that many at a time.
	opt.Jobs = max(1, jobs/len(o.bundles))
	if o.slurmDir != "" {
		j, err := verifySubmit(cmd, o)
		if err != nil {
			return err
		}
		opt.CubeOutcome = j.Outcome
	}
	jobs = min(jobs, len(o.bundles))
	reports := make([]*archive.Report, len(o.bundles))
	next := make(chan int)
	var wg sync.WaitGroup
	for range jobs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				reports[i] = archive.VerifyFile(ctx, o.bundles[i], opt)
			}
		}()
	}
	for i := range o.bundles {
		next <- i
	}
	close(next)
	wg.Wait()
	verifyTempDirs.Range(func(k, _ any) bool {
		os.RemoveAll(k.(string))
		return true
	})
	if err := interruption(ctx); err != nil {
		return err
	}
	sum := verifySummary{Bundles: reports, Total: len(reports)}
	for _, r := range reports {
		switch {
		case r.Verified:
			sum.Verified++
		case r.Unreadable:
			sum.Unreadable++
		default:
			sum.Failed++
		}
	}
	if o.junit != "" {
		if err := writeFileAtomic(o.junit, cmd.OutOrStdout(), func(w io.Writer) error { return verifyJUnit(w, reports) }); err != nil {
			return err
		}
	}
	if o.json {
		if err := writeJSON(cmd.OutOrStdout(), sum); err != nil {
			return err
		}
	} else {
		verifyPrint(cmd.OutOrStdout(), &sum)
	}
	if err := ctx.Err(); err != nil {
		return usageErr(err)
	}
	switch {
	case sum.Unreadable > 0:
		return usageErr(nil)
	case sum.Failed > 0:
		return refuted(nil)
	}
	return nil
}

// verifyResolver re-solves a CNF with the given backends for --resolve.
func verifyResolver(solvers []verify.Solver, f solveSolverFlags) func(ctx context.Context, cnf *dimacs.CNF) (*archive.Resolution, error) {
	return func(ctx context.Context, cnf *dimacs.CNF) (*archive.Resolution, error) {
		dir, err := os.MkdirTemp("", "spinecert-resolve-")
		if err != nil {
			return nil, err
		}
		// Verify reads the proof before it returns; the directory is removed
		// once every bundle is done.
		results, err := verify.RunAll(ctx, cnf, solvers, verify.RunOptions{Limit: f.timeLimit, ProofDir: dir, StopOnModel: true})
		if err != nil {
			os.RemoveAll(dir)
			return nil, err
		}
		res := &archive.Resolution{Answer: "unknown"}
		for _, r := range results {
			res.Runs = append(res.Runs, archive.Run{Backend: r.Backend, Version: r.Version, Answer: strings.ToLower(r.Answer.String()), Seconds: r.Elapsed.Seconds()})
			switch {
			case r.Answer == verify.Sat:
				res.Answer = "sat"
			case r.Answer == verify.Unsat && r.Proof != "" && res.Proof == "" && res.Answer != "sat":
				res.Answer, res.Proof, res.ProofFormat = "unsat", r.Proof, r.ProofFormat
			}
		}
		if res.Answer == "sat" {
			res.Proof = ""
		}
		verifyTempDirs.Store(dir, true)
		return res, nil
	}
}

// verifyTempDirs are the proof directories of --resolve, removed at exit.
var verifyTempDirs sync.Map

func verifyPrint(w io.Writer, s *verifySummary) {
	for _, r := range s.Bundles {
		status := "holds — every check passed"
		switch {
		case r.Unreadable:
			status = "unreadable"
		case !r.Verified:
			status = "rejected"
		}
		fmt.Fprintf(w, "%s: %s (%.2f s)\n", r.Bundle, status, r.Seconds)
		if r.Claim != "" {
			fmt.Fprintf(w, "  claim: %s\n", r.Claim)
		}
		if r.Label != "" {
			fmt.Fprintf(w, "  label: %s\n", archive.LabelText(r.Label))
		}
		for _, c := range r.Checks {
			fmt.Fprintf(w, "  %-4s %s: %s\n", c.Status, c.Name, c.Detail)
		}
		if d := r.Drift; d != nil && !r.Verified {
			if d.StoredCNFChecked {
				fmt.Fprintf(w, "    the proof was checked against the CNF stored in the bundle (not derived from the claim by this spinecert)\n")
			}
			if d.CNFChanged && !d.Resolved {
				fmt.Fprintf(w, "  encoder drift: not re-solved (use --resolve to re-establish the claim with the current encoder)\n")
			}
		}
	}
	fmt.Fprintf(w, "total: %d bundle(s): %d hold, %d rejected, %d unreadable\n", s.Total, s.Verified, s.Failed, s.Unreadable)
}

type junitSuites struct {
	XMLName  xml.Name     `xml:"testsuites"`
	Tests    int          `xml:"tests,attr"`
	Failures int          `xml:"failures,attr"`
	Errors   int          `xml:"errors,attr"`
	Suites   []junitSuite `xml:"testsuite"`
}

type junitSuite struct {
	Name     string      `xml:"name,attr"`
	Tests    int         `xml:"tests,attr"`
	Failures int         `xml:"failures,attr"`
	Errors   int         `xml:"errors,attr"`
	Time     string      `xml:"time,attr"`
	Cases    []junitCase `xml:"testcase"`
}

type junitCase struct {
	Name      string        `xml:"name,attr"`
	Classname string        `xml:"classname,attr"`
	Time      string        `xml:"time,attr"`
	Failure   *junitProblem `xml:"failure,omitempty"`
	Error     *junitProblem `xml:"error,omitempty"`
	SystemOut string        `xml:"system-out,omitempty"`
}

type junitProblem struct {
	Message string `xml:"message,attr"`
	Type    string `xml:"type,attr"`
	Text    string `xml:",chardata"`
}

// verifyJUnit writes the reports as JUnit XML: one test case per bundle, a
// failure for a rejected bundle, an error for one not readable.
func verifyJUnit(w io.Writer, reports []*archive.Report) error {
	s := junitSuite{Name: "spinecert verify", Tests: len(reports)}
	total := 0.0
	for _, r := range reports {
		total += r.Seconds
		var lines []string
		for _, c := range r.Checks {
			lines = append(lines, fmt.Sprintf("%s %s: %s", c.Status, c.Name, c.Detail))
		}
		if r.Drift != nil {
			lines = append(lines, "encoder drift: "+r.Drift.Summary)
		}
		tc := junitCase{Name: r.Bundle, Classname: "spinecert.verify", Time: fmt.Sprintf("%.3f", r.Seconds), SystemOut: strings.Join(lines, "\n")}
		if r.Claim != "" {
			tc.SystemOut = "claim: " + r.Claim + "\n" + tc.SystemOut
		}
		if r.Label != "" {
			tc.SystemOut = "label: " + archive.LabelText(r.Label) + "\n" + tc.SystemOut
		}
		if !r.Verified {
			var msgs []string
			for _, c := range r.Failures() {
				msgs = append(msgs, c.Name+": "+c.Detail)
			}
			p := &junitProblem{Message: firstLine(msgs), Type: "rejected", Text: strings.Join(msgs, "\n")}
			if r.Unreadable {
				p.Type = "unreadable"
				tc.Error = p
				s.Errors++
			} else {
				tc.Failure = p
				s.Failures++
			}
		}
		s.Cases = append(s.Cases, tc)
	}
	s.Time = fmt.Sprintf("%.3f", total)
	doc := junitSuites{Tests: s.Tests, Failures: s.Failures, Errors: s.Errors, Suites: []junitSuite{s}}
	if _, err := io.WriteString(w, xml.Header); err != nil {
		return err
	}
	enc := xml.NewEncoder(w)
	enc.Indent("", "  ")
	if err := enc.Encode(doc); err != nil {
		return err
	}
	_, err := io.WriteString(w, "\n")
	return err
}

func firstLine(msgs []string) string {
	if len(msgs) == 0 {
		return "rejected"
	}
	return msgs[0]
}

// verifySubmit hands the cube proof checks of the one bundle to a Slurm
// job array and waits for it to leave the queue.
func verifySubmit(cmd *cobra.Command, o *verifyOptions) (*cubejob.VerifyJob, error) {
	ctx := cmd.Context()
	m, _, err := showRead(o.bundles[0], cmd)
	if err != nil {
		return nil, err
	}
	if m.Refutation == nil || m.Refutation.Cubes == nil {
		return nil, usageErr(fmt.Errorf("%s: the refutation is not split into cubes; verify it without --slurm", o.bundles[0]))
	}
	j, err := cubejob.NewVerifyJob(o.slurmDir, o.bundles[0], m.Refutation.Cubes.Count, o.sl.perTask)
	if err != nil {
		return nil, err
	}
	sopt, err := o.sl.options(nil)
	if err != nil {
		return nil, err
	}
	if err := j.Submit(ctx, sopt); err != nil {
		return nil, err
	}
	fmt.Fprintf(cmd.ErrOrStderr(), "verify: job %s: %d array tasks check the proofs of %d cubes; waiting\n", j.SlurmID, j.Tasks(), j.Cubes)
	if err := j.Wait(ctx, ""); err != nil {
		if ierr := interruption(ctx); ierr != nil {
			return nil, ierr
		}
		return nil, err
	}
	return j, nil
}

// runVerifyTask checks one array task's slice of cube proofs and records
// each outcome for the verify that submitted the array.
func runVerifyTask(cmd *cobra.Command, o *verifyOptions) error {
	j, err := cubejob.OpenVerifyJob(o.slurmDir)
	if err != nil {
		return usageErr(err)
	}
	if o.slurmTask < 0 || o.slurmTask >= j.Tasks() {
		return usageErr(fmt.Errorf("--slurm-task %d: the job has array tasks 0 to %d", o.slurmTask, j.Tasks()-1))
	}
	task := fmt.Sprintf("slurm %s_%d", os.Getenv("SLURM_ARRAY_JOB_ID"), o.slurmTask)
	var mu sync.Mutex
	var recErr error
	checked := 0
	opt := archive.VerifyOptions{
		CubeFilter: func(i int) bool { return j.InSlice(o.slurmTask, i) },
		CubeChecked: func(i int, sum string, out proof.Outcome) {
			err := j.Record(i, sum, out, task)
			mu.Lock()
			defer mu.Unlock()
			checked++
			if err != nil && recErr == nil {
				recErr = err
			}
		},
	}
	archive.VerifyFile(cmd.Context(), j.Bundle, opt)
	if err := interruption(cmd.Context()); err != nil {
		return err
	}
	if recErr != nil {
		return recErr
	}
	fmt.Fprintf(cmd.OutOrStdout(), "array task %d: checked %d cube proofs of %s\n", o.slurmTask, checked, j.Bundle)
	return nil
}
