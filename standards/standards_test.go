package standards

import (
	"reflect"
	"testing"
)

func TestSplit(t *testing.T) {
	for _, c := range []struct {
		in, rest string
		clauses  []Clause
	}{
		{"no clause here", "no clause here", nil},
		{"", "", nil},
		{"turn insulation withstands the surge; clause: IEC 60034-15:2009, 4.2 (from memory)",
			"turn insulation withstands the surge",
			[]Clause{{"IEC 60034-15:2009, 4.2 (from memory)", "IEC 60034-15:2009", "4.2 (from memory)"}}},
		{"clause: IEC 60085:2007", "", []Clause{{"IEC 60085:2007", "IEC 60085:2007", ""}}},
		{"a; Clause: A, 1; b; clause: B, 2", "a; b", []Clause{{"A, 1", "A", "1"}, {"B, 2", "B", "2"}}},
		{"the clause: is empty; clause:", "the clause: is empty", nil},
		{"x (a; b); clause: IEC TS 60034-18-41:2014, enhancement factor (from memory; to be confirmed)", "x (a; b)",
			[]Clause{{"IEC TS 60034-18-41:2014, enhancement factor (from memory; to be confirmed)", "IEC TS 60034-18-41:2014", "enhancement factor (from memory; to be confirmed)"}}},
	} {
		rest, clauses := Split(c.in)
		if rest != c.rest || !reflect.DeepEqual(clauses, c.clauses) {
			t.Errorf("Split(%q) = %q, %+v; want %q, %+v", c.in, rest, clauses, c.rest, c.clauses)
		}
	}
}

func FuzzSplit(f *testing.F) {
	f.Add("desc; clause: IEC 60034-1:2017, 9.2")
	f.Add("clause:;clause: ,")
	f.Fuzz(func(t *testing.T, s string) {
		rest, clauses := Split(s)
		if len(rest) > len(s) {
			t.Fatalf("the description grew: %q from %q", rest, s)
		}
		for _, c := range clauses {
			if c.Text == "" {
				t.Fatalf("an empty clause from %q", s)
			}
		}
	})
}
