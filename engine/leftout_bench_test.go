package engine_test

import (
	"fmt"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
)

// BenchmarkOptionalParts compiles and evaluates a sheet of 500 instances
// of a template with optional parts, half of them left out, and lists
// the defaults kept under every use, as a page does: one walk for all.
func BenchmarkOptionalParts(b *testing.B) {
	var lines []string
	for i := range 500 {
		if i%2 == 0 {
			lines = append(lines, fmt.Sprintf("use u%d = t/parts with U = %d kV", i, 1+i%5))
		} else {
			lines = append(lines, fmt.Sprintf("use u%d = t/parts with U = 2 kV, V_i = 5 kV, V_w = 8 kV", i))
		}
	}
	src := sheetOf("s.md", lines...)
	opt := engine.Options{Resolve: partsResolver(nil)}
	for b.Loop() {
		calc := engine.CompileWith(src, opt)
		calc.Evaluate()
		n := 0
		for _, st := range calc.Statements {
			if st.Kind == engine.Use {
				n += len(calc.KeptDefaultsOf(st))
			}
		}
		if n != 750 { // two kept under each full use, one under each partial one
			b.Fatalf("%d defaults kept", n)
		}
	}
}
