package preview

import (
	"bytes"
	"fmt"
	"net/http/httptest"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"testing"

	"github.com/sheaf-calc/sheaf/build"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// served fetches every page the server holds, with the reload script
// taken out again.
func served(t *testing.T, srv *Server) map[string][]byte {
	t.Helper()
	srv.mu.Lock()
	var paths []string
	for p := range srv.pages {
		paths = append(paths, p)
	}
	srv.mu.Unlock()
	out := map[string][]byte{}
	for _, p := range paths {
		w := httptest.NewRecorder()
		srv.ServeHTTP(w, httptest.NewRequest("GET", "/"+p, nil))
		if w.Code != 200 {
			t.Fatalf("%s: served %d", p, w.Code)
		}
		out[p] = bytes.Replace(w.Body.Bytes(), []byte(reloadScript(srv.Builds())), nil, 1)
	}
	return out
}

// fullBuild is every page of a build of the sources as they are now.
func fullBuild(t *testing.T, src string) map[string][]byte {
	t.Helper()
	res, err := build.Load(src, build.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][]byte{}
	if err := res.Pages(func(f render.File) error { out[f.Path] = f.Data; return nil }); err != nil {
		t.Fatal(err)
	}
	return out
}

// The preview rebuilds only what an edit touches, and serves what a full
// build of the edited sources gives, byte for byte: an input of a sheet
// nobody takes from, one of a sheet others take from, a template most
// sheets use, a CSV file a template reads, a half-typed formula and its
// fix, a new sheet.
func TestIncrementalEqualsFullBuild(t *testing.T) {
	src := filepath.Join(t.TempDir(), "tarnwick-weir")
	if err := os.CopyFS(src, os.DirFS(filepath.Join("..", "examples", "tarnwick-weir"))); err != nil {
		t.Fatal(err)
	}
	srv, err := New(src, build.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	all := []string{"01-field-coil.md", "02-coil-emf.md", "03-speed-voltage.md", "04-pump-motor-back-emf.md", "05-stator-insulation.md", "06-emf-waveform-and-excitation.md"}
	for _, tc := range []struct {
		name, file, old, new string
		redo                 []string
	}{
		{"a sheet nobody takes from", "03-speed-voltage.md", "B_1 = 0.83 T", "B_1 = 0.86 T", []string{"03-speed-voltage.md"}},
		{"a sheet others take from", "01-field-coil.md", "k_C = 1.08", "k_C = 1.10", []string{"01-field-coil.md", "02-coil-emf.md", "03-speed-voltage.md", "06-emf-waveform-and-excitation.md"}},
		{"a template", "_templates/tw-g1-ratings.md", "U_n = 690 V", "U_n = 660 V", []string{"01-field-coil.md", "02-coil-emf.md", "03-speed-voltage.md", "05-stator-insulation.md", "06-emf-waveform-and-excitation.md"}},
		// The pole plate's curve, read by the template sheet 01 uses: the
		// sheets that take from 01 follow, and the served copy of the file.
		{"a CSV file a template's table reads", "data/pole-plate-dc.csv", "1200,1.28", "1200,1.29", []string{"01-field-coil.md", "02-coil-emf.md", "03-speed-voltage.md", "06-emf-waveform-and-excitation.md"}},
		{"a half-typed formula", "04-pump-motor-back-emf.md", "R_a = 0.28 ohm", "R_a = 0.28 ohm *", []string{"04-pump-motor-back-emf.md"}},
		{"the formula fixed", "04-pump-motor-back-emf.md", "R_a = 0.28 ohm *", "R_a = 0.28 ohm", []string{"04-pump-motor-back-emf.md"}},
		// A later date in one sheet moves the build date every page
		// states: one sheet evaluated again, every page rendered again.
		{"a later date", "04-pump-motor-back-emf.md", "date: 2026-12-02", "date: 2026-12-05", []string{"04-pump-motor-back-emf.md"}},
		{"a new sheet", "", "", "", append(all, "06-spare.md")},
	} {
		t.Run(tc.name, func(t *testing.T) {
			pagesBefore := served(t, srv)
			before := map[string]*project.Sheet{}
			for _, s := range srv.res.Package.Sheets {
				before[s.Path()] = s
			}
			if tc.file == "" {
				if err := os.WriteFile(filepath.Join(src, "06-spare.md"), []byte("---\ntitle: Spare\n---\n```sheaf\nP = 630 kVA ; spare rating ; source: generator data sheet TW-G1-DS rev D\n```\n"), 0o644); err != nil {
					t.Fatal(err)
				}
			} else {
				edit(t, filepath.Join(src, tc.file), tc.old, tc.new)
			}
			if err := srv.rebuild(); err != nil {
				t.Fatal(err)
			}
			var redone []string
			for _, s := range srv.res.Package.Sheets {
				if before[s.Path()] != s {
					redone = append(redone, s.Path())
				}
			}
			if !slices.Equal(redone, tc.redo) {
				t.Errorf("evaluated again %v, want %v", redone, tc.redo)
			}
			got, want := served(t, srv), fullBuild(t, src)
			var gp, wp []string
			for p := range got {
				gp = append(gp, p)
			}
			for p := range want {
				wp = append(wp, p)
			}
			sort.Strings(gp)
			sort.Strings(wp)
			if !slices.Equal(gp, wp) {
				t.Fatalf("serves %v, a full build makes %v", gp, wp)
			}
			for _, p := range wp {
				if !bytes.Equal(got[p], want[p]) {
					t.Errorf("served %s differs from a full build's: %s", p, firstDiff(got[p], want[p]))
				}
			}
			// The page of a sheet the edit does not touch stays as it was;
			// the package pages name the new package stamp.
			for _, s := range srv.res.Package.Sheets {
				if tc.name == "a later date" {
					if bytes.Equal(pagesBefore[s.Page], got[s.Page]) {
						t.Errorf("%s still states the build date before the edit", s.Page)
					}
					continue
				}
				if old, ok := pagesBefore[s.Page]; ok && !slices.Contains(tc.redo, s.Path()) && !bytes.Equal(old, got[s.Page]) {
					t.Errorf("%s changed, and the edit does not touch its sheet", s.Page)
				}
			}
			if bytes.Equal(pagesBefore["index.html"], got["index.html"]) {
				t.Error("the index still states the stamp of the sources before the edit")
			}
		})
	}
}

// A preview of one sheet loads it afresh on each save, and serves what a
// build of that sheet gives.
func TestIncrementalOfOneSheet(t *testing.T) {
	src := filepath.Join(t.TempDir(), "tarnwick-weir")
	if err := os.CopyFS(src, os.DirFS(filepath.Join("..", "examples", "tarnwick-weir"))); err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(src, "01-field-coil.md")
	srv, err := New(file, build.Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	edit(t, file, "k_C = 1.08", "k_C = 1.10")
	if err := srv.rebuild(); err != nil {
		t.Fatal(err)
	}
	got, want := served(t, srv), fullBuild(t, file)
	if len(got) != len(want) {
		t.Fatalf("serves %d pages, a build of the sheet makes %d", len(got), len(want))
	}
	for p, data := range want {
		if !bytes.Equal(got[p], data) {
			t.Errorf("served %s differs from a build of the edited sheet", p)
		}
	}
	if !bytes.Contains(got["sheets/01-field-coil.html"], []byte("1.10")) {
		t.Error("the page does not show the edited value 1.10")
	}
}

// firstDiff shows where two pages part.
func firstDiff(a, b []byte) string {
	i := 0
	for i < len(a) && i < len(b) && a[i] == b[i] {
		i++
	}
	lo := max(0, i-80)
	return fmt.Sprintf("served %q, built %q", a[lo:min(len(a), i+80)], b[lo:min(len(b), i+80)])
}
