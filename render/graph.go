package render

import (
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"sync"

	"github.com/goccy/go-graphviz"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/internal/atomicfile"
	"github.com/sheaf-calc/sheaf/project"
)

// graphDOT writes a sheet's dependency graph in the DOT language: one node
// per statement, an arrow from each statement to every statement that uses
// it, inputs on the left and results to the right. Every node links to its
// statement on the page.
func graphDOT(s *project.Sheet, digits int) string {
	var b strings.Builder
	b.WriteString("digraph sheet {\n rankdir=LR;\n bgcolor=\"transparent\";\n")
	b.WriteString(" node [shape=box, style=\"rounded,filled\", fillcolor=\"#ffffff\", color=\"#5d6870\", fontname=\"sans-serif\", fontsize=10, height=0.3];\n")
	b.WriteString(" edge [color=\"#8a969e\", arrowsize=0.6];\n")
	// The statements of each template instance sit in a box of their own.
	var cluster string
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.Use {
			continue
		}
		if st.Instance != cluster {
			if cluster != "" {
				b.WriteString(" }\n")
			}
			cluster = st.Instance
			if cluster != "" {
				fmt.Fprintf(&b, " subgraph %s {\n  label=%s; style=\"rounded,dashed\"; color=\"#8a969e\"; fontname=\"sans-serif\"; fontsize=10;\n",
					strconv.Quote("cluster_"+cluster), dotQuote(cluster+" (template)"))
			}
		}
		id := anchor(st)
		attrs := []string{
			"id=" + strconv.Quote("g-"+id),
			"URL=" + strconv.Quote("#"+id),
			"tooltip=" + strconv.Quote(st.Pos.String()),
			"label=" + dotQuote(graphLabel(st, digits)),
		}
		switch {
		case st.Status == engine.Failed || st.Status == engine.Blocked:
			attrs = append(attrs, `fillcolor="#fbe9e7"`, `color="#9b1c1c"`, `style="rounded,filled,dashed"`)
		case st.Kind == engine.Check && st.Status == engine.Pass:
			attrs = append(attrs, `shape=hexagon`, `style=filled`, `fillcolor="#e6f2ea"`, `color="#1f6f43"`)
		case st.Kind == engine.Check:
			attrs = append(attrs, `shape=hexagon`, `style=filled`, `fillcolor="#fbe9e7"`, `color="#9b1c1c"`)
		case st.IsInput():
			attrs = append(attrs, `fillcolor="#eef3f5"`, `color="#24505f"`)
		}
		fmt.Fprintf(&b, " %s [%s];\n", strconv.Quote(id), strings.Join(attrs, ", "))
	}
	if cluster != "" {
		b.WriteString(" }\n")
	}
	for _, st := range s.Calc.Statements {
		for _, d := range st.Deps {
			if d.Kind != engine.Use && st.Kind != engine.Use {
				fmt.Fprintf(&b, " %s -> %s;\n", strconv.Quote(anchor(d)), strconv.Quote(anchor(st)))
			}
		}
	}
	b.WriteString("}\n")
	return b.String()
}

// graphLabel is the text of a statement's node: its name and value, or a
// check's verdict and comparison.
func graphLabel(st *engine.Statement, digits int) string {
	switch st.Status {
	case engine.OK:
		if st.IsInput() {
			return TerminalLine(st, digits)
		}
		return SymbolText(st.Name) + " = " + ValueText(st.Value, st.Shown, digits)
	case engine.Pass:
		return "PASS  " + st.Formula
	case engine.Fail:
		return "FAIL  " + st.Formula
	}
	if st.Kind == engine.Check {
		return "check (error)"
	}
	return SymbolText(st.Name) + " (error)"
}

// dotQuote quotes a label for DOT, where only " and \ need escaping.
func dotQuote(s string) string {
	return `"` + strings.NewReplacer(`\`, `\\`, `"`, `\"`, "\n", " ").Replace(s) + `"`
}

// grapher lays graphs out with Graphviz's dot layout (compiled to
// WebAssembly inside go-graphviz, so no program needs installing). Layouts
// are cached on disk by the SHA-256 of their DOT text when a cache folder
// is given, so a rebuild lays out only the sheets that changed.
type grapher struct {
	cache string
}

// layoutEngine names the layout library and its Graphviz, for cache keys.
const layoutEngine = "go-graphviz v0.2.10 (Graphviz 12.1.2) dot"

// go-graphviz runs one WebAssembly module for the whole process, so every
// use of it is serialised; the rest of a page still renders in parallel.
var (
	graphvizMu sync.Mutex
	graphvizGV *graphviz.Graphviz
)

func newGrapher(cache string) (*grapher, error) {
	graphvizMu.Lock()
	defer graphvizMu.Unlock()
	if graphvizGV == nil {
		gv, err := graphviz.New(context.Background())
		if err != nil {
			return nil, err
		}
		graphvizGV = gv
	}
	return &grapher{cache: cache}, nil
}

func (g *grapher) close() {}

var (
	svgProlog  = regexp.MustCompile(`(?s)^.*?(<svg\b)`)
	svgComment = regexp.MustCompile(`(?s)<!--.*?-->\n?`)
)

// svg returns the laid-out graph as an <svg> element ready to embed in a
// page: no XML prolog, no DOCTYPE, no comments.
func (g *grapher) svg(dot string) ([]byte, error) {
	// The key names the layout library, so an upgrade never reuses an old layout.
	sum := sha256.Sum256([]byte(layoutEngine + "\n" + dot))
	key := hex.EncodeToString(sum[:])
	var cached string
	if g.cache != "" {
		cached = filepath.Join(g.cache, "graph-"+key+".svg")
		if data, err := os.ReadFile(cached); err == nil {
			return data, nil
		}
	}
	buf, err := layout(dot)
	if err != nil {
		return nil, err
	}
	out := svgComment.ReplaceAll(buf, nil)
	out = svgProlog.ReplaceAll(out, []byte("$1"))
	if cached != "" {
		// A cache that cannot be written only costs time.
		_ = atomicfile.Write(cached, out, 0o644)
	}
	return out, nil
}

// layout runs Graphviz's dot layout and returns the SVG it writes.
func layout(dot string) ([]byte, error) {
	graphvizMu.Lock()
	defer graphvizMu.Unlock()
	graph, err := graphviz.ParseBytes([]byte(dot))
	if err != nil {
		return nil, fmt.Errorf("dependency graph: %w", err)
	}
	defer graph.Close()
	var buf bytes.Buffer
	if err := graphvizGV.Render(context.Background(), graph, graphviz.SVG, &buf); err != nil {
		return nil, fmt.Errorf("dependency graph layout: %w", err)
	}
	return buf.Bytes(), nil
}
