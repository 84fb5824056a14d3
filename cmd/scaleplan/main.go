package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"strings"

	"github.com/urfave/cli/v2"
)

// Exit statuses (the manual in doc.go lists them).
const (
	exitOK       = 0
	exitBadInput = 1
	exitUsage    = 2
)

// usageError marks a mistake in how the command was called (exit 2), as
// opposed to bad input data (exit 1).
type usageError struct{ msg string }

func (e usageError) Error() string { return e.msg }

func usagef(format string, args ...any) error { return usageError{fmt.Sprintf(format, args...)} }

func main() {
	// Keep large batches within a bounded memory: a soft limit makes the
	// garbage collector work harder rather than let the heap double. The
	// standard GOMEMLIMIT variable overrides it.
	if os.Getenv("GOMEMLIMIT") == "" {
		debug.SetMemoryLimit(768 << 20)
	}
	os.Exit(run(os.Args, os.Stdout, os.Stderr))
}

// run executes the command line and returns the exit status; it never
// panics on user input and prints one line on stderr for an error.
func run(args []string, stdout, stderr io.Writer) int {
	app := newApp(stdout, stderr)
	ordered, err := flagsFirst(app, args)
	if err == nil {
		err = app.Run(ordered)
	}
	if err == nil {
		return exitOK
	}
	fmt.Fprintln(stderr, "scaleplan: "+err.Error())
	var ue usageError
	if errors.As(err, &ue) || strings.HasPrefix(err.Error(), "Required flag") {
		return exitUsage
	}
	return exitBadInput
}

func newApp(stdout, stderr io.Writer) *cli.App {
	app := &cli.App{
		Name:      "scaleplan",
		Usage:     "plan physical model tests: scale, material, medium, facility and similitude compromises",
		Writer:    stdout,
		ErrWriter: stderr,
		// Errors are printed once by run, never by the library.
		ExitErrHandler:  func(*cli.Context, error) {},
		HideHelpCommand: true,
		OnUsageError: func(_ *cli.Context, err error, _ bool) error {
			return usageError{err.Error()}
		},
		CommandNotFound: func(c *cli.Context, name string) {},
		Commands:        commands(),
		// Shell completion: scaleplan completion prints the bash script.
		EnableBashCompletion: true,
		Flags: []cli.Flag{
			&cli.BoolFlag{Name: "version", Usage: "print the version recorded in the build"},
		},
	}
	app.Action = func(c *cli.Context) error {
		if c.Bool("version") {
			fmt.Fprintln(c.App.Writer, versionLine())
			return nil
		}
		if c.NArg() > 0 {
			return usagef("unknown command %q (see scaleplan --help)", c.Args().First())
		}
		return cli.ShowAppHelp(c)
	}
	for _, cmd := range app.Commands {
		cmd.OnUsageError = app.OnUsageError
	}
	return app
}

// commands lists the subcommands; each lives in its own file.
func commands() []*cli.Command {
	return []*cli.Command{
		runCommand(),
		initCommand(),
		checkCommand(),
		rulesCommand(),
		materialsCommand(),
		groupsCommand(),
		versionCommand(),
		completionCommand(),
	}
}

// flagsFirst moves a subcommand's flags before its arguments, so that
// "scaleplan groups F=N V=m/s --json" works as well as the flags-first
// order the command-line library expects. "--" ends the flags.
func flagsFirst(app *cli.App, args []string) ([]string, error) {
	if len(args) < 3 || args[len(args)-1] == completionFlag {
		// The completion request must stay the last argument.
		return args, nil
	}
	var cmd *cli.Command
	for _, c := range app.Commands {
		if c.Name == args[1] {
			cmd = c
		}
	}
	if cmd == nil {
		return args, nil
	}
	takesValue := map[string]bool{}
	for _, f := range cmd.Flags {
		_, isBool := f.(*cli.BoolFlag)
		for _, n := range f.Names() {
			takesValue[n] = !isBool
		}
	}
	var flags, rest []string
	for i := 2; i < len(args); i++ {
		a := args[i]
		if a == "--" {
			rest = append(rest, args[i+1:]...)
			break
		}
		if strings.HasPrefix(a, "-") && len(a) > 1 {
			flags = append(flags, a)
			name := strings.TrimLeft(a, "-")
			if !strings.Contains(name, "=") && takesValue[name] {
				if i+1 >= len(args) {
					return nil, usagef("flag %s needs a value", a)
				}
				i++
				flags = append(flags, args[i])
			}
			continue
		}
		rest = append(rest, a)
	}
	out := append([]string{args[0], args[1]}, flags...)
	if len(rest) > 0 {
		out = append(out, "--")
		out = append(out, rest...)
	}
	return out, nil
}
