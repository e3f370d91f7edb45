package project

import (
	"runtime"
	"testing"

	"github.com/sheaf-calc/sheaf/internal/benchdata"
)

// BenchmarkPackage1000x50 reads, checks and evaluates a package of 1,000
// sheets of 50 statements. Target on a 2-core machine: under 1 s per
// operation (see BENCHMARKS.md).
func BenchmarkPackage1000x50(b *testing.B) {
	files := benchdata.Package(1000, 50)
	b.ReportAllocs()
	b.ResetTimer()
	var pkg *Package
	for i := 0; i < b.N; i++ {
		pkg = FromFiles("bench", files)
	}
	b.StopTimer()
	if len(pkg.Diags) != 0 {
		b.Fatalf("generated package has diagnostics: %v", pkg.Diags[0])
	}
	if c := pkg.Counts(); c.Pass != 5000 || c.Results != 45000 {
		b.Fatalf("generated package gave %+v", c)
	}
	var ms runtime.MemStats
	runtime.ReadMemStats(&ms)
	b.ReportMetric(float64(ms.HeapInuse)/(1<<20), "heap-MB")
}
