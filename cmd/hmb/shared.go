package main

import (
	"flag"

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
