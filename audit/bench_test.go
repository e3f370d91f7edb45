package audit_test

import (
	"fmt"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// BenchmarkAuditManyStatements audits one sheet of engine.MaxStatements
// unsourced, unused inputs (three findings each). Matching findings to
// their statements was quadratic: a sheet of 100,000 statements spent its
// time there. Target: linear, well under a second on 2 cores.
func BenchmarkAuditManyStatements(b *testing.B) {
	var src strings.Builder
	src.WriteString(front + "```sheaf\n")
	for i := range engine.MaxStatements {
		fmt.Fprintf(&src, "a_%d = %d m\n", i, i)
	}
	src.WriteString("```\n")
	pkg := project.FromFiles("pkg", map[string][]byte{"a.md": []byte(src.String())})
	if len(pkg.Diags) != 0 {
		b.Fatalf("sheet errors: %v", pkg.Diags[0])
	}
	b.ResetTimer()
	for range b.N {
		if r := audit.Run(pkg); len(r.Findings) < engine.MaxStatements {
			b.Fatalf("%d findings", len(r.Findings))
		}
	}
}
