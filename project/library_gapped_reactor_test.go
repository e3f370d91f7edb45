package project_test

import (
	"math"
	"testing"
)

// Issue 13, item 4: lib/gapped-reactor. No worked example of the fringing
// formula was recalled with its numbers, so the choke of the test package
// is worked again in Go, independently of sheaf's engine; the checks are
// made to fail.

// TestLibraryGappedReactorIndependent works the DC-link choke again in Go. No
// worked example of the fringing formula was recalled with its numbers;
// the formula is McLyman's (3rd ed., from memory), the data are invented.
func TestLibraryGappedReactorIndependent(t *testing.T) {
	_, byPath := loadLibrary(t)
	s := byPath["gapped-dc-link-choke.md"]
	allPass(t, s)
	const mu0 = 4e-7 * math.Pi // sheaf's mu_0 (CODATA 2018) differs by about 1e-10
	const tol = 1e-8
	lt, n, idc, di := 2e-3, 32.0, 35.0, 8.0
	aNet, kst, lc, g, win, mur := 19e-4, 0.95, 0.30, 1.2e-3, 80e-3, 6000.0
	aGross, g1 := aNet/kst, g/2
	fr := 1 + g1/math.Sqrt(aGross)*math.Log(2*win/g1)
	rc := lc / (mur * mu0 * aNet)
	rg := g / (mu0 * fr * aGross)
	v := func(name string) float64 { return libraryValue(t, s, "dl."+name) }
	closeTo(t, "F_fr", v("F_fr"), fr, 1e-12)
	closeTo(t, "F_fr by hand", v("F_fr"), 1+0.6/math.Sqrt(2000)*math.Log(160/0.6), 1e-12) // mm and mm²: the formula is dimensionless
	closeTo(t, "R_tot", v("R_tot"), rc+rg, tol)
	nreq := math.Sqrt(lt * (rc + rg))
	closeTo(t, "N_req", v("N_req"), nreq, tol)
	closeTo(t, "N_t", v("N_t"), math.Ceil(nreq), 0)
	l := n * n / (rc + rg)
	closeTo(t, "L", v("L"), l, tol)
	closeTo(t, "L_0 (fringing neglected)", v("L_0"), n*n/(rc+g/(mu0*aGross)), tol)
	ipk := idc + di/2
	closeTo(t, "B_c_pk", v("B_c_pk"), n*ipk/(rc+rg)/aNet, tol)
	closeTo(t, "B_c_pk as L·I/(N·A)", v("B_c_pk"), l*ipk/(n*aNet), tol)
	closeTo(t, "B_g_pk", v("B_g_pk"), n*ipk/(rc+rg)/(fr*aGross), tol)
	closeTo(t, "dB", v("dB"), l*di/(n*aNet), tol)
	closeTo(t, "W_pk", v("W_pk"), l*ipk*ipk/2, tol)
	// By hand, for the report: F = 1.0749, 32 turns give 2.20 mH.
	closeTo(t, "L to three figures", v("L"), 2.20e-3, 2e-3)
}

// The gapped-reactor checks fail where a design breaks them.
func TestLibraryGappedReactorChecksCanFail(t *testing.T) {
	// 29 turns give 1.82 mH, short of 2 mH.
	wantFail(t, checkStatus(t, starterWith(t, "gapped-reactor", map[string]string{"N": "29"})),
		"L >= L_t")
	// 40 turns: 3.5 mH, but 1.77 T in the core at 39 A.
	wantFail(t, checkStatus(t, starterWith(t, "gapped-reactor", map[string]string{"N": "40"})),
		"B_c_pk <= B_max")
	// An 8 mm gap in one leg of the starter's 19 cm² core: F = 1 +
	// (8/43.6)·ln(160/8) = 1.55; 80 turns keep L above 2 mH and B low.
	wantFail(t, checkStatus(t, starterWith(t, "gapped-reactor", map[string]string{"g": "8 mm", "N": "80"})),
		"F_fr <= F_max")
}

// Rule 4: the template carries the cautions and states its limits.
func TestLibraryGappedReactorCautions(t *testing.T) { templateCautions(t, "gapped-reactor") }
