// Package project loads a folder of sheets as one calculation package: it
// reads every Markdown file with the sheets package, compiles and evaluates
// its formula blocks with the engine, and gathers the diagnostics. The
// renderers take a Package and show it; they compute nothing.
package project

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"github.com/sheaf-calc/sheaf/band"
	"github.com/sheaf-calc/sheaf/conditions"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/fixity"
	"github.com/sheaf-calc/sheaf/sheets"
)

// DefaultDigits is the number of significant figures results are shown to
// when neither the command line nor a sheet says otherwise.
const DefaultDigits = 4

// Package is a compiled and evaluated calculation package.
type Package struct {
	Root   string   // the folder as given
	Sheets []*Sheet // the pages of the package, sorted by path
	// Templates are the package's sheets that other sheets use and that
	// are not pages themselves, sorted by path.
	Templates []*sheets.Document
	Files     []SourceFile // every source file with its hash, sorted by path
	Diags     diag.List

	latestDate string // the latest date in the pages' front matter
	// data holds the CSV files the pages' tables read, by path.
	data map[string][]byte
	// whole is set when every file of the folder was read before
	// compiling, so that Update can tell what an edit touches.
	whole      bool
	loadedFrom string // the folder or sheet Load was given
}

// Sheet pairs a parsed Markdown sheet with its compiled calculation.
type Sheet struct {
	Doc  *sheets.Document
	Calc *engine.Calc
	// Page is the path of the sheet's page inside a built package, with
	// forward slashes: "sheets/field-coil.html".
	Page string
	// Number is the sheet's place in the package, from 1, in the order of
	// Package.Sheets; it is set before the sheet is compiled, so that a
	// page rendered while other sheets still compile can say "Sheet n of N".
	Number int

	uses  []string // package files its use statements reach, directly or not, sorted
	takes []string // sheets its take statements name, sorted
	rests []string // the files its page rests on, sorted (see RestsOn)

	fixed map[*engine.Statement]fixity.Outcome
	// Conditions is what the sheet's cases, sweeps and tolerances gave;
	// nil for a sheet with none.
	Conditions *conditions.Report

	bandOnce sync.Once
	bands    map[*engine.Statement]band.Band

	// What outlives the calculation (see ReleaseCalc): the tally, the
	// calculation's diagnostics and its sampling.
	counts   Counts
	diags    diag.List
	sampling *Sampling
}

// Sampling is the sample count and seed of a sheet's tolerance analysis.
type Sampling struct {
	Samples int
	Seed    uint64
}

// Sampled returns the sample count and seed of the sheet's tolerance
// analysis, nil for a sheet without tolerances.
func (s *Sheet) Sampled() *Sampling { return s.sampling }

// ReleaseCalc lets go of the sheet's compiled calculation, its
// conditions and what was found of its checks, once its page and what
// the package pages and the audit read of it are made: a package of
// thousands of sheets then holds one calculation per sheet being worked,
// not one per sheet. The sheet's title block, tally, diagnostics and
// sampling stay; its page, the package pages and the JSON can no longer
// be rendered from it.
func (s *Sheet) ReleaseCalc() {
	s.Calc, s.Conditions, s.fixed, s.bands = nil, nil, nil, nil
}

// CalcReleased reports whether ReleaseCalc let go of the calculation.
func (s *Sheet) CalcReleased() bool { return s.Calc == nil }

// Band returns the tolerance band a check is one side of: the sheet checks
// the same quantity against a lower and an upper limit.
func (s *Sheet) Band(st *engine.Statement) (band.Band, bool) {
	s.bandOnce.Do(func() { s.bands = band.Find(s.Calc.Statements, s.Calc.Result) })
	b, ok := s.bands[st]
	return b, ok
}

// govern works the sheet out over its conditions, and shows each check
// that a case or a sweep reaches where it governs.
func govern(calc *engine.Calc) *conditions.Report {
	r := conditions.Run(calc)
	for _, st := range calc.Statements {
		g, ok := r.Governing(st)
		if !ok {
			continue
		}
		res := g.Result
		if res.Err != nil && g.Where != "as written" {
			// The error is the condition's: say which, where it shows.
			d := *res.Err
			d.Message = g.Where + ": " + d.Message
			res.Err = &d
		}
		calc.Govern(st, res)
	}
	return r
}

// Fixed reports whether a check of the sheet cannot fail (or cannot pass):
// its outcome does not depend on its inputs, so it is not counted as a
// pass. holds is the outcome it always has.
func (s *Sheet) Fixed(st *engine.Statement) (fixed, holds bool) {
	o := s.fixed[st]
	return o.Fixed, o.Holds
}

// Path is the sheet's path inside the package, with forward slashes.
func (s *Sheet) Path() string { return s.Doc.Path }

// ReleaseProse lets go of the sheet's Markdown tree, which only its page
// needs, once the page is rendered, so that a package of thousands of
// sheets does not hold every tree until the end. The page cannot be
// rendered again; everything else about the sheet stays.
func (s *Sheet) ReleaseProse() { s.Doc.Doc = nil }

// ReleaseFormulaText lets go of the text of the sheet's formula blocks,
// assumptions and tables, which compiling read and which the compiled
// statements hold on their own. Call it only once every sheet of the
// package is compiled: a sheet may be another's template.
func (s *Sheet) ReleaseFormulaText() {
	s.Doc.Blocks, s.Doc.Assumptions, s.Doc.Tables = nil, nil, nil
}

// ProseReleased reports whether ReleaseProse let go of the tree.
func (s *Sheet) ProseReleased() bool { return s.Doc.Doc == nil }

// Title is the sheet's title, or its file name when it has none.
func (s *Sheet) Title() string {
	if s.Doc.Meta.Title != "" {
		return s.Doc.Meta.Title
	}
	return strings.TrimSuffix(path.Base(s.Doc.Path), ".md")
}

// Load reads a package from a folder, or from a single Markdown file.
// Every .md file below the folder is read, except in folders whose names
// start with "."; files in folders whose names start with "_", and sheets
// whose front matter says template: true, are templates: other sheets use
// them, and they are not pages of their own. A single file is read with
// the templates it uses, from the folder it lies in, and nothing else.
// Nothing outside the folder is read: a symbolic link that resolves
// outside it is an error. Load fails when the files cannot be read or
// their names clash; problems inside the sheets are diagnostics of the
// returned package.
func Load(root string) (*Package, error) { return LoadWith(root, LoadOptions{}) }

// LoadOptions say what to do with each sheet while a package loads.
type LoadOptions struct {
	// Evaluated, when set, is called with each page as soon as it is
	// evaluated, from the goroutine that evaluated it and in no set
	// order, so that a build can render the page and let go of what
	// only the page needs while the other sheets compile. When it is
	// called, the package's Files, stamp and BuildDate are final; its
	// Sheets are not, and it must not read them. It is not called for a
	// single sheet, whose templates are read as they are used.
	Evaluated func(pkg *Package, s *Sheet)
	// Prose says that Evaluated renders the pages, which read the
	// sheets' Markdown trees. With Evaluated set, no page holds its tree
	// from the start (thousands of trees would be the largest part of
	// memory): with Prose, a page is parsed again just before it is
	// compiled, and its tree and formula text are let go once Evaluated
	// returns; without, a page's tree is let go as soon as it is read.
	Prose bool
}

// LoadWith is Load with options.
func LoadWith(root string, opt LoadOptions) (*Package, error) {
	info, err := os.Stat(root)
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %w", root, err)
	}
	if !info.IsDir() {
		pkg, err := loadOne(root)
		if pkg != nil {
			pkg.loadedFrom = root
		}
		return pkg, err
	}
	f, err := openFolder(root)
	if err != nil {
		return nil, err
	}
	files, err := f.readAll()
	if err != nil {
		return nil, err
	}
	if !hasSheets(files) {
		return nil, fmt.Errorf("%s holds no Markdown sheets (*.md)", root)
	}
	if err := distinctNames(mapKeys(files)); err != nil {
		return nil, err
	}
	pkg := build(root, files, nil, nil, opt)
	pkg.loadedFrom = root
	return pkg, nil
}

// loadOne reads one sheet, and the templates it uses when it uses them.
func loadOne(file string) (*Package, error) {
	dir := filepath.Dir(file)
	f, err := openFolder(dir)
	if err != nil {
		return nil, err
	}
	one := filepath.ToSlash(filepath.Base(file))
	data, err := f.read(one)
	if err != nil {
		return nil, err
	}
	return build(dir, map[string][]byte{one: data}, func(p string) bool { return p == one }, f, LoadOptions{}), nil
}

// sheetPaths lists the sheets among the files, sorted; the data files
// are read when a table names them.
func sheetPaths(files map[string][]byte) []string {
	var out []string
	for _, p := range mapKeys(files) {
		if isSheet(p) {
			out = append(out, p)
		}
	}
	return out
}

func mapKeys(files map[string][]byte) []string {
	keys := make([]string, 0, len(files))
	for k := range files {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

// isTemplatePath reports whether a file lies in a folder whose name starts
// with "_".
func isTemplatePath(p string) bool {
	parts := strings.Split(p, "/")
	for _, d := range parts[:len(parts)-1] {
		if strings.HasPrefix(d, "_") {
			return true
		}
	}
	return false
}

// FromFiles builds a package from file contents keyed by their path inside
// the package. Files are parsed and sheets compiled in parallel; the result
// does not depend on the order in which they finish.
func FromFiles(root string, files map[string][]byte) *Package {
	return build(root, files, nil, nil, LoadOptions{})
}

// build builds a package whose pages are the sheets page accepts (all but
// templates when page is nil); every file is available as a template, and
// so is every sheet of more, when more is not nil, read when it is used.
// Each page is handed to opt.Evaluated, when it is set, once it is
// evaluated.
func build(root string, files map[string][]byte, page func(string) bool, more *folder, opt LoadOptions) *Package {
	paths := sheetPaths(files)
	docs := make([]*sheets.Document, len(paths))
	var ln *lean
	if opt.Evaluated != nil && page == nil && more == nil {
		ln = &lean{files: files, prose: opt.Prose, takes: make([][]engine.TakeRef, len(paths))}
	}
	parallel(len(paths), func(i int) {
		docs[i] = sheets.Parse(paths[i], files[paths[i]])
		if ln != nil && !isTemplate(docs[i]) {
			docs[i], ln.takes[i] = ln.thin(docs[i])
		}
	})
	return assemble(root, files, docs, page, more, opt.Evaluated, nil, ln)
}

// lean is how a build of many sheets loads its pages without holding
// every page's parsed document at once: each page is read once to plan
// the compile (its title block and what it takes) and again, whole, just
// before it is compiled.
type lean struct {
	files map[string][]byte
	prose bool               // the pages are rendered: keep the tree until Evaluated returns
	takes [][]engine.TakeRef // by file, in path order: what each page takes
}

// thin keeps of a page only its path and title block, and what it takes.
func (ln *lean) thin(d *sheets.Document) (*sheets.Document, []engine.TakeRef) {
	refs := engine.TakenSheets(sourceOf(d, nil))
	return &sheets.Document{Path: d.Path, Meta: d.Meta}, refs
}

// whole parses a page again, for compiling; without prose its tree goes
// at once.
func (ln *lean) whole(d *sheets.Document) *sheets.Document {
	doc := sheets.Parse(d.Path, ln.files[d.Path])
	if !ln.prose {
		doc.Doc = nil
	}
	return doc
}

// assemble compiles and evaluates the parsed docs (one per file, in path
// order) as build does, except that a page found in keep is taken as it is
// instead of being compiled again (see Update). With ln, the pages among
// docs are thin (see lean): each is parsed again before it is compiled,
// and its tree and formula text go once evaluated returns.
func assemble(root string, files map[string][]byte, docs []*sheets.Document, page func(string) bool, more *folder, evaluated func(*Package, *Sheet), keep map[string]*Sheet,
	ln *lean) *Package {
	pkg := &Package{Root: root, whole: page == nil && more == nil}
	r := &resolver{docs: map[string]*sheets.Document{}, more: more, files: files, thin: map[string]bool{}}
	var pages []*sheets.Document
	var taken [][]engine.TakeRef
	for i, d := range docs {
		r.docs[d.Path] = d
		if ln != nil && !isTemplate(d) {
			r.thin[d.Path] = true
		}
		switch {
		case page != nil && page(d.Path):
			pages = append(pages, d)
		case page != nil:
		case isTemplate(d):
			pkg.Templates = append(pkg.Templates, d)
		default:
			pages = append(pages, d)
			if ln != nil {
				taken = append(taken, ln.takes[i])
			}
		}
	}
	pkg.Sheets = make([]*Sheet, len(pages))
	pkg.latestDate = latestDate(pages)
	if more == nil {
		// Every file was read before compiling: the list is final now.
		pkg.Files = sourceFiles(r.files)
	} else {
		evaluated = nil
	}
	t := newTakes(pages, taken)
	// Sheets taken from compile before the sheets that take from them:
	// each wave compiles in parallel the sheets whose sources are done.
	for _, wave := range t.waves {
		parallel(len(wave), func(k int) {
			i := wave[k]
			doc := pages[i]
			if s, ok := keep[doc.Path]; ok {
				pkg.Sheets[i] = s
				t.done(i, s)
				return
			}
			if ln != nil {
				doc = ln.whole(doc)
			}
			var used usedFiles
			calc := engine.CompileWith(r.source(doc, &used), engine.Options{Resolve: used.recording(r.resolverFor(&used)), Take: t.find})
			calc.Evaluate()
			fixed := fixity.Find(calc) // while the program can still run
			conds := govern(calc)
			calc.Release()
			s := &Sheet{Doc: doc, Calc: calc, Page: PagePath(doc.Path), Number: i + 1, fixed: fixed, Conditions: conds, uses: used.sorted(), takes: t.named[i],
				diags: calc.Diags}
			s.rests = t.restsOn(i, s)
			s.counts = s.tally()
			if sp := conds.SpreadOf(); sp != nil {
				s.sampling = &Sampling{Samples: sp.Samples, Seed: sp.Seed}
			}
			pkg.Sheets[i] = s
			t.done(i, s)
			if evaluated != nil {
				evaluated(pkg, s)
			}
			if ln != nil {
				s.ReleaseProse()
				s.ReleaseFormulaText()
			}
		})
	}

	if more != nil {
		pkg.Files = sourceFiles(r.files) // with the templates read since
	}
	pkg.data = dataOf(pkg.Sheets, r.files)
	for _, d := range pkg.Templates {
		pkg.Diags = append(pkg.Diags, d.Diags...)
	}
	for _, s := range pkg.Sheets {
		pkg.Diags = append(pkg.Diags, s.Doc.Diags...)
		pkg.Diags = append(pkg.Diags, s.diags...)
	}
	pkg.Diags.Sort()
	return pkg
}

// isTemplate reports whether a file of a package folder is a template
// rather than a page: it says so, or it lies in a folder named "_...".
func isTemplate(d *sheets.Document) bool { return d.Meta.Template || isTemplatePath(d.Path) }

// PagePath is the path of a sheet's page inside a built package, with
// forward slashes: "sheets/field-coil.html" for "field-coil.md".
func PagePath(sheet string) string {
	return "sheets/" + strings.TrimSuffix(sheet, path.Ext(sheet)) + ".html"
}

// parallel runs f(0..n-1) on as many goroutines as there are processors.
func parallel(n int, f func(i int)) {
	work := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				f(i)
			}
		}()
	}
	for i := 0; i < n; i++ {
		work <- i
	}
	close(work)
	wg.Wait()
}

// sourceOf gives the engine a sheet's formula blocks, assumptions and
// tables; a table read from a file has its rows from read, or, when read
// is nil, none and an error that says they were not read.
func sourceOf(doc *sheets.Document, read func(t *sheets.TableText, from string) engine.TableSource) engine.SheetSource {
	src := engine.SheetSource{Path: doc.Path, Title: doc.Meta.Title, Caution: doc.Meta.Caution,
		Validity: doc.Meta.Validity, Sources: doc.Meta.Sources}
	for _, a := range doc.Assumptions {
		src.Assumptions = append(src.Assumptions, engine.AssumptionSource{ID: a.ID, Text: a.Text, Pos: a.Pos})
	}
	for _, t := range doc.Tables {
		if t.File != "" {
			if read == nil {
				src.Tables = append(src.Tables, engine.TableSource{Name: t.Name, Caption: t.Caption, Pos: t.Pos, File: t.File,
					Err: &diag.Diagnostic{Pos: t.FilePos, Message: "table " + t.Name + " is read from a file, which is read only in a package"}})
				continue
			}
			src.Tables = append(src.Tables, read(t, doc.Path))
			continue
		}
		src.Tables = append(src.Tables, engine.TableSource{Name: t.Name, Caption: t.Caption, Pos: t.Pos,
			Header: cellsOf(t.Header), Rows: rowsOf(t.Rows)})
	}
	for _, b := range doc.Blocks {
		eb := engine.SourceBlock{Fence: b.Fence}
		for _, l := range b.Lines {
			eb.Lines = append(eb.Lines, engine.SourceLine{Text: l.Text, Pos: l.Pos})
		}
		src.Blocks = append(src.Blocks, eb)
	}
	return src
}

func cellsOf(cells []sheets.Cell) []engine.CellSource {
	out := make([]engine.CellSource, len(cells))
	for i, c := range cells {
		out[i] = engine.CellSource{Text: c.Text, Pos: c.Pos}
	}
	return out
}

func rowsOf(rows [][]sheets.Cell) [][]engine.CellSource {
	out := make([][]engine.CellSource, len(rows))
	for i, row := range rows {
		out[i] = cellsOf(row)
	}
	return out
}

// resolver finds templates for use statements: the built-in library
// (lib/<name>) or a sheet of the package, by its path relative to the
// sheet that uses it. Nothing outside the package folder can be named: the
// package's files were read before compiling, and a path that leaves the
// folder is refused.
type resolver struct {
	mu    sync.Mutex
	docs  map[string]*sheets.Document
	files map[string][]byte // every file read, for the package's list
	more  *folder           // where to read templates not read yet, or nil
	// thin marks the pages a lean load keeps only the title block of: one
	// used as a template is parsed again when it is first used.
	thin map[string]bool
}

// doc finds a sheet of the package by its path, reading it from the
// folder when the package reads templates as they are used.
func (r *resolver) doc(p string) (*sheets.Document, error) {
	r.mu.Lock()
	defer r.mu.Unlock()
	if r.thin[p] {
		delete(r.thin, p)
		r.docs[p] = sheets.Parse(p, r.files[p])
	}
	if doc, ok := r.docs[p]; ok || r.more == nil {
		if !ok {
			return nil, fmt.Errorf("no sheet %s in the package", p)
		}
		return doc, nil
	}
	if !Selected(p) || !isSheet(p) {
		return nil, fmt.Errorf("no sheet %s in the package", p)
	}
	data, err := r.more.read(p)
	if errors.Is(err, fs.ErrNotExist) {
		return nil, fmt.Errorf("no sheet %s in the package", p)
	}
	if err != nil {
		return nil, err
	}
	doc := sheets.Parse(p, data)
	r.docs[p], r.files[p] = doc, data
	return doc, nil
}

// resolverFor is the resolver of one sheet's use statements: it notes
// in used the data files the templates' tables read.
func (r *resolver) resolverFor(used *usedFiles) engine.Resolver {
	return func(ref, from string) (engine.SheetSource, string, error) { return r.resolve(ref, from, used) }
}

func (r *resolver) resolve(ref, from string, used *usedFiles) (engine.SheetSource, string, error) {
	if name, ok := strings.CutPrefix(ref, sheets.LibraryPrefix); ok {
		doc, err := sheets.LibraryTemplate(name)
		if err != nil {
			return engine.SheetSource{}, "", err
		}
		return sourceOf(doc, nil), doc.Path, nil
	}
	if strings.HasPrefix(from, sheets.LibraryPrefix) {
		return engine.SheetSource{}, "", fmt.Errorf("a built-in template can use only other built-in templates, not %s", ref)
	}
	p, err := templatePath(ref, from)
	if err != nil {
		return engine.SheetSource{}, "", err
	}
	doc, err := r.doc(p)
	if err != nil {
		return engine.SheetSource{}, "", err
	}
	if doc.Diags.Errors() > 0 {
		d := doc.Diags[0]
		return engine.SheetSource{}, "", fmt.Errorf("template %s has an error at %s: %s", p, d.Pos, d.Message)
	}
	return r.source(doc, used), p, nil
}

// templatePath is the package file a use statement in the file at from
// names: a path relative to from, with or without .md, inside the folder.
func templatePath(ref, from string) (string, error) {
	p, written, inside := packagePath(ref, from)
	switch {
	case !written:
		return "", fmt.Errorf("template %s must be a path inside the package folder, written with /", ref)
	case !inside:
		return "", fmt.Errorf("template %s leaves the package folder; templates must lie inside it", ref)
	}
	return p, nil
}

// packagePath is the package file that ref, written in the file at from,
// names: a path relative to from, with or without .md. written is false
// for a path written as an absolute or Windows path, inside false for one
// that leaves the package folder.
func packagePath(ref, from string) (p string, written, inside bool) {
	if path.IsAbs(ref) || strings.ContainsAny(ref, "\\:") {
		return "", false, false
	}
	p = path.Clean(path.Join(path.Dir(from), ref))
	if !strings.EqualFold(path.Ext(p), ".md") {
		p += ".md"
	}
	return p, true, p != ".." && !strings.HasPrefix(p, "../")
}

// Counts tallies a sheet's or a package's outcomes.
type Counts struct {
	Results, Inputs, Pass, Fail, Errors, Blocked int
	// Fixed counts the checks whose outcome cannot depend on their inputs;
	// they are neither passes nor failures.
	Fixed int
}

// Add sums two tallies.
func (c Counts) Add(o Counts) Counts {
	return Counts{c.Results + o.Results, c.Inputs + o.Inputs, c.Pass + o.Pass, c.Fail + o.Fail, c.Errors + o.Errors, c.Blocked + o.Blocked, c.Fixed + o.Fixed}
}

// Checks counts the checks that were evaluated: passes, failures and fixed.
func (c Counts) Checks() int { return c.Pass + c.Fail + c.Fixed }

// Counts tallies the sheet. Errors counts every error diagnostic of the
// sheet, including those outside statements (front matter, empty blocks).
func (s *Sheet) Counts() Counts { return s.counts }

// tally counts the sheet's outcomes, once, when it is evaluated.
func (s *Sheet) tally() Counts {
	var c Counts
	caseErrors := 0
	for _, st := range s.Calc.Statements {
		status := s.Calc.Result(st).Status
		if fixed, _ := s.Fixed(st); fixed && (status == engine.Pass || status == engine.Fail) {
			c.Fixed++
			continue
		}
		switch status {
		case engine.OK:
			if st.Kind == engine.Use || st.IsCondition() {
				continue // an instance's results are its own statements; a condition has none
			}
			c.Results++
			if st.IsInput() {
				c.Inputs++
			}
		case engine.Pass:
			c.Pass++
		case engine.Fail:
			c.Fail++
		case engine.Blocked:
			c.Blocked++
		case engine.Errored:
			if _, governed := s.Conditions.Governing(st); governed && st.Verdict != engine.Errored {
				caseErrors++ // an error of a case or sweep point, not among the sheet's diagnostics
			}
		}
	}
	c.Errors = s.Doc.Diags.Errors() + s.Calc.Diags.Errors() + caseErrors
	return c
}

// Counts tallies the whole package.
func (p *Package) Counts() Counts {
	var c Counts
	for _, s := range p.Sheets {
		c = c.Add(s.Counts())
	}
	return c
}

// Digits is the number of significant figures for a sheet: the sheet's own
// setting, else the package default given.
func (s *Sheet) Digits(def int) int {
	if s.Doc.Meta.Digits > 0 {
		return s.Doc.Meta.Digits
	}
	if def > 0 {
		return def
	}
	return DefaultDigits
}
