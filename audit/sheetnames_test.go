package audit

import (
	"fmt"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

// TestSheetNamesAgreesWithTryingEverySheet holds the index to the rule it
// stands in for: for every source, the first sheet it names is the one
// that trying namesSheet on every sheet in package order finds.
func TestSheetNamesAgreesWithTryingEverySheet(t *testing.T) {
	files := map[string][]byte{
		"01-field-coil.md":         []byte("---\ntitle: Field coil\n---\n```sheaf\nx = 1 m\n```\n"),
		"02-coil-emf.md":           []byte("---\ntitle: Coil EMF\n---\n```sheaf\nx = 1 m\n```\n"),
		"sub/10-gap.md":            []byte("---\ntitle: Gap\n---\n```sheaf\nx = 1 m\n```\n"),
		"sub/100-stator.md":        []byte("```sheaf\nx = 1 m\n```\n"),
		"part-07/sheet-0012.md":    []byte("---\ntitle: Synthetic sheet 12\n---\n```sheaf\nx = 1 m\n```\n"),
		"part-07/Pump Motor.md":    []byte("---\ntitle: Pump motor back EMF\n---\n```sheaf\nx = 1 m\n```\n"),
		"part-08/Überstrom-02b.md": []byte("---\ntitle: ÜBERSTROM\n---\n```sheaf\nx = 1 m\n```\n"),
	}
	pkg := project.FromFiles("pkg", files)
	sources := []string{
		"", "drawing 12-3", "test report 12", "sheet 01 rerun", "from sheet 2", "see sheet 10", "per sheet 100",
		"in sheet 1000", "field study sheet 02", "Sheet 01", "01-field-coil.md", "the field coil sheet",
		"coil emf, rev B", "COIL-EMF", "gap", "gaps", "stator", "100-stator", "Synthetic sheet 12, Phi_3",
		"synthetic sheet 120", "sheet-0012", "pump motor", "Pump Motor back EMF", "überstrom-02b", "ÜBERSTROM tables",
		"sheet 02b", "from sheet 0", "see sheet 10 and sheet 01",
	}
	ix := newSheetNames(pkg.Sheets)
	matched := 0
	for _, self := range append([]*project.Sheet{nil}, pkg.Sheets...) {
		for _, src := range sources {
			var want *project.Sheet
			for _, s := range pkg.Sheets {
				if s != self && namesSheet(src, s) {
					want = s
					break
				}
			}
			if got := ix.lookup(src, self); got != want {
				t.Errorf("source %q from %s: the index finds %s, trying every sheet finds %s", src, name(self), name(got), name(want))
			}
			if got := ix.first(src, self); got != want {
				t.Errorf("source %q from %s: first finds %s, trying every sheet finds %s", src, name(self), name(got), name(want))
			}
			if want != nil {
				matched++
			}
		}
	}
	if matched < len(sources) {
		t.Fatalf("only %d of the cases name a sheet: the test no longer tries the matching rules", matched)
	}
}

func name(s *project.Sheet) string {
	if s == nil {
		return "nothing"
	}
	return fmt.Sprintf("%q", s.Path())
}
