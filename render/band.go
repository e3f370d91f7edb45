package render

import (
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/units"
)

// BandText says where a check's quantity sits in the tolerance band it is
// one side of, in the check's unit: "at 38 % of the band 1.7–2.2". It is ""
// for a check that is not one side of a band.
func BandText(s *project.Sheet, st *engine.Statement, digits int) string {
	b, ok := s.Band(st)
	if !ok {
		return ""
	}
	r := s.Calc.Result(st)
	u := r.Shown
	lo, hi := ValueText(b.Lo, u, digits), ValueText(b.Hi, u, digits)
	if u.Symbol != "1" && u.Symbol != "" {
		// One unit for the pair: "1.7–2.2 V", not "1.7 V–2.2 V".
		lo = units.FormatNumber(u.FromSI(b.Lo), digits)
	}
	where := "at " + units.FormatNumber(b.Position()*100, 2) + " % of the band " + lo + "–" + hi
	switch pos := b.Position(); {
	case pos < 0:
		where += ", below it"
	case pos > 1:
		where += ", above it"
	}
	return where
}

// inBand reports whether a check is one side of a tolerance band, whose
// place in the band says more than its utilisation.
func inBand(s *project.Sheet, st *engine.Statement) bool {
	_, ok := s.Band(st)
	return ok
}
