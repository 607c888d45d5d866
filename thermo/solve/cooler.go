package solve

// Cooler: heat removed from one stream (a condenser drawn without its cooling water).
//
//	mass:     m_in = m_out
//	energy:   m h_in = m h_out + duty
//	pressure: p_out = p_in - dp
//
// Entropy generation as for the heater (heater.go): with T_boundary (the cooling water or air the
// heat goes to) S_gen = m (s_out - s_in) + duty / T_boundary; without it only the fluid's own
// pressure drop counts, the heat taken as leaving at the fluid's temperature.
func init() { ops["cooler"] = unitOp{buildCooler, finishHeated} }

func buildCooler(b *builder, u int) {
	in, out := b.port(u, "in"), b.port(u, "out")
	q := b.param(u, "duty", true, 0)
	b.massBalance(u, []int{in}, []int{out})
	b.energyBalance(u, "", []int{in}, []int{out}, nil, []term{q})
	b.pressureDrop(u, in, out, b.drop(u, "dp"), "")
}
