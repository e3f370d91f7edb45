package units

// Kind separates quantities that share a dimension but must not be
// converted into one another silently. The SI makes the radian and the
// cycle both "1", so rpm, Hz and rad/s all have dimension T⁻¹; sheaf keeps a
// kind beside the dimension so that a conversion which would lose or add a
// factor 2π is caught, and so that absolute temperatures (°C, °F) are not
// mixed with temperature differences (K).
type Kind uint8

// The kinds.
const (
	// Plain quantities carry no extra meaning beyond their dimension.
	Plain Kind = iota
	// Angle quantities are measured in radians: rad, deg, rad/s, deg/s.
	Angle
	// Cycle quantities count whole cycles or revolutions as 1: Hz, rpm, r/s
	// (ISO 80000-3 rotational frequency and frequency).
	Cycle
	// AbsTemp quantities are temperatures on a scale with an offset zero:
	// °C and °F. Their SI value is the thermodynamic temperature in K.
	AbsTemp
)

// String names the kind for messages and JSON.
func (k Kind) String() string {
	switch k {
	case Angle:
		return "angle"
	case Cycle:
		return "cycles"
	case AbsTemp:
		return "absolute temperature"
	}
	return "plain"
}
