package render

import (
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

func benchGraph(b *testing.B, s *project.Sheet) {
	g, err := newGrapher("")
	if err != nil {
		b.Fatal(err)
	}
	dot := graphDOT(s, 4)
	if _, err := g.svg(dot); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := g.svg(graphDOT(s, 4)); err != nil {
			b.Fatal(err)
		}
	}
}
