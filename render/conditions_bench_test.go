package render

import (
	"strconv"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

// BenchmarkConditionsPage renders the page of a sheet with 64 load cases
// (the most a sheet may have), a sweep of 2,001 points with its plot and
// tolerances on two inputs: the case tables, the sweep's table of 25 rows
// and its figure. Target: under 50 ms per page on a 2-core machine, so
// that conditions never dominate a package's build.
func BenchmarkConditionsPage(b *testing.B) {
	var src strings.Builder
	src.WriteString("```sheaf\nU_s = 110 V ± 5 % normal ; supply ; source: invented\nR_f = 2.42 ohm in 2.35 ohm .. 2.52 ohm ; coil ; source: invented\n" +
		"I_f = U_s / R_f ; field current\nP_f = U_s * I_f ; field power\ncheck I_f <= 60 A ; rating\n")
	for i := range 64 {
		src.WriteString("case c" + strconv.Itoa(i) + ": U_s = " + strconv.Itoa(90+i) + " V\n")
	}
	src.WriteString("sweep su: U_s over 90 V .. 130 V by 0.02 V show I_f, P_f\nsample 20000 times, seed 4\n```\n")
	pkg := project.FromFiles("bench", map[string][]byte{"c.md": []byte(src.String())})
	if len(pkg.Diags) > 0 {
		b.Fatal(pkg.Diags)
	}
	opt := Options{Version: "bench", NoGraphs: true}.ForPackage(pkg)
	b.ReportAllocs()
	b.ResetTimer()
	var size int
	for i := 0; i < b.N; i++ {
		f, err := SheetFile(pkg, pkg.Sheets[0], opt)
		if err != nil {
			b.Fatal(err)
		}
		size = len(f.Data)
	}
	b.ReportMetric(float64(size)/(1<<10), "page-kB")
}
