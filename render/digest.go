package render

import (
	"fmt"
	"os"
	"sync"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/standards"
)

// Digest is what the package pages and the JSON document read of one
// sheet: its rows of the index and the registers, rendered, the places of
// its template statements, and its entries of the JSON. It is made while
// the sheet's calculation is alive and holds none of it, so that a build
// can let the calculation go once the page is written; in a build its
// rows wait in a spool file, not in memory (see Digests).
type Digest struct {
	checks      []indexedCheck // its counted checks, in the sheet's order
	fixed       blob           // rows of its fixed checks
	inputs      blob           // its rows of the inputs register
	assumptions blob           // its rows of the assumptions register
	standards   []standardRow
	// instances is the first instance of each template line the page
	// shows, for links to positions in templates.
	instances map[lineAt]string
	// hasJSON says the JSON parts were made: its entries of the JSON
	// registers and its JSON object.
	hasJSON  bool
	register JSONRegisters
	json     blob
}

// indexedCheck is a row of the index's table of checks, with what orders it.
type indexedCheck struct {
	row    blob
	status engine.Status
	util   float64
}

// standardRow is a row of the standards register, with what orders it.
type standardRow struct {
	standard, ref string
	index         int // the statement's place in the sheet
	row           blob
}

// lineAt is a line of a file.
type lineAt struct {
	file string
	line int
}

// blob is a piece of a page kept for later: in memory, or at a place in
// the spool file.
type blob struct {
	mem     []byte
	off, n  int64
	spooled bool
}

func (b blob) empty() bool { return b.len() == 0 }

// len is the size of the piece.
func (b blob) len() int { return len(b.mem) + int(b.n) }

// Digests holds the digests of a package's sheets, made one by one as the
// sheets are evaluated. With a spool file, the rendered rows and JSON of
// each sheet are written there as it is added and read back when the
// package pages and the JSON are written, so that they are never in
// memory all at once. Many goroutines may Add at once.
type Digests struct {
	mu    sync.Mutex
	of    map[*project.Sheet]*Digest
	json  bool
	spool *os.File
	end   int64
	err   error // the first error of the spool
}

// NewDigests makes an empty set whose digests have their JSON parts when
// json is set, with its rows in spool unless it is nil.
func NewDigests(spool *os.File, json bool) *Digests {
	return &Digests{of: map[*project.Sheet]*Digest{}, spool: spool, json: json}
}

// Add makes the digest of sheet s, whose calculation must still be
// alive; opt should be the options the package pages are rendered with.
func (ds *Digests) Add(pkg *project.Package, s *project.Sheet, opt Options) error {
	d, err := ds.digestOf(s, opt, ds.json)
	if err != nil {
		return err
	}
	ds.mu.Lock()
	defer ds.mu.Unlock()
	ds.of[s] = d
	return ds.err
}

// Err reports the first error of writing or reading the spool.
func (ds *Digests) Err() error {
	if ds == nil {
		return nil
	}
	ds.mu.Lock()
	defer ds.mu.Unlock()
	return ds.err
}

// keep keeps a piece for later: in the spool when there is one.
func (ds *Digests) keep(data []byte) blob {
	if ds == nil || ds.spool == nil {
		return blob{mem: data}
	}
	ds.mu.Lock()
	b := blob{off: ds.end, n: int64(len(data)), spooled: true}
	ds.end += b.n
	ds.mu.Unlock()
	if _, err := ds.spool.WriteAt(data, b.off); err != nil {
		ds.fail(fmt.Errorf("cannot keep a part of the package pages aside in %s: %w", ds.spool.Name(), err))
	}
	return b
}

// read gives back a piece kept.
func (ds *Digests) read(b blob) []byte {
	if !b.spooled {
		return b.mem
	}
	data := make([]byte, b.n)
	if _, err := ds.spool.ReadAt(data, b.off); err != nil {
		ds.fail(fmt.Errorf("cannot read back a part of the package pages from %s: %w", ds.spool.Name(), err))
	}
	return data
}

func (ds *Digests) fail(err error) {
	ds.mu.Lock()
	defer ds.mu.Unlock()
	if ds.err == nil {
		ds.err = err
	}
}

// digestsOf gives the digest of every sheet of pkg, in the package's
// order: from opt.Digests when it has the sheet, else made now.
func digestsOf(pkg *project.Package, opt Options) []*Digest {
	out := make([]*Digest, len(pkg.Sheets))
	for i, s := range pkg.Sheets {
		if opt.Digests != nil {
			opt.Digests.mu.Lock()
			out[i] = opt.Digests.of[s]
			opt.Digests.mu.Unlock()
		}
		if out[i] == nil {
			if s.CalcReleased() {
				// A build lets a calculation go only after adding its digest.
				panic(fmt.Sprintf("render: the calculation of %s was let go before its digest was made", s.Path()))
			}
			out[i], _ = (*Digests)(nil).digestOf(s, opt, false)
		}
	}
	return out
}

// digestOf makes the digest of one sheet, with its JSON parts when json
// is set (the JSON object is then made now); a nil set keeps the rows in
// memory.
func (ds *Digests) digestOf(s *project.Sheet, opt Options, json bool) (*Digest, error) {
	d := &Digest{instances: map[lineAt]string{}}
	digits := s.Digits(opt.Digits)
	for _, c := range sheetChecks(s, s.Page, s.Path(), digits) {
		p := &page{}
		checkLine(p, c, true)
		d.checks = append(d.checks, indexedCheck{row: ds.keep(p.Bytes()), status: c.r.Status, util: c.r.Utilisation})
	}
	p := &page{}
	for _, c := range fixedChecks(s, s.Page, s.Path(), digits) {
		checkLine(p, c, true)
	}
	d.fixed = ds.keep(p.Bytes())
	d.inputs = ds.keep(inputRows(s))
	d.assumptions = ds.keep(assumptionRows(s))
	for _, st := range s.Calc.Statements {
		if st.Instance != "" {
			k := lineAt{st.Pos.File, st.Pos.Line}
			if _, seen := d.instances[k]; !seen {
				d.instances[k] = st.Instance
			}
		}
		_, clauses := standards.Split(st.Description)
		for _, c := range clauses {
			d.standards = append(d.standards, standardRow{standard: c.Standard, ref: c.Ref, index: st.Index, row: ds.keep(standardLine(s, st, c))})
		}
	}
	if json {
		data, err := marshal(jsonSheet(s, opt), "    ")
		if err != nil {
			return nil, fmt.Errorf("%s: %w", s.Path(), err)
		}
		d.hasJSON, d.register, d.json = true, sheetRegisters(s), ds.keep(data)
	}
	return d, nil
}

// registerOf gives a sheet's entries of the JSON registers.
func (d *Digest) registerOf(s *project.Sheet) (JSONRegisters, error) {
	switch {
	case d.hasJSON:
		return d.register, nil
	case s.CalcReleased():
		return JSONRegisters{}, errNoJSON(s)
	}
	return sheetRegisters(s), nil
}

// objectOf gives a sheet's JSON object.
func (d *Digest) objectOf(ds *Digests, s *project.Sheet, opt Options) ([]byte, error) {
	switch {
	case d.hasJSON:
		data := ds.read(d.json)
		return data, ds.Err()
	case s.CalcReleased():
		return nil, errNoJSON(s)
	}
	return marshal(jsonSheet(s, opt), "    ")
}

func errNoJSON(s *project.Sheet) error {
	return fmt.Errorf("render: the JSON of %s was not kept before its calculation was let go", s.Path())
}
