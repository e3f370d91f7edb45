package sheets_test

import (
	"bytes"
	"fmt"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/sheaf-calc/sheaf/sheets"
)

// The cells of a CSV file keep their place in it, in characters, with
// spaces before a cell, a byte-order mark, CRLF line ends, quoted cells,
// comments and empty lines.
func TestReadCSVPositions(t *testing.T) {
	src := "\xef\xbb\xbf# curve of the pole plate\r\nH [A/m], B [T]\r\n\r\n0,0\r\n\"250\",  0.40\r\nμ,ü\r\n"
	c, d := sheets.ReadCSV("data/bh.csv", []byte(src))
	if d != nil {
		t.Fatal(d)
	}
	got := []string{}
	for _, row := range append([][]sheets.Cell{c.Header}, c.Rows...) {
		for _, cell := range row {
			got = append(got, fmt.Sprintf("%s@%d:%d", cell.Text, cell.Pos.Line, cell.Pos.Col))
		}
	}
	want := "H [A/m]@2:1 B [T]@2:10 0@4:1 0@4:3 250@5:1 0.40@5:9 μ@6:1 ü@6:3"
	if strings.Join(got, " ") != want {
		t.Errorf("cells\n%s\nwant\n%s", strings.Join(got, " "), want)
	}
	if c.Rows[0][0].Pos.File != "data/bh.csv" {
		t.Errorf("file %q", c.Rows[0][0].Pos.File)
	}
}

// Each way a file can fail to be a table is reported in the file, at the
// line and column where it goes wrong.
func TestReadCSVErrors(t *testing.T) {
	for _, tc := range []struct{ name, src, at, msg string }{
		{"bare quote", "H [A/m],B [T]\n0,0\n1,2\"x\n", "f.csv:3:4", `bare " in non-quoted-field`},
		{"open quote", "H [A/m],B [T]\n0,0\n1,\"2\n3,4\n", "f.csv:4:4", "row starts on line 3"},
		{"semicolons", "H [A/m];B [T]\n0;0\n", "f.csv:1:1", "semicolons"},
		{"not UTF-8", "H [A/m],B [T]\n0,\xff\n", "f.csv:2:3", "not valid UTF-8"},
		{"empty", "# only a comment\n\n", "f.csv:1:1", "no header"},
		{"too large", strings.Repeat("1,2\n", sheets.MaxSheetBytes/4+1), "f.csv:1:1", "limit for one data file"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, d := sheets.ReadCSV("f.csv", []byte(tc.src))
			if d == nil {
				t.Fatal("no error")
			}
			if d.Pos.String() != tc.at || !strings.Contains(d.Message, tc.msg) {
				t.Errorf("got %s: %s; want %s: ...%s...", d.Pos, d.Message, tc.at, tc.msg)
			}
		})
	}
}

// A file of many rows is read to one row past the table limit, so that
// the engine can refuse it without the rest being held.
func TestReadCSVStopsPastTheLimit(t *testing.T) {
	var b bytes.Buffer
	b.WriteString("x,y\n")
	for i := 0; i < sheets.MaxTableRows+50; i++ {
		fmt.Fprintf(&b, "%d,%d\n", i, 2*i)
	}
	c, d := sheets.ReadCSV("f.csv", b.Bytes())
	if d != nil {
		t.Fatal(d)
	}
	if len(c.Rows) != sheets.MaxTableRows+1 {
		t.Errorf("%d rows kept, want %d", len(c.Rows), sheets.MaxTableRows+1)
	}
	if last := c.Rows[len(c.Rows)-1][0]; last.Pos.Line != sheets.MaxTableRows+2 {
		t.Errorf("the last row kept is on line %d", last.Pos.Line)
	}
}

// A caption "Table <name> from <file>: caption" names a file, at the
// column where its name is written; a pipe table after it as well, or no
// file, is an error at the caption.
func TestFileTableCaption(t *testing.T) {
	s := sheets.Parse("s.md", []byte("# S\n\nTable BH from data/pole-plate.csv: DC curve of the plate\n\nText.\n"))
	if len(s.Diags) != 0 || len(s.Tables) != 1 {
		t.Fatalf("diagnostics %v, %d tables", s.Diags, len(s.Tables))
	}
	tb := s.Tables[0]
	if tb.Name != "BH" || tb.File != "data/pole-plate.csv" || tb.Caption != "DC curve of the plate" || tb.FilePos.String() != "s.md:3:15" {
		t.Errorf("table %+v", tb)
	}
	s = sheets.Parse("s.md", []byte("Table BH from bh.csv\n"))
	if len(s.Tables) != 1 || s.Tables[0].File != "bh.csv" || s.Tables[0].Caption != "" {
		t.Errorf("without a caption: %+v", s.Tables)
	}
	s = sheets.Parse("s.md", []byte("Table BH from bh.csv: curve\n| H [A/m] | B [T] |\n|---|---|\n| 0 | 0 |\n"))
	if len(s.Diags) != 1 || !strings.Contains(s.Diags[0].Message, "a pipe table follows") {
		t.Errorf("a pipe table after a file's caption: %v", s.Diags)
	}
	s = sheets.Parse("s.md", []byte("Table BH from : curve\n"))
	if len(s.Diags) != 1 || !strings.Contains(s.Diags[0].Message, "names no file") || s.Diags[0].Pos.String() != "s.md:1:1" {
		t.Errorf("no file: %v", s.Diags)
	}
}

// FuzzCSV reads arbitrary bytes as a CSV table. ReadCSV must not panic;
// every cell and every error must lie on a line of the file at a column
// inside it, with a cell's text found where it is said to start (for a
// cell that is not quoted).
func FuzzCSV(f *testing.F) {
	for _, seed := range []string{
		"H [A/m],B [T]\n0,0\n250,0.40\n",
		"\xef\xbb\xbfH [A/m],B [T]\r\n0,0\r\n",
		"# source: demo\nx,y\n\n1,2\n",
		"a,\"b\"\"c\"\n\"1\n2\",3\n",
		"a,b\n1,2\"\n",
		"a;b\n1;2\n",
		"μ [Ω],ü\n1,2\n",
		"x\n\xff\n",
		"",
		"\"",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		c, d := sheets.ReadCSV("f.csv", data)
		clean := bytes.ReplaceAll(bytes.TrimPrefix(data, []byte("\xef\xbb\xbf")), []byte("\r\n"), []byte("\n"))
		lines := strings.Split(string(clean), "\n")
		inside := func(line, col int) bool {
			return line >= 1 && line <= len(lines) && col >= 1 && col <= utf8.RuneCountInString(lines[line-1])+1
		}
		if d != nil {
			if c != nil {
				t.Fatal("both a table and an error")
			}
			if !inside(d.Pos.Line, d.Pos.Col) {
				t.Fatalf("error outside the file: %s", d.Error())
			}
			return
		}
		if len(c.Rows) > sheets.MaxTableRows+1 {
			t.Fatalf("%d rows kept", len(c.Rows))
		}
		for _, row := range append([][]sheets.Cell{c.Header}, c.Rows...) {
			for _, cell := range row {
				if !inside(cell.Pos.Line, cell.Pos.Col) {
					t.Fatalf("cell %q at %v, outside the file", cell.Text, cell.Pos)
				}
				line := []rune(lines[cell.Pos.Line-1])
				rest := string(line[cell.Pos.Col-1:])
				if !strings.HasPrefix(rest, `"`) && !strings.HasPrefix(rest, cell.Text) {
					t.Fatalf("cell %q at %v, but the line there reads %q", cell.Text, cell.Pos, rest)
				}
			}
		}
	})
}

// BenchmarkReadCSV reads a table of the most rows a table may have,
// 10,000 rows of two columns, as a long measured curve would be.
func BenchmarkReadCSV(b *testing.B) {
	var buf bytes.Buffer
	buf.WriteString("# a measured curve\nH [A/m],B [T]\n")
	for i := 0; i < sheets.MaxTableRows; i++ {
		fmt.Fprintf(&buf, "%d,%.4f\n", 10*i, 2*float64(i)/sheets.MaxTableRows)
	}
	data := buf.Bytes()
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if c, d := sheets.ReadCSV("f.csv", data); d != nil || len(c.Rows) != sheets.MaxTableRows {
			b.Fatal(d)
		}
	}
}
