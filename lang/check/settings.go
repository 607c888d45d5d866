package check

import (
	"fmt"
	"slices"
	"strings"

	"hmb/lang/ast"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// Settings lists the top-level settings, for completion and suggestions.
var Settings = append(slices.Clone(baseSettings), displayKeys()...)

var baseSettings = []string{"title", "display", "atmosphere", "elevation", "tolerance", "ambient",
	"project", "document", "revision", "prepared_by", "checked_by", "date"}

// sheetFields are the settings of the report's title block: each takes a string.
var sheetFields = map[string]func(*model.Sheet) *string{
	"project":     func(s *model.Sheet) *string { return &s.Project },
	"document":    func(s *model.Sheet) *string { return &s.Document },
	"revision":    func(s *model.Sheet) *string { return &s.Revision },
	"prepared_by": func(s *model.Sheet) *string { return &s.PreparedBy },
	"checked_by":  func(s *model.Sheet) *string { return &s.CheckedBy },
	"date":        func(s *model.Sheet) *string { return &s.Date },
}

// DisplayPrefix starts a setting that chooses the unit one quantity is shown in:
// display_flow t/h, display_pressure barg.
const DisplayPrefix = "display_"

// DisplayQuantities are the quantities a file may choose a display unit for, with the
// dimension each is measured in; the setting is DisplayPrefix and the name. A chosen
// temperature scale also shows the temperature differences.
var DisplayQuantities = []struct {
	Name string
	Dim  units.Dim
	Doc  string
}{
	{"flow", units.MassFlow, "mass flows"},
	{"vol_flow", units.VolumeFlow, "volumetric flows"},
	{"pressure", units.Pressure, "pressures (a gauge unit shows gauge readings) and pressure drops"},
	{"temperature", units.Temperature, "temperatures and temperature differences"},
	{"enthalpy", units.SpecificEnergy, "specific enthalpies"},
	{"entropy", units.SpecificEntropy, "specific entropies"},
	{"volume", units.SpecificVolume, "specific volumes"},
	{"density", units.Density, "densities"},
	{"power", units.ShaftPower, "shaft powers (turbines, pumps, the totals' power)"},
	{"duty", units.Power, "heat duties, fuel and the totals' heat"},
	{"heat_rate", units.HeatRate, "the heat rate"},
}

func displayKeys() []string {
	out := make([]string, len(DisplayQuantities))
	for i, q := range DisplayQuantities {
		out[i] = DisplayPrefix + q.Name
	}
	return out
}

// DisplayQuantity is the quantity a display_ setting names, or nil.
func DisplayQuantity(key string) (name string, dim units.Dim, ok bool) {
	for _, q := range DisplayQuantities {
		if DisplayPrefix+q.Name == key {
			return q.Name, q.Dim, true
		}
	}
	return "", 0, false
}

// settings reads the top-level settings first, wherever they stand: gauge pressures anywhere in
// the file need the site atmosphere.
func (c *checker) settings() {
	seen := map[string]*ast.Setting{}
	for _, s := range c.f.Stmts {
		s, ok := s.(*ast.Setting)
		if !ok {
			continue
		}
		key := s.Key.Name
		if !slices.Contains(Settings, key) {
			if _, isKind := model.Kinds[key]; isKind {
				c.errorf(CodeUnknownSetting, s, "%s needs a block: %s NAME { ... } with its streams", key, key)
				continue
			}
			d := c.errorf(CodeUnknownSetting, s.Key, "unknown setting %s (settings: %s)", key, strings.Join(baseSettings, ", ")+", "+DisplayPrefix+"QUANTITY")
			suggest(d, key, append(slices.Clone(Settings), kindNames()...))
			continue
		}
		if prev, dup := seen[key]; dup {
			d := c.errorf(CodeSettingTwice, s.Key, "%s is set twice", key)
			d.Related = related(prev, "first set here")
			continue
		}
		other := map[string]string{"atmosphere": "elevation", "elevation": "atmosphere"}[key]
		if prev, dup := seen[other]; dup {
			d := c.errorf(CodeSettingTwice, s.Key, "give the site atmosphere or the elevation, not both")
			d.Related = related(prev, other+" set here")
			continue
		}
		seen[key] = s
		c.setting(s)
	}
}

func (c *checker) setting(s *ast.Setting) {
	key := s.Key.Name
	bad := func(want string) { c.errorf(CodeSettingValue, s, "%s takes %s", key, want) }
	if _, _, ok := DisplayQuantity(key); ok {
		c.displayUnit(s)
		return
	}
	if field, ok := sheetFields[key]; ok {
		if s.Str == nil {
			bad(fmt.Sprintf("a string: %s \"...\"", key))
			return
		}
		*field(&c.m.Sheet) = s.Str.Value
		return
	}
	switch key {
	case "title":
		if s.Str == nil {
			bad("a string: title \"...\"")
			return
		}
		c.m.Title = s.Str.Value
	case "display":
		if s.Word == nil {
			bad("a unit system: SI or US")
			return
		}
		sys, ok := units.ParseSystem(s.Word.Name)
		if !ok {
			d := c.errorf(CodeSettingValue, s.Word, "unknown unit system %s: SI or US", s.Word.Name)
			suggest(d, s.Word.Name, []string{"SI", "US"})
			return
		}
		c.m.Display = sys
	case "atmosphere":
		if s.Qty == nil {
			bad("an absolute pressure: atmosphere 14.2 psia")
			return
		}
		if u, err := c.lookupUnit(spelling(s.Qty)); err == nil && u.Dim() == units.Pressure && !u.Level() {
			// A barometer reads absolute: of the readings only that one fits.
			for _, r := range u.Readings() {
				if r.Reading() == units.Absolute {
					d := c.errorf(CodeNoReading, s.Qty.Unit, "the atmosphere is an absolute pressure: write %s %s", s.Qty.Raw, r.Symbol())
					d.Fix = r.Symbol()
				}
			}
			return
		}
		v, u, ok := c.convert(s.Qty, units.Pressure, key, false)
		switch {
		case !ok:
		case u.Relative():
			c.errorf(CodeSettingValue, s.Qty, "the atmosphere is an absolute pressure, not %s", u.Symbol())
		case v <= 0:
			c.errorf(CodeImpossible, s.Qty, "the atmosphere must be above zero")
		default:
			c.m.Atm = v
		}
	case "elevation":
		if s.Qty == nil {
			bad("a height above sea level: elevation 1500 ft")
			return
		}
		v, _, ok := c.convert(s.Qty, units.Length, key, false)
		if !ok {
			return
		}
		atm, err := units.AtmosphereAt(v)
		if err != nil {
			c.errorf(CodeSettingValue, s.Qty, "%v", err)
			return
		}
		c.m.Atm = atm
	case "ambient":
		if s.Qty == nil {
			bad("a temperature: ambient 25 C")
			return
		}
		v, _, ok := c.convert(s.Qty, units.Temperature, key, false)
		switch {
		case !ok:
		case v <= 0:
			c.errorf(CodeImpossible, s.Qty, "the ambient temperature must be above absolute zero")
		default:
			c.m.Ambient = v
		}
	case "tolerance":
		if s.Qty == nil {
			bad("a relative tolerance: tolerance 0.1 %")
			return
		}
		v, _, ok := c.convert(s.Qty, units.Dimensionless, key, false)
		if ok && (v <= 0 || v >= 1) {
			c.errorf(CodeSettingValue, s.Qty, "tolerance %s%s must be above 0 and below 1 (100 %%)", s.Qty.Raw, unitSuffix(s.Qty))
			return
		}
		if ok {
			c.m.Tolerance = v
		}
	}
}

func kindNames() []string {
	names := make([]string, 0, len(model.Kinds))
	for k := range model.Kinds {
		names = append(names, k)
	}
	slices.Sort(names)
	return names
}

// displayUnit reads display_NAME UNIT: the unit one quantity is shown in, whatever the
// display system.
func (c *checker) displayUnit(s *ast.Setting) {
	name, dim, _ := DisplayQuantity(s.Key.Name)
	if s.Word == nil {
		c.errorf(CodeSettingValue, s, "%s takes a unit of %s: %s%s %s", s.Key.Name, dim, DisplayPrefix, name, examples(dim))
		return
	}
	q := &ast.Quantity{NumPos: s.Word.Pos(), Value: 1, Unit: s.Word}
	u, ok := c.unitIn(q, dim, s.Key.Name, false, false)
	if !ok {
		return
	}
	if !u.Level() {
		var alts []string
		for _, r := range u.Readings() {
			alts = append(alts, r.Symbol())
		}
		d := c.errorf(CodeNoReading, s.Word, "%s %s does not say whether pressures are shown absolute or gauge: write %s", s.Key.Name, s.Word.Name, joinOr(alts))
		if len(alts) > 0 {
			d.Fix = alts[0]
		}
		return
	}
	c.m.Pick.Set(dim, u)
}
