package sheets

import (
	"bytes"
	"fmt"

	"github.com/sheaf-calc/sheaf/diag"
)

// MaxSheetBytes bounds the size of one sheet file. Reading a sheet costs
// memory in proportion to its size, several times over; a sheet past this
// size is refused whole, with one message, before anything is parsed.
const MaxSheetBytes = 4 << 20

// MaxTableRows bounds the rows of one table. The reader keeps at most one
// row past it, so that the engine, which refuses a longer table, can say
// so without the rest being held in memory.
const MaxTableRows = 10_000

// tooLarge reports a sheet past MaxSheetBytes, naming a table that is too
// long when that is the cause.
func tooLarge(path string, src []byte) *diag.Diagnostic {
	if len(src) <= MaxSheetBytes {
		return nil
	}
	line, run, start := 0, 0, 0
	for rest := src; len(rest) > 0; line++ {
		var l []byte
		l, rest, _ = bytes.Cut(rest, []byte("\n"))
		if !bytes.HasPrefix(bytes.TrimLeft(l, " \t"), []byte("|")) {
			run = 0
			continue
		}
		if run == 0 {
			start = line + 1
		}
		// The header and the delimiter row are not rows of values.
		if run++; run > MaxTableRows+2 {
			return &diag.Diagnostic{Pos: diag.Pos{File: path, Line: start, Col: 1},
				Message: fmt.Sprintf("the table here has more than %d rows, the limit for one table; the sheet is not read", MaxTableRows),
				Hint:    "keep long data in several tables, or thin it to the points the calculation needs"}
		}
	}
	return &diag.Diagnostic{Pos: diag.Pos{File: path, Line: 1, Col: 1},
		Message: fmt.Sprintf("the sheet is larger than %d MiB, the limit for one sheet; it is not read", MaxSheetBytes>>20),
		Hint:    "split it into several sheets"}
}
