package render_test

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"os"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/santhosh-tekuri/jsonschema/v6"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/internal/version"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
	"github.com/sheaf-calc/sheaf/units"
)

// schemaFile is the published schema of the JSON output, in the repository.
const schemaFile = "../schema/package-1.json"

func compileSchema(t *testing.T) *jsonschema.Schema {
	t.Helper()
	c := jsonschema.NewCompiler()
	c.AssertFormat() // build_date is a calendar date, not only four digits, two and two
	sch, err := c.Compile(schemaFile)
	if err != nil {
		t.Fatalf("the schema does not compile: %v", err)
	}
	return sch
}

// decode reads a JSON document the way the validator wants it: numbers
// stay json.Number, so that an integer field is judged as written.
func decode(t *testing.T, data []byte) map[string]any {
	t.Helper()
	v, err := jsonschema.UnmarshalJSON(bytes.NewReader(data))
	if err != nil {
		t.Fatalf("the document is not JSON: %v", err)
	}
	m, ok := v.(map[string]any)
	if !ok {
		t.Fatalf("the document is a %T, not an object", v)
	}
	return m
}

// withAudit builds the JSON the way `sheaf build --json` does.
func withAudit(t *testing.T, pkg *project.Package) []byte {
	t.Helper()
	report := audit.Run(pkg)
	data, err := render.JSON(pkg, render.Options{Version: version.Version, Audit: &report, BuildDate: pkg.BuildDate("")})
	if err != nil {
		t.Fatal(err)
	}
	return data
}

func loadDemo(t *testing.T, dir string) *project.Package {
	t.Helper()
	pkg, err := project.Load(dir)
	if err != nil {
		t.Fatal(err)
	}
	return pkg
}

// brokenSheets is a package with errors of many kinds, so that statements
// with status error and blocked, warnings, and the front matter's odd
// corners all reach the document.
// listSheets is a sheet of lists: a short one, a long one and a
// reduction (invented values).
var listSheets = map[string][]byte{
	"turns.md": []byte("# Field coil turns\n\n```sheaf\nphi_k = [2.41 mWb, 2.38 mWb, 2.30 mWb, 2.17 mWb] ; flux linked by each turn group\n" +
		"lambda = sum(phi_k) ; flux linkage\ntheta [deg] = 0 deg .. 180 deg by 10 deg ; rotor positions\n" +
		"k_p(nu) = sin(nu * 7 / 9 * pi / 2) ; pitch factor\nk_p5 = k_p(5) ; fifth harmonic\nbad(x, x) = x\n```\n"),
}

// phasorSheets is a sheet of phasors: a generator's excitation at rated
// load (invented values, Tarnwick Weir).
var phasorSheets = map[string][]byte{
	"excitation.md": []byte("# Excitation at rated load\n\n```sheaf\nV = 6.35 kV ∠ 0 deg ; phase voltage\nI = 525 A /_ -31.79 deg ; armature current\n" +
		"Z_s = 0.04 Ω + 11.5j Ω ; synchronous impedance\nE [kV] = V + I * Z_s ; excitation EMF\ndelta [deg] = arg(E) ; load angle\ncheck abs(E) <= 12 kV\nI_q = 210j A ; reactive current ; source: invented\n```\n"),
}

// phasorListSheets is the three phase voltages of the Tarnwick Weir
// generator (invented), as a list of phasors, with their sum.
var phasorListSheets = map[string][]byte{
	"phases.md": []byte("# Phase voltages\n\n```sheaf\nV_ph = 6.35 kV ; phase voltage ; source: invented\n" +
		"U = V_ph ∠ [0 deg, -120 deg, 120 deg] ; phases a, b, c\nS = sum(U) ; their sum\n```\n"),
}

// seriesSheets is one stator coil of the Tarnwick Weir generator: its
// flux linkage against electrical rotor angle (invented: 0.44 Wb peak, 3 %
// 5th and 1.5 % 7th harmonic), its EMF at 50 Hz, and that EMF's harmonics.
var seriesSheets = map[string][]byte{
	"coil-emf.md": []byte("# Coil EMF waveform\n\n```sheaf\ntheta [deg] = 0 deg .. 360 deg by 5 deg ; electrical rotor angle\n" +
		"Lambda = 0.44 Wb ; peak flux linkage of the coil ; source: invented\n" +
		"lambda_c = Lambda * (sin(theta) + 0.03 * sin(5 * theta) + 0.015 * sin(7 * theta)) ; flux linkage\n" +
		"lambda_s = series(lambda_c, theta) ; flux linkage against rotor angle\n" +
		"omega = 2 * pi * 50 Hz ; electrical angular speed\ne = -omega * deriv(lambda_s) ; coil EMF\n" +
		"E_rms = rms(e) ; rms EMF\nE_5 = harmonic(e, 5) ; 5th harmonic\nd_e = thd(e) ; THD of the EMF\ncheck d_e <= 0.3\n```\n"),
}

var brokenSheets = map[string][]byte{
	"a-names.md": []byte(`---
title: Broken on purpose
revision: A
date: 30 November 2026
checked_on: soon
colour: blue
digits: 99
history:
  - rev: A
    date: yesterday
    colour: red
  - note: an entry without rev
accept:
  no-source: the value is a placeholder
  thin-margin:
---

# Names

Assumption gap-ok: the gap is as drawn.

` + "```sheaf" + `
a = 2 m                   ; length ; source: drawing TW-01 ; assume: drawn size
b = a * c_unknown         ; uses a name nobody defined
d = b + 1 m               ; blocked by b
e = a + 1 s               ; adds a length to a time
f = sqrt(-1 m^2)          ; not a number
g = (a *                  ; cannot be read
h [rpm] = 1 rad/s         ; an angular velocity shown as a frequency
k [kA] = 3 m              ; a display unit of another kind
n = 1500 rpm              ; rotational frequency ; assumes: gap-ok, nowhere
w = 2 * pi * n            ; angular velocity ; accept unused-result: shown for the record
T_1 = 20 degC             ; a temperature ; source: site survey TBC
check d <= 5 m            ; blocked check
check a >= 3 m            ; failing check
check a < 1 s             ; mismatched check
check a == 2 m            ; equality has no utilisation
x = y                     ; cycle
y = x                     ; cycle
= 5 m
check
` + "```" + `

` + "```sheaf" + `
` + "```" + `
`),
	"b-yaml.md":  []byte("---\ntitle: [unclosed\n---\n\n```sheaf\nz = 1 m\n```\n"),
	"c-utf8.md":  []byte("# Bad bytes \xff here\n\n```sheaf\nq = 1 \xfe m\n```\n"),
	"d-open.md":  []byte("---\ntitle: never closed\n\n```sheaf\nv = 1 m\n```\n"),
	"e-list.md":  []byte("---\n- just\n- a list\n---\n\n```sheaf\nu = 1e306 m\nu2 [nm] = u\ncheck [nm] u <= 2 * u\n```\n"),
	"f-prose.md": []byte("# Only prose\n\nNothing to compute here.\n"),
}

// The schema's $id is the URL every document names in its $schema.
func TestSchemaIDIsTheDocumentsSchema(t *testing.T) {
	data, err := os.ReadFile(schemaFile)
	if err != nil {
		t.Fatal(err)
	}
	var s struct {
		ID         string `json:"$id"`
		Draft      string `json:"$schema"`
		Properties struct {
			Schema struct {
				Const string `json:"const"`
			} `json:"$schema"`
		} `json:"properties"`
	}
	if err := json.Unmarshal(data, &s); err != nil {
		t.Fatal(err)
	}
	if s.ID != render.JSONSchemaID {
		t.Errorf("schema $id = %q, render.JSONSchemaID = %q", s.ID, render.JSONSchemaID)
	}
	if s.Properties.Schema.Const != render.JSONSchemaID {
		t.Errorf("the schema wants $schema %q, documents carry %q", s.Properties.Schema.Const, render.JSONSchemaID)
	}
	if s.Draft != "https://json-schema.org/draft/2020-12/schema" {
		t.Errorf("the schema is written against %q, want draft 2020-12", s.Draft)
	}
}

// The enums of the schema list exactly what the Go code can write, so that
// a new status, kind, severity or finding code cannot slip out unschema'd.
func TestSchemaEnumsMatchTheCode(t *testing.T) {
	data, err := os.ReadFile(schemaFile)
	if err != nil {
		t.Fatal(err)
	}
	var s struct {
		Defs map[string]struct {
			Properties map[string]struct {
				Enum  []string `json:"enum"`
				AnyOf []struct {
					Enum []string `json:"enum"`
				} `json:"anyOf"`
			} `json:"properties"`
		} `json:"$defs"`
	}
	if err := json.Unmarshal(data, &s); err != nil {
		t.Fatal(err)
	}
	var statuses, kinds, codes []string
	for st := engine.Pending; st <= engine.Blocked; st++ {
		statuses = append(statuses, st.String())
	}
	// Plain is written as no quantity_kind; other kinds without a name
	// match the schema's pattern (TestSchemaKindPattern).
	for _, k := range []units.Kind{units.Angle, units.Cycle, units.PerRadian, units.PerCycle,
		units.AbsTemp, units.Active, units.Apparent, units.Reactive} {
		kinds = append(kinds, k.String())
	}
	for _, r := range audit.Rules {
		codes = append(codes, r.Code)
	}
	for _, c := range []struct {
		def, prop string
		want      []string
	}{
		{"statement", "status", statuses},
		{"statement", "kind", []string{"definition", "check", "use", "param", "take", "case", "sweep", "sample"}},
		{"ref", "kind", []string{"definition", "check"}},
		{"statement", "quantity_kind", kinds},
		{"diagnostic", "severity", []string{diag.Error.String(), diag.Warning.String()}},
		{"finding", "code", codes},
	} {
		prop := s.Defs[c.def].Properties[c.prop]
		got := slices.Clone(prop.Enum)
		if len(prop.AnyOf) > 0 {
			got = slices.Clone(prop.AnyOf[0].Enum)
		}
		want := slices.Clone(c.want)
		slices.Sort(got)
		slices.Sort(want)
		if !slices.Equal(got, want) {
			t.Errorf("$defs/%s/%s enum = %q, the code writes %q", c.def, c.prop, got, want)
		}
	}
}

// seen gathers what a document exercises, so that the positive tests can
// show they reach every branch of the schema that matters.
type seen map[string]bool

func (s seen) walk(doc map[string]any) {
	for _, sh := range doc["sheets"].([]any) {
		for _, st := range sh.(map[string]any)["statements"].([]any) {
			m := st.(map[string]any)
			s["status "+m["status"].(string)] = true
			if k, ok := m["quantity_kind"].(string); ok {
				s["kind "+k] = true
			}
			if c, ok := m["check"].(map[string]any); ok {
				if _, ok := c["utilisation"]; !ok {
					s["check without utilisation"] = true
				}
			}
			if _, ok := m["name"]; !ok && m["kind"] == "definition" {
				s["definition without a name"] = true
			}
			for _, k := range []string{"left_out", "validity", "template_sources", "defaults_kept"} {
				if _, ok := m[k]; ok {
					s["use with "+k] = true
				}
			}
		}
		if meta := sh.(map[string]any)["meta"].(map[string]any); len(meta) == 0 {
			s["empty meta"] = true
		}
	}
	for _, d := range doc["diagnostics"].([]any) {
		s["severity "+d.(map[string]any)["severity"].(string)] = true
	}
	if a, ok := doc["audit"].(map[string]any); ok {
		for _, f := range a["findings"].([]any) {
			s["accepted "+map[bool]string{true: "yes", false: "no"}[f.(map[string]any)["accepted"].(bool)]] = true
		}
	} else {
		s["no audit"] = true
	}
	if _, ok := doc["build_date"]; !ok {
		s["no build date"] = true
	}
}

// Real documents validate: the demo package with its audit, its previous
// revision with a failing check, a package full of errors, one without
// audit, and an empty one.
func TestRealOutputValidates(t *testing.T) {
	sch := compileSchema(t)
	broken := project.FromFiles("broken", brokenSheets)
	all := seen{}
	for _, c := range []struct {
		name string
		data func(t *testing.T) []byte
		// check asserts what the document must show, beyond validating.
		check func(doc map[string]any) string
	}{
		{"demo with audit", func(t *testing.T) []byte { return withAudit(t, loadDemo(t, "../examples/tarnwick-weir")) }, func(doc map[string]any) string {
			s := doc["summary"].(map[string]any)
			if s["pass"] == json.Number("0") || s["fail"] != json.Number("0") || s["errors"] != json.Number("0") {
				return "the demo should pass every check without errors"
			}
			if doc["build_date"] == nil || doc["audit"] == nil {
				return "the demo's document should have a build date and an audit"
			}
			return ""
		}},
		{"demo revision A", func(t *testing.T) []byte { return withAudit(t, loadDemo(t, "../examples/tarnwick-weir-rev-A")) }, func(doc map[string]any) string {
			if doc["summary"].(map[string]any)["fail"] == json.Number("0") {
				return "revision A should have a failing check"
			}
			return ""
		}},
		{"package with errors", func(t *testing.T) []byte { return withAudit(t, broken) }, func(doc map[string]any) string {
			s := doc["summary"].(map[string]any)
			if s["errors"] == json.Number("0") || s["blocked"] == json.Number("0") {
				return "the broken package should have errors and blocked statements"
			}
			return ""
		}},
		{"package without audit", func(t *testing.T) []byte {
			data, err := render.JSON(broken, render.Options{Version: "test", Digits: 6})
			if err != nil {
				t.Fatal(err)
			}
			return data
		}, func(doc map[string]any) string {
			if _, ok := doc["audit"]; ok {
				return "a document written without an audit should have none"
			}
			return ""
		}},
		{"package with templates, tables and solve", func(t *testing.T) []byte {
			return withAudit(t, project.FromFiles("tpl", templatedSheets))
		}, func(doc map[string]any) string {
			kinds := map[string]bool{}
			for _, sh := range doc["sheets"].([]any) {
				for _, st := range sh.(map[string]any)["statements"].([]any) {
					m := st.(map[string]any)
					kinds[m["kind"].(string)] = true
					if m["overridden"] == true {
						kinds["overridden"] = true
					}
				}
				if len(sh.(map[string]any)["tables"].([]any)) > 0 {
					kinds["table"] = true
				}
			}
			for _, k := range []string{"use", "param", "overridden", "table"} {
				if !kinds[k] {
					return "the templated package should show " + k
				}
			}
			return ""
		}},
		{"package with lists", func(t *testing.T) []byte {
			return withAudit(t, project.FromFiles("lists", listSheets))
		}, func(doc map[string]any) string {
			for _, sh := range doc["sheets"].([]any) {
				for _, st := range sh.(map[string]any)["statements"].([]any) {
					m := st.(map[string]any)
					if m["name"] == "phi_k" {
						l, ok := m["list"].(map[string]any)
						if !ok || l["length"] != json.Number("4") || len(l["text"].([]any)) != 4 {
							return "phi_k should carry its four elements"
						}
						if fs, _ := sh.(map[string]any)["functions"].([]any); len(fs) != 2 {
							return "the sheet should list its two functions"
						}
						found := false
						for _, in := range doc["registers"].(map[string]any)["inputs"].([]any) {
							if m := in.(map[string]any); m["name"] == "phi_k" {
								l, _ := m["list_si"].([]any)
								found = len(l) == 4
							}
						}
						if !found {
							return "the inputs register should carry phi_k's four elements"
						}
						return ""
					}
				}
			}
			return "no statement phi_k"
		}},
		{"package with a series", func(t *testing.T) []byte {
			return withAudit(t, project.FromFiles("series", seriesSheets))
		}, func(doc map[string]any) string {
			for _, st := range doc["sheets"].([]any)[0].(map[string]any)["statements"].([]any) {
				m := st.(map[string]any)
				if m["name"] != "e" {
					continue
				}
				l, _ := m["list"].(map[string]any)
				o, _ := l["over"].(map[string]any)
				if o == nil || o["display_unit"] != "°" || len(o["display"].([]any)) != 73 {
					return fmt.Sprintf("e should carry its 73 rotor angles in degrees, not %v", l["over"])
				}
				return ""
			}
			return "no statement e"
		}},
		{"package with phasors", func(t *testing.T) []byte {
			return withAudit(t, project.FromFiles("phasors", phasorSheets))
		}, func(doc map[string]any) string {
			for _, st := range doc["sheets"].([]any)[0].(map[string]any)["statements"].([]any) {
				m := st.(map[string]any)
				if m["name"] == "E" {
					p, ok := m["phasor"].(map[string]any)
					if !ok || p["text"] != "10.83 kV ∠ 28.20°" {
						return fmt.Sprintf("E should carry its phasor as 10.83 kV ∠ 28.20°, not %v", m["phasor"])
					}
					if _, ok := m["display"].(map[string]any); !ok {
						return "E should carry its magnitude as its display value"
					}
					for _, in := range doc["registers"].(map[string]any)["inputs"].([]any) {
						if m := in.(map[string]any); m["name"] == "I_q" {
							if p, _ := m["phasor_si"].(map[string]any); p == nil || p["im"] != json.Number("210") || p["re"] != json.Number("0") {
								return fmt.Sprintf("the inputs register should carry I_q's parts, not %v", m["phasor_si"])
							}
							return ""
						}
					}
					return "the inputs register lacks I_q"
				}
			}
			return "no statement E"
		}},
		{"package with a list of phasors", func(t *testing.T) []byte {
			return withAudit(t, project.FromFiles("phasor-lists", phasorListSheets))
		}, func(doc map[string]any) string {
			for _, st := range doc["sheets"].([]any)[0].(map[string]any)["statements"].([]any) {
				if m := st.(map[string]any); m["name"] == "U" {
					l, _ := m["list"].(map[string]any)
					ps, _ := l["phasors"].([]any)
					if len(ps) != 3 || l["text"].([]any)[1] != "6.350 ∠ -120.0°" {
						return fmt.Sprintf("U should carry three phasors, the second 6.350 ∠ -120.0°, not %v", l)
					}
					return ""
				}
			}
			return "no statement U"
		}},
		{"package with no files", func(t *testing.T) []byte {
			data, err := render.JSON(project.FromFiles("empty", map[string][]byte{}), render.Options{})
			if err != nil {
				t.Fatal(err)
			}
			return data
		}, nil},
		// An epoch whose year has more than four digits is ignored like a
		// malformed one: the date falls back to the front matter's.
		{"SOURCE_DATE_EPOCH past year 9999", func(t *testing.T) []byte {
			pkg := loadDemo(t, "../examples/tarnwick-weir")
			data, err := render.JSON(pkg, render.Options{Version: "test", BuildDate: pkg.BuildDate("1000000000000000")})
			if err != nil {
				t.Fatal(err)
			}
			return data
		}, func(doc map[string]any) string {
			if doc["build_date"] != "2026-12-02" {
				return fmt.Sprintf("build_date = %v, want the latest front-matter date 2026-12-02", doc["build_date"])
			}
			return ""
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			data := c.data(t)
			doc := decode(t, data)
			if err := sch.Validate(doc); err != nil {
				t.Fatalf("the document does not match the schema:\n%v", err)
			}
			if c.check != nil {
				if msg := c.check(doc); msg != "" {
					t.Error(msg)
				}
			}
			all.walk(doc)
		})
	}
	// Every case of the bad-input table (badinput_test.go): each one a
	// different mistake, each reaching the document in its own shape.
	for _, c := range badCases() {
		pkg := project.FromFiles("pkg", map[string][]byte{"s.md": []byte(badSheet(c))})
		doc := decode(t, withAudit(t, pkg))
		if err := sch.Validate(doc); err != nil {
			t.Errorf("bad input %q: the document does not match the schema:\n%v", c.name, err)
		}
		all.walk(doc)
	}
	for _, want := range []string{
		"status ok", "status pass", "status fail", "status error", "status blocked",
		"kind angle", "kind cycles", "kind absolute temperature",
		"severity error", "severity warning", "accepted yes", "accepted no",
		"check without utilisation", "definition without a name", "empty meta", "no audit", "no build date",
		"use with left_out", "use with validity", "use with template_sources", "use with defaults_kept",
	} {
		if !all[want] {
			t.Errorf("no document exercised %q: the positive tests miss a branch of the schema", want)
		}
	}
}

// The schema has teeth: a valid document broken in one place fails, and
// fails at that place.
func TestSchemaRejectsBrokenDocuments(t *testing.T) {
	sch := compileSchema(t)
	demo := withAudit(t, loadDemo(t, "../examples/tarnwick-weir"))
	broken := withAudit(t, project.FromFiles("broken", brokenSheets))

	// find returns the location of the first statement with the status.
	statusAt := func(doc map[string]any, status string) (string, map[string]any) {
		for i, sh := range doc["sheets"].([]any) {
			for j, st := range sh.(map[string]any)["statements"].([]any) {
				if m := st.(map[string]any); m["status"] == status {
					return "/sheets/" + strconv.Itoa(i) + "/statements/" + strconv.Itoa(j), m
				}
			}
		}
		t.Fatalf("no statement with status %s", status)
		return "", nil
	}
	for _, c := range []struct {
		name string
		doc  []byte
		// breakIt changes the document and returns where the schema should
		// object, as a JSON pointer, and a word its message should hold.
		breakIt func(doc map[string]any) (at, says string)
	}{
		{"no stamp", demo, func(doc map[string]any) (string, string) {
			delete(doc, "stamp")
			return "", "stamp"
		}},
		{"a stamp that is not a SHA-256", demo, func(doc map[string]any) (string, string) {
			doc["stamp"] = "sha256:" + strings.Repeat("G", 64)
			return "/stamp", "match"
		}},
		{"an unknown top-level property", demo, func(doc map[string]any) (string, string) {
			doc["remarks"] = "looks fine"
			return "", "remarks"
		}},
		{"another schema version", demo, func(doc map[string]any) (string, string) {
			doc["$schema"] = "https://sheaf-calc.github.io/schema/package-2.json"
			return "/$schema", ""
		}},
		{"status maybe", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "ok")
			st["status"] = "maybe"
			return at + "/status", "one of"
		}},
		{"pos line 0", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "ok")
			st["pos"].(map[string]any)["line"] = json.Number("0")
			return at + "/pos/line", "minimum"
		}},
		{"pos line as a string", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "pass")
			st["pos"].(map[string]any)["line"] = "12"
			return at + "/pos/line", "string"
		}},
		{"pos col 1.5", demo, func(doc map[string]any) (string, string) {
			doc["audit"].(map[string]any)["findings"].([]any)[0].(map[string]any)["pos"].(map[string]any)["col"] = json.Number("1.5")
			return "/audit/findings/0/pos/col", "integer"
		}},
		{"a result without its SI value", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "ok")
			delete(st, "si")
			return at, "si"
		}},
		{"a passing check whose check says it fails", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "pass")
			st["check"].(map[string]any)["pass"] = false
			return at + "/check/pass", ""
		}},
		{"a negative count", demo, func(doc map[string]any) (string, string) {
			doc["summary"].(map[string]any)["pass"] = json.Number("-1")
			return "/summary/pass", "minimum"
		}},
		{"a source hash in capitals", demo, func(doc map[string]any) (string, string) {
			src := doc["sources"].([]any)[0].(map[string]any)
			src["sha256"] = strings.ToUpper(src["sha256"].(string))
			return "/sources/0/sha256", "match"
		}},
		{"diagnostics null", demo, func(doc map[string]any) (string, string) {
			doc["diagnostics"] = nil
			return "/diagnostics", "null"
		}},
		{"an accepted finding without a reason", demo, func(doc map[string]any) (string, string) {
			for i, f := range doc["audit"].(map[string]any)["findings"].([]any) {
				if m := f.(map[string]any); m["accepted"] == true {
					delete(m, "reason")
					return "/audit/findings/" + strconv.Itoa(i), "reason"
				}
			}
			t.Fatal("the demo has no accepted finding")
			return "", ""
		}},
		{"an unknown finding code", demo, func(doc map[string]any) (string, string) {
			doc["audit"].(map[string]any)["findings"].([]any)[0].(map[string]any)["code"] = "looks-odd"
			return "/audit/findings/0/code", "one of"
		}},
		{"quantity_kind plain", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "ok")
			st["quantity_kind"] = "plain"
			return at + "/quantity_kind", "one of"
		}},
		{"a build date that is no date", demo, func(doc map[string]any) (string, string) {
			doc["build_date"] = "2026-02-30"
			return "/build_date", "date"
		}},
		{"a diagnostic of severity info", broken, func(doc map[string]any) (string, string) {
			doc["diagnostics"].([]any)[0].(map[string]any)["severity"] = "info"
			return "/diagnostics/0/severity", "one of"
		}},
		{"a blocked statement without its reason", broken, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "blocked")
			delete(st, "error")
			return at, "error"
		}},
		{"a statement with an error and a value", broken, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "error")
			st["si"] = map[string]any{"value": json.Number("1"), "unit": "m"}
			return at, "not"
		}},
		{"a statement error of severity warning", broken, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "error")
			st["error"].(map[string]any)["severity"] = "warning"
			return at + "/error/severity", "error"
		}},
		{"a dimension in other words", demo, func(doc map[string]any) (string, string) {
			at, st := statusAt(doc, "ok")
			st["dimension"] = "length"
			return at + "/dimension", "match"
		}},
	} {
		t.Run(c.name, func(t *testing.T) {
			doc := decode(t, c.doc)
			if err := sch.Validate(doc); err != nil {
				t.Fatalf("the unbroken document fails already: %v", err)
			}
			at, says := c.breakIt(doc)
			err := sch.Validate(doc)
			if err == nil {
				t.Fatal("the broken document validates")
			}
			var ve *jsonschema.ValidationError
			if !errors.As(err, &ve) {
				t.Fatalf("validation failed with %T, not a ValidationError: %v", err, err)
			}
			if !reachesLocation(ve, at) {
				t.Errorf("the schema objects, but not at %q:\n%v", at, err)
			}
			if !strings.Contains(err.Error(), says) {
				t.Errorf("the objection does not mention %q:\n%v", says, err)
			}
		})
	}
}

// reachesLocation reports whether the error, or one of its causes, is at
// the JSON pointer at.
func reachesLocation(e *jsonschema.ValidationError, at string) bool {
	ptr := ""
	for _, p := range e.InstanceLocation {
		ptr += "/" + p
	}
	if ptr == at {
		return true
	}
	for _, c := range e.Causes {
		if reachesLocation(c, at) {
			return true
		}
	}
	return false
}

// templatedSheets use a template three ways, read a table and solve for an
// unknown; one sheet is a template built on its own, so its parameter has
// no value.
var templatedSheets = map[string][]byte{
	"_t/coil.md":    []byte("---\ntitle: coil\ntemplate: true\n---\nAssumption same: every turn links the same flux.\n\n```sheaf\nparam N [1] ; turns\nPhi = 1 mWb ; flux ; source: s\nlambda [Wb] = N * Phi ; linkage ; assumes: same\ncheck lambda <= 1 Wb ; limit ; accept check-literal: a demo\n```\n"),
	"standalone.md": []byte("```sheaf\nparam N [1] ; turns\nx = 2 * N\n```\n"),
	"job.md": []byte("---\ntitle: job\nrevision: A\nchecked by: C\n---\nTable BH: a curve\n\n| H [A/m] | B [T] |\n|---|---|\n| 0 | 0 |\n| 100 | 1 |\n| 1000 | 1.5 |\n\n```sheaf\n" +
		"N_f = 120 ; turns ; source: drawing\nuse c1 = _t/coil with N = N_f, Phi = 2 mWb\nuse c2 = _t/coil with N = 80\n" +
		"B_c = interp(BH.B, BH.H, 500 A/m) ; read\nx = solve(x^2 == 2, 0, 2) ; root two\nuse bad = _t/coil\n```\n"),
}

// Kinds without a name are written as their exponents, which the schema's
// pattern must accept, and the pattern must refuse what sheaf never writes.
func TestSchemaKindPattern(t *testing.T) {
	data, err := os.ReadFile(schemaFile)
	if err != nil {
		t.Fatal(err)
	}
	var s struct {
		Defs map[string]struct {
			Properties map[string]struct {
				AnyOf []struct {
					Pattern string `json:"pattern"`
				} `json:"anyOf"`
			} `json:"properties"`
		} `json:"$defs"`
	}
	if err := json.Unmarshal(data, &s); err != nil {
		t.Fatal(err)
	}
	alts := s.Defs["statement"].Properties["quantity_kind"].AnyOf
	if len(alts) != 2 {
		t.Fatalf("quantity_kind has %d alternatives, want an enum and a pattern", len(alts))
	}
	re := regexp.MustCompile(alts[1].Pattern)
	for _, k := range []units.Kind{{Rad: 2}, {Rad: -2}, {Rad: 1, Cyc: 1}, {Cyc: -3}, {Rad: -1, Tag: units.TagActive}} {
		if !re.MatchString(k.String()) {
			t.Errorf("kind %+v writes %q, which the schema's pattern refuses", k, k.String())
		}
	}
	for _, bad := range []string{"plain", "rad^0", "torque", "rad^-"} {
		if re.MatchString(bad) {
			t.Errorf("the schema's pattern accepts %q", bad)
		}
	}
}
