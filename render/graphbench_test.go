package render

import (
	"testing"

	"github.com/sheaf-calc/sheaf/internal/benchdata"
	"github.com/sheaf-calc/sheaf/project"
)

// graphBenchSheets are the sheets BenchmarkGraphLayout lays out: the
// five sheets of the demo package and a synthetic 50-statement sheet.
func graphBenchSheets(b *testing.B) []*project.Sheet {
	demo, err := project.Load("../examples/tarnwick-weir")
	if err != nil {
		b.Fatal(err)
	}
	bench := project.FromFiles("bench", map[string][]byte{"s50.md": []byte(benchdata.Sheet(1, 50))})
	return append(demo.Sheets, bench.Sheets...)
}

// BenchmarkGraphLayout lays out and draws the dependency graph of one
// sheet per operation, with no cache: the cost a page pays for its graph.
func BenchmarkGraphLayout(b *testing.B) {
	for _, s := range graphBenchSheets(b) {
		b.Run(s.Path(), func(b *testing.B) {
			benchGraph(b, s)
		})
	}
}

func benchGraph(b *testing.B, s *project.Sheet) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := graphSVG(s, 4); err != nil {
			b.Fatal(err)
		}
	}
}
