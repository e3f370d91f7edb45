package render

import (
	"bytes"
	"encoding/json"
	"testing"

	"github.com/sheaf-calc/sheaf/project"
)

// The streamed JSON must be exactly the document encoded in one piece.
func TestStreamedJSONEqualsTheWholeDocument(t *testing.T) {
	for name, files := range map[string]map[string][]byte{
		"two sheets with an error": {"a.md": []byte(coil), "b.md": []byte("```sheaf\nx = 1 m\n```\n")},
		"one clean sheet":          {"a.md": []byte("```sheaf\nx = 1 m\n```\n")},
		"prose only":               {"a.md": []byte("# nothing to compute\n")},
	} {
		pkg := project.FromFiles("pkg", files)
		opt := Options{Version: "test"}
		streamed, err := JSON(pkg, opt)
		if err != nil {
			t.Fatal(err)
		}
		var whole bytes.Buffer
		enc := json.NewEncoder(&whole)
		enc.SetIndent("", "  ")
		enc.SetEscapeHTML(false)
		if err := enc.Encode(Document(pkg, opt)); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(streamed, whole.Bytes()) {
			t.Errorf("%s: streamed JSON differs from the whole document\nstreamed:\n%s\nwhole:\n%s", name, streamed, whole.Bytes())
		}
	}
}
