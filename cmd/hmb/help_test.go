package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestCommandHelp: hmb COMMAND --help (and -h, and hmb help COMMAND) prints that command's usage
// and every option it takes to stdout, and exits 0.
func TestCommandHelp(t *testing.T) {
	options := map[string][]string{
		"check":  {"-format", "-si", "-us", "-quiet"},
		"fmt":    {"-w", "-check"},
		"props":  {"-json", "-atm", "-elevation", "-si", "-us"},
		"table":  {"-format", "-o", "-si", "-us"},
		"plot":   {"-kind", "-full-dome", "-o", "-si", "-us"},
		"report": {"-o", "-si", "-us"},
		"lsp":    nil,
	}
	for _, c := range commands {
		if c.name == "version" {
			continue
		}
		opts, ok := options[c.name]
		if !ok {
			t.Errorf("command %s has no row in this test", c.name)
		}
		for _, args := range [][]string{{c.name, "--help"}, {c.name, "-h"}, {"help", c.name}} {
			var out, errb bytes.Buffer
			code := run(args, strings.NewReader(""), &out, &errb)
			if code != 0 || errb.Len() != 0 {
				t.Errorf("%v: exit %d, stderr %q; want 0 and nothing", args, code, errb.String())
			}
			text := out.String()
			if !strings.HasPrefix(text, "usage: hmb "+c.name) || !strings.Contains(text, c.doc[0]) ||
				!strings.Contains(text, "licensed engineer") {
				t.Errorf("%v: help is\n%s", args, text)
			}
			for _, o := range opts {
				if !strings.Contains(text, "  "+o+" ") && !strings.Contains(text, "  "+o+"\n") && !strings.Contains(text, "  "+o+"\t") {
					t.Errorf("%v: help does not list %s:\n%s", args, o, text)
				}
			}
		}
	}
}

// TestBadOption: an unknown option is a usage error (exit 2) that points at --help.
func TestBadOption(t *testing.T) {
	for _, c := range []string{"check", "fmt", "props", "table", "plot", "report"} {
		var out, errb bytes.Buffer
		code := run([]string{c, "--no-such-option"}, nil, &out, &errb)
		want := "hmb " + c + ": flag provided but not defined: -no-such-option (hmb " + c + " --help lists the options)\n"
		if code != 2 || errb.String() != want || out.Len() != 0 {
			t.Errorf("%s: exit %d, stderr %q, stdout %q; want 2, %q", c, code, errb.String(), out.String(), want)
		}
	}
}
