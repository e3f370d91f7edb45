package audit

import (
	"path"
	"slices"
	"strings"

	"github.com/sheaf-calc/sheaf/project"
)

// sheetNames finds, for a source text, the sheets of a package that it may
// name, without trying every sheet: testing each input's source against
// each sheet cost inputs × sheets, which made the audit of 4,000 sheets
// take minutes. It narrows the sheets to candidates that namesSheet then
// confirms, so its answer is namesSheet's.
type sheetNames struct {
	sheets []*project.Sheet
	// byText finds sheets by a lowered stem or title: every way of naming
	// a sheet by its name contains one of them.
	byText  map[string][]int
	lengths []int // the distinct lengths of byText's keys, ascending
	// byNumber finds sheets by the digits their stem starts with, for
	// "sheet 01".
	byNumber map[string][]int
	always   []int // sheets any source may name (an empty stem)
}

func newSheetNames(sheets []*project.Sheet) *sheetNames {
	ix := &sheetNames{sheets: sheets, byText: map[string][]int{}, byNumber: map[string][]int{}}
	add := func(key string, i int) {
		if list := ix.byText[key]; len(list) == 0 || list[len(list)-1] != i {
			ix.byText[key] = append(list, i)
		}
	}
	for i, s := range sheets {
		stem := strings.TrimSuffix(strings.ToLower(path.Base(s.Path())), ".md")
		if stem == "" {
			ix.always = append(ix.always, i)
		} else {
			add(stem, i)
		}
		if t := strings.ToLower(s.Doc.Meta.Title); t != "" {
			add(t, i)
		}
		if n := leadingDigits(stem); n != "" {
			ix.byNumber[n] = append(ix.byNumber[n], i)
		}
	}
	for k := range ix.byText {
		ix.lengths = append(ix.lengths, len(k))
	}
	slices.Sort(ix.lengths)
	ix.lengths = slices.Compact(ix.lengths)
	return ix
}

// lookupCost is about the bytes hashed to look up every key length at
// every position of a source of n bytes.
func (ix *sheetNames) lookupCost(n int) int {
	cost := 0
	for _, l := range ix.lengths {
		if l > n {
			break
		}
		cost += n * l
	}
	return cost
}

// leadingDigits is the run of digits a stem starts with.
func leadingDigits(s string) string {
	n := 0
	for n < len(s) && isDigit(s[n]) {
		n++
	}
	return s[:n]
}

// first is the first sheet in package order, other than self, that the
// source names, or nil.
func (ix *sheetNames) first(source string, self *project.Sheet) *project.Sheet {
	if ix.lookupCost(len(source)) > len(ix.sheets)*len(source) {
		// A small package, or keys of very many lengths against a long
		// source: trying every sheet is cheaper.
		return ix.scan(source, self)
	}
	return ix.lookup(source, self)
}

// scan tries every sheet in package order.
func (ix *sheetNames) scan(source string, self *project.Sheet) *project.Sheet {
	for _, s := range ix.sheets {
		if s != self && namesSheet(source, s) {
			return s
		}
	}
	return nil
}

// lookup tries only the sheets whose stem or title occurs in the source
// or whose number the source gives.
func (ix *sheetNames) lookup(source string, self *project.Sheet) *project.Sheet {
	low := strings.ToLower(source)
	cand := slices.Clone(ix.always)
	for i := range low {
		for _, n := range ix.lengths {
			if i+n > len(low) {
				break
			}
			cand = append(cand, ix.byText[low[i:i+n]]...)
		}
	}
	for _, m := range sheetNumber.FindAllStringSubmatch(source, -1) {
		cand = append(cand, ix.byNumber[m[3]]...)
	}
	slices.Sort(cand)
	for _, i := range slices.Compact(cand) {
		if s := ix.sheets[i]; s != self && namesSheet(source, s) {
			return s
		}
	}
	return nil
}
