package sheets

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"github.com/sheaf-calc/sheaf/diag"
)

// CSVTable is the cells of a table read from a CSV file of the package:
// the first record is the header ("H [A/m]", as in a pipe table), every
// later one a row. Every cell knows where it starts in the CSV file, so
// that a bad cell is reported there, not at the sheet that names it.
type CSVTable struct {
	Header []Cell
	Rows   [][]Cell
}

// ReadCSV reads the CSV file at path (the package path, for positions).
// Cells are separated by commas, a field may be quoted as RFC 4180 says,
// spaces before a cell are dropped, empty lines are skipped and lines that
// start with # are comments (where a file may name its source). It reads
// at most MaxTableRows+1 rows, so that the engine can refuse a longer
// table without the rest being held, and refuses a file larger than
// MaxSheetBytes, not valid UTF-8, or not well-formed, at file:line:col.
func ReadCSV(path string, data []byte) (*CSVTable, *diag.Diagnostic) {
	at := func(line, col int) diag.Pos { return diag.Pos{File: path, Line: line, Col: col} }
	if len(data) > MaxSheetBytes {
		return nil, &diag.Diagnostic{Pos: at(1, 1),
			Message: fmt.Sprintf("the file is larger than %d MiB, the limit for one data file; it is not read", MaxSheetBytes>>20),
			Hint:    "keep long data in several files, or thin it to the points the calculation needs"}
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	data = bytes.ReplaceAll(data, []byte("\r\n"), []byte("\n"))
	lines := newLineIndex(data)
	if off := firstInvalid(data); off >= 0 {
		line, col := lines.pos(off)
		return nil, &diag.Diagnostic{Pos: at(line, col), Message: fmt.Sprintf("byte 0x%02x is not valid UTF-8", data[off]), Hint: "save the file as UTF-8"}
	}
	// charCol turns the byte column encoding/csv gives into characters.
	charCol := func(line, byteCol int) int {
		if line < 1 || line > len(lines.starts) {
			return 1
		}
		start, end := lines.starts[line-1], len(data)
		if line < len(lines.starts) {
			end = lines.starts[line] - 1
		}
		text := data[start:end]
		return utf8.RuneCount(text[:min(max(byteCol-1, 0), len(text))]) + 1
	}
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1 // the engine says which row has too few or too many cells
	r.TrimLeadingSpace = true
	r.Comment = '#'
	t := &CSVTable{}
	for len(t.Rows) <= MaxTableRows {
		rec, err := r.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				msg := "the row is not well-formed CSV: " + pe.Err.Error()
				if pe.StartLine != pe.Line {
					msg += fmt.Sprintf(" (the row starts on line %d)", pe.StartLine)
				}
				return nil, &diag.Diagnostic{Pos: at(pe.Line, charCol(pe.Line, pe.Column)), Message: msg,
					Hint: `separate cells with commas; a cell with a comma or a quote is written in double quotes, with "" for a quote inside`}
			}
			return nil, &diag.Diagnostic{Pos: at(1, 1), Message: "cannot read the file as CSV: " + err.Error()}
		}
		cells := make([]Cell, len(rec))
		for i, text := range rec {
			line, col := r.FieldPos(i)
			cells[i] = Cell{Text: strings.TrimSpace(text), Pos: at(line, charCol(line, col))}
		}
		if t.Header == nil {
			if len(cells) == 1 && strings.Contains(cells[0].Text, ";") {
				return nil, &diag.Diagnostic{Pos: cells[0].Pos, Message: "the header is one cell holding semicolons",
					Hint: "separate the cells with commas, and write numbers with a decimal point"}
			}
			t.Header = cells
			continue
		}
		t.Rows = append(t.Rows, cells)
	}
	if t.Header == nil {
		return nil, &diag.Diagnostic{Pos: at(1, 1), Message: "the file holds no header and no rows",
			Hint: "write a header of names with units, such as H [A/m],B [T], and a row of numbers per line"}
	}
	return t, nil
}

// firstInvalid is the offset of the first byte that is not valid UTF-8,
// or -1.
func firstInvalid(data []byte) int {
	if utf8.Valid(data) {
		return -1
	}
	off := 0
	for off < len(data) {
		r, n := utf8.DecodeRune(data[off:])
		if r == utf8.RuneError && n == 1 {
			return off
		}
		off += n
	}
	return -1
}
