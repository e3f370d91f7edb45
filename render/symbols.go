package render

import (
	"html"
	"strings"
)

// greek maps spelled-out Greek letter names to the letters, so that a sheet
// can write Phi, lambda or mu_r in ASCII and the package shows Φ, λ, μ_r.
// Capitals that look like Latin letters (Alpha, Beta, ...) are left alone.
var greek = map[string]string{
	"alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ε", "varepsilon": "ε",
	"zeta": "ζ", "eta": "η", "theta": "θ", "vartheta": "ϑ", "iota": "ι", "kappa": "κ",
	"lambda": "λ", "mu": "μ", "nu": "ν", "xi": "ξ", "pi": "π", "rho": "ρ", "sigma": "σ",
	"tau": "τ", "upsilon": "υ", "phi": "φ", "varphi": "ϕ", "chi": "χ", "psi": "ψ", "omega": "ω",
	"Gamma": "Γ", "Delta": "Δ", "Theta": "Θ", "Lambda": "Λ", "Xi": "Ξ", "Pi": "Π",
	"Sigma": "Σ", "Upsilon": "Υ", "Phi": "Φ", "Psi": "Ψ", "Omega": "Ω",
}

// splitName splits a name into its symbol and subscript parts, with Greek
// names turned into letters: "mu_r" gives "μ" and ["r"].
func splitName(name string) (string, []string) {
	parts := strings.Split(name, "_")
	for i, p := range parts {
		if g, ok := greek[p]; ok {
			parts[i] = g
		}
	}
	return parts[0], parts[1:]
}

// SymbolText writes a name as plain text with the Greek letters set and the
// subscript after an underscore, for places that are not MathML. A name in
// a template instance keeps the instance before a dot: c1.λ.
func SymbolText(name string) string {
	if i := strings.LastIndexByte(name, '.'); i >= 0 {
		return name[:i+1] + SymbolText(name[i+1:])
	}
	base, subs := splitName(name)
	if len(subs) == 0 {
		return base
	}
	return base + "_" + strings.Join(subs, ",")
}

// symbolMathML writes a name as MathML: a letter with its subscript, after
// the instance it belongs to and a colon, if any.
func symbolMathML(name string) string {
	if i := strings.LastIndexByte(name, '.'); i >= 0 {
		// g1:Q_s, the instance and its name read as one name, not as a
		// product of two.
		return `<mrow><mi mathvariant="normal">` + html.EscapeString(name[:i]) + `</mi><mo lspace="0" rspace="0">:</mo>` + symbolMathML(name[i+1:]) + "</mrow>"
	}
	base, subs := splitName(name)
	b := mi(base)
	if len(subs) == 0 {
		return b
	}
	return "<msub>" + b + mi(strings.Join(subs, ",")) + "</msub>"
}

func mi(s string) string { return "<mi>" + html.EscapeString(s) + "</mi>" }

// symbolHTML writes a name as HTML text with a <sub> subscript, for tables;
// an instance's name reads g1:Q<sub>s</sub>.
func symbolHTML(name string) string {
	if i := strings.LastIndexByte(name, '.'); i >= 0 {
		return html.EscapeString(name[:i]) + ":" + symbolHTML(name[i+1:])
	}
	base, subs := splitName(name)
	out := "<var>" + html.EscapeString(base) + "</var>"
	if len(subs) > 0 {
		out += "<sub>" + html.EscapeString(strings.Join(subs, ",")) + "</sub>"
	}
	return out
}
