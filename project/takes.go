package project

import (
	"fmt"
	"sort"
	"strings"
	"sync"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/sheets"
)

// takes orders a package's sheets so that a sheet that takes a result of
// another is compiled after it, and finds the sheets take statements name.
type takes struct {
	index map[string]int // page sheet path -> index
	// waves lists the sheets by the round they compile in: a sheet comes
	// in the round after the last of the sheets it takes from.
	waves [][]int
	// cyclic holds the sheets that take from each other in a cycle, with
	// the cycle as a message.
	cyclic map[int]string
	// named lists, per sheet, the sheets its take statements name, sorted,
	// whether or not the package has them.
	named [][]string

	// taken marks the sheets another takes from: only their calculations
	// are kept here for the takers, so that a build can let the others go.
	taken map[int]bool

	mu    sync.Mutex
	calc  map[int]*engine.Calc
	sheet map[int]*Sheet
}

// takeTarget resolves a sheet named by a take statement in the sheet at
// from: a path relative to that sheet, with or without .md.
func takeTarget(ref, from string) (string, error) {
	p, written, inside := packagePath(ref, from)
	switch {
	case !written:
		return "", fmt.Errorf("sheet %s must be a path inside the package folder, written with /", ref)
	case !inside:
		return "", fmt.Errorf("sheet %s leaves the package folder", ref)
	}
	return p, nil
}

// newTakes orders the pages by what they take: taken[i], when given,
// lists what page i takes, else it is read from the page.
func newTakes(pages []*sheets.Document, taken [][]engine.TakeRef) *takes {
	t := &takes{index: map[string]int{}, cyclic: map[int]string{}, calc: map[int]*engine.Calc{}, sheet: map[int]*Sheet{}, taken: map[int]bool{}}
	for i, d := range pages {
		t.index[d.Path] = i
	}
	uses := make([][]int, len(pages)) // sheet -> sheets it takes from
	t.named = make([][]string, len(pages))
	for i, d := range pages {
		seen := map[string]bool{}
		var refs []engine.TakeRef
		if taken != nil {
			refs = taken[i]
		} else {
			refs = engine.TakenSheets(sourceOf(d, nil))
		}
		for _, ref := range refs {
			p, err := takeTarget(ref.Sheet, d.Path)
			if err == nil && p != d.Path && !seen[p] {
				seen[p] = true
				t.named[i] = append(t.named[i], p)
			}
			if j, ok := t.index[p]; err == nil && ok && j != i {
				uses[i] = append(uses[i], j)
				t.taken[j] = true
			}
		}
		sort.Strings(t.named[i])
	}
	t.findCycles(pages, uses)
	t.order(uses)
	return t
}

// findCycles marks the sheets on a cycle of takes, and reports each cycle
// once, at the take statements that close it.
func (t *takes) findCycles(pages []*sheets.Document, uses [][]int) {
	state := make([]int, len(uses)) // 0 new, 1 on the path, 2 done
	var stack []int
	var visit func(i int)
	visit = func(i int) {
		state[i] = 1
		stack = append(stack, i)
		for _, j := range uses[i] {
			switch state[j] {
			case 0:
				visit(j)
			case 1:
				k := len(stack) - 1
				for stack[k] != j {
					k--
				}
				var names []string
				for _, m := range stack[k:] {
					names = append(names, pages[m].Path)
				}
				names = append(names, pages[j].Path)
				msg := "sheets take results from each other in a cycle: " + strings.Join(names, " → ")
				for _, m := range stack[k:] {
					if _, seen := t.cyclic[m]; !seen {
						t.cyclic[m] = msg
					}
				}
			}
		}
		stack = stack[:len(stack)-1]
		state[i] = 2
	}
	for i := range uses {
		if state[i] == 0 {
			visit(i)
		}
	}
}

// order puts every sheet in the wave after the sheets it takes from;
// sheets on a cycle go in the first wave, where their takes fail, and a
// sheet that takes from one of them in a later wave, so that what it
// reads does not depend on which goroutine finished first.
func (t *takes) order(uses [][]int) {
	wave := make([]int, len(uses))
	for i := range wave {
		wave[i] = -1
	}
	var depth func(i int) int
	depth = func(i int) int {
		if wave[i] >= 0 {
			return wave[i]
		}
		wave[i] = 0
		if _, ok := t.cyclic[i]; ok {
			return 0
		}
		d := 0
		for _, j := range uses[i] {
			// A sheet on a cycle is in the first wave: one that takes
			// from it, and is not on the cycle, comes after it.
			d = max(d, depth(j)+1)
		}
		wave[i] = d
		return d
	}
	for i := range uses {
		w := depth(i)
		for len(t.waves) <= w {
			t.waves = append(t.waves, nil)
		}
		t.waves[w] = append(t.waves[w], i)
	}
	for _, w := range t.waves {
		sort.Ints(w)
	}
}

func (t *takes) done(i int, s *Sheet) {
	t.mu.Lock()
	if t.taken[i] {
		t.calc[i] = s.Calc
	}
	t.sheet[i] = s
	t.mu.Unlock()
}

// restsOn lists the files the page of s, the compiled sheet i, rests on:
// its own, those its uses reach, and what each sheet it takes from rests
// on. A sheet on a cycle takes nothing, so it rests on the names of the
// sheets it would take from and not on what they rest on; a take of a
// sheet the package lacks rests on the name. Sheets taken from are done
// before: the waves order them.
func (t *takes) restsOn(i int, s *Sheet) []string {
	set := map[string]bool{s.Path(): true}
	for _, u := range s.uses {
		set[u] = true
	}
	for _, p := range s.takes {
		set[p] = true
		j, ok := t.index[p]
		if !ok || t.cyclic[i] != "" {
			continue
		}
		t.mu.Lock()
		from := t.sheet[j]
		t.mu.Unlock()
		if from != nil {
			for _, r := range from.rests {
				set[r] = true
			}
		}
	}
	return sortedKeys(set)
}

func sortedKeys(set map[string]bool) []string {
	out := make([]string, 0, len(set))
	for k := range set {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// find returns the compiled sheet a take statement names.
func (t *takes) find(ref, from string) (*engine.Calc, string, error) {
	p, err := takeTarget(ref, from)
	if err != nil {
		return nil, "", err
	}
	if i, ok := t.index[from]; ok && t.cyclic[i] != "" {
		return nil, "", &engine.TakeError{Msg: t.cyclic[i], Hint: "one of these sheets must work the value out itself instead of taking it"}
	}
	j, ok := t.index[p]
	if !ok {
		return nil, "", fmt.Errorf("no sheet %s in the package (templates hold no results to take)", p)
	}
	if p == from {
		return nil, "", fmt.Errorf("a sheet cannot take a result from itself: use the name directly")
	}
	t.mu.Lock()
	calc := t.calc[j]
	t.mu.Unlock()
	if calc == nil {
		return nil, "", fmt.Errorf("sheet %s is not ready", p) // cannot happen: waves order the sheets
	}
	return calc, p, nil
}
