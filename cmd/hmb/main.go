// Command hmb checks heat and material balances of steam and water systems written as calc files.
//
//	hmb check [--format text|json|sarif] [--si|--us] [--quiet] PATH...
//	hmb fmt [-w] [--check] PATH...
//	hmb props [--si|--us] [--json] NAME=VALUE NAME=VALUE
//	hmb lsp
//
// Exit status: 0 no errors, 1 errors found (or failed expectations), 2 usage or I/O error.
package main

import (
	"fmt"
	"io"
	"os"
)

const usage = `hmb: heat and material balances of steam and water systems

usage:
  hmb check [--format text|json|sarif] [--si|--us] [--quiet] PATH...
        solve every calc file (*.hmb, directories recursively) and report problems
  hmb fmt [-w] [--check] PATH...
        print calc files in canonical layout (-w rewrites them, --check lists those that differ)
  hmb props [--si|--us] [--json] [--atm P | --elevation Z] NAME=VALUE NAME=VALUE
        water/steam state from two properties, e.g. hmb props p=150psig x=1
        NAME is any two of p T h s x; gauge pressures read against --atm or --elevation
  hmb table [--format md|csv|html] [--si|--us] [-o OUT] FILE
        stream and unit tables of one solved calc file
  hmb plot [--kind Ts|hs|ph] [--si|--us] [-o out.svg] FILE
        property diagram (SVG) with the saturation dome, isobars, streams and units
  hmb report [--si|--us] [-o out.html] FILE
        one self-contained HTML page: caution, tables, diagrams, expectations, findings
  hmb lsp
        language server on stdin and stdout (for editors; see editors/README.md)
  hmb version

Results support, and do not replace, code-compliant design and review by a licensed engineer.
`

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
