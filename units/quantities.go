package units

// quantityNames names the dimensions that engineers meet, after ISO 80000,
// so that a message can say "a voltage" instead of "T⁻³ L² M I⁻¹". Where
// two quantities share a dimension (energy and torque) the entry names both.
var quantityNames = func() map[Dim]string {
	rows := [][2]string{
		{"1", "pure number"}, {"m", "length"}, {"kg", "mass"}, {"s", "time"}, {"A", "current"},
		{"K", "temperature"}, {"mol", "amount of substance"}, {"cd", "luminous intensity"},
		{"m^2", "area"}, {"m^3", "volume"}, {"s^-1", "frequency"}, {"N", "force"},
		{"Pa", "pressure"}, {"J", "energy or torque"}, {"W", "power"}, {"C", "electric charge"},
		{"V", "voltage"}, {"F", "capacitance"}, {"Ω", "resistance"}, {"S", "conductance"},
		{"Wb", "magnetic flux"}, {"T", "magnetic flux density"}, {"H", "inductance"},
		{"A/m", "magnetic field strength"}, {"V/m", "electric field strength"},
		{"A/m^2", "current density"}, {"H/m", "permeability"}, {"F/m", "permittivity"},
		{"A/Wb", "reluctance"}, {"Ω*m", "resistivity"}, {"S/m", "conductivity"},
		{"m/s", "velocity"}, {"m/s^2", "acceleration"}, {"kg*m^2", "moment of inertia"},
		{"kg/m^3", "density"}, {"K/W", "thermal resistance"}, {"W/K", "thermal conductance"},
		{"W/m^2", "heat flux density"}, {"V/s", "rate of change of voltage"}, {"Wb/m", "magnetic vector potential"},
		{"1/K", "temperature coefficient"}, {"J/kg", "specific energy"}, {"N/m", "force per length"},
		{"V*s", "magnetic flux"}, {"kg*m/s", "momentum"},
	}
	m := map[Dim]string{}
	for _, r := range rows {
		d := dimOf(r[0])
		if _, dup := m[d]; !dup {
			m[d] = r[1]
		}
	}
	return m
}()

// Describe names a dimension for messages: "voltage (V)", "magnetic flux
// (Wb)", or for a dimension without a name its coherent SI unit.
func Describe(d Dim) string {
	name, named := quantityNames[d]
	// One coherent SI unit picks no prefix, except on the gram, where it
	// gives kg: the coherent unit of mass, not the table's g.
	unit := AutoUnit(1, d, Plain).Symbol
	switch {
	case d.IsDimensionless():
		return "a pure number"
	case named:
		return name + " (" + unit + ")"
	}
	return "a quantity in " + d.SIUnits()
}
