package engine

// MaxStatements bounds the statements of one sheet, counting those its
// template instances bring. Every statement costs memory and time in
// every stage; a sheet past this size is better split into several.
const MaxStatements = 10_000

// MaxTableRows bounds the rows of one table. Tables hold curves and
// measured points; a longer one is data for another tool.
const MaxTableRows = 10_000

// MaxSolves bounds the solve statements of one sheet, templates included.
// Linking a solve to the statements inside its search looks through the
// sheet's dependencies, so the cost grows with solves times statements.
const MaxSolves = 200
