package build

import (
	"bufio"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sync"

	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// target is an output folder made ready for a build: its path resolved,
// its lock held, the leftovers of killed builds gone. Its staging and
// aside folders and its lock file lie beside it, under hidden names.
type target struct {
	given   string // the folder as the user named it, for messages
	out     string
	staging string
	aside   string
	unlock  func()
}

// writeFile writes a file into the staging folder and exchangeFolders
// swaps two folders; tests replace them to make a write fail or to take
// the two-rename path.
var (
	writeFile       = os.WriteFile
	exchangeFolders = exchange
)

// prepare refuses an output folder that would overwrite the sources or
// files sheaf did not write, takes its lock, and clears what killed
// builds left beside it.
func prepare(out, sources string) (*target, error) {
	o, err := resolve(out)
	if err != nil {
		return nil, fmt.Errorf("-o %s: %w", out, err)
	}
	suggest := filepath.Join(filepath.Dir(sources), filepath.Base(sources)+"-html")
	switch {
	case o == filepath.Dir(o):
		return nil, fmt.Errorf("-o %s is the root of the file system: a build replaces its output folder whole; name a folder of its own, for example %s", out, suggest)
	case within(o, sources):
		return nil, fmt.Errorf("-o %s lies inside the package's sources (%s): sheaf never writes there; choose a folder outside them, for example %s", out, sources, suggest)
	case within(sources, o):
		return nil, fmt.Errorf("-o %s holds the package's sources (%s): a build replaces its output folder whole; choose a folder of its own, for example %s", out, sources, suggest)
	}
	parent, base := filepath.Dir(o), filepath.Base(o)
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return nil, fmt.Errorf("cannot make the folder for -o %s: %w", out, err)
	}
	t := &target{given: out, out: o,
		staging: filepath.Join(parent, "."+base+".sheaf-staging"),
		aside:   filepath.Join(parent, "."+base+".sheaf-old"),
	}
	t.unlock, err = lock(filepath.Join(parent, "."+base+".sheaf-lock"))
	if errors.Is(err, errBusy) {
		return nil, fmt.Errorf("another sheaf build is writing %s now: wait for it to finish, then build again", out)
	}
	if err != nil {
		return nil, fmt.Errorf("cannot lock %s for the build (sheaf keeps a lock file beside it, so its folder must be writable): %w", out, err)
	}
	if err := t.recover(); err != nil {
		t.unlock()
		return nil, err
	}
	if err := ownFolder(out, o); err != nil {
		t.unlock()
		return nil, err
	}
	return t, nil
}

// recover undoes what a killed build left: a previous package moved aside
// but not replaced goes back, and half-written or old folders go.
func (t *target) recover() error {
	if _, err := os.Lstat(t.out); errors.Is(err, fs.ErrNotExist) {
		// Only a whole package goes back: one whose removal had begun
		// may have lost its manifest, and is removed below.
		if data, err := os.ReadFile(filepath.Join(t.aside, ManifestName)); err == nil && isManifest(data) {
			if err := os.Rename(t.aside, t.out); err != nil {
				return fmt.Errorf("cannot restore the previous package %s from %s: %w", t.given, t.aside, err)
			}
		}
	}
	for _, p := range []string{t.staging, t.aside} {
		if err := removeAll(p); err != nil {
			return fmt.Errorf("cannot remove %s, left by an earlier build of %s: %w; remove it by hand", p, t.given, err)
		}
	}
	return nil
}

// ownFolder refuses an output folder that holds files sheaf did not
// write: a build replaces the folder whole, and would delete them.
func ownFolder(given, out string) error {
	info, err := os.Lstat(out)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil
	case err != nil:
		return err
	case !info.IsDir():
		return fmt.Errorf("-o %s is a file, not a folder: name a new or empty folder, or one that sheaf built", given)
	}
	entries, err := os.ReadDir(out)
	if err != nil || len(entries) == 0 {
		return err
	}
	if data, err := os.ReadFile(filepath.Join(out, ManifestName)); err == nil && isManifest(data) {
		return nil
	}
	return fmt.Errorf("-o %s holds files that sheaf did not write (%s, and no %s): a build replaces its output folder whole "+
		"and would delete them; name a new or empty folder, or one that sheaf built", given, entries[0].Name(), ManifestName)
}

// isManifest reports whether data is a manifest that sheaf wrote.
func isManifest(data []byte) bool {
	_, err := ParseManifest(data)
	return err == nil
}

// build stages the package, its manifest and the JSON, then swaps the
// staging folder in for the output. On any error the output is left as
// it was.
//
// Each sheet's page is rendered and written as soon as the sheet is
// evaluated, and the sheet then lets go of its Markdown tree, so that a
// large package never holds every tree and page at once; the index, the
// registers and the audit follow once every sheet is done.
func (t *target) build(src string, opt Options) (res *Result, err error) {
	if err := os.Mkdir(t.staging, 0o755); err != nil {
		return nil, fmt.Errorf("cannot stage the build beside %s (sheaf writes the package there first, so that folder must be writable): %w", t.given, err)
	}
	defer func() {
		if err != nil {
			_ = removeAll(t.staging)
			err = fmt.Errorf("%w; %s is left as it was", err, t.given)
		}
	}()
	sp := t.newSheetPages()
	dg, err := t.newDigests(opt.JSON != "")
	if err != nil {
		return nil, err
	}
	defer dg.close()
	res, err = load(src, opt, func(pkg *project.Package, s *project.Sheet, ropt render.Options) {
		sp.add(pkg, s, ropt)
		dg.add(pkg, s, ropt)
	}, dg.audit)
	sp.wait()
	if err == nil {
		err = dg.err
	}
	if err != nil {
		return nil, err
	}
	for _, s := range res.Package.Sheets {
		if s.ProseReleased() { // a single sheet's page is still to come
			s.ReleaseFormulaText()
		}
	}
	res.Render.Digests = dg.digests
	return res, t.write(res, sp, opt.JSON, dg.close)
}

// putSheet renders one sheet's page and writes it into the staging
// folder.
func (t *target) putSheet(pkg *project.Package, s *project.Sheet, ropt render.Options) (Page, error) {
	f, err := render.SheetFile(pkg, s, ropt)
	if err != nil {
		return Page{}, err
	}
	s.ReleaseProse()
	return PageOf(f), t.put(f.Path, f.Data)
}

// sheetPages writes the sheet pages rendered while the package loads, on
// goroutines of their own, so that waiting for the disk does not hold up
// compiling; a few pages at most wait in memory to be written.
type sheetPages struct {
	t     *target
	queue chan render.File
	wg    sync.WaitGroup
	mu    sync.Mutex
	pages map[string]Page // by page path, once written
	errs  map[string]error
}

func (t *target) newSheetPages() *sheetPages {
	sp := &sheetPages{t: t, queue: make(chan render.File, 2*runtime.GOMAXPROCS(0)),
		pages: map[string]Page{}, errs: map[string]error{}}
	for w := 0; w < 2; w++ {
		sp.wg.Add(1)
		go func() {
			defer sp.wg.Done()
			for f := range sp.queue {
				sp.record(f.Path, PageOf(f), t.put(f.Path, f.Data))
			}
		}()
	}
	return sp
}

// add renders the page of a sheet just evaluated, lets go of the sheet's
// Markdown tree and queues the page to be written.
func (sp *sheetPages) add(pkg *project.Package, s *project.Sheet, ropt render.Options) {
	f, err := render.SheetFile(pkg, s, ropt)
	if err != nil {
		sp.record(s.Page, Page{}, err)
		return
	}
	s.ReleaseProse()
	sp.queue <- f
}

// wait waits for the queued pages to be written.
func (sp *sheetPages) wait() {
	close(sp.queue)
	sp.wg.Wait()
}

func (sp *sheetPages) record(page string, p Page, err error) {
	sp.mu.Lock()
	defer sp.mu.Unlock()
	if err != nil {
		sp.errs[page] = err
		return
	}
	sp.pages[page] = p
}

// write writes the package pages, the sheet pages not written yet, the
// JSON and the manifest into the staging folder, calls done, and swaps it
// in. Pages are listed in a fixed order: the package pages, then the
// sheets'.
func (t *target) write(res *Result, sp *sheetPages, jsonPath string, done func()) error {
	made := map[string]bool{ManifestName: true}
	var pages []Page
	err := render.EachPackageFile(res.Package, res.Render, func(f render.File) error {
		pages = append(pages, PageOf(f))
		made[f.Path] = true
		return t.put(f.Path, f.Data)
	})
	if err == nil {
		err = res.Render.Digests.Err()
	}
	if err != nil {
		return err
	}
	ropt := res.Render.ForPackage(res.Package)
	for _, s := range res.Package.Sheets {
		if err := sp.errs[s.Page]; err != nil {
			return err
		}
		p, ok := sp.pages[s.Page]
		if !ok { // a single sheet: its page waited for its templates
			var err error
			if p, err = t.putSheet(res.Package, s, ropt); err != nil {
				return err
			}
		}
		pages = append(pages, p)
		made[p.Path] = true
	}
	m := NewManifest(res, pages)
	if jsonPath != "" {
		var err error
		if m.JSON, err = t.writeJSON(res, jsonPath, made); err != nil {
			return err
		}
	}
	data, err := m.Marshal()
	if err != nil {
		return err
	}
	if err := t.put(ManifestName, data); err != nil {
		return err
	}
	done()
	if err := t.swap(); err != nil {
		return fmt.Errorf("cannot put the new package in the place of %s (sheaf swaps whole folders, so it must be an ordinary folder, not a mount point): %w", t.given, err)
	}
	return nil
}

// put writes one file of the package into the staging folder.
func (t *target) put(rel string, data []byte) error {
	p := filepath.Join(t.staging, filepath.FromSlash(rel))
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		return err
	}
	return writeFile(p, data, 0o644)
}

// stream writes one file of the package into the staging folder with
// what fill writes, without holding it all in memory.
func (t *target) stream(rel string, fill func(io.Writer) error) error {
	p := filepath.Join(t.staging, filepath.FromSlash(rel))
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		return err
	}
	f, err := os.Create(p)
	if err != nil {
		return err
	}
	w := bufio.NewWriter(f)
	err = fill(w)
	if err == nil {
		err = w.Flush()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return err
}

// writeJSON writes the JSON document: into the staging folder when it
// lies inside the output, where the manifest lists it, else beside.
func (t *target) writeJSON(res *Result, path string, made map[string]bool) (*Page, error) {
	p, err := resolve(path)
	if err != nil {
		return nil, err
	}
	if !within(p, t.out) {
		return nil, atomicfile.WriteFunc(path, 0o644, res.WriteJSON)
	}
	rel, _ := filepath.Rel(t.out, p)
	rel = filepath.ToSlash(rel)
	if rel == "." || made[rel] {
		return nil, fmt.Errorf("--json %s would replace a file of the package; name another file", path)
	}
	h := sha256.New()
	if err := t.stream(rel, func(w io.Writer) error { return res.WriteJSON(io.MultiWriter(w, h)) }); err != nil {
		return nil, err
	}
	return &Page{Path: rel, SHA256: hex.EncodeToString(h.Sum(nil))}, nil
}

// swap puts the staging folder in the output's place in one step where
// the system can exchange two folders, else in two renames that recover
// undoes if the build is killed between them. The previous package is
// then removed; what a failed removal leaves, the next build removes.
func (t *target) swap() error {
	if _, err := os.Lstat(t.out); errors.Is(err, fs.ErrNotExist) {
		return os.Rename(t.staging, t.out)
	}
	err := exchangeFolders(t.staging, t.out)
	if err == nil {
		_ = removeAll(t.staging) // now the previous package
		return nil
	}
	if !errors.Is(err, errNoExchange) {
		return err
	}
	if err := os.Rename(t.out, t.aside); err != nil {
		return err
	}
	if err := os.Rename(t.staging, t.out); err != nil {
		_ = os.Rename(t.aside, t.out)
		return err
	}
	_ = removeAll(t.aside)
	return nil
}

// removeAll removes a folder of a previous build, making its folders
// writable first when a read-only one keeps its files.
func removeAll(p string) error {
	if err := os.RemoveAll(p); err == nil {
		return nil
	}
	_ = filepath.WalkDir(p, func(q string, d fs.DirEntry, err error) error {
		if err == nil && d.IsDir() {
			_ = os.Chmod(q, 0o700)
		}
		return nil
	})
	return os.RemoveAll(p)
}
