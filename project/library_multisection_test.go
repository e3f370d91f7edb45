package project_test

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/interp"
)

// Issue 13, item 4: lib/magnetic-circuit-multisection. Its published
// example (Hughes, 10th ed.) is in libraryExamples; it has no leakage, so
// the leakage and the saturating sections are compared here with a
// bisection in Go and with the closed form of a linear series–parallel
// circuit; the checks are made to fail.

// TestLibraryMultisectionIndependent finds the gap flux of the brake magnet by
// bisection over gonum's piecewise-linear reading of the same curves, with
// the leakage across the gap, open and closed, and the current for the
// wanted flux in closed form.
func TestLibraryMultisectionIndependent(t *testing.T) {
	_, byPath := loadLibrary(t)
	s := byPath["clapper-brake-magnet.md"]
	allPass(t, s)
	curve := func(name string) *interp.PiecewiseLinear {
		H, B := tableColumns(t, s, name)
		var hOfB interp.PiecewiseLinear
		if err := hOfB.Fit(B, H); err != nil {
			t.Fatal(err)
		}
		return &hOfB
	}
	yoke, solid := curve("BHy"), curve("BHs")
	const mu0 = 4e-7 * math.Pi
	n, i, pl := 1200.0, 1.5, 34e-9
	type section struct {
		l, a float64
		c    *interp.PiecewiseLinear
	}
	secs := []section{{0.24, 9.5e-4, yoke}, {0.08, 10e-4, solid}, {0.02, 12e-4, solid}}
	iron := func(phiC float64) float64 {
		f := 0.0
		for _, sc := range secs {
			f += sc.c.Predict(phiC/sc.a) * sc.l
		}
		return f
	}
	for _, c := range []struct {
		inst       string
		g, ag, phw float64
	}{{"open", 5e-3, 11e-4, 0.40e-3}, {"shut", 0.3e-3, 10e-4, 1.45e-3}} {
		rg := c.g / (mu0 * c.ag)
		sigma := 1 + pl*rg
		// Ampère round the circuit: N·I = Φ_g·R_g + Σ H_k(σ·Φ_g/A_k)·l_k.
		residual := func(phg float64) float64 { return n*i - phg*rg - iron(sigma*phg) }
		lo, hi := 0.0, 2.0*9.5e-4/sigma // the yoke's curve ends at 2.13 T
		for range 200 {
			mid := (lo + hi) / 2
			if residual(mid) > 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		phg := (lo + hi) / 2
		v := func(name string) float64 { return libraryValue(t, s, c.inst+"."+name) }
		closeTo(t, c.inst+".sigma", v("sigma"), sigma, 1e-8)
		closeTo(t, c.inst+".Phi_g", v("Phi_g"), phg, 1e-8)
		closeTo(t, c.inst+".Phi_c", v("Phi_c"), sigma*phg, 1e-8)
		closeTo(t, c.inst+".Phi_l", v("Phi_l"), pl*phg*rg, 1e-8)
		closeTo(t, c.inst+".F_1", v("F_1"), yoke.Predict(sigma*phg/9.5e-4)*0.24, 1e-7)
		closeTo(t, c.inst+".k_sat", v("k_sat"), n*i/(phg*rg), 1e-8)
		closeTo(t, c.inst+".lambda", v("lambda"), n*sigma*phg, 1e-8)
		iw := (c.phw*rg + iron(sigma*c.phw)) / n
		closeTo(t, c.inst+".I_w", v("I_w"), iw, 1e-8)
	}
	// By hand, open: R_g = 5 mm/(μ0·11 cm²) = 3.617 MA/Wb and σ = 1 + 34 nH × R_g = 1.123.
	closeTo(t, "open.sigma by hand", libraryValue(t, s, "open.sigma"), 1.123, 5e-4)
	// Closed, the iron takes most of the magnetomotive force: a saturation
	// factor well above 1, open hardly more than 1.
	if k := libraryValue(t, s, "shut.k_sat"); !(k > 3) {
		t.Errorf("shut.k_sat = %g: the closed magnet's iron should saturate", k)
	}
	if k := libraryValue(t, s, "open.k_sat"); !(k < 1.05) {
		t.Errorf("open.k_sat = %g: the open magnet's gap should take nearly all", k)
	}
}

// TestLibraryMultisectionLinearLeakage checks the leakage in a linear case against
// the closed form of the series–parallel circuit: with straight-line curves
// of μ_r, F = Φ_g·R_g + σ·Φ_g·Σ l_k/(μ0·μ_r·A_k).
func TestLibraryMultisectionLinearLeakage(t *testing.T) {
	src := `---
title: linear leakage
---

` + "```sheaf" + `
H_line = [0 A/m, 1000 A/m, 2000 A/m, 3000 A/m] ; straight-line curve ; source: test
mu_r = 1500 ; iron ; source: test
B_line [T] = mu_0 * mu_r * H_line ; curve
N = 500 ; turns ; source: test
I = 2 A ; current ; source: test
Phi_w = 1 mWb ; wanted flux ; source: test
g = 1 mm ; gap ; source: test
A_g = 10 cm^2 ; gap area ; source: test
l_1 = 20 cm ; length ; source: test
A_1 = 8 cm^2 ; area ; source: test
l_2 = 10 cm ; length ; source: test
A_2 = 12 cm^2 ; area ; source: test
l_3 = 5 cm ; length ; source: test
A_3 = 10 cm^2 ; area ; source: test
P_l = 0.2 uH ; leakage permeance ; source: test
use m = lib/magnetic-circuit-multisection with N = N, I = I, Phi_w = Phi_w, g = g, A_g = A_g, l_1 = l_1, A_1 = A_1, Hc_1 = H_line, Bc_1 = B_line, l_2 = l_2, A_2 = A_2, Hc_2 = H_line, Bc_2 = B_line, l_3 = l_3, A_3 = A_3, Hc_3 = H_line, Bc_3 = B_line, P_l = P_l
` + "```\n"
	pkg := build(t, map[string]string{"job.md": src})
	for _, d := range pkg.Diags {
		t.Fatalf("diagnostic: %v", d)
	}
	s := sheet(t, pkg, "job.md")
	const mu0 = 4e-7 * math.Pi // sheaf's mu_0 (CODATA 2018) differs by about 1e-10
	rg := 1e-3 / (mu0 * 10e-4)
	ri := 0.20/(mu0*1500*8e-4) + 0.10/(mu0*1500*12e-4) + 0.05/(mu0*1500*10e-4)
	sigma := 1 + 0.2e-6*rg
	phg := 500 * 2 / (rg + sigma*ri)
	closeTo(t, "m.Phi_g against the closed form", libraryValue(t, s, "m.Phi_g"), phg, 1e-8)
	closeTo(t, "m.I_w against the closed form", libraryValue(t, s, "m.I_w"), 1e-3*(rg+sigma*ri)/500, 1e-8)
	closeTo(t, "m.L_sec against N²·σ/(R_g + σ·R_i)", libraryValue(t, s, "m.L_sec"), 500*500*sigma/(rg+sigma*ri), 1e-8)
}

// The multisection checks fail where a circuit breaks them.
func TestLibraryMultisectionChecksCanFail(t *testing.T) {
	// 1.8 mWb wanted in the gap is 1.89 T in the 9.5 cm² yoke, above 1.8 T.
	wantFail(t, checkStatus(t, starterWith(t, "magnetic-circuit-multisection", map[string]string{"Phi_w": "1.8 mWb"})),
		"max(B_1w, B_2w, B_3w) <= B_max")
	// A section of 5.5 cm² needs 2.0 T for the wanted flux, and at 6 A it is
	// driven above 1.8 T.
	wantFail(t, checkStatus(t, starterWith(t, "magnetic-circuit-multisection", map[string]string{"A_1": "5.5 cm^2", "I": "6 A"})),
		"max(B_1w, B_2w, B_3w) <= B_max", "max(B_1, B_2, B_3) <= B_max")
}

// Rule 4: the template carries the cautions and states its limits.
func TestLibraryMultisectionCautions(t *testing.T) {
	templateCautions(t, "magnetic-circuit-multisection")
}
