package render

// asciiWidths are the advance widths of the printable ASCII characters
// (space to tilde) in DejaVu Sans, the widest of the common sans-serif
// faces a browser picks, in thousandths of the font size; measured from
// the font, so that a box is wide enough for its label whatever
// sans-serif face draws it.
var asciiWidths = [95]uint16{
	317, 400, 459, 837, 636, 950, 779, 274, 390, 390, 500, 837, 317, 360, 317, 336,
	636, 636, 636, 636, 636, 636, 636, 636, 636, 636, 336, 336, 837, 837, 837, 530,
	1000, 684, 686, 698, 770, 631, 575, 774, 751, 294, 294, 655, 557, 862, 748, 787,
	603, 787, 694, 634, 610, 731, 684, 988, 685, 610, 685, 390, 336, 390, 837, 500,
	500, 612, 634, 549, 634, 615, 352, 634, 633, 277, 277, 579, 277, 974, 633, 611,
	634, 634, 411, 520, 392, 633, 591, 817, 591, 591, 524, 636, 336, 636, 837,
}

// otherWidths are the same for the other characters that labels use most:
// Greek letters, unit signs and subscript digits. Any other character is
// taken as a full em wide.
var otherWidths = map[rune]uint16{
	'\u00a0': 317, '°': 500, '·': 317, '²': 400, '³': 400, 'µ': 636, 'Ω': 764, '−': 837, '≤': 837, '≥': 837,
	'√': 637, '±': 837, '×': 837, '÷': 837, 'α': 659, 'β': 638, 'γ': 591, 'δ': 611, 'ε': 540, 'ζ': 543,
	'η': 633, 'θ': 611, 'ϑ': 619, 'ι': 338, 'κ': 589, 'λ': 591, 'μ': 636, 'ν': 558, 'ξ': 557, 'π': 602,
	'ρ': 634, 'σ': 633, 'τ': 602, 'υ': 578, 'φ': 659, 'ϕ': 659, 'χ': 577, 'ψ': 659, 'ω': 837, 'Γ': 557,
	'Δ': 684, 'Θ': 787, 'Λ': 684, 'Ξ': 631, 'Π': 751, 'Σ': 631, 'Υ': 610, 'Φ': 787, 'Ψ': 787,
	'₀': 400, '₁': 400, '₂': 400, '₃': 400, '₄': 400, '₅': 400, '₆': 400, '₇': 400, '₈': 400, '₉': 400,
	'…': 1000, '–': 500, '—': 1000, '‰': 1341, '‘': 317, '’': 317, '“': 518, '”': 518,
}

// textWidth estimates the width of one line of graph text.
func textWidth(s string) float64 {
	total := 0
	for _, r := range s {
		switch w, ok := otherWidths[r]; {
		case r >= ' ' && r <= '~':
			total += int(asciiWidths[r-' '])
		case ok:
			total += int(w)
		default:
			total += 1000
		}
	}
	return float64(total) * graphFont / 1000
}
