package units

import (
	"fmt"
	"math"
	"sort"
	"sync"
)

// Unit is a parsed unit expression: how to get from a value in this unit to
// coherent SI, and what it measures.
type Unit struct {
	Symbol string  // the expression as sheaf prints it, e.g. "kg·m²/s³"
	Dim    Dim     // dimension
	Scale  float64 // SI value = (x + Offset) × Scale
	Offset float64 // non-zero only for °C and °F on their own
	Kind   Kind
}

// One is the unit of pure numbers.
var One = Unit{Symbol: "1", Scale: 1}

// ToSI converts a value in this unit to coherent SI.
func (u Unit) ToSI(x float64) float64 { return (x + u.Offset) * u.Scale }

// FromSI converts a coherent SI value to this unit.
func (u Unit) FromSI(v float64) float64 { return v/u.Scale - u.Offset }

// IsAffine reports whether the unit has an offset zero (°C, °F).
func (u Unit) IsAffine() bool { return u.Offset != 0 }

// registry holds every symbol and alias of the table, resolved once.
type registry struct {
	bySymbol map[string]*Def
	spelled  []string // every accepted spelling, sorted, for suggestions
	once     sync.Once
	all      []string // spelled plus every prefixed form
}

var reg = buildRegistry()

func buildRegistry() *registry {
	r := &registry{bySymbol: map[string]*Def{}}
	for i := range Table {
		d := &Table[i]
		if err := r.resolve(d); err != nil {
			panic(fmt.Sprintf("units: table row %q: %v", d.Symbol, err)) // a programming error in the table
		}
		for _, s := range append([]string{d.Symbol}, d.Aliases...) {
			if _, dup := r.bySymbol[s]; dup {
				panic("units: duplicate symbol " + s)
			}
			r.bySymbol[s] = d
			r.spelled = append(r.spelled, s)
		}
	}
	sort.Strings(r.spelled)
	return r
}

func (r *registry) resolve(d *Def) error {
	if d.Of == "" {
		d.unit = Unit{Symbol: d.Symbol, Dim: d.Dim, Scale: d.Scale, Kind: d.Kind}
		return nil
	}
	of, err := r.parse(d.Of, true)
	if err != nil {
		return err
	}
	d.unit = Unit{Symbol: d.Symbol, Dim: of.Dim, Scale: d.Scale * of.Scale, Offset: d.Offset, Kind: d.Kind}
	return nil
}

// Lookup finds a single unit symbol, with or without an SI prefix.
func Lookup(sym string) (Unit, bool) { return reg.lookup(sym) }

func (r *registry) lookup(sym string) (Unit, bool) {
	if d, ok := r.bySymbol[sym]; ok {
		return d.unit, true
	}
	for _, p := range allPrefixSpellings {
		if len(sym) <= len(p.spelling) || sym[:len(p.spelling)] != p.spelling {
			continue
		}
		d, ok := r.bySymbol[sym[len(p.spelling):]]
		if !ok || !d.Prefix {
			continue
		}
		u := d.unit
		u.Symbol = p.prefix.Symbol + d.Symbol
		u.Scale *= math.Pow10(p.prefix.Exp)
		return u, true
	}
	return Unit{}, false
}

// DefOf returns the table row behind a plain (unprefixed) symbol or alias.
func DefOf(sym string) (*Def, bool) {
	d, ok := reg.bySymbol[sym]
	return d, ok
}

type prefixSpelling struct {
	spelling string
	prefix   Prefix
}

// allPrefixSpellings lists every way a prefix may be written, longest first
// so that "da" is tried before "d".
var allPrefixSpellings = func() []prefixSpelling {
	var out []prefixSpelling
	for _, p := range Prefixes {
		out = append(out, prefixSpelling{p.Symbol, p})
	}
	for alias, sym := range prefixAliases {
		for _, p := range Prefixes {
			if p.Symbol == sym {
				out = append(out, prefixSpelling{alias, p})
			}
		}
	}
	sort.SliceStable(out, func(i, j int) bool {
		if len(out[i].spelling) != len(out[j].spelling) {
			return len(out[i].spelling) > len(out[j].spelling)
		}
		return out[i].spelling < out[j].spelling
	})
	return out
}()
