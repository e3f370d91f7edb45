package engine

// Utilisation is a check's demand over its capacity from its two sides in
// the check's own unit, by the rule the engine's own results follow:
// left/right for < and <=, right/left for > and >=, NaN where it has no
// meaning. The pages read it for a check at each point of a sweep.
func Utilisation(op string, left, right float64) float64 { return utilisation(op, left, right) }
