package main

import (
	"fmt"

	"github.com/urfave/cli/v2"
)

// completionFlag is the argument the command-line library answers with
// the names that may come next (commands, then a command's flags).
const completionFlag = "--generate-bash-completion"

// bashCompletion completes scaleplan's commands and flags by asking the
// program itself (so it never goes stale), and file names elsewhere (the
// study workbooks and folders).
const bashCompletion = `# bash completion for scaleplan
# Load it in this shell:     source <(scaleplan completion)
# or for every new shell:    scaleplan completion > ~/.local/share/bash-completion/completions/scaleplan
_scaleplan_complete() {
	local cur="${COMP_WORDS[COMP_CWORD]}"
	local words=("${COMP_WORDS[@]:1:COMP_CWORD-1}")
	if [[ "$cur" == -* ]]; then
		# The flags of the command typed so far.
		COMPREPLY=($(compgen -W "$("${COMP_WORDS[0]}" "${words[@]}" - ` + completionFlag + ` 2>/dev/null)" -- "$cur"))
	elif [[ ${#words[@]} -eq 0 ]]; then
		# A command.
		COMPREPLY=($(compgen -W "$("${COMP_WORDS[0]}" ` + completionFlag + ` 2>/dev/null)" -- "$cur"))
	else
		# Studies: workbooks and folders.
		COMPREPLY=($(compgen -f -- "$cur"))
	fi
}
complete -o default -o filenames -F _scaleplan_complete scaleplan
`

func completionCommand() *cli.Command {
	return &cli.Command{
		Name:      "completion",
		Usage:     "print a bash completion script (source <(scaleplan completion))",
		UsageText: "scaleplan completion",
		Action: func(c *cli.Context) error {
			if c.NArg() > 0 {
				return usagef("completion takes no argument: it prints the bash script")
			}
			fmt.Fprint(c.App.Writer, bashCompletion)
			return nil
		},
	}
}
