package feature

// This file implements what the editor shows of measurements (givens written with a ±): the
// hover on a measured value (measured and reconciled, both with their 95 % ±, and the
// normalised correction), the ± of every solved value, and the reconciled value as an inlay
// hint beside each reading.

import (
	"fmt"
	"math"

	"hmb/lang"
	"hmb/lsp/cache"
	"hmb/lsp/ext"
	"hmb/thermo/model"
	"hmb/thermo/reconcile"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// measuredAt returns the measured given whose statement spans byte offset off, or nil. It needs
// no solution: the model says which givens are measurements.
func measuredAt(res *lang.Result, off int) *model.Given {
	m := res.Model
	if m == nil {
		return nil
	}
	in := func(g *model.Given) bool { return g != nil && g.Measured && g.Span.Start <= off && off < g.Span.End }
	for _, s := range m.Streams {
		for _, g := range s.Given {
			if in(g) {
				return g
			}
		}
	}
	for _, u := range m.Units {
		for _, g := range u.Params {
			if in(g) {
				return g
			}
		}
	}
	return nil
}

// MeasurementHover is the Markdown description of the measurement whose given spans off: the
// reading and the reconciled value, each with its 95 % ±, the correction and the normalised
// correction with its verdict. sol may be nil (not solved).
func MeasurementHover(res *lang.Result, sol *solve.Result, off int) string {
	rec := reconcile.Of(sol)
	ms := rec.At(off)
	if ms == nil {
		return ""
	}
	disp := display(res)
	u := disp.Unit(ms.Dim)
	delta := ms.Stream < 0 && ms.Unit >= 0 && isDeltaParam(res.Model, ms.Unit, ms.Property)
	val := func(v, half float64) string {
		if math.IsNaN(v) {
			return "unknown"
		}
		num := disp.Number(ms.Dim, v)
		if delta {
			num = units.Number(u, u.DeltaFromSI(v))
		}
		return withU(num, u, half)
	}
	var b []byte
	b = fmt.Appendf(b, "**measurement** `%s %s`\n\n| | value |\n|---|---:|\n", ms.Name, ms.Property)
	b = fmt.Appendf(b, "| measured | %s |\n", val(ms.Measured, ms.UMeasured))
	b = fmt.Appendf(b, "| reconciled | %s |\n", val(ms.Reconciled, ms.UReconciled))
	switch {
	case !rec.Reconciled:
		b = append(b, "\nnot reconciled: see the error on the file"...)
	case !ms.Checked:
		b = append(b, "\nno balance checks this reading (its redundancy is zero): it is taken as read"...)
	default:
		corr := units.Format(u.DeltaFromSI(ms.Reconciled-ms.Measured), 3)
		b = fmt.Appendf(b, "| correction | %s %s |\n", corr, units.DeltaSymbol(u))
		verdict := "within 1.96"
		if ms.Suspect {
			verdict = "above 1.96: a suspect meter"
		}
		b = fmt.Appendf(b, "\nnormalised correction %s, %s; redundancy %s", units.Format(ms.Test, 3), verdict, units.Format(ms.Share, 2))
	}
	b = append(b, "\n\n± is the 95 % half-width (1.96 standard deviations)."...)
	return string(b)
}

func isDeltaParam(m *model.Model, u int, param string) bool {
	if m == nil || u >= len(m.Units) || m.Units[u].Kind == nil {
		return false
	}
	p := m.Units[u].Kind.Param(param)
	return p != nil && p.Delta
}

// withU writes a number in the unit u with its 95 % ± when it has one: "18.356 ± 0.15 kg/s".
func withU(num string, u units.Unit, half float64) string {
	s := num
	if half > 0 {
		s += " ± " + reconcile.FormatU(u, half)
	}
	if sym := u.Symbol(); sym != "" {
		s += " " + sym
	}
	return s
}

// showU writes a solved result in its display unit with its 95 % ± (none when it follows from
// exact givens alone, or the file has no measurements).
func showU(d units.Display, r *model.ResultSpec, v, half float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "unknown"
	}
	if !(half > 0) {
		return r.Show(d, v)
	}
	if r.Delta {
		dim := r.Dim
		if dim == units.Temperature {
			dim = units.TemperatureDiff
		}
		u := d.Unit(dim)
		return withU(units.Number(u, u.DeltaFromSI(v)), u, half)
	}
	return withU(d.Number(r.Dim, v), d.Unit(r.Dim), half)
}

// MeasurementHints are the reconciled values beside each measurement that a balance checks,
// for the givens that end inside span: "reconciled 18.356 ± 0.15 kg/s".
func MeasurementHints(snap *cache.Snapshot, res *lang.Result, sol *solve.Result, span model.Span) []ext.InlayHint {
	rec := reconcile.Of(sol)
	if rec == nil || !rec.Reconciled {
		return nil
	}
	disp := display(res)
	var out []ext.InlayHint
	for _, ms := range rec.Measurements {
		end := ms.Given.Span.End
		if !ms.Checked || end < span.Start || end > span.End {
			continue
		}
		u := disp.Unit(ms.Dim)
		num := disp.Number(ms.Dim, ms.Reconciled)
		if ms.Stream < 0 && isDeltaParam(res.Model, ms.Unit, ms.Property) {
			num = units.Number(u, u.DeltaFromSI(ms.Reconciled))
		}
		label := "reconciled " + withU(num, u, ms.UReconciled)
		if ms.Suspect {
			label += " (suspect)"
		}
		out = append(out, ext.InlayHint{Position: snap.Mapper.Position(end), Label: label, Kind: ext.InlayHintType, PaddingLeft: true})
	}
	return out
}
