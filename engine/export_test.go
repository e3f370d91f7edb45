package engine

// Evals counts the steps a frame has evaluated, for the tests of
// incremental runs.
func (f *Frame) Evals() int { return f.evals }
