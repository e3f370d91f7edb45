package build

import (
	"fmt"
	"os"
	"path/filepath"
	"sync"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// spoolName is the file in the staging folder that holds the sheets'
// rows of the package pages and their JSON objects until those are
// written; it is removed before the package is swapped in.
const spoolName = ".sheaf-spool"

// sheetDigests keeps, for each sheet a build has evaluated, what the
// package pages, the JSON and the audit read of it (render.Digest and
// audit.SheetAudit), and then lets the sheet's calculation go: a package
// of thousands of sheets then holds only the calculations being worked.
type sheetDigests struct {
	digests *render.Digests
	spool   *os.File

	mu     sync.Mutex
	audits map[*project.Sheet]*audit.SheetAudit
	err    error
}

// newDigests makes the set, with its spool file in the staging folder;
// the sheets' JSON is kept when json is set.
func (t *target) newDigests(json bool) (*sheetDigests, error) {
	f, err := os.OpenFile(filepath.Join(t.staging, spoolName), os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o600)
	if err != nil {
		return nil, fmt.Errorf("cannot keep the sheets' rows aside in the staging folder beside %s: %w", t.given, err)
	}
	return &sheetDigests{audits: map[*project.Sheet]*audit.SheetAudit{}, spool: f, digests: render.NewDigests(f, json)}, nil
}

// add digests and audits a sheet just evaluated, then lets go of its
// calculation. A sheet that others take results from keeps nothing alive
// by being released: the takers hold what they read.
func (dg *sheetDigests) add(pkg *project.Package, s *project.Sheet, ropt render.Options) {
	err := dg.digests.Add(pkg, s, ropt)
	a := audit.Sheet(s)
	s.ReleaseCalc()
	dg.mu.Lock()
	defer dg.mu.Unlock()
	dg.audits[s] = a
	if err != nil && dg.err == nil {
		dg.err = err
	}
}

// audit gives the audit of a sheet: kept by add, or made now for a sheet
// that was not released (a single sheet, whose page waits for its
// templates).
func (dg *sheetDigests) audit(s *project.Sheet) *audit.SheetAudit {
	dg.mu.Lock()
	a := dg.audits[s]
	dg.mu.Unlock()
	if a == nil {
		a = audit.Sheet(s)
	}
	return a
}

// close removes the spool file, once the JSON is written or the build
// has failed; it may be called again.
func (dg *sheetDigests) close() {
	if dg.spool != nil {
		_ = dg.spool.Close()
		_ = os.Remove(dg.spool.Name())
		dg.spool = nil
	}
}
