package engine

import (
	"strings"
	"unicode"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Figures a statement asks for with `; draw: ...`, beyond the plot of y
// against x that every series gets:
//
//	; draw: spectrum           on a series: its harmonics, as bars
//	; draw: phasors V, IZ, E   on a phasor: a diagram of the named phasors
//
// The checker refuses a draw it cannot honour where the note is written;
// the statement itself still computes.

// The kinds of figure a draw note asks for.
const (
	DrawSpectrum = "spectrum"
	DrawPhasors  = "phasors"
)

// MaxDrawnPhasors is the most phasors one diagram takes: past a dozen,
// the labels crowd each other out.
const MaxDrawnPhasors = 12

// Drawing is one figure a draw note asks for.
type Drawing struct {
	Kind  string   // DrawSpectrum or DrawPhasors
	Names []string // for phasors: the phasors to draw, in order
	Pos   diag.Pos // where the note is written
}

// Drawings returns the figures a statement's draw notes ask for, in the
// order written; the ones the checker refused are left out.
func (s *Calc) Drawings(st *Statement) []Drawing {
	var out []Drawing
	for _, n := range st.Notes {
		if n.Key != "draw" {
			continue
		}
		if d, err := parseDrawing(n.Value, n.Pos); err == nil && s.drawingProblem(st, d) == nil {
			out = append(out, d)
		}
	}
	return out
}

// parseDrawing reads the value of a draw note: "spectrum", or "phasors"
// and a list of names separated by commas.
func parseDrawing(val string, at diag.Pos) (Drawing, *diag.Diagnostic) {
	kind, rest, _ := strings.Cut(strings.TrimSpace(val), " ")
	d := Drawing{Kind: strings.ToLower(kind), Pos: at}
	rest = strings.TrimSpace(rest)
	switch d.Kind {
	case DrawSpectrum:
		if rest != "" {
			return d, errAt(at, "write draw: spectrum alone; it draws the harmonics of the series it is on", "draw: spectrum takes no names, found %q", clipText(rest))
		}
		return d, nil
	case DrawPhasors:
		for _, name := range strings.Split(rest, ",") {
			name = strings.TrimSpace(name)
			if !drawnName(name) {
				return d, errAt(at, "name phasor results of this sheet, separated by commas, as draw: phasors V, I_Z, E", "%q is not a name", clipText(name))
			}
			d.Names = append(d.Names, name)
		}
		if len(d.Names) > MaxDrawnPhasors {
			return d, errAt(at, "split the diagram in two", "a diagram takes at most %d phasors, this one names %d", MaxDrawnPhasors, len(d.Names))
		}
		return d, nil
	}
	return d, errAt(at, "write draw: spectrum on a series, or draw: phasors A, B, C on a phasor", "sheaf draws no %q", clipText(kind))
}

// drawnName reports whether s is a name, an instance's included (gen.E).
func drawnName(s string) bool {
	if s == "" {
		return false
	}
	for _, part := range strings.Split(s, ".") {
		r := []rune(part)
		if len(r) == 0 || !isIdentStart(r[0]) {
			return false
		}
		for _, c := range r[1:] {
			if !isIdentPart(c) {
				return false
			}
		}
	}
	return true
}

// clipText shortens what a message quotes back to the author.
func clipText(s string) string {
	if r := []rune(s); len(r) > 40 {
		return string(r[:40]) + "…"
	}
	return strings.TrimFunc(s, unicode.IsSpace)
}

// checkDrawings refuses draw notes that cannot be honoured: an unknown
// figure, a spectrum of what is not a series or is sampled too coarsely
// or unevenly for harmonics, a diagram on what is not a phasor, or of
// names that are not phasor results of the sheet or differ in dimension.
func (s *Calc) checkDrawings() {
	for _, st := range s.Statements {
		for _, n := range st.Notes {
			if n.Key != "draw" {
				continue
			}
			d, err := parseDrawing(n.Value, n.Pos)
			if err == nil {
				err = s.drawingProblem(st, d)
			}
			if err != nil {
				s.Diags = append(s.Diags, *err)
			}
		}
	}
}

func (s *Calc) drawingProblem(st *Statement, d Drawing) *diag.Diagnostic {
	if st.Verdict == Errored || st.Kind != Definition {
		if st.Kind != Definition {
			return errAt(d.Pos, "put the draw note on the definition of a series or a phasor", "a draw note on a statement that defines no value draws nothing")
		}
		return nil // the statement's own error says enough
	}
	t := st.Type
	if d.Kind == DrawSpectrum {
		switch {
		case !t.IsSeries():
			return errAt(d.Pos, "put draw: spectrum on a series, as e = series(y, theta)", "%s is not a series: a spectrum needs y sampled over one period", st.Name)
		case t.Len-1 < MinPeriodSamples:
			return errAt(d.Pos, "sample the period more finely", "%s has %d samples per period; a spectrum needs at least %d", st.Name, t.Len-1, MinPeriodSamples)
		}
		if xs, ok := knownAxis(st.Expr); ok && unevenAt(xs) > 0 {
			return errAt(d.Pos, "sample the period evenly, as theta = 0 deg .. 360 deg by 5 deg", "%s is sampled unevenly; harmonics need even samples", st.Name)
		}
		return nil
	}
	if !t.IsComplex() || t.IsList() {
		return errAt(d.Pos, "put draw: phasors on one of the phasors it draws", "%s is not a phasor", st.Name)
	}
	for _, name := range d.Names {
		p := s.DrawnPhasor(st, name)
		switch {
		case p == nil:
			return errAt(d.Pos, "name phasor results of this sheet, as they are defined", "unknown name %s", name)
		case !p.Type.IsComplex() || p.Type.IsList():
			return errAt(d.Pos, "draw only phasors: a diagram shows complex values", "%s is not a phasor", name)
		case p.Type.Dim != t.Dim:
			return errAt(d.Pos, "draw phasors of one dimension together, as voltages with voltages", "%s is %s and %s is %s: one diagram has one scale", name, units.Describe(p.Type.Dim), st.Name, units.Describe(t.Dim))
		}
	}
	return nil
}

// DrawnPhasor finds a name of a draw note on st: a name of the sheet, or
// inside a template, a name of st's own instance.
func (s *Calc) DrawnPhasor(st *Statement, name string) *Statement {
	if p := s.Lookup(name); p != nil {
		return p
	}
	if st.Instance != "" {
		return s.Lookup(st.Instance + "." + name)
	}
	return nil
}

// SeriesAxisName returns the name of the list a series is sampled over,
// theta for series(lambda_c, theta) and what is worked from it, or "" when
// the axis has no name of its own.
func SeriesAxisName(st *Statement) string {
	var walk func(e Expr) string
	walk = func(e Expr) string {
		switch e := e.(type) {
		case *Ref:
			if e.Target != nil && e.Target.Expr != nil {
				return walk(e.Target.Expr)
			}
		case *Call:
			if e.Func != nil && e.Func.Name == "series" {
				if r, ok := e.Args[1].(*Ref); ok {
					return r.Name
				}
				return ""
			}
			if e.Func != nil && e.Func.Name == "deriv" {
				return walk(e.Args[0])
			}
		case *Unary:
			return walk(e.X)
		case *Binary:
			if e.X.Type().IsSeries() {
				return walk(e.X)
			}
			return walk(e.Y)
		}
		return ""
	}
	if st == nil || st.Expr == nil {
		return ""
	}
	return walk(st.Expr)
}
