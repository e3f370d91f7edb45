package verify

import (
	"crypto/sha256"
	"encoding/hex"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/build"
)

const version = "test"

// sources writes a small package and returns its folder.
func sources(t *testing.T, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for p, body := range files {
		if err := os.WriteFile(filepath.Join(dir, p), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

var twoSheets = map[string]string{
	"coil.md": "# Coil\n\n```sheaf\nN = 120 ; turns ; source: drawing C-1\nI = 4 A ; current ; source: test T-1\nF = N * I\n```\n",
	"gap.md":  "# Gap\n\n```sheaf\ng = 2 mm ; air gap ; source: drawing C-2\n```\n",
}

// built builds src into a new folder, with the JSON inside when json is
// set, and checks that it verifies.
func built(t *testing.T, src, json string) string {
	t.Helper()
	out := filepath.Join(t.TempDir(), "pkg")
	opt := build.Options{Version: version, NoGraphs: true, Out: out}
	if json != "" {
		opt.JSON = filepath.Join(out, json)
	}
	if _, err := build.Run(src, opt); err != nil {
		t.Fatal(err)
	}
	if r, err := Verify(out, src, version); err != nil || !r.OK() {
		t.Fatalf("a fresh build does not verify: %v %+v", err, r.Problems)
	}
	return out
}

// mustFail verifies and wants a problem naming file whose message holds msg.
func mustFail(t *testing.T, out, src, file, msg string) {
	t.Helper()
	r, err := Verify(out, src, version)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range r.Problems {
		if p.File == file && strings.Contains(p.Message, msg) {
			return
		}
	}
	t.Errorf("verify does not say %s: %q; problems: %+v", file, msg, r.Problems)
}

func write(t *testing.T, path, body string) {
	t.Helper()
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
}

func TestFailsOnAFileTheManifestDoesNotList(t *testing.T) {
	src := sources(t, twoSheets)
	for _, added := range []string{"sheets/extra.html", "app.js", "sheets/deep/x.html", ".hidden"} {
		t.Run(added, func(t *testing.T) {
			out := built(t, src, "")
			write(t, filepath.Join(out, filepath.FromSlash(added)), "<script>alert(1)</script>")
			mustFail(t, out, src, added, "the manifest does not list")
		})
	}
}

// The old in-place build left the page of a deleted sheet beside the new
// ones: verify names it.
func TestFailsOnAStalePageOfADeletedSheet(t *testing.T) {
	src := sources(t, twoSheets)
	out := built(t, src, "")
	stale, err := os.ReadFile(filepath.Join(out, "sheets", "gap.html"))
	if err != nil {
		t.Fatal(err)
	}
	if err := os.Remove(filepath.Join(src, "gap.md")); err != nil {
		t.Fatal(err)
	}
	if _, err := build.Run(src, build.Options{Version: version, NoGraphs: true, Out: out}); err != nil {
		t.Fatal(err)
	}
	write(t, filepath.Join(out, "sheets", "gap.html"), string(stale))
	mustFail(t, out, src, "sheets/gap.html", "the manifest does not list")
}

func TestTheJSONInsideThePackageIsVerified(t *testing.T) {
	src := sources(t, twoSheets)
	out := built(t, src, "package.json")
	p := filepath.Join(out, "package.json")
	data, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	write(t, p, strings.Replace(string(data), "120", "121", 1))
	mustFail(t, out, src, "package.json", "has been changed")
}

// editManifest rewrites the manifest of a built package.
func editManifest(t *testing.T, out string, edit func(*build.Manifest)) {
	t.Helper()
	p := filepath.Join(out, build.ManifestName)
	data, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	m, err := build.ParseManifest(data)
	if err != nil {
		t.Fatal(err)
	}
	edit(&m)
	if data, err = m.Marshal(); err != nil {
		t.Fatal(err)
	}
	write(t, p, string(data))
}

func TestManifestPathsStayInsideThePackage(t *testing.T) {
	src := sources(t, twoSheets)
	secret := filepath.Join(t.TempDir(), "secret.txt")
	write(t, secret, "a file outside the package\n")
	sum := sha256.Sum256([]byte("a file outside the package\n"))
	hash := hex.EncodeToString(sum[:])
	for _, c := range []struct{ name, path string }{
		{"dot-dot", "../../" + filepath.Base(filepath.Dir(secret)) + "/secret.txt"},
		{"absolute", filepath.ToSlash(secret)},
		{"dot-dot inside", "sheets/../index.html"},
		{"backslash", `..\secret.txt`},
	} {
		t.Run(c.name, func(t *testing.T) {
			out := built(t, src, "")
			editManifest(t, out, func(m *build.Manifest) {
				m.Pages = append(m.Pages, build.Page{Path: c.path, SHA256: hash})
			})
			mustFail(t, out, src, c.path, "not a file of the package")
		})
	}
	t.Run("json", func(t *testing.T) {
		out := built(t, src, "")
		editManifest(t, out, func(m *build.Manifest) { m.JSON = &build.Page{Path: filepath.ToSlash(secret), SHA256: hash} })
		mustFail(t, out, src, filepath.ToSlash(secret), "not a file of the package")
	})
	// A link inside the package that points outside is not followed.
	t.Run("symlink", func(t *testing.T) {
		out := built(t, src, "")
		link := filepath.Join(out, "sheets", "gap.html")
		if err := os.Remove(link); err != nil {
			t.Fatal(err)
		}
		if err := os.Symlink(secret, link); err != nil {
			t.Skip("no symlinks here:", err)
		}
		editManifest(t, out, func(m *build.Manifest) {
			for i := range m.Pages {
				if m.Pages[i].Path == "sheets/gap.html" {
					m.Pages[i].SHA256 = hash
				}
			}
		})
		mustFail(t, out, src, "sheets/gap.html", "cannot be read inside the package")
		mustFail(t, out, src, "sheets/gap.html", "not a plain file")
	})
}

func TestRefusesAManifestSheafDidNotWrite(t *testing.T) {
	src := sources(t, twoSheets)
	out := built(t, src, "")
	write(t, filepath.Join(out, build.ManifestName), `{"tool": "other", "pages": []}`)
	if _, err := Verify(out, src, version); err == nil || !strings.Contains(err.Error(), "not a manifest sheaf wrote") {
		t.Errorf("verify of a foreign manifest: %v", err)
	}
}

// FuzzVerifyManifest verifies a built package under a manifest of any
// bytes: verify never panics, and never says verified while the manifest
// names a file outside the package.
func FuzzVerifyManifest(f *testing.F) {
	src := f.TempDir()
	for p, body := range twoSheets {
		if err := os.WriteFile(filepath.Join(src, p), []byte(body), 0o644); err != nil {
			f.Fatal(err)
		}
	}
	out := filepath.Join(f.TempDir(), "pkg")
	if _, err := build.Run(src, build.Options{Version: version, NoGraphs: true, Out: out}); err != nil {
		f.Fatal(err)
	}
	good, err := os.ReadFile(filepath.Join(out, build.ManifestName))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(good)
	f.Add([]byte(strings.Replace(string(good), `"sheets/gap.html"`, `"../pkg/sheets/gap.html"`, 1)))
	f.Add([]byte(strings.Replace(string(good), `"sheets/gap.html"`, `"/etc/passwd"`, 1)))
	f.Add([]byte(`{"tool": "sheaf x", "pages": [{"path": "index.html"}, {"path": "index.html"}]}`))
	f.Fuzz(func(t *testing.T, manifest []byte) {
		if err := os.WriteFile(filepath.Join(out, build.ManifestName), manifest, 0o644); err != nil {
			t.Fatal(err)
		}
		r, err := Verify(out, src, version)
		if err != nil || !r.OK() {
			return
		}
		if string(manifest) != string(good) {
			m, _ := build.ParseManifest(manifest)
			for _, pg := range listed(m) {
				if !filepath.IsLocal(pg.Path) || strings.Contains(pg.Path, "\\") {
					t.Errorf("verified with the path %q", pg.Path)
				}
			}
		}
	})
}

func TestAManifestWithImpossibleDigitsIsAProblem(t *testing.T) {
	src := sources(t, twoSheets)
	out := built(t, src, "")
	editManifest(t, out, func(m *build.Manifest) { m.Digits = 99 })
	mustFail(t, out, src, build.ManifestName, "states 99 significant figures")
}

// A package whose sheets take from each other: emf.md takes from
// coil.md, and gap.md stands alone.
var takingSheets = map[string]string{
	"coil.md": "# Coil\n\n```sheaf\nN = 120 ; turns ; source: drawing C-1\nI = 4 A ; current ; source: test T-1\nF [A] = N * I ; ampere-turns\n```\n",
	"emf.md":  "# EMF\n\n```sheaf\ntake F from coil\nR = 2.4 MA/Wb ; gap reluctance ; source: field study F-3\nPhi [mWb] = F / R ; flux per pole\n```\n",
	"gap.md":  "# Gap\n\n```sheaf\ng = 2 mm ; air gap ; source: drawing C-2\n```\n",
}

// pageHashes reads the page hashes of a built package's manifest.
func pageHashes(t *testing.T, out string) map[string]string {
	t.Helper()
	data, err := os.ReadFile(filepath.Join(out, build.ManifestName))
	if err != nil {
		t.Fatal(err)
	}
	m, err := build.ParseManifest(data)
	if err != nil {
		t.Fatal(err)
	}
	hashes := map[string]string{}
	for _, pg := range m.Pages {
		hashes[pg.Path] = pg.SHA256
	}
	return hashes
}

// An edit of one sheet changes that sheet's page, the pages of the sheets
// that take from it and the package pages, and no other page: each sheet's
// page states the stamp of what it rests on, not the package stamp.
func TestAnEditChangesOnlyThePagesItTouches(t *testing.T) {
	for _, c := range []struct {
		file, old, new string
		changes        []string
	}{
		{"coil.md", "N = 120", "N = 140", []string{"sheets/coil.html", "sheets/emf.html"}},
		{"emf.md", "2.4 MA/Wb", "2.6 MA/Wb", []string{"sheets/emf.html"}},
		{"gap.md", "2 mm", "2.5 mm", []string{"sheets/gap.html"}},
	} {
		t.Run(c.file, func(t *testing.T) {
			src := sources(t, takingSheets)
			before := pageHashes(t, built(t, src, ""))
			write(t, filepath.Join(src, c.file), strings.Replace(takingSheets[c.file], c.old, c.new, 1))
			after := pageHashes(t, built(t, src, ""))
			if len(before) != len(after) {
				t.Fatalf("%d pages before the edit, %d after", len(before), len(after))
			}
			for p, h := range before {
				sheet := strings.HasPrefix(p, "sheets/")
				want := !sheet
				for _, ch := range c.changes {
					want = want || p == ch
				}
				if (after[p] != h) != want {
					t.Errorf("%s changed: %v, want %v", p, after[p] != h, want)
				}
			}
		})
	}
}

// A page must state its own stamp: a sheet's page that states the package
// stamp, or a package page that states a sheet's, does not verify, even
// with the manifest's hash made to fit.
func TestEachPageStatesItsOwnStamp(t *testing.T) {
	src := sources(t, takingSheets)
	for _, c := range []struct{ page, from, msg string }{
		{"sheets/emf.html", "sheets/gap.html", "the sources this sheet rests on give"},
		{"index.html", "sheets/coil.html", "the package's is"},
	} {
		t.Run(c.page, func(t *testing.T) {
			out := built(t, src, "")
			stampIn := func(p string) string {
				data, err := os.ReadFile(filepath.Join(out, filepath.FromSlash(p)))
				if err != nil {
					t.Fatal(err)
				}
				return string(stampMeta.FindSubmatch(data)[1])
			}
			own, other := stampIn(c.page), stampIn(c.from)
			if own == other {
				t.Fatalf("%s and %s state the same stamp %s", c.page, c.from, own)
			}
			data, _ := os.ReadFile(filepath.Join(out, filepath.FromSlash(c.page)))
			forged := strings.ReplaceAll(string(data), own, other)
			write(t, filepath.Join(out, filepath.FromSlash(c.page)), forged)
			sum := sha256.Sum256([]byte(forged))
			editManifest(t, out, func(m *build.Manifest) {
				for i := range m.Pages {
					if m.Pages[i].Path == c.page {
						m.Pages[i].SHA256 = hex.EncodeToString(sum[:])
					}
				}
			})
			mustFail(t, out, src, c.page, c.msg)
		})
	}
}
