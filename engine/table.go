package engine

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/interp"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// CellSource is the text of a table cell and where it starts.
type CellSource struct {
	Text string
	Pos  diag.Pos
}

// TableSource is a table as the sheet reader found it: a caption "Table
// <name>: ..." and a pipe table whose header cells are "name [unit]".
type TableSource struct {
	Name    string
	Caption string
	Pos     diag.Pos
	Header  []CellSource
	Rows    [][]CellSource
	// File is the package file the rows were read from ("" for a pipe
	// table), and Err why it could not be read, for the table to carry.
	File string
	Err  *diag.Diagnostic
}

// LookupTable is named data that formulas read through interp, spline and pick.
type LookupTable struct {
	Name    string
	Caption string
	Pos     diag.Pos
	Columns []*Column
	Err     *diag.Diagnostic // set when the table cannot be read
	// File is the CSV file of the package the rows come from, or "".
	File string
}

// Column is one column of a table: its values in coherent SI.
type Column struct {
	Table  *LookupTable
	Name   string
	Unit   units.Unit
	Pos    diag.Pos
	Values []float64
	Texts  []string // as written
}

// readTable turns a table's cells into columns of numbers, checking the
// units in the header and every cell.
func readTable(src TableSource, name string) *LookupTable {
	t := &LookupTable{Name: name, Caption: src.Caption, Pos: src.Pos, File: src.File}
	fail := func(d *diag.Diagnostic) *LookupTable {
		if t.Err == nil {
			t.Err = d
		}
		return t
	}
	if src.Err != nil {
		return fail(src.Err)
	}
	if len(src.Header) == 0 || len(src.Rows) < 2 {
		return fail(errAt(src.Pos, "give the table a header row and at least two rows of values", "table %s has too few rows", name))
	}
	if len(src.Rows) > MaxTableRows {
		at := src.Pos
		if src.File != "" && len(src.Rows[MaxTableRows]) > 0 {
			at = src.Rows[MaxTableRows][0].Pos // the first row past the limit, in the file
		}
		return fail(errAt(at, "keep long data in several tables, or thin it to the points the calculation needs",
			"table %s has more than %d rows, the limit for one table", name, MaxTableRows))
	}
	seen := map[string]bool{}
	for _, h := range src.Header {
		colName, unitText, _ := strings.Cut(strings.TrimSpace(h.Text), "[")
		colName = strings.TrimSpace(colName)
		if r, end := identifier([]rune(colName), 0); r == "" || end != len([]rune(colName)) {
			return fail(errAt(h.Pos, "write the header as a name and a unit, for example H [A/m]", "column %q of table %s needs a name", h.Text, name))
		}
		if seen[colName] {
			return fail(errAt(h.Pos, "give each column its own name", "table %s has two columns named %s", name, colName))
		}
		seen[colName] = true
		u := units.One
		if strings.Contains(h.Text, "[") {
			ut := strings.TrimSpace(strings.TrimSuffix(strings.TrimSpace(unitText), "]"))
			if !strings.HasSuffix(strings.TrimSpace(unitText), "]") {
				return fail(errAt(h.Pos, "close the unit with ]", "the unit of column %s has no closing ]", colName))
			}
			var err error
			if u, err = units.Parse(ut); err != nil {
				return fail(unitError(err, h.Pos, "unit of column "+colName))
			}
		}
		t.Columns = append(t.Columns, &Column{Table: t, Name: colName, Unit: u, Pos: h.Pos})
	}
	for _, row := range src.Rows {
		if len(row) != len(t.Columns) {
			at := src.Pos
			if len(row) > 0 {
				at = row[0].Pos
			}
			return fail(errAt(at, "give every row one value per column", "a row of table %s has %d cells for %d columns", name, len(row), len(t.Columns)))
		}
		for i, c := range row {
			v, err := strconv.ParseFloat(strings.ReplaceAll(strings.TrimSpace(strings.ReplaceAll(c.Text, "−", "-")), "_", ""), 64)
			if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
				return fail(errAt(c.Pos, "write a plain number; the unit is in the header", "cell %q of table %s is not a number", c.Text, name))
			}
			col := t.Columns[i]
			col.Values = append(col.Values, col.Unit.ToSI(v))
			col.Texts = append(col.Texts, strings.TrimSpace(c.Text))
		}
	}
	return t
}

// Column finds a column by name.
func (t *LookupTable) Column(name string) *Column {
	for _, c := range t.Columns {
		if c.Name == name {
			return c
		}
	}
	return nil
}

func (t *LookupTable) columnNames() string {
	var names []string
	for _, c := range t.Columns {
		names = append(names, c.Name)
	}
	return strings.Join(names, ", ")
}

// interpolator reads a y column against an x column at any x between the
// table's ends (and beyond them when extrapolation is asked for, along the
// end segments).
type interpolator struct {
	xs, ys      []float64 // increasing xs
	predict     func(float64) float64
	extrapolate bool
}

// newInterpolator fits the columns; the x column must be strictly
// monotone. cubic asks for a monotone cubic (Fritsch–Butland) rather than
// straight lines.
func newInterpolator(y, x *Column, cubic, extrapolate bool) (*interpolator, error) {
	n := len(x.Values)
	xs := append([]float64(nil), x.Values...)
	ys := append([]float64(nil), y.Values...)
	if n >= 2 && xs[0] > xs[n-1] {
		for i, j := 0, n-1; i < j; i, j = i+1, j-1 {
			xs[i], xs[j] = xs[j], xs[i]
			ys[i], ys[j] = ys[j], ys[i]
		}
	}
	for i := 1; i < n; i++ {
		if !(xs[i] > xs[i-1]) {
			return nil, fmt.Errorf("column %s of table %s must rise (or fall) strictly from row to row to be read against", x.Name, x.Table.Name)
		}
	}
	ip := &interpolator{xs: xs, ys: ys, extrapolate: extrapolate}
	var p interp.FittablePredictor = &interp.PiecewiseLinear{}
	if cubic && n >= 3 {
		p = &interp.FritschButland{}
	}
	if err := p.Fit(xs, ys); err != nil {
		return nil, err
	}
	ip.predict = p.Predict
	return ip, nil
}

// at returns y at x, or NaN outside the table when extrapolation was not
// asked for.
func (ip *interpolator) at(x float64) float64 {
	n := len(ip.xs)
	// A value a rounding away from an end is at the end: 0.0165 Wb over
	// 0.01 m² is 1.6500000000000001 T.
	slack := 1e-12 * (ip.xs[n-1] - ip.xs[0])
	if x < ip.xs[0] && x >= ip.xs[0]-slack {
		x = ip.xs[0]
	} else if x > ip.xs[n-1] && x <= ip.xs[n-1]+slack {
		x = ip.xs[n-1]
	}
	switch {
	case x >= ip.xs[0] && x <= ip.xs[n-1]:
		return ip.predict(x)
	case !ip.extrapolate || math.IsNaN(x):
		return math.NaN()
	case x < ip.xs[0]:
		return ip.ys[0] + (x-ip.xs[0])*(ip.ys[1]-ip.ys[0])/(ip.xs[1]-ip.xs[0])
	}
	return ip.ys[n-1] + (x-ip.xs[n-1])*(ip.ys[n-1]-ip.ys[n-2])/(ip.xs[n-1]-ip.xs[n-2])
}

// exactIndex finds rows by their x: the column's values sorted, with the
// rows they are on, so that pick inside a search costs a binary search,
// not a scan of every row.
type exactIndex struct {
	vals []float64
	rows []int
}

func newExactIndex(x *Column) *exactIndex {
	ix := &exactIndex{vals: append([]float64(nil), x.Values...), rows: make([]int, len(x.Values))}
	for i := range ix.rows {
		ix.rows[i] = i
	}
	sort.Sort(ix)
	return ix
}

func (ix *exactIndex) Len() int { return len(ix.vals) }
func (ix *exactIndex) Less(i, j int) bool {
	return ix.vals[i] < ix.vals[j] || ix.vals[i] == ix.vals[j] && ix.rows[i] < ix.rows[j]
}
func (ix *exactIndex) Swap(i, j int) {
	ix.vals[i], ix.vals[j] = ix.vals[j], ix.vals[i]
	ix.rows[i], ix.rows[j] = ix.rows[j], ix.rows[i]
}

// find returns the first row whose x equals key within a relative 1e-9,
// or -1. Every such x lies within 2e-9·|key| of key.
func (ix *exactIndex) find(key float64) int {
	tol := 2e-9 * math.Abs(key)
	lo := sort.Search(len(ix.vals), func(i int) bool { return ix.vals[i] >= key-tol })
	best := -1
	for j := lo; j < len(ix.vals) && ix.vals[j] <= key+tol; j++ {
		if sameX(ix.vals[j], key) && (best < 0 || ix.rows[j] < best) {
			best = ix.rows[j]
		}
	}
	return best
}

// sameX reports whether a table's x and a key are equal within a
// relative 1e-9.
func sameX(v, key float64) bool {
	return v == key || math.Abs(v-key) <= 1e-9*math.Max(math.Abs(v), math.Abs(key))
}

// rangeText writes a column's range in its own unit: "0 … 10 kA/m".
func rangeText(c *Column) string {
	vals := append([]float64(nil), c.Values...)
	sort.Float64s(vals)
	lo, hi := c.Unit.FromSI(vals[0]), c.Unit.FromSI(vals[len(vals)-1])
	sym := ""
	if c.Unit.Symbol != "1" {
		sym = " " + c.Unit.Symbol
	}
	return units.FormatNumber(lo, 4) + " … " + units.FormatNumber(hi, 4) + sym
}
