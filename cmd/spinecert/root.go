package main

import (
	"fmt"
	"os"

	"github.com/spf13/cobra"
	"spinecert.dev/verify"
)

// version is the spinecert version, recorded in every artifact spinecert writes.
var version = "0.1.0-dev"

// commands returns every subcommand, in the order the help lists them: the
// one place a new command is added (its file is cmd_NAME.go).
func commands() []*cobra.Command {
	return []*cobra.Command{
		newCheckCmd(),
		newLayoutCmd(),
		newDrawCmd(),
		newPlanarCmd(),
		newEncodeCmd(),
		newDecodeCmd(),
		newSolveCmd(),
		newProofCmd(),
		newPageNumberCmd(),
		newSplitCmd(),
		newConquerCmd(),
		newGatherCmd(),
		newBundleCmd(),
		newVerifyCmd(),
		newShowCmd(),
		newExtractCmd(),
		newDemoCmd(),
	}
}

// childHandlers are hidden entry points for spinecert's own child processes;
// see childMain. The gophersat backend runs in a child process so that a
// time-out can kill it (see verify.Gophersat).
var childHandlers = map[string]func(ctx contextT, args []string) int{
	verify.GophersatChild: func(_ contextT, args []string) int {
		return verify.RunGophersatChild(args, os.Stdout, os.Stderr)
	},
}

func newRootCmd() *cobra.Command {
	cobra.EnableCommandSorting = false // the help lists commands as commands() does
	root := &cobra.Command{
		Use:   "spinecert",
		Short: "Evidence for page-number claims about graphs",
		Long: `spinecert turns claims about the page number (book thickness) and queue number of
graphs into evidence that anyone can re-check: it validates layouts directly,
encodes "G has a k-page layout" as DIMACS CNF, decides it with independent
solvers, checks clausal proofs with its own checker, and bundles the evidence.`,
		Version:       version,
		SilenceUsage:  true,
		SilenceErrors: true,
		Args:          cobra.ArbitraryArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if len(args) > 0 {
				return usageErr(fmt.Errorf("unknown command %q (see spinecert --help)", args[0]))
			}
			return cmd.Help()
		},
	}
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error { return usageErr(err) })
	for _, cmd := range commands() {
		addExitHelp(cmd)
		root.AddCommand(cmd)
	}
	setHelp(root)
	return root
}

// addExitHelp makes a command's argument and flag errors exit with status 2
// (the help template shows the exit-code table).
func addExitHelp(cmd *cobra.Command) {
	if cmd.Long == "" {
		cmd.Long = cmd.Short
	}
	if args := cmd.Args; args != nil {
		cmd.Args = func(c *cobra.Command, a []string) error {
			if err := args(c, a); err != nil {
				return usageErr(err)
			}
			return nil
		}
	}
	cmd.SetFlagErrorFunc(func(c *cobra.Command, err error) error { return usageErr(err) })
	for _, sub := range cmd.Commands() {
		addExitHelp(sub)
	}
}
