package main

import (
	"fmt"
	"strings"

	"github.com/spf13/cobra"
)

// usageTemplate is spinecert's own layout of a command's usage: how to run
// it, its commands, its options. Subcommands inherit it from the root.
const usageTemplate = `how to run it:{{if .Runnable}}
  {{.UseLine}}{{if .HasAvailableFlags}} [options]{{end}}{{end}}{{if .HasAvailableSubCommands}}
  {{.CommandPath}} COMMAND [ARGUMENTS] [options]{{end}}{{if gt (len .Aliases) 0}}

other names: {{.NameAndAliases}}{{end}}{{if .HasExample}}

examples:
{{.Example}}{{end}}{{if .HasAvailableSubCommands}}

commands:{{range .Commands}}{{if (or .IsAvailableCommand (eq .Name "help"))}}
  {{rpad .Name .NamePadding }} {{.Short}}{{end}}{{end}}{{end}}{{if .HasAvailableLocalFlags}}

options:
{{.LocalFlags.FlagUsages | trimTrailingWhitespaces}}{{end}}{{if .HasAvailableInheritedFlags}}

options of every command:
{{.InheritedFlags.FlagUsages | trimTrailingWhitespaces}}{{end}}
`

// helpTemplate is the full help: the description, the usage and the
// exit-code table, which every command's help shows.
const helpTemplate = `{{with (or .Long .Short)}}{{. | trimTrailingWhitespaces}}

{{end}}{{if or .Runnable .HasSubCommands}}{{.UsageString}}
{{end}}` + exitTable + `{{if .HasAvailableSubCommands}}

"{{.CommandPath}} COMMAND -h" describes one command.{{end}}
`

// completionHelp says, for each shell, how to load spinecert's completion
// script, in spinecert's words.
var completionHelp = map[string]string{
	"bash": "Write the bash completion script on stdout. It needs bash's completion support\n" +
		"(Debian's bash-completion). For this shell:\n\n" +
		"    source <(spinecert completion bash)\n\n" +
		"For every new shell, keep the script where bash-completion looks:\n\n" +
		"    spinecert completion bash > ~/.local/share/bash-completion/completions/spinecert",
	"zsh": "Write the zsh completion script on stdout. With compinit enabled, keep it as\n" +
		"_spinecert in a directory of $fpath:\n\n" +
		"    spinecert completion zsh > \"${fpath[1]}/_spinecert\"",
	"fish": "Write the fish completion script on stdout. For this shell:\n\n" +
		"    spinecert completion fish | source\n\n" +
		"For every new shell:\n\n" +
		"    spinecert completion fish > ~/.config/fish/completions/spinecert.fish",
	"powershell": "Write the PowerShell completion script on stdout. For this shell:\n\n" +
		"    spinecert completion powershell | Out-String | Invoke-Expression\n\n" +
		"For every new shell, add that line to your PowerShell profile.",
}

// setHelp gives root and every command under it spinecert's help and usage
// layout, its own help command, and its own words for the help, version and
// completion entries. Call it after the subcommands are added.
func setHelp(root *cobra.Command) {
	root.SetUsageTemplate(usageTemplate)
	root.SetHelpTemplate(helpTemplate)
	root.SetHelpCommand(newHelpCmd())
	root.SetVersionTemplate("spinecert {{.Version}}\n")
	root.Flags().BoolP("version", "v", false, "print spinecert's version")
	root.InitDefaultHelpCmd()
	root.InitDefaultCompletionCmd()
	for _, c := range root.Commands() {
		if c.Name() == "completion" {
			c.Short = "Write a script that completes spinecert's commands in a shell"
			c.Long = "completion writes a script that completes spinecert's commands, options and\n" +
				"arguments in bash, fish, powershell or zsh; the help of each shell's command\n" +
				"says how to load it."
			for _, sh := range c.Commands() {
				sh.Short = "Write the completion script for " + sh.Name()
				sh.Long = completionHelp[sh.Name()]
			}
		}
	}
	var walk func(c *cobra.Command)
	walk = func(c *cobra.Command) {
		c.DisableFlagsInUseLine = true // the template says [options]
		if c.Flags().Lookup("help") == nil {
			c.Flags().BoolP("help", "h", false, "describe "+c.CommandPath())
		}
		for _, sub := range c.Commands() {
			walk(sub)
		}
	}
	walk(root)
}

// newHelpCmd is "spinecert help [COMMAND]".
func newHelpCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "help [COMMAND]",
		Short: "Describe spinecert or one of its commands",
		Long:  `help describes spinecert, or the command it names (as COMMAND -h does).`,
		ValidArgsFunction: func(c *cobra.Command, args []string, toComplete string) ([]cobra.Completion, cobra.ShellCompDirective) {
			parent, _, err := c.Root().Find(args)
			if err != nil || parent == nil {
				parent = c.Root()
			}
			var out []cobra.Completion
			for _, sub := range parent.Commands() {
				if (sub.IsAvailableCommand() || sub.Name() == "help") && strings.HasPrefix(sub.Name(), toComplete) {
					out = append(out, cobra.CompletionWithDesc(sub.Name(), sub.Short))
				}
			}
			return out, cobra.ShellCompDirectiveNoFileComp
		},
		RunE: func(c *cobra.Command, args []string) error {
			cmd, rest, err := c.Root().Find(args)
			if err != nil || cmd == nil || len(rest) > 0 {
				return usageErr(fmt.Errorf("no command %q (see spinecert --help)", strings.Join(args, " ")))
			}
			return cmd.Help()
		},
	}
}
