package units

// Defining constants. Go evaluates constant expressions exactly and rounds once, so each derived
// factor below is the correctly rounded value of its definition.
const (
	// International yard and pound agreement (1959).
	kgPerLbm = 0.45359237
	mPerFt   = 0.3048
	mPerInch = 0.0254

	// Standard acceleration of gravity, 3rd CGPM (1901); defines the pound-force.
	standardGravity = 9.80665
	nPerLbf         = kgPerLbm * standardGravity
	paPerPsi        = nPerLbf / (mPerInch * mPerInch) // 6894.757293168...

	// International Table Btu, 5th International Conference on the Properties of Steam (London,
	// 1956): 1 Btu_IT = 1055.05585262 J, chosen so that 1 Btu_IT/lbm = 2326 J/kg exactly.
	jPerBtu = 1055.05585262

	// Mechanical horsepower: 550 ft lbf/s.
	wPerHp = 550 * mPerFt * nPerLbf // 745.69987158227022

	// Ton of refrigeration: 12 000 Btu_IT/h (NIST SP 811 (2008) Appendix B.8).
	wPerTR = 12000 * jPerBtu / 3600

	// Conventional inch of mercury: a column of mercury at 0 degC (32 F), taken at the
	// conventional density 13 595.1 kg/m3, under standard gravity; NIST SP 811 (2008)
	// Appendix B.8 rounds it to 3.386 389 E+03 Pa.
	paPerInHg = 13595.1 * standardGravity * mPerInch

	// Conventional inch of water: a column of density 1000 kg/m3 (water near 4 degC) under
	// standard gravity; NIST SP 811 (2008) Appendix B.8 lists 2.490 889 E+02 Pa.
	paPerInH2O = 1000 * standardGravity * mPerInch

	// Conventional millimetre of mercury, as the inch above; NIST SP 811 (2008) Appendix B.8
	// lists 1.333 224 E+02 Pa.
	paPerMmHg = 13595.1 * standardGravity * 1e-3

	// Kilogram-force per square centimetre: the kilogram-force is 1 kg under standard gravity;
	// NIST SP 811 (2008) Appendix B.8 lists 9.806 65 E+04 Pa (exact).
	paPerKgfCm2 = standardGravity / 1e-4

	// International Table calorie, 5th International Conference on the Properties of Steam
	// (London, 1956): 4.1868 J exactly (NIST SP 811 (2008) Appendix B.8, cal_IT).
	jPerKcal = 4186.8

	// Standard atmosphere, 10th CGPM (1954).
	paPerAtm = 101325.0
	paPerBar = 1e5

	// The kelvin and the rankine share the zero; one rankine is 5/9 kelvin.
	kPerR = 5.0 / 9.0

	// US liquid gallon: 231 cubic inches exactly (NIST SP 811 (2008) Appendix B.8 lists
	// 3.785 412 E-03 m3; B.9 lists the gallon (U.S.) per minute as 6.309 020 E-05 m3/s).
	m3PerGal = 231 * mPerInch * mPerInch * mPerInch

	// Kilowatt hour: 3.6 MJ exactly (NIST SP 811 (2008) Appendix B.8).
	jPerKWh = 3.6e6
)

// StandardAtmosphere is the default site atmosphere for gauge pressures, in Pa.
const StandardAtmosphere = paPerAtm

// def is one unit: SI = (v + offset) * scale; v*scale + atm for gauge units, atm - v*scale for
// vacuum readings.
type def struct {
	sym     string
	dim     Dim
	scale   float64
	offset  float64
	reading Reading
	us      bool // US customary family (for choosing a display system from what was typed)
	// strict units accept no case variants: the case of a leading M or m is the difference
	// between mega and milli. Single-letter spellings are always strict (K is not k).
	strict bool
	alt    []string
}

// defs lists every unit; index 0 is the bare number. Canonical symbols come first in each group
// because suggestions prefer earlier candidates on a tie.
var defs = []def{
	{sym: "", dim: Dimensionless, scale: 1},
	{sym: "%", dim: Dimensionless, scale: 0.01},
	{sym: "frac", dim: Dimensionless, scale: 1},

	// Pressure: absolute unless marked otherwise. SI units are absolute by definition; psi and the
	// bare columns (inHg, inH2O, mmHg) and kgf/cm2 say no reading, so they state differences only
	// (a drop, a tolerance) and a pressure itself needs its reading spelt out.
	{sym: "Pa", dim: Pressure, scale: 1},
	{sym: "hPa", dim: Pressure, scale: 100},
	{sym: "kPa", dim: Pressure, scale: 1e3, alt: []string{"kPa(a)", "kPaa"}},
	{sym: "MPa", dim: Pressure, scale: 1e6, strict: true, alt: []string{"MPa(a)", "MPaa"}},
	{sym: "bar", dim: Pressure, scale: paPerBar, alt: []string{"bara", "bar(a)"}},
	{sym: "mbar", dim: Pressure, scale: paPerBar / 1000, strict: true},
	{sym: "psia", us: true, dim: Pressure, scale: paPerPsi, alt: []string{"psi(a)"}},
	{sym: "atm", dim: Pressure, scale: paPerAtm},
	{sym: "psig", us: true, dim: Pressure, scale: paPerPsi, reading: Gauge, alt: []string{"psi(g)"}},
	{sym: "bar(g)", dim: Pressure, scale: paPerBar, reading: Gauge, alt: []string{"barg"}},
	{sym: "kPa(g)", dim: Pressure, scale: 1e3, reading: Gauge, alt: []string{"kPag"}},
	{sym: "MPa(g)", dim: Pressure, scale: 1e6, reading: Gauge, strict: true, alt: []string{"MPag"}},
	{sym: "psi", us: true, dim: Pressure, scale: paPerPsi, reading: Difference, alt: []string{"psid", "psi(d)"}},
	{sym: "inHg(abs)", us: true, dim: Pressure, scale: paPerInHg, alt: []string{"inHg(a)"}},
	{sym: "inHg(vac)", us: true, dim: Pressure, scale: paPerInHg, reading: Vacuum},
	{sym: "inHg", us: true, dim: Pressure, scale: paPerInHg, reading: Difference},
	{sym: "inH2O(abs)", us: true, dim: Pressure, scale: paPerInH2O, alt: []string{"inH2O(a)"}},
	{sym: "inH2O(vac)", us: true, dim: Pressure, scale: paPerInH2O, reading: Vacuum},
	{sym: "inH2O", us: true, dim: Pressure, scale: paPerInH2O, reading: Difference},
	{sym: "mmHg(abs)", dim: Pressure, scale: paPerMmHg, alt: []string{"mmHg(a)"}},
	{sym: "mmHg(vac)", dim: Pressure, scale: paPerMmHg, reading: Vacuum},
	{sym: "mmHg", dim: Pressure, scale: paPerMmHg, reading: Difference},
	{sym: "kgf/cm2(a)", dim: Pressure, scale: paPerKgfCm2, alt: []string{"kgf/cm2a", "kg/cm2(a)", "kg/cm2a"}},
	{sym: "kgf/cm2(g)", dim: Pressure, scale: paPerKgfCm2, reading: Gauge, alt: []string{"kgf/cm2g", "kg/cm2(g)", "kg/cm2g"}},
	{sym: "kgf/cm2", dim: Pressure, scale: paPerKgfCm2, reading: Difference, alt: []string{"kg/cm2"}},

	// Temperature (absolute scales).
	{sym: "K", dim: Temperature, scale: 1, alt: []string{"degK"}},
	{sym: "C", dim: Temperature, scale: 1, offset: 273.15, alt: []string{"degC", "°C", "℃"}},
	{sym: "F", us: true, dim: Temperature, scale: kPerR, offset: 459.67, alt: []string{"degF", "°F", "℉"}},
	{sym: "R", us: true, dim: Temperature, scale: kPerR, alt: []string{"degR", "°R"}},

	// Temperature differences: scale only; SI base is the kelvin.
	{sym: "dK", dim: TemperatureDiff, scale: 1, alt: []string{"ΔK"}},
	{sym: "dC", dim: TemperatureDiff, scale: 1, alt: []string{"ΔC", "Δ°C"}},
	{sym: "dF", us: true, dim: TemperatureDiff, scale: kPerR, alt: []string{"ΔF", "Δ°F"}},
	{sym: "dR", us: true, dim: TemperatureDiff, scale: kPerR, alt: []string{"ΔR", "Δ°R"}},

	// Specific energy (enthalpy).
	{sym: "J/kg", dim: SpecificEnergy, scale: 1},
	{sym: "kJ/kg", dim: SpecificEnergy, scale: 1e3},
	{sym: "MJ/kg", dim: SpecificEnergy, scale: 1e6, strict: true},
	{sym: "Btu/lbm", us: true, dim: SpecificEnergy, scale: jPerBtu / kgPerLbm, alt: []string{"Btu/lb"}},
	{sym: "kcal/kg", dim: SpecificEnergy, scale: jPerKcal},

	// Specific entropy; a kelvin and a degree Celsius (a rankine and a degree Fahrenheit) are the
	// same size, so the per-degree spellings share a unit.
	{sym: "J/(kg K)", dim: SpecificEntropy, scale: 1, alt: []string{
		"J/(kg·K)", "J/(kg*K)", "J/(kg.K)", "J/kgK", "J/kg-K", "J/kg/K", "J/kg·K"}},
	{sym: "kJ/(kg K)", dim: SpecificEntropy, scale: 1e3, alt: []string{
		"kJ/(kg·K)", "kJ/(kg*K)", "kJ/(kg.K)", "kJ/kgK", "kJ/kg-K", "kJ/kg/K", "kJ/kg·K",
		"kJ/(kg C)", "kJ/(kg·C)", "kJ/(kg*C)", "kJ/(kg.C)", "kJ/(kg-C)", "kJ/kgC", "kJ/kg-C", "kJ/kg/C",
		"kJ/(kg °C)", "kJ/(kg·°C)", "kJ/(kg*°C)", "kJ/(kg.°C)", "kJ/(kg-°C)", "kJ/kg°C", "kJ/kg-°C", "kJ/kg·°C", "kJ/kg/°C",
		"kJ/(kg degC)", "kJ/(kg*degC)", "kJ/(kg.degC)", "kJ/(kg-degC)", "kJ/kgdegC", "kJ/kg-degC", "kJ/kg/degC"}},
	{sym: "kcal/(kg K)", dim: SpecificEntropy, scale: jPerKcal, alt: []string{
		"kcal/(kg·K)", "kcal/(kg*K)", "kcal/kgK", "kcal/kg-K", "kcal/kg/K",
		"kcal/(kg C)", "kcal/(kg °C)", "kcal/(kg·°C)", "kcal/(kg*C)", "kcal/kgC", "kcal/kg-C", "kcal/kg-°C", "kcal/kg/C"}},
	{sym: "Btu/(lbm R)", us: true, dim: SpecificEntropy, scale: jPerBtu / kgPerLbm / kPerR, alt: []string{
		"Btu/(lbm·R)", "Btu/(lbm*R)", "Btu/lbmR", "Btu/lbm-R", "Btu/lbm/R", "Btu/lbm-°R",
		"Btu/(lb R)", "Btu/lb-R", "Btu/lbR",
		"Btu/(lbm F)", "Btu/(lbm·F)", "Btu/lbmF", "Btu/lbm-F", "Btu/lbm/F", "Btu/lbm-°F",
		"Btu/(lb F)", "Btu/lb-F", "Btu/lbF"}},

	// Specific volume.
	{sym: "m3/kg", dim: SpecificVolume, scale: 1, alt: []string{"m³/kg"}},
	{sym: "L/kg", dim: SpecificVolume, scale: 1e-3, alt: []string{"dm3/kg"}},
	{sym: "ft3/lbm", us: true, dim: SpecificVolume, scale: mPerFt * mPerFt * mPerFt / kgPerLbm,
		alt: []string{"ft³/lbm", "ft3/lb", "ft³/lb"}},

	// Density.
	{sym: "kg/m3", dim: Density, scale: 1, alt: []string{"kg/m³"}},
	{sym: "lbm/ft3", us: true, dim: Density, scale: kgPerLbm / (mPerFt * mPerFt * mPerFt),
		alt: []string{"lbm/ft³", "lb/ft3", "lb/ft³"}},

	// Mass flow. "kpph" (thousand pounds per hour) and "pph" are the steam-plant shorthand:
	// common practice, no source.
	{sym: "kg/s", dim: MassFlow, scale: 1},
	{sym: "kg/min", dim: MassFlow, scale: 1.0 / 60},
	{sym: "kg/h", dim: MassFlow, scale: 1.0 / 3600, alt: []string{"kg/hr"}},
	{sym: "t/h", dim: MassFlow, scale: 1000.0 / 3600, alt: []string{"t/hr"}},
	{sym: "lbm/s", us: true, dim: MassFlow, scale: kgPerLbm, alt: []string{"lb/s"}},
	{sym: "lbm/min", us: true, dim: MassFlow, scale: kgPerLbm / 60, alt: []string{"lb/min"}},
	{sym: "lbm/h", us: true, dim: MassFlow, scale: kgPerLbm / 3600, alt: []string{"lb/h", "lbm/hr", "lb/hr", "pph"}},
	{sym: "klbm/h", us: true, dim: MassFlow, scale: 1000 * kgPerLbm / 3600, alt: []string{"klb/h", "klb/hr", "kpph"}},
	// M and MM are the Roman thousand and million of US trade usage (as in MBH, MMBtu/h), never
	// mega: common practice, no source. Strict, so "mlb/h" is not read as either.
	{sym: "Mlb/h", us: true, dim: MassFlow, scale: 1000 * kgPerLbm / 3600, strict: true, alt: []string{"Mlb/hr", "Mlbm/h", "Mlbm/hr"}},
	{sym: "MMlb/h", us: true, dim: MassFlow, scale: 1e6 * kgPerLbm / 3600, strict: true, alt: []string{"MMlb/hr", "MMlbm/h", "MMlbm/hr"}},

	// Power. MBH (thousand Btu/h, Roman M) is HVAC trade usage: common practice, no source.
	{sym: "W", dim: Power, scale: 1},
	{sym: "kW", dim: Power, scale: 1e3},
	{sym: "MW", dim: Power, scale: 1e6, strict: true},
	{sym: "kJ/h", dim: Power, scale: 1e3 / 3600, alt: []string{"kJ/hr"}},
	{sym: "MJ/h", dim: Power, scale: 1e6 / 3600, strict: true, alt: []string{"MJ/hr"}},
	{sym: "GJ/h", dim: Power, scale: 1e9 / 3600, alt: []string{"GJ/hr"}},
	{sym: "kcal/h", dim: Power, scale: jPerKcal / 3600, alt: []string{"kcal/hr"}},
	{sym: "Btu/h", us: true, dim: Power, scale: jPerBtu / 3600, alt: []string{"Btu/hr"}},
	{sym: "MBH", us: true, dim: Power, scale: 1e3 * jPerBtu / 3600, alt: []string{"kBtu/h", "kBtu/hr"}},
	{sym: "MMBtu/h", us: true, dim: Power, scale: 1e6 * jPerBtu / 3600, alt: []string{"MMBtu/hr"}},
	{sym: "hp", us: true, dim: Power, scale: wPerHp},
	{sym: "TR", us: true, dim: Power, scale: wPerTR, alt: []string{"ton"}},

	// Length (elevations, heads).
	{sym: "m", dim: Length, scale: 1},
	{sym: "km", dim: Length, scale: 1e3},
	{sym: "ft", us: true, dim: Length, scale: mPerFt},

	// Entropy rate (entropy generated by a unit): a power per kelvin or per rankine.
	{sym: "W/K", dim: EntropyRate, scale: 1},
	{sym: "kW/K", dim: EntropyRate, scale: 1e3},
	{sym: "MW/K", dim: EntropyRate, scale: 1e6, strict: true},
	{sym: "Btu/(h R)", us: true, dim: EntropyRate, scale: jPerBtu / 3600 / kPerR, alt: []string{
		"Btu/h/R", "Btu/(h·R)", "Btu/(h*R)", "Btu/h-R", "Btu/hR", "Btu/(hr R)", "Btu/hr/R", "Btu/hr-R"}},

	// Volumetric flow (of a liquid, at its own state). gpm is the US gallon per minute.
	{sym: "m3/s", dim: VolumeFlow, scale: 1, alt: []string{"m³/s"}},
	{sym: "m3/h", dim: VolumeFlow, scale: 1.0 / 3600, alt: []string{"m³/h", "m3/hr", "m³/hr"}},
	{sym: "L/s", dim: VolumeFlow, scale: 1e-3, alt: []string{"l/s"}},
	{sym: "L/min", dim: VolumeFlow, scale: 1e-3 / 60, alt: []string{"l/min", "lpm"}},
	{sym: "gpm", us: true, dim: VolumeFlow, scale: m3PerGal / 60, alt: []string{"gal/min", "USgpm"}},
	{sym: "ft3/min", us: true, dim: VolumeFlow, scale: mPerFt * mPerFt * mPerFt / 60, alt: []string{"ft³/min", "cfm"}},
	{sym: "ft3/s", us: true, dim: VolumeFlow, scale: mPerFt * mPerFt * mPerFt, alt: []string{"ft³/s", "cfs"}},

	// Heat rate: heat in per unit of net work, a ratio (kJ/kJ) shown per kilowatt hour of work.
	{sym: "kJ/kJ", dim: HeatRate, scale: 1, alt: []string{"J/J"}},
	{sym: "kJ/kWh", dim: HeatRate, scale: 1e3 / jPerKWh, alt: []string{"kJ/kW-h", "kJ/kW·h"}},
	{sym: "kcal/kWh", dim: HeatRate, scale: jPerKcal / jPerKWh, alt: []string{"kcal/kW-h"}},
	{sym: "Btu/kWh", us: true, dim: HeatRate, scale: jPerBtu / jPerKWh, alt: []string{"Btu/kW-h", "Btu/kW·h"}},

	// Speed (of sound).
	{sym: "m/s", dim: Velocity, scale: 1},
	{sym: "ft/s", us: true, dim: Velocity, scale: mPerFt, alt: []string{"fps"}},
}
