package render

import (
	"runtime"
	"runtime/metrics"
	"testing"
	"time"

	"github.com/sheaf-calc/sheaf/internal/benchdata"
	"github.com/sheaf-calc/sheaf/project"
)

// BenchmarkRender1000x50 renders the HTML pages of a package of 1,000
// sheets of 50 statements, without the dependency graphs (whose layout
// BenchmarkGraphs measures). Target: under 2 s per operation on a 2-core
// machine, on top of BenchmarkPackage1000x50.
func BenchmarkRender1000x50(b *testing.B) {
	pkg := project.FromFiles("bench", benchdata.Package(1000, 50))
	opt := Options{Version: "bench", NoGraphs: true}
	b.ReportAllocs()
	b.ResetTimer()
	var size int
	for i := 0; i < b.N; i++ {
		size = 0
		err := WriteHTML(pkg, opt, func(f File) error {
			size += len(f.Data)
			return nil
		})
		if err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	b.ReportMetric(float64(size)/(1<<20), "output-MB")
	var ms runtime.MemStats
	runtime.ReadMemStats(&ms)
	b.ReportMetric(float64(ms.Sys)/(1<<20), "sys-MB")
}

// BenchmarkGraphs100x50 renders the pages of 100 sheets of 50 statements
// with their dependency graphs, laid out by Graphviz (no cache), and
// reports the cost per sheet.
func BenchmarkGraphs100x50(b *testing.B) {
	pkg := project.FromFiles("bench", benchdata.Package(100, 50))
	opt := Options{Version: "bench"}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := WriteHTML(pkg, opt, func(File) error { return nil }); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Milliseconds())/float64(b.N)/100, "ms/sheet")
}

// BenchmarkJSON1000x50 writes the JSON document of the same package.
func BenchmarkJSON1000x50(b *testing.B) {
	pkg := project.FromFiles("bench", benchdata.Package(1000, 50))
	opt := Options{Version: "bench"}
	b.ReportAllocs()
	b.ResetTimer()
	var size int
	for i := 0; i < b.N; i++ {
		counter := &countingWriter{}
		if err := WriteJSON(pkg, opt, counter); err != nil {
			b.Fatal(err)
		}
		size = counter.n
	}
	b.ReportMetric(float64(size)/(1<<20), "output-MB")
}

// BenchmarkEndToEnd1000x50 does what `sheaf build --no-graphs` does, once
// per operation: read, check, evaluate and render the HTML. It reports the
// peak memory the process held from the operating system, the figure to
// hold under 300 MB.
func BenchmarkEndToEnd1000x50(b *testing.B) {
	files := benchdata.Package(1000, 50)
	opt := Options{Version: "bench", NoGraphs: true}
	b.ReportAllocs()
	b.ResetTimer()
	peak := watchPeak()
	for i := 0; i < b.N; i++ {
		// Each build starts from a collected heap, as a fresh process does.
		b.StopTimer()
		runtime.GC()
		b.StartTimer()
		pkg := project.FromFiles("bench", files)
		if err := WriteHTML(pkg, opt, func(File) error { return nil }); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	b.ReportMetric(peak()/(1<<20), "peak-MB")
}

// countingWriter counts and discards what is written: the benchmarks
// measure rendering, not the disk.
type countingWriter struct{ n int }

func (c *countingWriter) Write(p []byte) (int, error) {
	c.n += len(p)
	return len(p), nil
}

// watchPeak samples the memory the Go runtime holds from the operating
// system (runtime/metrics /memory/classes/total:bytes, minus what it has
// released) every few milliseconds, and returns a function that stops the
// sampling and reports the peak.
func watchPeak() func() float64 {
	samples := []metrics.Sample{{Name: "/memory/classes/total:bytes"}, {Name: "/memory/classes/heap/released:bytes"}}
	var peak float64
	stop := make(chan struct{})
	done := make(chan struct{})
	read := func() {
		metrics.Read(samples)
		if v := float64(samples[0].Value.Uint64() - samples[1].Value.Uint64()); v > peak {
			peak = v
		}
	}
	go func() {
		defer close(done)
		t := time.NewTicker(2 * time.Millisecond)
		defer t.Stop()
		for {
			select {
			case <-stop:
				read()
				return
			case <-t.C:
				read()
			}
		}
	}()
	return func() float64 {
		close(stop)
		<-done
		return peak
	}
}
