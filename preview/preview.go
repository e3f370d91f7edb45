// Package preview serves a package on localhost while its sheets are
// edited: it rebuilds the pages in memory when a source changes (fsnotify),
// only those of the sheets the change touches and the package pages, and
// tells the open pages to reload through server-sent events. The
// reload script is added only to the pages it serves; built pages stay
// free of scripts. An edit that does not load (a deleted file, a renamed
// folder) keeps the last good pages and shows the error on each of them;
// errors inside a sheet show in place, on the sheet's page, as a build
// draws them.
package preview

import (
	"bytes"
	"context"
	"fmt"
	"html"
	"net"
	"net/http"
	"os"
	"path"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"time"

	"github.com/fsnotify/fsnotify"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// eventsPath is where the open pages listen for a reload.
const eventsPath = "/_sheaf/events"

// reloadScript is added before </body> of every served page. It names the
// build the page came from, so that a page that connects after a rebuild
// it missed reloads at once.
func reloadScript(build int) string {
	return `<script>new EventSource("` + eventsPath + `?build=` + strconv.Itoa(build) + `").onmessage=function(){location.reload()}</script>`
}

// settle is how long the server waits after a change for more changes
// (editors write a file in several steps) before it rebuilds.
const settle = 40 * time.Millisecond

// Server serves one package and rebuilds it on change.
type Server struct {
	src string
	opt build.Options

	// res is the last good build; only the rebuilding goroutine (New,
	// then Watch) touches it.
	res *build.Result

	mu    sync.Mutex
	pages map[string][]byte // the last good pages, by path
	// later, when set, renders the package pages of the last good build
	// when one is first asked for; pages holds them until then only as
	// they were before the last edit, and is not read for them.
	later   *packagePages
	problem string // why the last rebuild failed, or ""
	clients map[chan struct{}]bool
	builds  int // rebuilds done, for tests
}

// New loads the package at src and renders its pages.
func New(src string, opt build.Options) (*Server, error) {
	s := &Server{src: src, opt: opt, clients: map[chan struct{}]bool{}}
	if err := s.rebuild(); err != nil {
		return nil, err
	}
	return s, nil
}

// rebuild brings the pages up to date with the sources: it evaluates
// and renders again only the sheets an edit touches, with the package
// pages (see build.Result.Reload), and keeps every other page as it is.
// On failure it keeps the pages it has and records the problem.
func (s *Server) rebuild() error {
	var (
		res    *build.Result
		redone []*project.Sheet
		err    error
	)
	if s.res == nil {
		res, err = build.Load(s.src, s.opt)
		if err == nil {
			redone = res.Package.Sheets
		}
	} else {
		res, redone, err = s.res.Reload(s.opt)
	}
	var pages map[string][]byte
	var later *packagePages
	if err == nil && res != s.res {
		pages, later, err = s.render(res, redone)
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	s.builds++
	if err != nil {
		s.problem = err.Error()
		return err
	}
	if pages != nil {
		s.res, s.pages, s.later = res, pages, later
	}
	s.problem = ""
	return nil
}

// packagePages renders the index, the registers and the audit of one
// build once, when the first of them is asked for: they read every sheet
// and the audit, and the page an edit is seen on is the sheet's.
type packagePages struct {
	once  sync.Once
	res   *build.Result
	pages map[string][]byte
}

// get is a package page, and whether it is one.
func (pp *packagePages) get(p string) ([]byte, bool) {
	pp.once.Do(func() {
		pp.pages = map[string][]byte{}
		for _, f := range pp.res.PackagePages() {
			pp.pages[f.Path] = f.Data
		}
	})
	data, ok := pp.pages[p]
	return data, ok
}

// render gives the pages of res: every page when every sheet was
// evaluated again, else the last pages with the pages of the sheets
// redone rendered again, and the package pages to render when asked.
func (s *Server) render(res *build.Result, redone []*project.Sheet) (map[string][]byte, *packagePages, error) {
	pages := map[string][]byte{}
	if len(redone) == len(res.Package.Sheets) {
		err := res.Pages(func(f render.File) error {
			pages[f.Path] = f.Data
			return nil
		})
		return pages, nil, err
	}
	s.mu.Lock()
	for p, data := range s.pages {
		pages[p] = data
	}
	s.mu.Unlock()
	opt := res.Render.ForPackage(res.Package)
	files := make([]render.File, len(redone))
	errs := make([]error, len(redone))
	var wg sync.WaitGroup
	work := make(chan int)
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				files[i], errs[i] = render.SheetFile(res.Package, redone[i], opt)
			}
		}()
	}
	for i := range redone {
		work <- i
	}
	close(work)
	wg.Wait()
	for i, f := range files {
		if errs[i] != nil {
			return nil, nil, errs[i]
		}
		pages[f.Path] = f.Data
	}
	return pages, &packagePages{res: res}, nil
}

// Builds is the number of rebuilds done so far, the first included.
func (s *Server) Builds() int {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.builds
}

// ServeHTTP serves a page with the reload script, or the event stream.
func (s *Server) ServeHTTP(w http.ResponseWriter, r *http.Request) {
	if r.URL.Path == eventsPath {
		s.events(w, r)
		return
	}
	p := strings.TrimPrefix(path.Clean("/"+r.URL.Path), "/")
	if p == "" {
		p = "index.html"
	}
	s.mu.Lock()
	data, ok := s.pages[p]
	problem, build, later := s.problem, s.builds, s.later
	s.mu.Unlock()
	// Sheets' pages lie under sheets/ (project.PagePath), package pages
	// beside it.
	if later != nil && !strings.HasPrefix(p, "sheets/") {
		if pp, isPackagePage := later.get(p); isPackagePage {
			data, ok = pp, true
		}
	}
	if !ok {
		http.Error(w, "no page "+p+" in the package; the index is at /", http.StatusNotFound)
		return
	}
	w.Header().Set("Cache-Control", "no-store")
	if !strings.HasSuffix(p, ".html") { // a data file's copy, as read
		w.Header().Set("Content-Type", "text/csv; charset=utf-8")
		w.Write(data)
		return
	}
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.Write(servedPage(data, problem, build))
}

// servedPage adds the reload script and, when the last rebuild failed,
// a banner with the reason, to a built page.
func servedPage(data []byte, problem string, build int) []byte {
	i := bytes.LastIndex(data, []byte("</body>"))
	if i < 0 {
		return data
	}
	var b bytes.Buffer
	b.Grow(len(data) + 512)
	b.Write(data[:i])
	if problem != "" {
		b.WriteString(`<div role="alert" style="position:fixed;left:0;right:0;top:0;z-index:9;background:#b3261e;color:#fff;padding:.6rem 1rem;font:14px/1.4 system-ui,sans-serif;white-space:pre-wrap">`)
		b.WriteString("The package did not rebuild; these pages are from the last good build.\n" + html.EscapeString(problem) + "</div>")
	}
	b.WriteString(reloadScript(build))
	b.Write(data[i:])
	return b.Bytes()
}

// events holds a server-sent event stream open and sends "reload" after
// each rebuild.
func (s *Server) events(w http.ResponseWriter, r *http.Request) {
	fl, ok := w.(http.Flusher)
	if !ok {
		http.Error(w, "streaming not supported", http.StatusInternalServerError)
		return
	}
	ch := make(chan struct{}, 1)
	s.mu.Lock()
	s.clients[ch] = true
	if since, err := strconv.Atoi(r.URL.Query().Get("build")); err == nil && since != s.builds {
		ch <- struct{}{} // the page is older than the last rebuild
	}
	s.mu.Unlock()
	defer func() {
		s.mu.Lock()
		delete(s.clients, ch)
		s.mu.Unlock()
	}()
	w.Header().Set("Content-Type", "text/event-stream")
	w.Header().Set("Cache-Control", "no-store")
	fmt.Fprint(w, ": connected\n\n")
	fl.Flush()
	for {
		select {
		case <-r.Context().Done():
			return
		case <-ch:
			fmt.Fprint(w, "data: reload\n\n")
			fl.Flush()
		}
	}
}

// notify tells every open page to reload.
func (s *Server) notify() {
	s.mu.Lock()
	defer s.mu.Unlock()
	for ch := range s.clients {
		select {
		case ch <- struct{}{}:
		default: // a reload is already waiting
		}
	}
}

// Watch rebuilds on every change under the sources until ctx ends, then
// tells the open pages to reload. report, if set, is told each rebuild's
// outcome.
func (s *Server) Watch(ctx context.Context, report func(error)) error {
	w, err := fsnotify.NewWatcher()
	if err != nil {
		return err
	}
	defer w.Close()
	root := s.src
	if fi, err := os.Stat(root); err == nil && !fi.IsDir() {
		root = filepath.Dir(root)
	}
	root, _ = filepath.Abs(root)
	addTree(w, root)
	// The parent shows the folder itself renamed, deleted or put back.
	w.Add(filepath.Dir(root))
	timer := time.NewTimer(time.Hour)
	timer.Stop()
	for {
		select {
		case <-ctx.Done():
			return nil
		case ev, ok := <-w.Events:
			if !ok {
				return nil
			}
			if ev.Name != root && !strings.HasPrefix(ev.Name, root+string(filepath.Separator)) {
				continue // a neighbour of the package folder
			}
			if ev.Has(fsnotify.Create) {
				if fi, err := os.Stat(ev.Name); err == nil && fi.IsDir() {
					addTree(w, ev.Name)
				}
			}
			timer.Reset(settle)
		case err, ok := <-w.Errors:
			if !ok {
				return nil
			}
			if report != nil {
				report(err)
			}
		case <-timer.C:
			// A renamed or deleted folder drops out of the watch; watch
			// the tree again so that its return is seen.
			addTree(w, root)
			err := s.rebuild()
			if report != nil {
				report(err)
			}
			s.notify()
		}
	}
}

// addTree watches dir and every folder below it, except hidden ones.
func addTree(w *fsnotify.Watcher, dir string) {
	filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil || !d.IsDir() {
			return nil
		}
		if p != dir && strings.HasPrefix(d.Name(), ".") {
			return filepath.SkipDir
		}
		w.Add(p)
		return nil
	})
}

// Listen opens a listener on localhost at port, or at a free port when
// port is 0.
func Listen(port int) (net.Listener, error) {
	return net.Listen("tcp", fmt.Sprintf("127.0.0.1:%d", port))
}
