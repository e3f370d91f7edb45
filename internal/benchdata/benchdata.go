// Package benchdata generates a large synthetic calculation package for
// sheaf's benchmarks: many sheets of realistic statements (inputs with
// units and sources, derived results with display units, functions and
// checks) between paragraphs of prose.
package benchdata

import (
	"fmt"
	"strings"
)

// Package returns sheets files, each with about statements statements,
// keyed by path.
func Package(sheets, statements int) map[string][]byte {
	files := make(map[string][]byte, sheets)
	for i := 0; i < sheets; i++ {
		files[fmt.Sprintf("part-%02d/sheet-%04d.md", i%20, i)] = []byte(Sheet(i, statements))
	}
	return files
}

// Sheet writes one synthetic sheet. Each group of ten statements is a
// small magnetic-circuit and EMF calculation; later groups use earlier
// results so that the dependency graph has depth.
func Sheet(seed, statements int) string {
	var b strings.Builder
	fmt.Fprintf(&b, "---\ntitle: Synthetic sheet %d\nproject: Benchmark\njob: B-%04d\nrevision: A\n---\n\n", seed, seed)
	fmt.Fprintf(&b, "# Sheet %d\n\nThis sheet exists to measure sheaf. It holds %d statements in groups of ten.\n\n", seed, statements)
	for g := 0; g*10 < statements; g++ {
		fmt.Fprintf(&b, "## Group %d\n\nA paragraph of prose between formula blocks, with *emphasis* and a list:\n\n- item one\n- item two\n\n", g)
		b.WriteString("```sheaf\n")
		s := func(format string, args ...any) { fmt.Fprintf(&b, format+"\n", args...) }
		s("g_%d = %.2f mm ; air gap ; source: drawing %d-%d", g, 2.0+float64((seed+g)%7)*0.25, seed, g)
		s("A_%d = %.3f m^2 ; pole area ; source: drawing %d-%d", g, 0.02+float64((seed*3+g)%5)*0.004, seed, g)
		s("N_%d = %d ; turns", g, 80+(seed+g)%60)
		s("I_%d = %.1f A ; field current ; source: test report %d", g, 10+float64((seed+2*g)%15), seed)
		s("R_%d [kA/Wb] = 1.08 * g_%d / (mu_0 * A_%d) ; gap reluctance", g, g, g)
		if g > 0 {
			s("Phi_%d [mWb] = N_%d * I_%d / (R_%d + 0.05 * R_%d) ; flux per pole", g, g, g, g, g-1)
		} else {
			s("Phi_%d [mWb] = N_%d * I_%d / R_%d ; flux per pole", g, g, g, g)
		}
		s("B_%d = Phi_%d / A_%d ; gap flux density", g, g, g)
		s("E_%d [V] = sqrt(2) * pi * 50 Hz * N_%d * Phi_%d * sin(75 deg) ; phase EMF", g, g, g)
		s("lambda_%d [Wb] = max(N_%d * Phi_%d, 1 mWb) ; flux linkage", g, g, g)
		s("check B_%d <= 2.5 T ; below saturation", g)
		b.WriteString("```\n\n")
	}
	return b.String()
}
