package render

import "github.com/sheaf-calc/sheaf/engine"

// choice writes a conditional value as a piecewise rule: a brace before
// the value and its condition, and the other value with "otherwise".
func (w *mathWriter) choice(e engine.Expr) bool {
	n, ok := e.(*engine.Choice)
	if !ok {
		return false
	}
	w.b.WriteString(`<mrow><mo fence="true" stretchy="true">{</mo><mtable columnalign="left"><mtr><mtd>`)
	w.expr(n.Value, 0)
	w.b.WriteString(`</mtd><mtd><mtext>when</mtext><mspace width="0.4em"></mspace>`)
	w.expr(n.Cond, 0)
	w.b.WriteString(`</mtd></mtr><mtr><mtd>`)
	w.expr(n.Other, 0)
	w.b.WriteString(`</mtd><mtd><mtext>otherwise</mtext></mtd></mtr></mtable></mrow>`)
	return true
}
