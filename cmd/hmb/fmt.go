package main

import (
	"bytes"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

func runFmt(args []string, stdout, stderr io.Writer) error {
	fset := flag.NewFlagSet("fmt", flag.ContinueOnError)
	fset.SetOutput(io.Discard)
	write := fset.Bool("w", false, "rewrite files in place")
	check := fset.Bool("check", false, "list files whose layout differs; exit 1 if any")
	if err := fset.Parse(args); err != nil {
		return usageErr("%v", err)
	}
	if *write && *check {
		return usageErr("-w and --check exclude each other")
	}
	if fset.NArg() == 0 {
		return usageErr("no files: give calc files (*.hmb) or directories")
	}
	paths, err := collectFiles(fset.Args())
	if err != nil {
		return &exitError{code: 2, msg: err.Error()}
	}
	differ, failed := 0, 0
	for _, p := range paths {
		src, err := os.ReadFile(p)
		if err != nil {
			return &exitError{code: 2, msg: err.Error()}
		}
		out, err := formatSource(p, src)
		if err != nil {
			// A file that does not parse is never rewritten.
			fmt.Fprintf(stderr, "%v\n", err)
			failed++
			continue
		}
		same := bytes.Equal(src, out)
		switch {
		case *check:
			if !same {
				fmt.Fprintln(stdout, p)
				differ++
			}
		case *write:
			if !same {
				if err := writeFileAtomic(p, out); err != nil {
					return &exitError{code: 2, msg: err.Error()}
				}
			}
		default:
			stdout.Write(out)
		}
	}
	if failed > 0 {
		return &exitError{code: 1, msg: fmt.Sprintf("%d file(s) do not parse; left unchanged", failed)}
	}
	if differ > 0 {
		return &exitError{code: 1}
	}
	return nil
}

// writeFileAtomic replaces path with data through a temporary file in the same directory and a
// rename, so a crash leaves either the old file or the new one, never half of one.
func writeFileAtomic(path string, data []byte) error {
	info, err := os.Stat(path)
	if err != nil {
		return err
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	defer os.Remove(name) // no-op after a successful rename
	if _, err := tmp.Write(data); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Chmod(info.Mode().Perm()); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Sync(); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	return os.Rename(name, path)
}
