package preview

import (
	"net/http/httptest"
	"os"
	"path/filepath"
	"testing"

	"github.com/sheaf-calc/sheaf/build"
)

// BenchmarkPreviewEdit is the preview's edit loop on the demo: a saved
// sheet rebuilt (every sheet, in memory) and its page served with the
// reload script. Target (issue 12): under 100 ms an edit.
func BenchmarkPreviewEdit(b *testing.B) {
	src := filepath.Join(b.TempDir(), "tarnwick-weir")
	if err := os.CopyFS(src, os.DirFS(filepath.Join("..", "examples", "tarnwick-weir"))); err != nil {
		b.Fatal(err)
	}
	srv, err := New(src, build.Options{Version: "bench"})
	if err != nil {
		b.Fatal(err)
	}
	req := httptest.NewRequest("GET", "/sheets/03-speed-voltage.html", nil)
	for b.Loop() {
		if err := srv.rebuild(); err != nil {
			b.Fatal(err)
		}
		w := httptest.NewRecorder()
		srv.ServeHTTP(w, req)
		if w.Code != 200 || w.Body.Len() == 0 {
			b.Fatalf("served %d, %d bytes", w.Code, w.Body.Len())
		}
	}
}
