// Package project loads a folder of sheets as one calculation package: it
// reads every Markdown file with the sheets package, compiles and evaluates
// its formula blocks with the engine, and gathers the diagnostics. The
// renderers take a Package and show it; they compute nothing.
package project

import (
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// DefaultDigits is the number of significant figures results are shown to
// when neither the command line nor a sheet says otherwise.
const DefaultDigits = 4

// Package is a compiled and evaluated calculation package.
type Package struct {
	Root   string       // the folder as given
	Sheets []*Sheet     // sorted by path
	Files  []SourceFile // every source file with its hash, sorted by path
	Diags  diag.List
}

// Sheet pairs a parsed Markdown sheet with its compiled calculation.
type Sheet struct {
	Doc  *sheets.Sheet
	Calc *engine.Sheet
	// Page is the path of the sheet's page inside a built package, with
	// forward slashes: "sheets/field-coil.html".
	Page string
}

// Path is the sheet's path inside the package, with forward slashes.
func (s *Sheet) Path() string { return s.Doc.Path }

// Title is the sheet's title, or its file name when it has none.
func (s *Sheet) Title() string {
	if s.Doc.Meta.Title != "" {
		return s.Doc.Meta.Title
	}
	return strings.TrimSuffix(path.Base(s.Doc.Path), ".md")
}

// Load reads a package from a folder (every .md file below it, skipping
// folders whose names start with . or _) or from a single Markdown file.
// It fails only when the files cannot be read; problems inside the sheets
// are diagnostics of the returned package.
func Load(root string) (*Package, error) {
	info, err := os.Stat(root)
	if err != nil {
		return nil, fmt.Errorf("cannot read %s: %w", root, err)
	}
	files := map[string][]byte{}
	if !info.IsDir() {
		data, err := os.ReadFile(root)
		if err != nil {
			return nil, err
		}
		files[filepath.Base(root)] = data
		return FromFiles(filepath.Dir(root), files), nil
	}
	err = filepath.WalkDir(root, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		name := d.Name()
		if d.IsDir() {
			if p != root && (strings.HasPrefix(name, ".") || strings.HasPrefix(name, "_")) {
				return filepath.SkipDir
			}
			return nil
		}
		if !strings.EqualFold(filepath.Ext(name), ".md") {
			return nil
		}
		data, err := os.ReadFile(p)
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(root, p)
		files[filepath.ToSlash(rel)] = data
		return nil
	})
	if err != nil {
		return nil, err
	}
	if len(files) == 0 {
		return nil, fmt.Errorf("%s holds no Markdown sheets (*.md)", root)
	}
	return FromFiles(root, files), nil
}

// FromFiles builds a package from file contents keyed by their path inside
// the package. Sheets compile in parallel; the result does not depend on
// the order in which they finish.
func FromFiles(root string, files map[string][]byte) *Package {
	paths := make([]string, 0, len(files))
	for p := range files {
		paths = append(paths, p)
	}
	sort.Strings(paths)
	pkg := &Package{Root: root, Sheets: make([]*Sheet, len(paths)), Files: sourceFiles(files)}

	work := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				pkg.Sheets[i] = compileSheet(paths[i], files[paths[i]])
			}
		}()
	}
	for i := range paths {
		work <- i
	}
	close(work)
	wg.Wait()

	for _, s := range pkg.Sheets {
		pkg.Diags = append(pkg.Diags, s.Doc.Diags...)
		pkg.Diags = append(pkg.Diags, s.Calc.Diags...)
	}
	pkg.Diags.Sort()
	return pkg
}

func compileSheet(p string, data []byte) *Sheet {
	doc := sheets.Parse(p, data)
	src := engine.SheetSource{Path: p}
	for _, a := range doc.Assumptions {
		src.Assumptions = append(src.Assumptions, engine.AssumptionSource{ID: a.ID, Text: a.Text, Pos: a.Pos})
	}
	for _, b := range doc.Blocks {
		eb := engine.Block{Fence: b.Fence}
		for _, l := range b.Lines {
			eb.Lines = append(eb.Lines, engine.Line{Text: l.Text, Pos: l.Pos})
		}
		src.Blocks = append(src.Blocks, eb)
	}
	calc := engine.Compile(src)
	calc.Evaluate()
	return &Sheet{Doc: doc, Calc: calc, Page: "sheets/" + strings.TrimSuffix(p, path.Ext(p)) + ".html"}
}

// Counts tallies a sheet's or a package's outcomes.
type Counts struct {
	Results, Inputs, Pass, Fail, Errors, Blocked int
}

// Add sums two tallies.
func (c Counts) Add(o Counts) Counts {
	return Counts{c.Results + o.Results, c.Inputs + o.Inputs, c.Pass + o.Pass, c.Fail + o.Fail, c.Errors + o.Errors, c.Blocked + o.Blocked}
}

// Counts tallies the sheet. Errors counts every error diagnostic of the
// sheet, including those outside statements (front matter, empty blocks).
func (s *Sheet) Counts() Counts {
	var c Counts
	for _, st := range s.Calc.Statements {
		switch st.Status {
		case engine.OK:
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
		}
	}
	c.Errors = s.Doc.Diags.Errors() + s.Calc.Diags.Errors()
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
