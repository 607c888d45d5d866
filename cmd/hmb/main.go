// Command hmb checks heat and material balances of steam and water systems written as calc files.
//
//	hmb check [--format text|json|sarif] [--si|--us] [--quiet] PATH...
//	hmb fmt [-w] [--check] PATH...
//	hmb props [--si|--us] [--json] NAME=VALUE NAME=VALUE
//	hmb table | plot | report [options] FILE   (--case NAME, --sweep NAME: a case, a sweep)
//	hmb lsp
//
// hmb COMMAND --help prints a command's usage and options.
//
// Exit status: 0 no errors, 1 errors found (or failed expectations), 2 usage or I/O error.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"
)

// command is one subcommand as its usage shows it: the options and arguments it takes and what
// it does (one line each).
type command struct {
	name, args string
	doc        []string
}

var commands = []command{
	{"check", "[--format text|json|sarif] [--si|--us] [--quiet] PATH...",
		[]string{"solve every calc file (*.hmb, directories recursively) and report problems"}},
	{"fmt", "[-w] [--check] PATH...",
		[]string{"print calc files in canonical layout (-w rewrites them, --check lists those that differ)"}},
	{"props", "[--si|--us] [--json] [--atm P | --elevation Z] NAME=VALUE NAME=VALUE",
		[]string{"water/steam state from two properties, e.g. hmb props p=150psig x=1",
			"NAME is any two of p T h s x; gauge and vacuum readings against --atm or --elevation"}},
	{"table", "[--format md|csv|html] [--si|--us] [--case NAME | --sweep NAME [--result R]...] [-o OUT] FILE",
		[]string{"stream and unit tables of one solved calc file, its cases side by side;",
			"--case shows one case, --sweep a sweep's results against the swept value (md or csv)"}},
	{"plot", "[--kind Ts|hs|ph|flowsheet] [--full-dome] [--values] [--si|--us] [--case NAME | --sweep NAME [--result R]...] [-o out.svg] FILE",
		[]string{"property diagram (SVG) with the saturation dome, isobars, streams and units, or the",
			"heat and material balance diagram (flowsheet): equipment symbols and tagged streams;",
			"--sweep draws a sweep's results against the swept value"}},
	{"report", "[--si|--us] [-o out.html] FILE",
		[]string{"one self-contained HTML page: caution, tables, diagrams, expectations, findings"}},
	{"lsp", "",
		[]string{"language server on stdin and stdout (for editors; see editors/README.md)"}},
	{"version", "", nil},
}

const caution = "Results support, and do not replace, code-compliant design and review by a licensed engineer.\n"

// synopsis is "hmb NAME ARGS" of a command.
func (c command) synopsis() string {
	if c.args == "" {
		return "hmb " + c.name
	}
	return "hmb " + c.name + " " + c.args
}

// usage is what hmb prints with no command or with --help.
var usage = func() string {
	var b strings.Builder
	b.WriteString("hmb: heat and material balances of steam and water systems\n\nusage:\n")
	for _, c := range commands {
		b.WriteString("  " + c.synopsis() + "\n")
		for _, d := range c.doc {
			b.WriteString("        " + d + "\n")
		}
	}
	b.WriteString("\nhmb COMMAND --help describes one command.\n\n" + caution)
	return b.String()
}()

// parseFlags parses a command's options. --help (or -h) prints the command's usage and its
// options to stdout and ends the command with status 0; a bad option is a usage error (status 2)
// that points at --help.
func parseFlags(fs *flag.FlagSet, args []string, stdout io.Writer) error {
	err := fs.Parse(args)
	if err == nil {
		return nil
	}
	if !errors.Is(err, flag.ErrHelp) {
		return usageErr("%v (hmb %s --help lists the options)", err, fs.Name())
	}
	writeCommandHelp(stdout, fs)
	return &exitError{code: 0}
}

// writeCommandHelp writes the usage of the command fs parses for, and its options.
func writeCommandHelp(w io.Writer, fs *flag.FlagSet) {
	for _, c := range commands {
		if c.name != fs.Name() {
			continue
		}
		fmt.Fprintf(w, "usage: %s\n\n", c.synopsis())
		for _, d := range c.doc {
			fmt.Fprintln(w, d)
		}
	}
	n := 0
	fs.VisitAll(func(*flag.Flag) { n++ })
	if n > 0 {
		fmt.Fprintln(w, "\noptions:")
		out := fs.Output()
		fs.SetOutput(w)
		fs.PrintDefaults()
		fs.SetOutput(out)
	}
	fmt.Fprint(w, "\n"+caution)
}

// exitError carries an exit status up to main.
type exitError struct {
	code int
	msg  string
}

func (e *exitError) Error() string { return e.msg }

func usageErr(format string, a ...any) error {
	return &exitError{code: 2, msg: fmt.Sprintf(format, a...)}
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// run is main without the process: tests call it.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, usage)
		return 2
	}
	var err error
	switch args[0] {
	case "props":
		err = runProps(args[1:], stdout)
	case "check":
		err = runCheck(args[1:], stdout, stderr)
	case "fmt":
		err = runFmt(args[1:], stdout, stderr)
	case "lsp":
		err = runLSP(args[1:], stdin, stdout, stderr)
	case "table":
		err = runTable(args[1:], stdout, stderr)
	case "plot":
		err = runPlot(args[1:], stdout, stderr)
	case "report":
		err = runReport(args[1:], stdout, stderr)
	case "version", "--version":
		fmt.Fprintln(stdout, "hmb", version)
		return 0
	case "help", "-h", "--help":
		if len(args) == 2 && args[0] == "help" && args[1] != "help" && args[1] != "version" {
			return run([]string{args[1], "--help"}, stdin, stdout, stderr) // hmb help check
		}
		fmt.Fprint(stdout, usage)
		return 0
	default:
		fmt.Fprintf(stderr, "hmb: unknown command %q\n\n%s", args[0], usage)
		return 2
	}
	if err == nil {
		return 0
	}
	if e, ok := err.(*exitError); ok {
		if e.msg != "" {
			fmt.Fprintln(stderr, "hmb "+args[0]+": "+e.msg)
		}
		return e.code
	}
	fmt.Fprintln(stderr, "hmb "+args[0]+": "+err.Error())
	return 2
}

const version = "0.1.0-dev"
