package main

import (
	"context"
	"flag"
	"io"

	"hmb/lsp"
)

// runLSP serves the language server protocol on stdin and stdout; logs go to stderr.
func runLSP(args []string, stdin io.Reader, stdout, stderr io.Writer) error {
	if len(args) == 1 && (args[0] == "--help" || args[0] == "-help" || args[0] == "-h") {
		writeCommandHelp(stdout, flag.NewFlagSet("lsp", flag.ContinueOnError))
		return nil
	}
	if len(args) > 0 {
		return usageErr("hmb lsp takes no arguments (it speaks the language server protocol on stdin and stdout)")
	}
	if err := lsp.Run(context.Background(), stdin, stdout, stderr); err != nil {
		return &exitError{code: 1, msg: err.Error()}
	}
	return nil
}
