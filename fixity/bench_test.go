package fixity_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/fixity"
)

// BenchmarkFind2000 varies the inputs of one sheet of 2,000 inputs, 2,000
// results and 2,000 checks, each check resting on its own input and on one
// shared limit: the variation must cost the sum of the checks'
// dependencies, not inputs times checks (see BENCHMARKS.md).
func BenchmarkFind2000(b *testing.B) {
	var src strings.Builder
	src.WriteString("B_max = 1.6 T ; limit ; source: s\n")
	for i := range 2000 {
		fmt.Fprintf(&src, "B_%d = %d mT ; flux density ; source: s\nD_%d = B_%d * 2 ; twice\ncheck D_%d <= B_max\n", i, 100+i%500, i, i, i)
	}
	sheet := engine.SheetSource{Path: "b.md"}
	var block engine.SourceBlock
	for n, line := range strings.Split(strings.TrimSpace(src.String()), "\n") {
		block.Lines = append(block.Lines, engine.SourceLine{Text: line, Pos: posAt(n + 2)})
	}
	sheet.Blocks = []engine.SourceBlock{block}
	calc := engine.Compile(sheet)
	if len(calc.Diags) != 0 {
		b.Fatalf("%v", calc.Diags[0])
	}
	calc.Evaluate()
	b.ReportAllocs()
	for b.Loop() {
		if got := fixity.Find(calc); len(got) != 0 {
			b.Fatalf("%d checks called fixed", len(got))
		}
	}
}

func posAt(line int) diag.Pos { return diag.Pos{File: "b.md", Line: line, Col: 1} }
