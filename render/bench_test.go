package render

import (
	"fmt"
	"runtime"
	"runtime/metrics"
	"strings"
	"testing"
	"time"

	"github.com/sheaf-calc/sheaf/internal/benchdata"
	"github.com/sheaf-calc/sheaf/project"
)

// BenchmarkRender1000x50 renders the HTML pages of a package of 1,000
// sheets of 50 statements, without the dependency graphs (which
// BenchmarkGraphs100x50 and BenchmarkGraphLayout measure). Target: under 2 s per operation on a 2-core
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
// with their dependency graphs, and reports the cost per sheet.
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

// tableSheet is a sheet that reads a named table of the given number of
// rows: a small calculation beside a large block of data.
func tableSheet(rows int) []byte {
	var b strings.Builder
	b.WriteString("# Magnetisation curve\n\nTable BH: the steel's curve, as measured\n\n| H [A/m] | B [T] |\n|---|---|\n")
	for i := 0; i < rows; i++ {
		fmt.Fprintf(&b, "| %d | %.6f |\n", i*10, 2*float64(i)/float64(rows))
	}
	b.WriteString("\n```sheaf\nH_c = 500 A/m ; field strength ; source: design\nB_c = interp(BH.B, BH.H, H_c) ; flux density\ncheck B_c <= 2 T ; below saturation\n```\n")
	return []byte(b.String())
}

// BenchmarkSheetPageTable renders the page of one sheet holding a table
// of 20,000 rows (about 0.43 MB of source), and reports the bytes
// allocated per byte of source: memory should stay a small multiple of
// the source, not the 24 times that was once reserved up front.
func BenchmarkSheetPageTable(b *testing.B) {
	src := tableSheet(20000)
	pkg := project.FromFiles("bench", map[string][]byte{"curve.md": src})
	opt := Options{Version: "bench", NoGraphs: true}
	pr := newProse()
	b.ReportAllocs()
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	b.ResetTimer()
	var size int
	for i := 0; i < b.N; i++ {
		page, err := sheetPage(pkg, pkg.Sheets[0], opt, pr)
		if err != nil {
			b.Fatal(err)
		}
		size = len(page)
	}
	b.StopTimer()
	runtime.ReadMemStats(&after)
	b.ReportMetric(float64(after.TotalAlloc-before.TotalAlloc)/float64(b.N)/float64(len(src)), "alloc/source-byte")
	b.ReportMetric(float64(size)/float64(len(src)), "page/source")
}
