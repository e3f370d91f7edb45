package sheets

import (
	"embed"
	"fmt"
	"path"
	"sort"
	"strings"
	"sync"
)

//go:embed library/*.md
var libraryFS embed.FS

// LibraryPrefix starts the name of a built-in template: lib/magnetic-circuit.
const LibraryPrefix = "lib/"

// LibraryNames lists the built-in templates, sorted.
func LibraryNames() []string {
	entries, _ := libraryFS.ReadDir("library")
	var names []string
	for _, e := range entries {
		names = append(names, strings.TrimSuffix(e.Name(), ".md"))
	}
	sort.Strings(names)
	return names
}

// LibrarySource returns the Markdown of a built-in template.
func LibrarySource(name string) ([]byte, bool) {
	data, err := libraryFS.ReadFile(path.Join("library", strings.TrimSuffix(name, ".md")+".md"))
	return data, err == nil
}

var (
	libraryMu     sync.Mutex
	libraryParsed = map[string]*Document{}
)

// LibraryTemplate returns a built-in template, parsed once. Its path is
// lib/<name>.md, the name errors inside it show.
func LibraryTemplate(name string) (*Document, error) {
	name = strings.TrimSuffix(name, ".md")
	libraryMu.Lock()
	defer libraryMu.Unlock()
	if s, ok := libraryParsed[name]; ok {
		return s, nil
	}
	data, ok := LibrarySource(name)
	if !ok {
		return nil, fmt.Errorf("no built-in template %s%s; the library holds %s", LibraryPrefix, name, strings.Join(LibraryNames(), ", "))
	}
	s := Parse(LibraryPrefix+name+".md", data)
	libraryParsed[name] = s
	return s, nil
}
