package solve

import "hmb/thermo/model"

// Totals are the whole file's shaft powers and heat duties, W (model.TotalResults reads them
// by name). A sum is NaN when one of its terms was not solved.
//
//	PowerOut = sum of the turbines' shaft power
//	PowerIn  = sum of the pumps' shaft power
//	HeatIn   = sum of the boilers' and heaters' duty, and of the duty of exchangers heated
//	           from outside the file (hot side from and to the battery limit, cold side not)
//	HeatOut  = sum of the coolers' duty, and of the duty of exchangers cooled from outside the
//	           file (a surface condenser: cold side from and to the battery limit, hot side not)
//
// An exchanger between two streams of the file (a feedwater heater) moves heat inside it and
// counts in neither. A boiler's duty is the heat its water takes, not the fuel's.
type Totals struct {
	PowerOut, PowerIn, HeatIn, HeatOut float64
}

// totals sums the units' results into Result.Totals.
func (s *solveRun) totals() {
	s.res.Totals = totalsOf(s.m, s.res)
}

func totalsOf(m *model.Model, res *Result) *Totals {
	t := &Totals{}
	// A stream crosses the battery limit at an end no unit takes: it leaves no unit or enters
	// none.
	from := make([]bool, len(m.Streams)) // leaves some unit
	to := make([]bool, len(m.Streams))   // enters some unit
	for _, u := range m.Units {
		if u == nil || u.Kind == nil {
			continue
		}
		for _, p := range u.Ports {
			spec := u.Kind.Port(p.Role)
			if spec == nil || p.Stream < 0 || p.Stream >= len(m.Streams) {
				continue
			}
			if spec.Inlet {
				to[p.Stream] = true
			} else {
				from[p.Stream] = true
			}
		}
	}
	// outside: a side of an exchanger whose inlet comes from no unit and whose outlet goes to
	// none.
	outside := func(u *model.Unit, in, out string) bool {
		i, o := portOf(u, in), portOf(u, out)
		return i >= 0 && o >= 0 && !from[i] && !to[o]
	}
	for k, u := range m.Units {
		if u == nil || u.Kind == nil || k >= len(res.Units) {
			continue
		}
		r := &res.Units[k]
		switch u.Kind.Name {
		case "turbine":
			t.PowerOut += r.W
		case "pump":
			t.PowerIn += r.W
		case "boiler", "heater":
			t.HeatIn += r.Q
		case "cooler":
			t.HeatOut += r.Q
		case "exchanger":
			hot, cold := outside(u, "hot_in", "hot_out"), outside(u, "cold_in", "cold_out")
			switch {
			case hot && !cold:
				t.HeatIn += r.Q
			case cold && !hot:
				t.HeatOut += r.Q
			}
		}
	}
	return t
}

// portOf is the stream of a unit's role, or -1.
func portOf(u *model.Unit, role string) int {
	for _, p := range u.Ports {
		if p.Role == role {
			return p.Stream
		}
	}
	return -1
}
