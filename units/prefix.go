package units

// Prefix is an SI prefix.
type Prefix struct {
	Symbol string
	Name   string
	Exp    int // power of ten
}

// Prefixes are the 24 SI prefixes of the SI Brochure (9th ed., 2019, table
// 7) with the four adopted by the 27th CGPM in 2022 (ronna, quetta, ronto,
// quecto), largest first.
var Prefixes = []Prefix{
	{"Q", "quetta", 30}, {"R", "ronna", 27}, {"Y", "yotta", 24}, {"Z", "zetta", 21},
	{"E", "exa", 18}, {"P", "peta", 15}, {"T", "tera", 12}, {"G", "giga", 9},
	{"M", "mega", 6}, {"k", "kilo", 3}, {"h", "hecto", 2}, {"da", "deca", 1},
	{"d", "deci", -1}, {"c", "centi", -2}, {"m", "milli", -3}, {"µ", "micro", -6},
	{"n", "nano", -9}, {"p", "pico", -12}, {"f", "femto", -15}, {"a", "atto", -18},
	{"z", "zepto", -21}, {"y", "yocto", -24}, {"r", "ronto", -27}, {"q", "quecto", -30},
}

// prefixAliases are other spellings of the micro sign: the Greek letter mu
// (U+03BC), which looks the same, and "u" for ASCII keyboards.
var prefixAliases = map[string]string{"μ": "µ", "u": "µ"}

// prefixByExp finds the prefix for a power of ten; ok is false for none.
func prefixByExp(exp int) (Prefix, bool) {
	for _, p := range Prefixes {
		if p.Exp == exp {
			return p, true
		}
	}
	return Prefix{}, false
}
