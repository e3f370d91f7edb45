package render

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"

	"github.com/sheaf-calc/sheaf/audit"
	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/sheets"
	"github.com/sheaf-calc/sheaf/units"
)

// JSONSchemaID names the version of the JSON document; it changes whenever
// a field changes meaning or goes away.
const JSONSchemaID = "https://sheaf-calc.github.io/schema/package-1.json"

// JSONDoc is the JSON form of a package. schema/package-1.json in the
// repository describes it as a JSON Schema.
type JSONDoc struct {
	Schema    string               `json:"$schema"`
	Tool      JSONTool             `json:"tool"`
	Stamp     string               `json:"stamp"`
	BuildDate string               `json:"build_date,omitempty"`
	Sources   []project.SourceFile `json:"sources"`
	Summary   JSONSummary          `json:"summary"`
	Registers JSONRegisters        `json:"registers"`
	Audit     *JSONAudit           `json:"audit,omitempty"`
	Sheets    []JSONSheet          `json:"sheets"`
	Diags     []JSONDiag           `json:"diagnostics"`
}

// JSONRegisters are the package-wide registers.
type JSONRegisters struct {
	Inputs      []JSONInput      `json:"inputs"`
	Assumptions []JSONAssumption `json:"assumptions"`
}

// JSONInput is a row of the inputs register.
type JSONInput struct {
	Sheet string    `json:"sheet"`
	Name  string    `json:"name"`
	Pos   diag.Pos  `json:"pos"`
	Value string    `json:"value"` // as written
	Unit  string    `json:"unit"`
	SI    JSONValue `json:"si"`
	// ListSI holds the SI values of an input that is a list; SI is then
	// its element of largest magnitude.
	ListSI []float64 `json:"list_si,omitempty"`
	// PhasorSI holds the parts of an input that is imaginary (210j A);
	// SI is then its magnitude.
	PhasorSI    *JSONPhasorSI `json:"phasor_si,omitempty"`
	Description string        `json:"description,omitempty"`
	Source      string        `json:"source,omitempty"`
	// Instance names the template instance the input belongs to;
	// Overridden is set when the using sheet gave its value.
	Instance   string `json:"instance,omitempty"`
	Overridden bool   `json:"overridden,omitempty"`
}

// JSONAssumption is a row of the assumptions register.
type JSONAssumption struct {
	Sheet      string    `json:"sheet"`
	ID         string    `json:"id"`
	Text       string    `json:"text"`
	Pos        diag.Pos  `json:"pos"`
	Statement  string    `json:"statement,omitempty"` // set when the assumption is a statement
	Dependents []JSONRef `json:"dependents"`
}

// JSONRef points at a statement.
type JSONRef struct {
	Name string   `json:"name,omitempty"` // a definition's name
	Kind string   `json:"kind"`
	Pos  diag.Pos `json:"pos"`
}

// JSONAudit is the audit of the package.
type JSONAudit struct {
	Open     int             `json:"open"`
	Findings []audit.Finding `json:"findings"`
}

// JSONTool names the tool that wrote the document.
type JSONTool struct {
	Name    string `json:"name"`
	Version string `json:"version"`
}

// JSONSummary counts outcomes.
type JSONSummary struct {
	Sheets  int `json:"sheets"`
	Results int `json:"results"`
	Inputs  int `json:"inputs"`
	Pass    int `json:"pass"`
	Fail    int `json:"fail"`
	// Fixed counts the checks that cannot fail, apart from Pass and Fail.
	Fixed   int `json:"fixed"`
	Errors  int `json:"errors"`
	Blocked int `json:"blocked"`
}

// JSONSheet is one sheet.
type JSONSheet struct {
	Path       string          `json:"path"`
	Page       string          `json:"page"`
	Title      string          `json:"title"`
	Meta       sheets.Meta     `json:"meta"`
	Tables     []JSONTable     `json:"tables"`
	Statements []JSONStatement `json:"statements"`
	Functions  []JSONFunction  `json:"functions,omitempty"`
	// Sampling is the Monte Carlo count and seed of a sheet with
	// tolerances.
	Sampling *JSONSampling `json:"sampling,omitempty"`
}

// JSONFunction is a function of the sheet's own: its definition, which has
// no value; each call is checked and evaluated in the statement it is in.
type JSONFunction struct {
	Name        string    `json:"name"`
	Params      []string  `json:"params"`
	Pos         diag.Pos  `json:"pos"`
	Text        string    `json:"text"`
	Formula     string    `json:"formula"`
	Description string    `json:"description,omitempty"`
	Instance    string    `json:"instance,omitempty"`
	Error       *JSONDiag `json:"error,omitempty"`
}

// JSONTable is a named table of the sheet, or of one of its instances.
type JSONTable struct {
	Name    string       `json:"name"`
	Caption string       `json:"caption"`
	Pos     diag.Pos     `json:"pos"`
	File    string       `json:"file,omitempty"` // the CSV file the rows were read from
	Columns []JSONColumn `json:"columns"`
	Error   *JSONDiag    `json:"error,omitempty"`
}

// JSONColumn is a column of a table: its values as written and in SI.
type JSONColumn struct {
	Name   string    `json:"name"`
	Unit   string    `json:"unit"`
	Values []string  `json:"values"`
	SI     []float64 `json:"si"`
}

// JSONSet is one input a use statement or a case sets; a case's value
// also in SI.
type JSONSet struct {
	Name    string     `json:"name"`
	Formula string     `json:"formula"`
	SI      *JSONValue `json:"si,omitempty"`
}

// JSONStatement is one definition or check with its value.
type JSONStatement struct {
	Kind         string      `json:"kind"` // "definition" or "check"
	Name         string      `json:"name,omitempty"`
	Pos          diag.Pos    `json:"pos"`
	Text         string      `json:"text"`
	Status       string      `json:"status"` // ok, pass, fail, error, blocked
	Input        bool        `json:"input"`
	Dimension    string      `json:"dimension,omitempty"`
	QuantityKind string      `json:"quantity_kind,omitempty"`
	SI           *JSONValue  `json:"si,omitempty"`
	Display      *JSONValue  `json:"display,omitempty"`
	List         *JSONList   `json:"list,omitempty"`
	Phasor       *JSONPhasor `json:"phasor,omitempty"`
	Check        *JSONCheck  `json:"check,omitempty"`
	Description  string      `json:"description,omitempty"`
	// Clauses are the standards' clauses the statement applies, as written
	// after `; clause:`.
	Clauses    []string   `json:"clauses,omitempty"`
	Source     string     `json:"source,omitempty"`
	Assumption string     `json:"assumption,omitempty"`
	Assumes    []string   `json:"assumes,omitempty"`
	Uses       []string   `json:"uses"`
	UsedBy     []string   `json:"used_by"`
	TakenFrom  *JSONTaken `json:"taken_from,omitempty"`
	RestsOn    *JSONTrace `json:"rests_on,omitempty"`
	Error      *JSONDiag  `json:"error,omitempty"`
	// Template reuse: on a use statement, the template and the inputs it
	// sets; on a statement from a template, its instance, and whether the
	// using sheet set its value (Default is then the template's own).
	Template   string    `json:"template,omitempty"`
	Sets       []JSONSet `json:"sets,omitempty"`
	Instance   string    `json:"instance,omitempty"`
	Overridden bool      `json:"overridden,omitempty"`
	Default    string    `json:"default,omitempty"`
	// On a use statement, from the template's front matter: where it
	// holds and what it rests on; on a use of the sheet itself, also the
	// parts left out for optional inputs not set and the defaults kept
	// that checks rest on.
	Validity        []string          `json:"validity,omitempty"`
	TemplateSources []string          `json:"template_sources,omitempty"`
	LeftOut         []JSONLeftOut     `json:"left_out,omitempty"`
	DefaultsKept    []JSONKeptDefault `json:"defaults_kept,omitempty"`
	// The sheet's conditions: a statement's outcome in each load case, a
	// check's governing condition, an input's tolerance, what the
	// tolerances do to a check or a result, and a sweep's points.
	Cases     map[string]JSONCaseValue `json:"cases,omitempty"`
	Governing *JSONGoverning           `json:"governing,omitempty"`
	Tolerance *JSONTolerance           `json:"tolerance,omitempty"`
	Spread    *JSONSpread              `json:"spread,omitempty"`
	Sweep     *JSONSweep               `json:"sweep,omitempty"`
}

// JSONTrace lists the inputs and assumptions a result ultimately rests on.
type JSONTrace struct {
	Inputs      []string `json:"inputs"`
	Assumptions []string `json:"assumptions"`
}

// JSONList is a list's elements, in coherent SI and as the page shows
// them, all in one unit each.
type JSONList struct {
	Length  int       `json:"length"`
	SI      []float64 `json:"si"`
	Display []float64 `json:"display"`
	Text    []string  `json:"text"`
	// Over is a series' x, absent for a list: the list holds its y.
	Over *JSONAxis `json:"over,omitempty"`
	// Phasors are the elements of a list of phasors, absent for a list
	// of real values: si and display then hold their magnitudes.
	Phasors []JSONPhasorPart `json:"phasors,omitempty"`
}

// JSONPhasorPart is one element of a list of phasors: its parts in
// coherent SI and its angle.
type JSONPhasorPart struct {
	ReSI     float64 `json:"re_si"`
	ImSI     float64 `json:"im_si"`
	AngleRad float64 `json:"angle_rad"`
	AngleDeg float64 `json:"angle_deg"`
}

// JSONAxis is a series' x values in coherent SI, and the unit the page
// shows them in.
type JSONAxis struct {
	SI          []float64 `json:"si"`
	Unit        string    `json:"unit"`
	DisplayUnit string    `json:"display_unit"`
	Display     []float64 `json:"display"`
}

// JSONPhasor is a complex value's parts in coherent SI and its angle; the
// statement's si and display hold its magnitude.
type JSONPhasor struct {
	ReSI     float64 `json:"re_si"`
	ImSI     float64 `json:"im_si"`
	AngleRad float64 `json:"angle_rad"`
	AngleDeg float64 `json:"angle_deg"`
	Text     string  `json:"text"`
}

// JSONPhasorSI is a phasor's parts in coherent SI.
type JSONPhasorSI struct {
	Re float64 `json:"re"`
	Im float64 `json:"im"`
}

// JSONValue is a number in a unit.
type JSONValue struct {
	Value float64 `json:"value"`
	Unit  string  `json:"unit"`
	Text  string  `json:"text,omitempty"` // as shown, to the sheet's significant figures
}

// JSONCheck is the outcome of a check: both sides in SI and in the check's
// unit, and the utilisation.
type JSONCheck struct {
	Op          string    `json:"op"`
	Pass        bool      `json:"pass"`
	LeftSI      float64   `json:"left_si"`
	RightSI     float64   `json:"right_si"`
	Left        JSONValue `json:"left"`
	Right       JSONValue `json:"right"`
	Utilisation *float64  `json:"utilisation,omitempty"`
	// Fixed is set for a check whose outcome cannot depend on its inputs:
	// not counted as a pass or a failure.
	Fixed bool `json:"fixed,omitempty"`
	// Band is set for one side of a tolerance band.
	Band *JSONBand `json:"band,omitempty"`
}

// JSONBand is where a quantity sits in the tolerance band two checks state.
type JSONBand struct {
	LowSI    float64 `json:"low_si"`
	HighSI   float64 `json:"high_si"`
	ValueSI  float64 `json:"value_si"`
	Position float64 `json:"position"`
	Text     string  `json:"text"`
}

// JSONDiag is a diagnostic.
type JSONDiag struct {
	Pos      diag.Pos `json:"pos"`
	Severity string   `json:"severity"`
	Message  string   `json:"message"`
	Hint     string   `json:"hint,omitempty"`
}

func jsonDiag(d diag.Diagnostic) JSONDiag {
	return JSONDiag{Pos: d.Pos, Severity: d.Severity.String(), Message: d.Message, Hint: d.Hint}
}

// JSON returns the package as an indented JSON document.
func JSON(pkg *project.Package, opt Options) ([]byte, error) {
	var buf bytes.Buffer
	err := WriteJSON(pkg, opt, &buf)
	return buf.Bytes(), err
}

// WriteJSON writes the package as an indented JSON document, one sheet at
// a time, so that a large package never sits in memory as one document.
// The bytes are those of encoding Document(pkg, opt) with two-space
// indentation.
func WriteJSON(pkg *project.Package, opt Options, w io.Writer) error {
	bw := bufio.NewWriter(w)
	ds := digestsOf(pkg, opt)
	doc, err := documentHead(pkg, opt, ds)
	if err != nil {
		return err
	}
	head, err := marshal(doc, "")
	if err != nil {
		return err
	}
	// The head has empty sheet and diagnostic lists; open the sheets list
	// and stream its members, then write the rest of the head after it.
	const emptySheets = `"sheets": [],`
	i := bytes.Index(head, []byte(emptySheets))
	if i < 0 {
		return fmt.Errorf("render: unexpected JSON head")
	}
	bw.Write(head[:i])
	if len(pkg.Sheets) == 0 {
		bw.WriteString(emptySheets)
	} else {
		bw.WriteString(`"sheets": [`)
		for k, s := range pkg.Sheets {
			if k > 0 {
				bw.WriteString(",")
			}
			bw.WriteString("\n    ")
			data, err := ds[k].objectOf(opt.Digests, s, opt)
			if err != nil {
				return err
			}
			bw.Write(data)
		}
		bw.WriteString("\n  ],")
	}
	tail := head[i+len(emptySheets):]
	diags := make([]JSONDiag, 0, len(pkg.Diags))
	for _, d := range pkg.Diags {
		diags = append(diags, jsonDiag(d))
	}
	const emptyDiags = `"diagnostics": []`
	j := bytes.Index(tail, []byte(emptyDiags))
	if j < 0 {
		return fmt.Errorf("render: unexpected JSON tail")
	}
	bw.Write(tail[:j])
	list, err := marshal(diags, "  ")
	if err != nil {
		return err
	}
	bw.WriteString(`"diagnostics": `)
	bw.Write(list)
	bw.Write(tail[j+len(emptyDiags):])
	bw.WriteString("\n")
	return bw.Flush()
}

func marshal(v any, prefix string) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetIndent(prefix, "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimSuffix(buf.Bytes(), []byte("\n")), nil
}

func documentHead(pkg *project.Package, opt Options, ds []*Digest) (JSONDoc, error) {
	c := pkg.Counts()
	reg, err := registers(pkg, ds)
	doc := JSONDoc{
		Schema:    JSONSchemaID,
		Tool:      JSONTool{Name: "sheaf", Version: opt.Version},
		Stamp:     project.StampOf(pkg.Files, opt.Version),
		BuildDate: opt.BuildDate,
		Sources:   pkg.Files,
		Summary:   JSONSummary{Sheets: len(pkg.Sheets), Results: c.Results, Inputs: c.Inputs, Pass: c.Pass, Fail: c.Fail, Fixed: c.Fixed, Errors: c.Errors, Blocked: c.Blocked},
		Registers: reg,
		Sheets:    []JSONSheet{},
		Diags:     []JSONDiag{},
	}
	if doc.Sources == nil {
		doc.Sources = []project.SourceFile{}
	}
	if opt.Audit != nil {
		doc.Audit = &JSONAudit{Open: opt.Audit.Open(), Findings: opt.Audit.Findings}
		if doc.Audit.Findings == nil {
			doc.Audit.Findings = []audit.Finding{}
		}
	}
	return doc, err
}

// registers builds the package-wide inputs and assumptions registers.
func registers(pkg *project.Package, ds []*Digest) (JSONRegisters, error) {
	r := JSONRegisters{Inputs: []JSONInput{}, Assumptions: []JSONAssumption{}}
	for i, d := range ds {
		reg, err := d.registerOf(pkg.Sheets[i])
		if err != nil {
			return r, err
		}
		r.Inputs = append(r.Inputs, reg.Inputs...)
		r.Assumptions = append(r.Assumptions, reg.Assumptions...)
	}
	return r, nil
}

// sheetRegisters are a sheet's entries of the JSON registers.
func sheetRegisters(s *project.Sheet) JSONRegisters {
	var r JSONRegisters
	for _, st := range s.Calc.Statements {
		if !st.IsInput() || s.Calc.Result(st).Status != engine.OK {
			continue
		}
		v, u := InputText(st)
		res := s.Calc.Result(st)
		in := JSONInput{Sheet: s.Path(), Name: st.Name, Pos: st.Pos, Value: v, Unit: u,
			SI: JSONValue{Value: res.Value, Unit: st.Type.Dim.SIUnits()}, ListSI: res.List,
			Description: st.Description, Source: st.Source, Instance: st.Instance, Overridden: st.Overridden}
		if p := res.Phasor; p != nil {
			in.PhasorSI = &JSONPhasorSI{Re: p.Re, Im: p.Im}
		}
		r.Inputs = append(r.Inputs, in)
	}
	for _, a := range s.Calc.Assumptions {
		ja := JSONAssumption{Sheet: s.Path(), ID: a.ID, Text: a.Text, Pos: a.Pos, Dependents: []JSONRef{}}
		if a.Statement != nil {
			ja.Statement = a.Statement.Name
		}
		for _, d := range a.Dependents {
			ja.Dependents = append(ja.Dependents, ref(d))
		}
		r.Assumptions = append(r.Assumptions, ja)
	}
	return r
}

func ref(st *engine.Statement) JSONRef {
	k := "definition"
	if st.Kind == engine.Check {
		k = "check"
	}
	return JSONRef{Name: st.Name, Kind: k, Pos: st.Pos}
}

func jsonSheet(s *project.Sheet, opt Options) JSONSheet {
	digits := s.Digits(opt.Digits)
	js := JSONSheet{Path: s.Path(), Page: s.Page, Title: s.Title(), Meta: s.Doc.Meta, Tables: []JSONTable{}, Statements: []JSONStatement{}, Sampling: jsonSampling(s)}
	for _, t := range s.Calc.Tables {
		jt := JSONTable{Name: t.Name, Caption: t.Caption, Pos: t.Pos, File: t.File, Columns: []JSONColumn{}}
		if t.Err != nil {
			d := jsonDiag(*t.Err)
			jt.Error = &d
		} else {
			for _, c := range t.Columns {
				jt.Columns = append(jt.Columns, JSONColumn{Name: c.Name, Unit: c.Unit.Symbol, Values: c.Texts, SI: c.Values})
			}
		}
		js.Tables = append(js.Tables, jt)
	}
	for _, st := range s.Calc.Statements {
		if st.Kind == engine.FunctionDef {
			js.Functions = append(js.Functions, jsonFunction(st))
			continue
		}
		js.Statements = append(js.Statements, jsonStatement(s, st, digits))
	}
	return js
}

func jsonFunction(st *engine.Statement) JSONFunction {
	f := JSONFunction{Name: st.Name, Params: st.Params, Pos: st.Pos, Text: st.Text, Formula: st.Formula, Description: st.Description, Instance: st.Instance}
	if f.Params == nil {
		f.Params = []string{}
	}
	if st.Problem != nil {
		d := jsonDiag(*st.Problem)
		f.Error = &d
	}
	return f
}

// Document builds the JSON form of a package in memory.
func Document(pkg *project.Package, opt Options) JSONDoc {
	// Only a build lets calculations go, and it never asks for this.
	doc, _ := documentHead(pkg, opt, digestsOf(pkg, opt))
	for _, s := range pkg.Sheets {
		doc.Sheets = append(doc.Sheets, jsonSheet(s, opt))
	}
	for _, d := range pkg.Diags {
		doc.Diags = append(doc.Diags, jsonDiag(d))
	}
	return doc
}

func names(sts []*engine.Statement) []string {
	out := []string{}
	for _, s := range sts {
		if s.Name != "" {
			out = append(out, s.Name)
		}
	}
	return out
}

// JSONTaken names where a taken result comes from.
type JSONTaken struct {
	Sheet string `json:"sheet"`
	Name  string `json:"name"`
}

func jsonStatement(s *project.Sheet, st *engine.Statement, digits int) JSONStatement {
	calc := s.Calc
	res := calc.Result(st)
	j := JSONStatement{
		Kind: "definition", Name: st.Name, Pos: st.Pos, Text: st.Text, Status: res.Status.String(),
		Input: st.IsInput(), Description: describe(st), Source: st.Source, Clauses: clauseTexts(st),
		Assumption: st.Assumption, Assumes: st.Assumes,
		Uses: names(st.Deps), UsedBy: names(st.Users),
	}
	if !st.IsInput() && (st.Expr != nil || st.Kind == engine.Take) {
		inputs, assumptions := calc.RestsOn(st)
		t := &JSONTrace{Inputs: names(inputs), Assumptions: []string{}}
		for _, a := range assumptions {
			t.Assumptions = append(t.Assumptions, a.ID)
		}
		j.RestsOn = t
	}
	switch st.Kind {
	case engine.Check:
		j.Kind = "check"
	case engine.Use:
		j.Kind = "use"
		j.Template = st.Template
		for _, o := range st.Overrides {
			j.Sets = append(j.Sets, JSONSet{Name: o.Name, Formula: o.Formula})
		}
		jsonUseParts(calc, st, &j)
		j.RestsOn = nil
	case engine.Param:
		j.Kind = "param"
	case engine.Take:
		j.Kind = "take"
		if st.Taken != nil {
			j.TakenFrom = &JSONTaken{Sheet: st.TakenPath, Name: st.Remote}
		}
	}
	j.Instance = st.Instance
	if st.Overridden {
		j.Overridden = true
		if st.Default != nil {
			j.Default = exprText(st.Default)
		}
	}
	if res.Err != nil {
		d := jsonDiag(*res.Err)
		j.Error = &d
	}
	if st.IsCondition() {
		jsonConditionStatement(&j, st)
		addConditions(&j, s, st, digits)
		return j // a condition has no value of its own
	}
	if st.Kind == engine.Use {
		return j // an instance has no value of its own
	}
	if res.Status == engine.OK || res.Status == engine.Pass || res.Status == engine.Fail {
		j.Dimension = st.Type.Dim.ASCII()
		if st.Type.Kind != units.Plain {
			j.QuantityKind = st.Type.Kind.String()
		}
	}
	switch res.Status {
	case engine.OK:
		jsonValue(&j, st, res, digits)
	case engine.Pass, engine.Fail:
		j.Check = jsonCheck(s, st, res, digits)
	}
	addConditions(&j, s, st, digits)
	return j
}

// jsonValue writes a definition's value: in SI, as shown, and a list's
// elements or a phasor's parts.
func jsonValue(j *JSONStatement, st *engine.Statement, res engine.Result, digits int) {
	j.SI = &JSONValue{Value: res.Value, Unit: st.Type.Dim.SIUnits()}
	shown := res.Shown.FromSI(res.Value)
	j.Display = &JSONValue{Value: shown, Unit: res.Shown.Symbol, Text: units.FormatNumber(shown, res.Digits(digits))}
	if res.List != nil {
		j.List = jsonList(res, digits)
	}
	if p := res.Phasor; p != nil {
		j.Phasor = &JSONPhasor{ReSI: p.Re, ImSI: p.Im, AngleRad: p.Angle(), AngleDeg: phasorDegrees(*p), Text: PhasorText(res, digits)}
	}
}

// jsonCheck writes a check's two sides, its utilisation, and whether it
// is fixed or one side of a band.
func jsonCheck(s *project.Sheet, st *engine.Statement, res engine.Result, digits int) *JSONCheck {
	l, r := res.Shown.FromSI(res.Left), res.Shown.FromSI(res.Right)
	c := &JSONCheck{
		Op: st.Compare().Op, Pass: res.Status == engine.Pass, LeftSI: res.Left, RightSI: res.Right,
		Left:  JSONValue{Value: l, Unit: res.Shown.Symbol, Text: units.FormatNumber(l, digits)},
		Right: JSONValue{Value: r, Unit: res.Shown.Symbol, Text: units.FormatNumber(r, digits)},
	}
	if !math.IsNaN(res.Utilisation) && !math.IsInf(res.Utilisation, 0) {
		u := res.Utilisation
		c.Utilisation = &u
	}
	c.Fixed, _ = s.Fixed(st)
	if b, ok := s.Band(st); ok {
		c.Band = &JSONBand{LowSI: b.Lo, HighSI: b.Hi, ValueSI: b.Value, Position: b.Position(), Text: BandText(s, st, digits)}
	}
	return c
}

// jsonList writes a list's elements in SI and in the unit they are shown in.
func jsonList(res engine.Result, digits int) *JSONList {
	l := &JSONList{Length: len(res.List), SI: res.List, Display: make([]float64, len(res.List)), Text: make([]string, len(res.List))}
	for i, x := range res.List {
		l.Display[i] = res.Shown.FromSI(x)
		l.Text[i] = elementText(res, i, digits)
	}
	for _, p := range res.Phasors {
		l.Phasors = append(l.Phasors, JSONPhasorPart{ReSI: p.Re, ImSI: p.Im, AngleRad: p.Angle(), AngleDeg: phasorDegrees(p)})
	}
	if res.Over != nil {
		a := &JSONAxis{SI: res.Over, Unit: res.OverShown.Dim.SIUnits(), DisplayUnit: res.OverShown.Symbol, Display: make([]float64, len(res.Over))}
		for i, x := range res.Over {
			a.Display[i] = res.OverShown.FromSI(x)
		}
		l.Over = a
	}
	return l
}
