package engine_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/units"
)

// compileLines compiles and evaluates one formula block whose first line is
// line 2 of r.md (the fence is line 1).
func compileLines(lines ...string) *engine.Calc {
	b := engine.SourceBlock{Fence: diag.Pos{File: "r.md", Line: 1, Col: 1}}
	for i, l := range lines {
		b.Lines = append(b.Lines, engine.SourceLine{Text: l, Pos: diag.Pos{File: "r.md", Line: i + 2, Col: 1}})
	}
	s := engine.Compile(engine.SheetSource{Path: "r.md", Blocks: []engine.SourceBlock{b}})
	s.Evaluate()
	return s
}

// shown is a definition's value in the unit it is shown in.
func shown(r engine.Result) float64 { return r.Shown.FromSI(r.Value) }

func near(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Abs(b) }

// A machine turning at n = 1500 rpm with a rotor 0.9 m across and p = 5
// pole pairs. rpm is a rotational frequency (cycles per time, like Hz);
// rad/s is an angular velocity; ω = 2πn (ISO 80000-3, angular velocity and
// rotational frequency; the table in units/table.go cites item 3-17.2).
func TestRotationalSpeedConvention(t *testing.T) {
	s := compileLines(
		"n = 1500 rpm",
		"D = 0.9 m",
		"p = 5",
		"v = pi*D*n",
		"omega [rad/s] = 2*pi*n",
		"f [Hz] = p*n",
		"n_check [rpm] = omega/(2*pi)",
		"omega_e = p*omega",
		"w_1 = 2*n*pi",
		"w_2 = pi*2*n",
		"w_3 = (2*pi)*n",
		"f_60 = 60*n",
	)
	for _, d := range s.Diags {
		t.Errorf("unexpected diagnostic: %s", d.Error())
	}
	type want struct {
		name   string
		value  float64 // in the unit shown
		unit   string
		kind   units.Kind
		source string
	}
	for _, w := range []want{
		// Peripheral speed v = πDn: π × 0.9 m × 25 /s = 70.686 m/s. Common practice.
		{"v", math.Pi * 0.9 * 25, "m/s", units.Plain, "v = πDn, common practice"},
		// ω = 2πn = 2π × 25 /s = 157.08 rad/s (ISO 80000-3).
		{"omega", 2 * math.Pi * 25, "rad/s", units.Angle, "ω = 2πn, ISO 80000-3"},
		// Synchronous frequency f = p·n = 5 × 25 /s = 125 Hz, p in pole
		// pairs. Common practice (from memory: f = pn/60 with n in rpm).
		{"f", 125, "Hz", units.Cycle, "f = pn, common practice"},
		// n = ω/(2π) brings back the 1500 rpm.
		{"n_check", 1500, "rpm", units.Cycle, "n = ω/(2π), ISO 80000-3"},
		// The electrical angular velocity ω_e = pω = 785.40 rad/s stays an
		// angular velocity: pole pairs are a pure number.
		{"omega_e", 5 * 2 * math.Pi * 25, "rad/s", units.Angle, "ω_e = pω, common practice"},
		// The 2π may be written in any order or grouping.
		{"w_1", 2 * math.Pi * 25, "rad/s", units.Angle, "2πn reordered"},
		{"w_2", 2 * math.Pi * 25, "rad/s", units.Angle, "2πn reordered"},
		{"w_3", 2 * math.Pi * 25, "rad/s", units.Angle, "2πn grouped"},
		// Any factor other than 2π keeps the cycles: 60 × 25 /s = 1.5 kHz.
		{"f_60", 1.5, "kHz", units.Cycle, "arithmetic"},
	} {
		st := s.Lookup(w.name)
		r := s.Result(st)
		if st == nil || r.Status != engine.OK {
			t.Errorf("%s: %+v", w.name, st)
			continue
		}
		if st.Type.Kind != w.kind {
			t.Errorf("%s: kind %v, want %v", w.name, st.Type.Kind, w.kind)
		}
		if r.Shown.Symbol != w.unit || !near(shown(r), w.value, 1e-12) {
			t.Errorf("%s = %v %s, want %v %s (%s)", w.name, shown(r), r.Shown.Symbol, w.value, w.unit, w.source)
		}
	}
	// The figures a reader sees, to four significant figures.
	for name, text := range map[string]string{"v": "70.69", "omega": "157.1", "f": "125.0", "n_check": "1500"} {
		if got := units.FormatNumber(shown(s.Result(s.Lookup(name))), 4); got != text {
			t.Errorf("%s shows %s, want %s", name, got, text)
		}
	}
}

// Each way of dropping or doubling the 2π is refused at the place it
// happens, with a message that names the 2π.
func TestRotationalSpeedSlips(t *testing.T) {
	s := compileLines(
		"n = 1500 rpm",
		"omega_0 = 2*pi*n",
		"omega [rad/s] = n",   // line 4: the rpm shown in rad/s
		"f [Hz] = omega_0",    // line 5: an angular velocity shown in Hz
		"f2 [Hz] = 2*pi*n",    // line 6: 2π where none belongs
		"check omega_0 <= n",  // line 7: rad/s against rpm
		"s = omega_0 + n",     // line 8: rad/s plus rpm
		"check [rad/s] n < n", // line 9: a check's display unit
	)
	for _, w := range []struct{ pos, msg, hint string }{
		{"r.md:4:8", "omega is a rotational frequency (cycles), and showing it in rad/s would drop a factor 2π", "omega [rad/s] = 2*pi*n"},
		{"r.md:5:4", "f is an angular velocity (radians), and showing it in Hz would add a factor 2π", "f [Hz] = omega_0/(2*pi)"},
		{"r.md:6:5", "f2 is an angular velocity (radians), and showing it in Hz would add a factor 2π", "f2 [Hz] = (2*pi*n)/(2*pi)"},
		{"r.md:7:15", "cannot compare an angle-based quantity (rad) and a cycle-based one (Hz, rpm)", "multiply the frequency by 2*pi"},
		{"r.md:8:13", "cannot add an angle-based quantity (rad) and a cycle-based one (Hz, rpm)", "multiply the frequency by 2*pi"},
		{"r.md:9:8", "the checked quantity is a rotational frequency (cycles), and showing it in rad/s would drop a factor 2π", "multiply the frequency by 2*pi"},
	} {
		found := false
		for _, d := range s.Diags {
			found = found || d.Pos.String() == w.pos && strings.Contains(d.Message, w.msg) && strings.Contains(d.Hint, w.hint)
		}
		if !found {
			t.Errorf("no diagnostic at %s: %s (hint %q)", w.pos, w.msg, w.hint)
		}
	}
	if len(s.Diags) != 6 {
		t.Errorf("%d diagnostics, want 6: %v", len(s.Diags), s.Diags)
	}
	// The good ones are unaffected.
	if st := s.Lookup("omega_0"); s.Result(st).Status != engine.OK || st.Type.Kind != units.Angle {
		t.Errorf("omega_0: %v %v", s.Result(st).Status, st.Type.Kind)
	}
}

// Absolute temperatures (°C) and differences (K): 40 °C plus 80 K is
// 120 °C, and the difference of two temperatures is in K. (SI Brochure,
// 9th ed., 2.3.1: t/°C = T/K − 273.15, so a difference of one °C is one K.)
func TestTemperatureConvention(t *testing.T) {
	s := compileLines(
		"T_a = 40 degC",
		"T_h = 40 degC + 80 K",
		"dT = T_h - T_a",
		"check T_h <= 155 degC",
	)
	for _, d := range s.Diags {
		t.Errorf("unexpected diagnostic: %s", d.Error())
	}
	th := s.Lookup("T_h")
	thR := s.Result(th)
	if thR.Status != engine.OK || thR.Shown.Symbol != "°C" || !near(shown(thR), 120, 1e-12) || th.Type.Kind != units.AbsTemp {
		t.Errorf("T_h = %v %s (%v), want 120 °C", shown(thR), thR.Shown.Symbol, th.Type.Kind)
	}
	if !near(thR.Value, 393.15, 1e-12) {
		t.Errorf("T_h = %v K in SI, want 393.15 K", thR.Value)
	}
	dt := s.Lookup("dT")
	dtR := s.Result(dt)
	if dtR.Status != engine.OK || dtR.Shown.Symbol != "K" || !near(shown(dtR), 80, 1e-12) || dt.Type.Kind != units.Plain {
		t.Errorf("dT = %v %s (%v), want a difference of 80 K", shown(dtR), dtR.Shown.Symbol, dt.Type.Kind)
	}
	chkR := s.Result(s.Statements[3])
	if chkR.Status != engine.Pass {
		t.Fatalf("check: %v %v", chkR.Status, chkR.Err)
	}
	// The utilisation is worked out on the values as shown, in °C:
	// 120/155 = 77.4 %. On kelvin it would read 393.15/428.15 = 91.8 %;
	// sheaf keeps the engineer's scale, so a margin reads as it is written.
	if !near(chkR.Utilisation, 120.0/155, 1e-12) {
		t.Errorf("utilisation %v, want 120/155 = %v (on °C values)", chkR.Utilisation, 120.0/155)
	}
	if chkR.Shown.Symbol != "°C" {
		t.Errorf("check shown in %s, want °C", chkR.Shown.Symbol)
	}
}
