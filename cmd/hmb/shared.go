package main

import (
	"flag"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"

	"hmb/thermo/units"
)

// systemFlags are the --si and --us options every command that shows results takes.
type systemFlags struct{ si, us *bool }

func addSystemFlags(fset *flag.FlagSet) systemFlags {
	return systemFlags{
		si: fset.Bool("si", false, "show results in SI units"),
		us: fset.Bool("us", false, "show results in US customary units"),
	}
}

// display is the system the options ask for, or nil when neither is set (the file's own, or
// what the command infers).
func (s systemFlags) display() (*units.System, error) {
	switch {
	case *s.si && *s.us:
		return nil, usageErr("--si and --us exclude each other")
	case *s.si:
		v := units.SI
		return &v, nil
	case *s.us:
		v := units.US
		return &v, nil
	}
	return nil, nil
}

// writeFileAtomic writes path through a temporary file in the same directory and a rename, so a
// crash or a reader never sees half a file: the old file or the new one, never a mix. An existing
// file keeps its mode; a new one gets 0644. Anything but a regular file is refused.
func writeFileAtomic(path string, data []byte) error {
	mode := fs.FileMode(0o644)
	if info, err := os.Stat(path); err == nil {
		if !info.Mode().IsRegular() {
			return fmt.Errorf("%s is not a regular file", path)
		}
		mode = info.Mode().Perm()
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
	if err := tmp.Chmod(mode); err != nil {
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
