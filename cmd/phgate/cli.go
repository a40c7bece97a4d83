package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"

	"github.com/fatih/color"
)

// Exit statuses of phgate.
const (
	// ExitOK: nothing at the failing severity.
	ExitOK = 0
	// ExitFindings: a finding at or above the --fail-on severity (or a
	// diff gate was crossed).
	ExitFindings = 1
	// ExitProblem: a usage error, or a file that could not be read,
	// parsed, validated or solved.
	ExitProblem = 2
)

// App is the command line with its streams injected, so tests run it in
// process.
type App struct {
	Stdin          io.Reader
	Stdout, Stderr io.Writer
	// Color reports whether stdout is a terminal that wants colour.
	Color bool
}

// New builds an App on the given streams; colour is on only when stdout
// is a terminal and NO_COLOR is unset.
func New(stdin io.Reader, stdout, stderr io.Writer) *App {
	a := &App{Stdin: stdin, Stdout: stdout, Stderr: stderr}
	// color.NoColor is computed by the colour library from NO_COLOR,
	// TERM=dumb and whether os.Stdout is a terminal.
	a.Color = stdout == io.Writer(os.Stdout) && !color.NoColor
	return a
}

// command is one subcommand.
type command struct {
	summary string
	run     func(a *App, args []string) int
}

// commands is the explicit table of subcommands.
var commands = map[string]command{
	"check":   {"solve and check recipes (files or folders; default .)", (*App).check},
	"show":    {"detailed report of one recipe", (*App).show},
	"catalog": {"list or explain catalog ingredients", (*App).catalog},
	"schema":  {"print a JSON Schema: recipe, catalog or config", (*App).schema},
	"rules":   {"list the rules, or explain one (phgate rules NAME)", (*App).rulesCmd},
	"plot":    {"draw a chart of one recipe as SVG or PNG", (*App).plot},
	"report":  {"self-contained HTML report with tables, findings and charts", (*App).report},
	"diff":    {"compare computed results between files, folders or git revisions", (*App).diff},
}

// Run executes one invocation and returns the exit status.
func (a *App) Run(args []string) int {
	if len(args) == 0 || args[0] == "-h" || args[0] == "--help" || args[0] == "help" {
		a.usage(a.Stdout)
		if len(args) == 0 {
			return ExitProblem
		}
		return ExitOK
	}
	if args[0] == "version" || args[0] == "--version" {
		fmt.Fprintln(a.Stdout, "phgate", version)
		return ExitOK
	}
	c, ok := commands[args[0]]
	if !ok {
		fmt.Fprintf(a.Stderr, "phgate: unknown command %q\n\n", args[0])
		a.usage(a.Stderr)
		return ExitProblem
	}
	return c.run(a, args[1:])
}

const version = "0.1.0"

func (a *App) usage(w io.Writer) {
	fmt.Fprintln(w, "phgate: pH and buffer checks for aqueous recipes kept in git")
	fmt.Fprintln(w, "\nusage: phgate COMMAND [options] [arguments]\n\ncommands:")
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		fmt.Fprintf(w, "  %-9s %s\n", n, commands[n].summary)
	}
	fmt.Fprintln(w, "\nRun 'phgate COMMAND -h' for a command's options.")
}

// flags builds a FlagSet that reports errors instead of exiting.
func (a *App) flags(name, argsHelp string) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(a.Stderr)
	fs.Usage = func() {
		fmt.Fprintf(a.Stderr, "usage: phgate %s [options] %s\n", name, argsHelp)
		fs.PrintDefaults()
	}
	return fs
}

// parse parses flags allowing them before and after positional arguments.
func parse(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			return nil, err
		}
		rest := fs.Args()
		if len(rest) == 0 {
			return pos, nil
		}
		if rest[0] == "--" {
			return append(pos, rest[1:]...), nil
		}
		pos = append(pos, rest[0])
		args = rest[1:]
	}
}

func (a *App) fail(format string, args ...any) int {
	fmt.Fprintf(a.Stderr, "phgate: "+format+"\n", args...)
	return ExitProblem
}

func isHelp(err error) bool { return err != nil && strings.Contains(err.Error(), "help requested") }
