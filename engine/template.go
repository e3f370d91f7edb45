package engine

import (
	"slices"
	"sort"
	"strings"
	"unicode"

	"github.com/sheaf-calc/sheaf/diag"
	"github.com/sheaf-calc/sheaf/units"
)

// Resolver finds a template named by a use statement: ref as written, from
// the path of the sheet (or template) that uses it. It returns the
// template's source with Path set to the name errors should show, and a
// key that is the same for every way of naming the same template (for
// reporting import cycles).
type Resolver func(ref, from string) (src SheetSource, key string, err error)

// Options control compilation.
type Options struct {
	// Resolve finds templates; nil means use statements are errors.
	Resolve Resolver
	// Take finds the compiled, evaluated sheet that a take statement
	// names, written as ref in the sheet at path from, and that sheet's
	// path; nil means take statements are errors.
	Take func(ref, from string) (*Calc, string, error)
}

// MaxTemplateDepth bounds templates that use templates.
const MaxTemplateDepth = 16

// MaxInstances bounds the template instances of one sheet, counting those
// inside other instances. Templates that each use the next twice double
// at every level: thirty levels would make a billion instances.
const MaxInstances = 2000

// OptionalWord follows a param's unit to make it optional:
// `param PDIV_pp [kV] optional`.
const OptionalWord = "optional"

// parseParam reads `param name [unit]`, or `param name [unit] optional`.
func parseParam(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Param
	name, j := identifier(r, i)
	if name == "" {
		return errAt(t.pos(i), "write for example: param Phi [Wb] ; flux per pole", "param needs a name")
	}
	st.Name, st.NamePos = name, t.pos(i)
	if err := validName(name, st.NamePos); err != nil {
		return err
	}
	j = skipSpace(r, j)
	if j >= end || r[j] != '[' {
		return errAt(t.pos(j), "write the unit it is measured in, for example param "+name+" [Wb], or [1] for a pure number",
			"param %s needs a unit in [ ]", name)
	}
	k, err := parseDisplay(st, t, j, end)
	if err != nil {
		return err
	}
	k = skipSpace(r[:end], k)
	if w, m := word(r[:end], k); w == OptionalWord && (m == end || unicode.IsSpace(r[m])) {
		st.Optional = true
		k = skipSpace(r[:end], m)
	}
	if k != end {
		return errAt(t.pos(k), "a parameter has no value: the sheet that uses the template sets it; write "+OptionalWord+" after the unit for one it may leave unset",
			"unexpected text after param %s [%s]", name, st.DisplayText)
	}
	st.Declared = st.Display
	st.Formula = "[" + st.DisplayText + "]"
	return nil
}

// parseUse reads `use name = template with a = formula, b = formula`.
func parseUse(st *Statement, t *text, i, end int) *diag.Diagnostic {
	r := t.runes
	st.Kind = Use
	const example = `write for example: use coil_a = lib/magnetic-circuit with N = N_f, I = I_f`
	name, j := identifier(r, i)
	if name == "" {
		return errAt(t.pos(i), example, "use needs a name for the instance")
	}
	st.Name, st.NamePos = name, t.pos(i)
	if err := validName(name, st.NamePos); err != nil {
		return err
	}
	j = skipSpace(r, j)
	if j >= end || r[j] != '=' {
		return errAt(t.pos(j), example, "expected = after use %s", name)
	}
	j = skipSpace(r, j+1)
	// The template: a quoted name, or a name without spaces.
	start := j
	if j < end && r[j] == '"' {
		k := j + 1
		for k < end && r[k] != '"' {
			k++
		}
		if k >= end {
			return errAt(t.pos(j), "close the template name with \"", "unterminated template name")
		}
		st.Template = string(r[j+1 : k])
		j = k + 1
	} else {
		for j < end && !unicode.IsSpace(r[j]) {
			j++
		}
		st.Template = string(r[start:j])
	}
	if st.Template == "" {
		return errAt(t.pos(start), example, "use %s = needs a template", name)
	}
	st.Formula = strings.TrimSpace(string(r[start:end]))
	st.DisplayPos = t.pos(start)
	j = skipSpace(r, j)
	if j >= end {
		return nil
	}
	if w, k := word(r, j); w != "with" {
		return errAt(t.pos(j), "set the template's inputs after with: "+example, "unexpected text after the template")
	} else {
		j = k
	}
	return parseOverrides(st, t, j, end)
}

// parseOverrides reads the `name = formula` assignments after with,
// separated by commas outside parentheses.
func parseOverrides(st *Statement, t *text, j, end int) *diag.Diagnostic {
	r := t.runes
	for j < end {
		j = skipSpace(r, j)
		n, k := identifier(r, j)
		if n == "" {
			return errAt(t.pos(j), "write name = formula", "expected the name of an input of the template")
		}
		o := Override{Name: n, NamePos: t.pos(j)}
		k = skipSpace(r, k)
		if k >= end || r[k] != '=' || (k+1 < end && r[k+1] == '=') {
			return errAt(t.pos(k), "write "+n+" = formula", "expected = after %s", n)
		}
		from := k + 1
		stop := topLevelComma(r, from, end)
		if skipSpace(r[:stop], from) == stop {
			return errAt(t.pos(from), "write the value or formula after =", "%s = has nothing on the right", n)
		}
		o.Formula = strings.TrimSpace(string(r[from:stop]))
		e, err := parseFormula(t, from, stop)
		if err != nil {
			return err
		}
		for _, prev := range st.Overrides {
			if prev.Name == n {
				return errAt(o.NamePos, "set each input once", "%s is set twice", n)
			}
		}
		o.Expr = e
		st.Overrides = append(st.Overrides, o)
		j = stop + 1
	}
	return nil
}

// topLevelComma returns the offset of the first comma in r[from:end]
// outside parentheses and list brackets, or end.
func topLevelComma(r []rune, from, end int) int {
	depth := 0
	for i := from; i < end; i++ {
		switch r[i] {
		case '(', '[':
			depth++
		case ')', ']':
			depth--
		case ',':
			if depth == 0 {
				return i
			}
		}
	}
	return end
}

// expander turns use statements into the statements of their instances.
type expander struct {
	sheet   *Calc
	resolve Resolver
	stack   []string // template keys being expanded, for cycles
	// assumptions and tables are those of the templates, under the
	// instance's name: "coil_a.uniform-gap", "coil_a.BH".
	assumptions []AssumptionSource
	tables      []TableSource
	// instances and statements count what the sheet has grown to so far;
	// over counts the limit they reached, when they reached one.
	instances, statements int
	over                  *diag.Diagnostic
	overOnce              bool // over concerns one use only, not the whole sheet
}

// expand returns the statements of a sheet with every instance's
// statements placed after its use statement.
func (x *expander) expand(sts []*Statement, from string) []*Statement {
	var out []*Statement
	for _, st := range sts {
		out = append(out, st)
		if st.Kind != Use || st.Verdict == Errored {
			continue
		}
		out = append(out, x.instantiate(st, from)...)
	}
	return out
}

// instantiate compiles the template a use statement names, under the
// instance's name, with the inputs it sets.
func (x *expander) instantiate(use *Statement, from string) []*Statement {
	fail := func(d *diag.Diagnostic) []*Statement {
		x.sheet.fail(use, d)
		return nil
	}
	if x.resolve == nil {
		return fail(errAt(use.DisplayPos, "templates are read from the package folder or the built-in library", "templates are not available here"))
	}
	top := len(x.stack) == 1 // a use written in the sheet itself
	if body, limited := x.limit(use, top); limited {
		return body
	}
	src, key, err := x.resolve(use.Template, from)
	if err != nil {
		return fail(errAt(use.DisplayPos, "run `sheaf templates` for the built-in library; other templates are paths inside the package folder", "%v", err))
	}
	for i, k := range x.stack {
		if k == key {
			chain := append(append([]string{}, x.stack[i:]...), key)
			return fail(errAt(use.DisplayPos, "a template may not use itself, directly or through others",
				"template cycle: %s", strings.Join(chain, " → ")))
		}
	}
	x.stack = append(x.stack, key)
	defer func() { x.stack = x.stack[:len(x.stack)-1] }()
	use.TemplateTitle, use.TemplateCaution = src.Title, src.Caution

	body, d := x.parseBody(use, src)
	if d != nil {
		return fail(d)
	}
	if x.over != nil {
		// A limit was reached inside: the instance is refused whole, and
		// the error goes to the using sheet's own statement.
		return x.refuse(use, top)
	}
	tables := x.adopt(use, src)
	mine, d := applyOverrides(use, body)
	if d != nil {
		return fail(d)
	}
	nameInstance(use, body, mine, tables)
	use.Parts = &InstanceParts{Validity: src.Validity, Sources: src.Sources}
	return x.leaveOut(use, body, top)
}

// parseBody parses a template afresh, so that every instance has
// statements of its own, and expands the instances inside it.
func (x *expander) parseBody(use *Statement, src SheetSource) ([]*Statement, *diag.Diagnostic) {
	var texts []*text
	for _, b := range src.Blocks {
		texts = append(texts, splitStatements(b)...)
	}
	if x.statements += len(texts); x.statements > MaxStatements {
		x.over = errAt(use.DisplayPos, "split the sheet, or use fewer or smaller templates",
			"the templates expand to more than %d statements, the limit for one sheet", MaxStatements)
		return nil, nil
	}
	var body []*Statement
	for _, t := range texts {
		st, perr := parseStatement(t)
		if perr != nil {
			return nil, errAt(use.DisplayPos, "fix the template first", "template %s has an error at %s: %s", use.Template, perr.Pos, perr.Message)
		}
		body = append(body, st)
	}
	return x.expand(body, src.Path), nil
}

// adopt takes in the template's assumptions and tables under the
// instance's name, and returns the template's own table names.
func (x *expander) adopt(use *Statement, src SheetSource) map[string]bool {
	for _, a := range src.Assumptions {
		a.ID = use.Name + "." + a.ID
		x.assumptions = append(x.assumptions, a)
	}
	tables := map[string]bool{}
	for _, t := range src.Tables {
		tables[t.Name] = true
		t.Name = use.Name + "." + t.Name
		x.tables = append(x.tables, t)
	}
	return tables
}

// localNames are the names a template body defines itself.
func localNames(body []*Statement) map[string]*Statement {
	local := map[string]*Statement{}
	for _, st := range body {
		if st.Name != "" && (st.Kind == Definition || st.Kind == Param || st.Kind == FunctionDef) && st.Instance == "" {
			local[st.Name] = st
		}
	}
	return local
}

// applyOverrides puts the user's values in place of the template's, and
// returns the statements whose formulas the using sheet wrote. Every
// parameter must be set, but those marked optional.
func applyOverrides(use *Statement, body []*Statement) (map[*Statement]bool, *diag.Diagnostic) {
	local := localNames(body)
	set := map[string]bool{}
	mine := map[*Statement]bool{}
	for _, o := range use.Overrides {
		target, ok := local[o.Name]
		if !ok || !(target.Kind == Param || target.IsInput()) {
			return nil, errAt(o.NamePos, "its inputs are "+inputList(body), "template %s has no input %s", use.Template, o.Name)
		}
		set[o.Name] = true
		mine[target] = true
		target.Default = target.Expr
		target.Expr = o.Expr
		target.Overridden = true
		target.Formula = o.Formula
		// The value now comes from the using sheet, not from the source
		// the template gave for its default.
		target.Source = ""
	}
	var missing []string
	for _, st := range body {
		if st.Kind == Param && st.Instance == "" && !set[st.Name] && !st.Optional {
			desc := st.Name + " [" + st.DisplayText + "]"
			if st.Description != "" {
				desc += " (" + st.Description + ")"
			}
			missing = append(missing, desc)
		}
	}
	if len(missing) > 0 {
		return nil, errAt(use.DisplayPos, "set them after with, for example: with "+strings.SplitN(missing[0], " ", 2)[0]+" = ...",
			"%s needs %s", use.Template, strings.Join(missing, ", "))
	}
	return mine, nil
}

// nameInstance gives the body's statements the instance's names: names
// inside the template's own formulas refer to the instance, while the
// user's formulas (mine) keep the user's names.
func nameInstance(use *Statement, body []*Statement, mine map[*Statement]bool, tables map[string]bool) {
	local := localNames(body)
	inner := map[string]bool{}
	for _, st := range body {
		if st.Kind == Use && st.Instance == "" {
			inner[st.Name] = true
		}
	}
	prefix := use.Name + "."
	rename := func(name string) string {
		head, _, _ := strings.Cut(name, ".")
		if _, ok := local[name]; ok || inner[head] || tables[head] {
			return prefix + name
		}
		return name
	}
	for _, st := range body {
		if st.Kind == Param || st.IsInput() {
			if st.Declared == nil {
				st.Declared = literalUnit(valueExpr(st))
			}
			if st.Kind == Param && st.Expr != nil {
				st.Kind = Definition // it has its value now
			}
		}
		if !mine[st] {
			Walk(st.Expr, func(e Expr) {
				switch n := e.(type) {
				case *Ref:
					if st.Kind != FunctionDef || !slices.Contains(st.Params, n.Name) {
						n.Name = rename(n.Name)
					}
				case *Apply:
					n.Name = rename(n.Name)
				}
			})
		}
		if st.Name != "" {
			st.Name = prefix + st.Name
		}
		renameCondition(st, rename, prefix)
		for i, id := range st.Assumes {
			st.Assumes[i] = prefix + id
		}
		if st.Instance == "" {
			st.Instance = use.Name
			st.Use = use
		} else {
			st.Instance = prefix + st.Instance
		}
		st.Block = use.Block
	}
}

// renameCondition gives a case's or a sweep's names the instance's: a
// template's cases set the instance's inputs, so that every sheet using
// the template shares its cases.
func renameCondition(st *Statement, rename func(string) string, prefix string) {
	switch st.Kind {
	case Case:
		for i := range st.Overrides {
			st.Overrides[i].Name = rename(st.Overrides[i].Name)
		}
	case Sweep:
		c := st.Cond
		c.InputName = rename(c.InputName)
		if c.InName != "" {
			c.InName = prefix + c.InName
		}
		for i, n := range c.showNames {
			c.showNames[i] = rename(n)
		}
	}
}

// limit counts an instance and reports whether the sheet has grown past
// a limit, with what instantiate should return then.
func (x *expander) limit(use *Statement, top bool) ([]*Statement, bool) {
	x.instances++
	switch {
	case x.over != nil:
	case len(x.stack) >= MaxTemplateDepth:
		chain := append(append([]string{}, x.stack[1:]...), use.Template)
		x.over = errAt(use.DisplayPos, "use fewer templates inside one another",
			"templates nested more than %d deep: %s", MaxTemplateDepth, strings.Join(chain, " → "))
		x.overOnce = true
	case x.instances > MaxInstances:
		x.over = errAt(use.DisplayPos, "use fewer instances; a template that uses others several times multiplies them",
			"the templates expand to more than %d instances, the limit for one sheet", MaxInstances)
	default:
		return nil, false
	}
	return x.refuse(use, top), true
}

// refuse fails a use statement because the sheet reached a limit. Only a
// use written in the sheet itself carries the error: the instances inside
// it are dropped with it.
func (x *expander) refuse(use *Statement, top bool) []*Statement {
	if top {
		d := *x.over
		d.Pos = use.DisplayPos
		x.sheet.fail(use, &d)
		if x.overOnce {
			x.over, x.overOnce = nil, false
		}
	}
	return nil
}

// valueExpr is the template's own value of an input: its default when the
// user set it.
func valueExpr(st *Statement) Expr {
	if st.Default != nil {
		return st.Default
	}
	return st.Expr
}

// literalUnit is the unit a literal was written in.
func literalUnit(e Expr) *units.Unit {
	if u, ok := e.(*Unary); ok {
		e = u.X
	}
	switch n := e.(type) {
	case *Quantity:
		u := n.Unit
		return &u
	case *Number:
		u := units.One
		return &u
	}
	return nil
}

func inputList(body []*Statement) string {
	var names []string
	for _, st := range body {
		if st.Instance == "" && (st.Kind == Param || st.IsInput() || st.Overridden) {
			names = append(names, st.Name)
		}
	}
	sort.Strings(names)
	if len(names) == 0 {
		return "none"
	}
	return strings.Join(names, ", ")
}

// overrideProblem says why a value set by a use statement does not fit the
// template's input, or returns nil.
func overrideProblem(st *Statement) *diag.Diagnostic {
	if !st.Overridden || st.Declared == nil {
		return nil
	}
	if st.Type.Dim != st.Declared.Dim {
		want := "a value in " + st.Declared.Symbol + " or a unit of the same kind"
		if st.Declared.Dim.IsDimensionless() {
			want = "a pure number"
		}
		return errAt(st.Expr.Pos(), "give "+st.Name+" "+want,
			"%s must be %s, but the value set is %s", st.Name, units.Describe(st.Declared.Dim), units.Describe(st.Type.Dim))
	}
	if msg, hint := displayProblem(st.Name, "", st.Type, *st.Declared); msg != "" && !st.Declared.Kind.IsPlain() {
		return errAt(st.Expr.Pos(), hint, "%s", msg)
	}
	return nil
}
