package engine_test

import (
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// Conditional values, in the style of TestChecker, worked by hand beside
// each case.
func TestChoices(t *testing.T) {
	for _, c := range []checkerCase{
		{"a piecewise rule takes the value whose condition holds",
			// 1.5/1.62 = 0.9259; below the knee, 1.
			[]string{"B_s = 1.5 T", "B_1 = 1.62 T", "B_2 = 1.2 T", "k_1 = 1 when B_1 <= B_s else B_s / B_1", "k_2 = 1 when B_2 <= B_s else B_s / B_2",
				// Three pieces: 20 °C rise below 10 A, 40 K below 20 A, else 60 K.
				"I = 15 A", "dT [K] = 20 K when I < 10 A else 40 K when I < 20 A else 60 K", "q = (5 when I < 1 A else 6) * 2"},
			map[string]string{"k_1": "ok 0.9259 1", "k_2": "ok 1.000 1", "dT": "ok 40.00 K", "q": "ok 12 1"}},
		{"only the chosen value is evaluated; an error there is located in it",
			[]string{"x = 0", "y = 1 when x == 0 else 1 / x", "bad = 1 / x when x == 1 else 2 / x", "z = y + 1"},
			map[string]string{"y": "ok 1 1", "bad": "error 4:32 division by zero", "z": "ok 2 1"}},
		{"conditional lists choose a whole list",
			[]string{"th = 0 deg .. 90 deg by 45 deg", "x = 2", "w [deg] = th when x < 1 else 2 * th"},
			map[string]string{"w": "ok [0, 90.00, 180.0] °"}},
		{"bad conditions are located errors",
			[]string{"x = 2", "a = 2 m when x > 1 else 3 s", "b = 2 m when x else 3 m", "c = [1, 2] when x > 1 else 3",
				"d = 1 when x > 1 m else 2", "e = 1 when [1, 2] < 3 else 2", "f = x < 1 when x > 1 else 2", "g = 1 when x > 1"},
			map[string]string{"a": "error 3:25 the value when the condition holds is length (m), but the value after else is time (s)",
				"b": "error 4:14 the condition of a conditional value must be a comparison",
				"c": "error 5:28 the value when the condition holds has 2 elements, but the value after else has one value",
				"d": "error 6:14 cannot compare a pure number and length (m)",
				"e": "error 7:12 a comparison takes single values; its left side is a list of 2",
				"f": "error 8:7 a value cannot be a comparison",
				"g": "error 9:17 a condition needs else and the value when it does not hold"}},
	} {
		c.run(t, engine.Options{})
	}
}
