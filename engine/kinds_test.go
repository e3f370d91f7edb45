package engine_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/units"
)

// tradeInputs are the inputs of the formulas of the trade below: a
// four-pole machine at 1500 rpm. Each value is exact in SI or nearly so,
// so that the expected results can be worked out by hand.
var tradeInputs = []string{
	"n = 1500 rpm",
	"omega_m = 150 rad/s",
	"D = 0.5 m",
	"r = 0.25 m",
	"p = 2",
	"Q_s = 36",
	"T = 100 N*m",
	"k_e = 0.4584 V*s/rad",
	"k_t = 0.4584 N*m/A",
	"k_E = 48 V/krpm",
	"k_V = 0.048 V/rpm",
	"I = 10 A",
	"f = 50 Hz",
	"N = 100",
	"Phi = 10 mWb",
	"L = 10 mH",
	"t = 2 ms",
	"J_m = 2 kg*m^2",
	"S = 500 kVA",
	"P_1 = 400 kW",
	"phi = 36.86989765 deg",
	"U = 400 V",
}

// kindCase is one formula of the trade with its expected outcome: an SI
// value (within 1e-9 relative) and kind, or an error whose message holds
// want and whose column is that of the first occurrence of at in the line.
type kindCase struct {
	line   string
	si     float64
	kind   units.Kind
	want   string // for an error: part of the message
	at     string // for an error: where it points
	source string
}

var twoPi = 2 * math.Pi

// A table of formulas engineers write for rotating machines, with the
// outcome each must have. Values: ISO 80000-3 (2019) for ω = 2πn and the
// rotational frequency; IEC 60034-1 conventions for torque and power are
// common practice; textbook forms are cited where they are used.
var kindCases = []kindCase{
	// Speeds and frequencies.
	{line: "v = pi*D*n", si: math.Pi * 0.5 * 25, source: "surface speed πDn, common practice"},
	{line: "omega [rad/s] = 2*pi*n", si: twoPi * 25, kind: units.Angle, source: "ω = 2πn, ISO 80000-3"},
	{line: "w_1 = n*2*pi", si: twoPi * 25, kind: units.Angle, source: "2π in any order"},
	{line: "w_2 = 360 deg * n", si: twoPi * 25, kind: units.Angle, source: "a full turn written as an angle"},
	{line: "w_3 = 2π*n", si: twoPi * 25, kind: units.Angle, source: "2π written with the Greek letter"},
	{line: "f_e [Hz] = p*n", si: 50, kind: units.Cycle, source: "f = p·n, common practice"},
	{line: "n_s [rpm] = f/p", si: 25, kind: units.Cycle, source: "synchronous speed n_s = f/p, common practice"},
	{line: "f_2 [Hz] = omega_m/(2*pi)", si: 150 / twoPi, kind: units.Cycle, source: "f = ω/(2π), ISO 80000-3"},
	{line: "omega_e [rad/s] = p*omega_m", si: 300, kind: units.Angle, source: "electrical angular velocity, common practice"},
	{line: "n_k [rpm] = 1.5 krpm", si: 25, kind: units.Cycle, source: "krpm as data sheets print it"},
	{line: "N_rev = n*t", si: 0.05, kind: units.Cycle, source: "revolutions in a time: cycles"},
	// Torque and power: torque is an energy per radian.
	{line: "P = T*omega_m", si: 15000, source: "P = Tω, common practice"},
	{line: "P_2 = 2*pi*n*T", si: twoPi * 25 * 100, source: "P = 2πnT, common practice"},
	{line: "P_3 = n*T*2*pi", si: twoPi * 25 * 100, source: "the 2π at the end of the product"},
	{line: "T_4 [N*m] = P_1/(2*pi*n)", si: 400e3 / (twoPi * 25), kind: units.PerRadian, source: "T = P/(2πn)"},
	{line: "T_m = k_t*I", si: 4.584, kind: units.PerRadian, source: "T = k_t·I, common practice"},
	{line: "T_z = T + k_t*I", si: 104.584, kind: units.PerRadian, source: "a sum of torques"},
	{line: "F_t [N] = T/r", si: 400, source: "tangential force from torque, common practice"},
	{line: "E_k [kJ] = 0.5*J_m*omega_m^2", si: 0.5 * 2 * 150 * 150, source: "kinetic energy ½Jω², common practice"},
	// Back EMF and its constants.
	{line: "E = k_e*omega_m", si: 0.4584 * 150, source: "E = k_e·ω, common practice"},
	{line: "E_2 = k_E*n", si: 72, source: "E = k_E·n with k_E in V/krpm: 48 V/krpm × 1.5 krpm"},
	{line: "E_3 [V] = k_e*2*pi*n", si: 0.4584 * twoPi * 25, source: "E = k_e·2πn"},
	{line: "k_e2 [V*s/rad] = k_V/(2*pi)", si: 0.048 * 60 / twoPi, kind: units.PerRadian, source: "k_e = k_E/(2π) with k_E in V·s per revolution"},
	{line: "k_E2 [V/krpm] = 2*pi*k_e", si: twoPi * 0.4584, kind: units.PerCycle, source: "k_E = 2π·k_e"},
	{line: "k_t2 [N*m/A] = k_e", si: 0.4584, kind: units.PerRadian, source: "k_t = k_e in SI units, common practice"},
	// Transformer EMF and reactance: the radian vanishes into a voltage.
	{line: "E_rms = sqrt(2)*pi*f*N*Phi", si: math.Sqrt2 * math.Pi * 50 * 100 * 0.01, source: "E = √2·π·f·N·Φ, common practice"},
	{line: "E_44 = 4.44*f*N*Phi", si: 4.44 * 50 * 100 * 0.01, source: "E = 4.44·f·N·Φ, common practice"},
	{line: "X [ohm] = 2*pi*f*L", si: twoPi * 50 * 0.01, source: "X = 2πfL, common practice"},
	{line: "v_2 = omega_m*r", si: 150 * 0.25, source: "v = ωr, common practice"},
	// Angles and their functions.
	{line: "theta [deg] = omega_m*t", si: 0.3, kind: units.Angle, source: "θ = ωt"},
	{line: "s_1 = sin(2*pi*f*t)", si: math.Sin(twoPi * 50 * 0.002), source: "sin(2πft)"},
	{line: "s_2 = sin(omega_m*t)", si: math.Sin(0.3), source: "sin(ωt)"},
	{line: "alpha_s [deg] = 2*p*180 deg/Q_s", si: 2 * 2 * math.Pi / 36, kind: units.Angle, source: "slot angle in electrical degrees, common practice"},
	// Power: active, reactive and apparent.
	{line: "P_a [kW] = S*cos(phi)", si: 400e3, kind: units.Active, source: "P = S·cos φ, IEC 60050-131"},
	{line: "Q_a [kvar] = S*sin(phi)", si: 300e3, kind: units.Reactive, source: "Q = S·sin φ, IEC 60050-131"},
	{line: "S_3 = 1.1*S", si: 550e3, kind: units.Apparent, source: "a constant factor keeps apparent power"},
	{line: "P_4 [kW] = sqrt(3)*U*I", si: math.Sqrt(3) * 400 * 10, kind: units.Active, source: "three-phase power √3·U·I"},
	// Temperatures.
	{line: "T_b [degC] = -25 degC + 10 K", si: 273.15 - 15, kind: units.AbsTemp, source: "a negative Celsius temperature"},
	{line: "N_c = 2*p*Q_s", si: 144, source: "a whole count"},

	// The slips: each an error at the place it happens.
	{line: "E_x [V] = k_e*n", want: "mixes radians and cycles", at: "*", source: "k_e per radian times rpm: the 2π is missing"},
	{line: "P_x [kW] = T*n", want: "mixes radians and cycles", at: "*", source: "torque times rpm: the 2π is missing"},
	{line: "P_y = n*T", want: "mixes radians and cycles", at: "*", source: "in either order"},
	{line: "k_x [V*s/rad] = k_V", want: "would add a factor 2π", at: "V*s", source: "V/rpm shown as V·s/rad"},
	{line: "omega_x [rad/s] = n", want: "would drop a factor 2π", at: "rad", source: "rpm shown as rad/s"},
	{line: "n_x [rpm] = omega_m", want: "would add a factor 2π", at: "rpm", source: "rad/s shown as rpm"},
	{line: "T_x [J] = k_t*I", want: "torque (an energy per radian, N·m) and cannot be shown in J", at: "J", source: "torque shown in J"},
	{line: "P_z [kW] = S", want: "apparent power (VA) and cannot be shown in kW", at: "kW", source: "VA shown as W"},
	{line: "Q_z [kvar] = P_1", want: "active power (W) and cannot be shown in kvar", at: "kvar", source: "W shown as var"},
	{line: "check omega_m <= n", want: "cannot compare an angle-based quantity", at: "<=", source: "rad/s against rpm"},
	{line: "s_3 = sin(f*t)", want: "counts cycles, not radians", at: "*t", source: "sin of cycles: the 2π is missing"},
	{line: "S_y = S + P_1", want: "cannot add an apparent power (VA) and an active power (W)", at: "+", source: "VA plus W"},
	{line: "E_y = k_E*omega_m + k_e*omega_m", want: "mixes radians and cycles", at: "*", source: "per cycle times radians"},
	// What engineers type out of habit.
	{line: "check U = 400 V", want: "a check needs a comparison", at: "=", source: "= for =="},
	{line: "x_1 = 3 m s", want: "write 3 m*s", at: "s", source: "a space between unit symbols"},
	{line: "x_2 = 1,5 V", want: "a comma inside a number", at: ",", source: "a decimal comma"},
	{line: "x_3 = 2(p + N)", want: "write 2*(p + N)", at: "(", source: "a product without its sign"},
	{line: "x_4 = 40 ºC", want: "did you mean 40 °C", at: "ºC", source: "the ordinal sign for a degree"},
	{line: "x_5 = 1e-400 V", want: "too small to hold", at: "1e", source: "a number that underflows"},
}

// TestFormulasOfTheTrade runs each formula after the common inputs and
// checks its value and kind, or its error and column.
func TestFormulasOfTheTrade(t *testing.T) {
	if len(kindCases) < 40 {
		t.Fatalf("%d formulas; the table must hold at least 40", len(kindCases))
	}
	for _, c := range kindCases {
		t.Run(c.line, func(t *testing.T) {
			lines := append(append([]string(nil), tradeInputs...), c.line)
			s := compileLines(lines...)
			row := len(lines) + 1 // compileLines starts at line 2
			var own []string
			for _, d := range s.Diags {
				if d.Pos.Line == row {
					own = append(own, d.Error())
				} else {
					t.Errorf("an input has a diagnostic: %s", d.Error())
				}
			}
			if c.want != "" {
				col := strings.Index(c.line, c.at)
				if col < 0 {
					t.Fatalf("bad test: %q not in the line", c.at)
				}
				pos := fmt.Sprintf("r.md:%d:%d:", row, len([]rune(c.line[:col]))+1)
				if len(own) != 1 || !strings.HasPrefix(own[0], pos) || !strings.Contains(own[0], c.want) {
					t.Fatalf("want one error at %s containing %q (%s); got %q", pos, c.want, c.source, own)
				}
				return
			}
			if len(own) > 0 {
				t.Fatalf("unexpected error (%s): %v", c.source, own)
			}
			st := s.Statements[len(s.Statements)-1]
			r := s.Result(st)
			if r.Status != engine.OK {
				t.Fatalf("status %s, want ok", r.Status)
			}
			if !near(r.Value, c.si, 1e-9) {
				t.Errorf("%s = %.12g in SI, want %.12g (%s)", st.Name, r.Value, c.si, c.source)
			}
			if st.Type.Kind != c.kind {
				t.Errorf("%s has kind %s, want %s", st.Name, st.Type.Kind, c.kind)
			}
		})
	}
}

// Whole-number counts show without decimals; other pure numbers keep the
// sheet's figures; no result shows five digits before the decimal point.
func TestResultDigits(t *testing.T) {
	s := compileLines("p = 2", "Q_s = 36", "N_c = 2*p*Q_s", "q = Q_s/(2*p*3)", "q_2 = Q_s/(4*p*3)",
		"k = round(2.6)", "x = 0.5*Q_s", "U [V] = 12345 V")
	for _, d := range s.Diags {
		t.Errorf("unexpected diagnostic: %s", d.Error())
	}
	for name, want := range map[string]string{"N_c": "144", "q": "3", "q_2": "1.500", "k": "3", "x": "18.00", "U": "1.234e+04"} {
		r := s.Result(s.Lookup(name))
		if got := units.FormatNumber(r.Shown.FromSI(r.Value), r.Digits(4)); got != want {
			t.Errorf("%s shows %q, want %q", name, got, want)
		}
	}
}
