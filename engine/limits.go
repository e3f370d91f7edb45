package engine

// MaxStatements bounds the statements of one sheet, counting those its
// template instances bring. Every statement costs memory and time in
// every stage; a sheet past this size is better split into several.
const MaxStatements = 20_000

// MaxTableRows bounds the rows of one table. Tables hold curves and
// measured points; a longer one is data for another tool.
const MaxTableRows = 10_000
