package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"hmb/thermo/if97"
	"hmb/thermo/units"
)

// propInput is one NAME=VALUE argument of hmb props, converted to SI.
type propInput struct {
	name string
	si   float64
	unit units.Unit
}

var propDims = map[string]units.Dim{
	"p": units.Pressure, "T": units.Temperature, "h": units.SpecificEnergy,
	"s": units.SpecificEntropy, "x": units.Dimensionless,
}

func runProps(args []string, stdout io.Writer) error {
	fs := flag.NewFlagSet("props", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	sysFlags := addSystemFlags(fs)
	asJSON := fs.Bool("json", false, "print one JSON object in SI base units")
	atmArg := fs.String("atm", "", "site atmosphere for gauge pressures, e.g. 12.9psia")
	elevArg := fs.String("elevation", "", "site elevation for gauge pressures, e.g. 1500m")
	// Options may follow the properties too (hmb props p=1MPa h=2800kJ/kg --json): parse them
	// wherever they stand, up to a "--".
	var positional []string
	for rest := args; ; {
		if err := parseFlags(fs, rest, stdout); err != nil {
			return err
		}
		rest = fs.Args()
		i := 0
		for i < len(rest) && !isOption(rest[i]) {
			i++
		}
		positional = append(positional, rest[:i]...)
		if i == len(rest) {
			break
		}
		if rest[i] == "--" {
			positional = append(positional, rest[i+1:]...)
			break
		}
		rest = rest[i:]
	}
	display, err := sysFlags.display()
	if err != nil {
		return err
	}
	atm, err := siteAtmosphere(*atmArg, *elevArg)
	if err != nil {
		return usageErr("%v", err)
	}
	pairs, err := propPairs(positional)
	if err != nil {
		return usageErr("%v", err)
	}
	if len(pairs) != 2 {
		return usageErr("need exactly two properties, e.g. p=150psig x=1 (got %d)", len(pairs))
	}
	var in [2]propInput
	for i, a := range pairs {
		if in[i], err = parsePropArg(a, atm); err != nil {
			return usageErr("%v", err)
		}
	}
	if in[0].name == in[1].name {
		return usageErr("%s is given twice", in[0].name)
	}
	st, err := stateFrom(in[0], in[1])
	if err != nil {
		return usageErr("%v", err)
	}
	if *asJSON {
		return writeStateJSON(stdout, st)
	}
	sys := inferSystem(in[:])
	if display != nil {
		sys = *display
	}
	writeStateTable(stdout, st, sys, atm)
	return nil
}

func siteAtmosphere(atmArg, elevArg string) (float64, error) {
	switch {
	case atmArg != "" && elevArg != "":
		return 0, errors.New("--atm and --elevation exclude each other")
	case atmArg != "":
		if _, sp, err := units.ParseQuantity(atmArg); err == nil {
			if u, err := units.Lookup(sp); err == nil && u.Dim() == units.Pressure && !u.Level() {
				for _, r := range u.Readings() {
					if r.Reading() == units.Absolute {
						num := strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(atmArg), sp))
						return 0, fmt.Errorf("--atm: the site atmosphere is an absolute pressure: write %s%s", num, r.Symbol())
					}
				}
			}
		}
		v, u, err := quantity(atmArg, units.Pressure)
		if err != nil {
			return 0, fmt.Errorf("--atm: %v", err)
		}
		if u.Relative() {
			return 0, fmt.Errorf("--atm: the site atmosphere must be an absolute pressure, not %s", u.Symbol())
		}
		p := u.ToSI(v, units.StandardAtmosphere)
		if !(p > 0) {
			return 0, fmt.Errorf("--atm: %s is not a positive pressure", atmArg)
		}
		return p, nil
	case elevArg != "":
		v, u, err := quantity(elevArg, units.Length)
		if err != nil {
			return 0, fmt.Errorf("--elevation: %v", err)
		}
		p, err := units.AtmosphereAt(u.ToSI(v, 0))
		if err != nil {
			return 0, fmt.Errorf("--elevation: %v", err)
		}
		return p, nil
	}
	return units.StandardAtmosphere, nil
}

// quantity parses "150psig" and checks that its unit has dimension d.
func quantity(s string, d units.Dim) (float64, units.Unit, error) {
	v, spelling, err := units.ParseQuantity(s)
	if err != nil {
		return 0, units.Unit{}, err
	}
	if spelling == "" && d != units.Dimensionless {
		return 0, units.Unit{}, fmt.Errorf("%q needs a unit of %s, e.g. %s", s, d, units.SI.Default(d).Symbol())
	}
	u, err := units.Lookup(spelling)
	if err != nil {
		return 0, units.Unit{}, err
	}
	if !u.Measures(d) && !(d == units.Temperature && u.Dim() == units.TemperatureDiff) {
		return 0, units.Unit{}, fmt.Errorf("%s is a unit of %s, not of %s", u.Symbol(), u.Dim(), d)
	}
	if !u.Level() {
		num := strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(s), spelling))
		var words, spell []string
		for _, r := range u.Readings() {
			words = append(words, map[units.Reading]string{units.Absolute: "absolute", units.Gauge: "gauge",
				units.Vacuum: "a vacuum below the site atmosphere"}[r.Reading()])
			spell = append(spell, num+r.Symbol())
		}
		return 0, units.Unit{}, fmt.Errorf("%s does not say whether it is %s: write %s",
			s, strings.Join(words, " or "), strings.Join(spell, " or "))
	}
	return v, u, nil
}

// isOption reports whether a word is an option (--json, -si) rather than part of a property:
// a value may start with a minus sign, never with a minus and a letter.
func isOption(w string) bool {
	if w == "--" {
		return true
	}
	if len(w) < 2 || w[0] != '-' {
		return false
	}
	c := strings.TrimLeft(w, "-")
	return c != "" && (c[0] >= 'a' && c[0] <= 'z' || c[0] >= 'A' && c[0] <= 'Z')
}

// propName is the property a NAME argument stands for: T in either case, p h s x in either case.
func propName(name string) string {
	name = strings.TrimSpace(name)
	switch name {
	case "t":
		return "T"
	case "P", "X", "H", "S":
		return strings.ToLower(name)
	}
	return name
}

var propExamples = map[string]string{"p": "150psig", "T": "600F", "h": "1200Btu/lbm", "s": "6.5kJ/(kg K)", "x": "0.9"}

// propPairs reads the NAME=VALUE arguments, however the shell split them: "p = 10bar" and
// "p= 10 bar" (three or two arguments) are read as p=10bar. A pair starts at a word that is
// followed by "=", so a value may hold spaces ("T=250 C", "s=6.5 kJ/(kg K)").
func propPairs(args []string) ([]string, error) {
	var words []string
	for _, a := range args {
		// Split around "=" so that "p=", "=10bar" and "p=10" all become words and "=" signs.
		for k, part := range strings.Split(a, "=") {
			if k > 0 {
				words = append(words, "=")
			}
			if part = strings.TrimSpace(part); part != "" {
				words = append(words, strings.Fields(part)...)
			}
		}
	}
	var pairs []string
	for i := 0; i < len(words); {
		if i+1 < len(words) && words[i+1] != "=" && words[i] != "=" {
			if _, ok := propDims[propName(words[i])]; ok {
				return nil, fmt.Errorf("%q: write %s=%s (NAME=VALUE)", words[i]+" "+words[i+1], words[i], words[i+1])
			}
		}
		if i+1 >= len(words) || words[i+1] != "=" || words[i] == "=" {
			return nil, fmt.Errorf("%q: expected NAME=VALUE, e.g. p=150psig (arguments: %s)", words[i], strings.Join(args, " "))
		}
		name := words[i]
		j := i + 2
		for j < len(words) && words[j] != "=" && !(j+1 < len(words) && words[j+1] == "=") {
			j++
		}
		if j == i+2 {
			ex, ok := propExamples[propName(name)]
			if !ok {
				ex = "150psig"
			}
			return nil, fmt.Errorf("%s= has no value, e.g. %s=%s", name, name, ex)
		}
		pairs = append(pairs, name+"="+strings.Join(words[i+2:j], " "))
		i = j
	}
	return pairs, nil
}

func parsePropArg(arg string, atm float64) (propInput, error) {
	name, val, ok := strings.Cut(arg, "=")
	if !ok {
		return propInput{}, fmt.Errorf("%q: expected NAME=VALUE, e.g. p=150psig", arg)
	}
	name = propName(name)
	d, ok := propDims[name]
	if !ok {
		return propInput{}, fmt.Errorf("%q: unknown property %q; use p, T, h, s or x", arg, name)
	}
	v, u, err := quantity(strings.TrimSpace(val), d)
	if err != nil {
		return propInput{}, fmt.Errorf("%s: %v", name, err)
	}
	si := u.ToSI(v, atm)
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return propInput{}, fmt.Errorf("%s: %q is not a number", name, val)
	}
	if d == units.Pressure && si <= 0 {
		return propInput{}, fmt.Errorf("p: %s is %s Pa absolute, not a positive pressure", val, units.Format(si, 6))
	}
	if d == units.Dimensionless && (si < 0 || si > 1) {
		return propInput{}, fmt.Errorf("x: quality %s is outside 0..1", val)
	}
	return propInput{name: name, si: si, unit: u}, nil
}

// stateFrom finds the state from two inputs in either order.
func stateFrom(a, b propInput) (if97.State, error) {
	order := "pThsx"
	if strings.Index(order, a.name) > strings.Index(order, b.name) {
		a, b = b, a
	}
	switch a.name + b.name {
	case "pT":
		return if97.PT(a.si, b.si)
	case "ph":
		return if97.PH(a.si, b.si)
	case "ps":
		return if97.PS(a.si, b.si)
	case "px":
		return if97.PX(a.si, b.si)
	case "Tx":
		return if97.TX(a.si, b.si)
	case "Th":
		return if97.TH(a.si, b.si)
	case "Ts":
		return if97.TS(a.si, b.si)
	case "hs":
		return if97.HS(a.si, b.si)
	}
	return if97.State{}, fmt.Errorf("the pair (%s, %s) does not fix a state here; give p or T with one of T, h, s, x, or h with s", a.name, b.name)
}

// inferSystem shows results in the system the user typed: US when any input unit is US customary.
func inferSystem(in []propInput) units.System {
	for _, p := range in {
		if p.unit.Dim() != units.Dimensionless && units.US.Has(p.unit) {
			return units.US
		}
	}
	return units.SI
}

// jsonNum is a number that marshals NaN (undefined, e.g. cp inside the dome) as null.
type jsonNum float64

func (f jsonNum) MarshalJSON() ([]byte, error) {
	if math.IsNaN(float64(f)) || math.IsInf(float64(f), 0) {
		return []byte("null"), nil
	}
	return json.Marshal(float64(f))
}

func writeStateJSON(w io.Writer, st if97.State) error {
	out := struct {
		P      jsonNum `json:"p"`
		T      jsonNum `json:"T"`
		H      jsonNum `json:"h"`
		U      jsonNum `json:"u"`
		S      jsonNum `json:"s"`
		Cp     jsonNum `json:"cp"`
		Cv     jsonNum `json:"cv"`
		V      jsonNum `json:"v"`
		Rho    jsonNum `json:"rho"`
		W      jsonNum `json:"w"`
		X      jsonNum `json:"x"`
		Phase  string  `json:"phase"`
		Region int     `json:"region"`
	}{jsonNum(st.P), jsonNum(st.T), jsonNum(st.H), jsonNum(st.U), jsonNum(st.S), jsonNum(st.Cp),
		jsonNum(st.Cv), jsonNum(st.V), jsonNum(st.Rho), jsonNum(st.W), jsonNum(st.X), st.Phase.String(), st.Region}
	b, err := json.Marshal(out)
	if err != nil {
		return err
	}
	_, err = fmt.Fprintf(w, "%s\n", b)
	return err
}

// writeStateTable prints the state as a two-column table in the chosen system.
func writeStateTable(w io.Writer, st if97.State, sys units.System, atm float64) {
	row := func(name string, si float64, d units.Dim, note string) {
		u := sys.Default(d)
		val := "n/a"
		if !math.IsNaN(si) {
			val = units.Format(u.FromSI(si, atm), 6)
		}
		fmt.Fprintf(w, "  %-4s %12s %-12s %s\n", name, val, u.Symbol(), note)
	}
	fmt.Fprintf(w, "water, %s (IF97 region %d)\n", st.Phase, st.Region)
	gauge := ""
	if g := sys.Gauge(); g != (units.Unit{}) {
		// The gauge reading is p less the atmosphere: it has no digit finer than they show.
		ref := max(g.DeltaFromSI(st.P), g.DeltaFromSI(atm))
		gauge = fmt.Sprintf("(%s %s)", units.FormatDiff(g.FromSI(st.P, atm), ref, 6), g.Symbol())
	}
	row("p", st.P, units.Pressure, gauge)
	row("T", st.T, units.Temperature, "")
	if !math.IsNaN(st.X) {
		// Six decimals, so that 0 and 1 read with the digits of 0.95.
		fmt.Fprintf(w, "  %-4s %12s %-12s\n", "x", strconv.FormatFloat(st.X, 'f', 6, 64), "")
	}
	row("h", st.H, units.SpecificEnergy, "")
	row("s", st.S, units.SpecificEntropy, "")
	row("u", st.U, units.SpecificEnergy, "")
	row("v", st.V, units.SpecificVolume, "")
	row("rho", st.Rho, units.Density, "")
	row("cp", st.Cp, units.SpecificEntropy, "")
	row("cv", st.Cv, units.SpecificEntropy, "")
	row("w", st.W, units.Velocity, "")
}
