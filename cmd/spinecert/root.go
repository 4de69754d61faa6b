package main

import (
	"fmt"

	"github.com/spf13/cobra"
)

// version is the spinecert version, recorded in every artifact spinecert writes.
var version = "0.1.0-dev"

// commands holds the constructors registered by the subcommand files.
var commands []func() *cobra.Command

// register adds a subcommand constructor; each subcommand file calls it from init.
func register(c func() *cobra.Command) { commands = append(commands, c) }

// childHandlers are hidden entry points for spinecert's own child processes
// (for example a solver run that must be killable); see childMain.
var childHandlers = map[string]func(ctx contextT, args []string) int{}

func newRootCmd() *cobra.Command {
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
	for _, c := range commands {
		cmd := c()
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
