package project_test

import (
	"math"
	"strings"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
)

// optionalJob compiles an invented one-sheet job that uses library
// templates, and returns the sheet.
func optionalJob(t *testing.T, src string) *project.Sheet {
	t.Helper()
	pkg := project.FromFiles("job", map[string][]byte{"job.md": []byte(src)})
	if len(pkg.Sheets) != 1 {
		t.Fatalf("%d sheets", len(pkg.Sheets))
	}
	return pkg.Sheets[0]
}

// outcomes counts a sheet's checks by status and collects its errors.
func outcomes(s *project.Sheet) (pass, fail int, errs []string) {
	for _, st := range s.Calc.Statements {
		switch r := s.Calc.Result(st); r.Status {
		case engine.Pass:
			pass++
		case engine.Fail:
			fail++
		case engine.Errored, engine.Blocked:
			errs = append(errs, st.Text)
		}
	}
	for _, d := range s.Calc.Diags {
		errs = append(errs, d.Error())
	}
	return pass, fail, errs
}

// The insulation template without PDIV_pp, for a mains-fed 400 V motor
// (invented data): the partial-discharge margin and its check are left
// out, not failed, and every other part is worked out. The hot spot is
// 40 °C + 75 K + 10 K = 125 °C against 155 °C for class 155 (IEC 60034-1
// hot-spot allowance and IEC 60085 class temperature, from memory).
func TestInsulationWithoutPDIV(t *testing.T) {
	s := optionalJob(t, "```sheaf\nuse ins = lib/insulation-margin with U_N = 0.4 kV, N_ph = 96, N_coil = 16, U_surge = 1.2 kV,\n"+
		"    k_ph = 1 / sqrt(3), k_ef = 1, cls = 155, dT_R = 75 K, k_os = 1\n```\n")
	pass, fail, errs := outcomes(s)
	if fail != 0 || len(errs) != 0 || pass != 1 {
		t.Errorf("want the hot-spot check alone to pass, with no failure or error: %d pass, %d fail, %q", pass, fail, errs)
	}
	closeTo(t, "ins.T_hs", libraryValue(t, s, "ins.T_hs"), celsius(125), 1e-12)
	// U_pp_inv = 2 · k_os · √2 · 1.05 · 400 V for a mains-fed winding.
	closeTo(t, "ins.U_pp_inv", libraryValue(t, s, "ins.U_pp_inv"), 2*math.Sqrt2*1.05*400, 1e-12)
	use := s.Calc.Statements[0]
	if use.Parts == nil || len(use.Parts.LeftOut) != 1 || strings.Join(use.Parts.LeftOut[0].Params, ",") != "PDIV_pp" ||
		use.Parts.LeftOut[0].Checks() != 1 {
		t.Fatalf("the partial-discharge part should be left out for PDIV_pp: %+v", use.Parts)
	}
	for _, name := range []string{"ins.m_PD", "ins.PDIV_pp"} {
		if s.Calc.Lookup(name) != nil {
			t.Errorf("%s should be left out", name)
		}
	}
	if len(use.Parts.Validity) == 0 || len(use.Parts.Sources) == 0 {
		t.Error("the use should carry the template's validity and sources")
	}

	// Set, the same template runs its check: RPDIV 4 kV against
	// 1.188 kV · 1.5625 (IEC TS 60034-18-41 enhancement factor 1.25 · 1.25,
	// from memory).
	s = optionalJob(t, "```sheaf\nuse ins = lib/insulation-margin with U_N = 0.4 kV, N_ph = 96, N_coil = 16, U_surge = 1.2 kV,\n"+
		"    k_ph = 1 / sqrt(3), k_ef = 1, cls = 155, dT_R = 75 K, k_os = 1, PDIV_pp = 4 kV\n```\n")
	if pass, fail, errs := outcomes(s); pass != 2 || fail != 0 || len(errs) != 0 {
		t.Errorf("with PDIV_pp both checks should pass: %d pass, %d fail, %q", pass, fail, errs)
	}
	closeTo(t, "ins.m_PD", libraryValue(t, s, "ins.m_PD"), 4000/(2*math.Sqrt2*1.05*400), 1e-12)
}

// A sheet that names a left-out result has an error at the name, saying
// which input to set.
func TestInsulationLeftOutNamed(t *testing.T) {
	s := optionalJob(t, "```sheaf\nuse ins = lib/insulation-margin with U_N = 0.4 kV, N_ph = 96, N_coil = 16, U_surge = 1.2 kV,\n"+
		"    k_ph = 1 / sqrt(3), k_ef = 1, cls = 155, dT_R = 75 K, k_os = 1\ncheck ins.m_PD >= 2\n```\n")
	if len(s.Calc.Diags) != 1 {
		t.Fatalf("want one error, got %v", s.Calc.Diags)
	}
	d := s.Calc.Diags[0]
	if d.Pos.Line != 4 || d.Pos.Col != 7 || !strings.Contains(d.Message, "ins.m_PD is not evaluated") ||
		!strings.Contains(d.Message, "PDIV_pp") || !strings.Contains(d.Hint, "PDIV_pp = ...") {
		t.Errorf("got %v", d)
	}
}

// The back-EMF template without a no-load test: the working point is
// worked out, the no-load part left out. E_b = U − I_a·R_a − U_brush =
// 250 − 49 · 0.2 − 2 = 238.2 V (Theraja, Vol. II, DC motor chapter, the
// back-EMF equation, from memory; data invented).
func TestBackEMFWithoutNoLoadTest(t *testing.T) {
	s := optionalJob(t, "```sheaf\nuse m = lib/motor-back-emf with U = 250 V, I_a = 49 A, n = 966 rpm, R_a = 0.2 ohm\n```\n")
	pass, fail, errs := outcomes(s)
	if pass != 1 || fail != 0 || len(errs) != 0 {
		t.Errorf("want the forward-running check alone: %d pass, %d fail, %q", pass, fail, errs)
	}
	closeTo(t, "m.E_b", libraryValue(t, s, "m.E_b"), 238.2, 1e-12)
	lo := s.Calc.Statements[0].Parts.LeftOut
	if len(lo) != 1 || strings.Join(lo[0].Params, ",") != "I_a0,U_0,n_0" || lo[0].Checks() != 1 {
		t.Errorf("the no-load part should be left out for its three inputs: %+v", lo)
	}
	// Part of the test set: U_0 and n_0 without I_a0 still leaves it out.
	s = optionalJob(t, "```sheaf\nuse m = lib/motor-back-emf with U = 250 V, I_a = 49 A, n = 966 rpm, R_a = 0.2 ohm, U_0 = 250 V, n_0 = 1000 rpm\n```\n")
	if lo := s.Calc.Statements[0].Parts.LeftOut; len(lo) != 1 || strings.Join(lo[0].Params, ",") != "I_a0" {
		t.Errorf("with I_a0 alone unset, the part waits for it: %+v", lo)
	}
}

// A take from another sheet of a result that sheet's instance left out is
// an error at the name, saying which input to set there.
func TestTakeOfLeftOutResult(t *testing.T) {
	pkg := project.FromFiles("job", map[string][]byte{
		"01-ins.md": []byte("```sheaf\nuse ins = lib/insulation-margin with U_N = 0.4 kV, N_ph = 96, N_coil = 16, U_surge = 1.2 kV,\n" +
			"    k_ph = 1 / sqrt(3), k_ef = 1, cls = 155, dT_R = 75 K, k_os = 1\n```\n"),
		"02-pd.md": []byte("```sheaf\ntake m = ins.m_PD from 01-ins\ntake T = ins.T_hs from 01-ins\n```\n"),
	})
	var s *project.Sheet
	for _, sh := range pkg.Sheets {
		if strings.HasSuffix(sh.Path(), "02-pd.md") {
			s = sh
		}
	}
	if s == nil {
		t.Fatal("no sheet 02-pd.md")
	}
	if len(s.Calc.Diags) != 1 {
		t.Fatalf("want one error, got %v", s.Calc.Diags)
	}
	d := s.Calc.Diags[0]
	if d.Pos.Line != 2 || d.Pos.Col != 10 || d.Message != "01-ins.md leaves ins.m_PD out: it rests on the optional input PDIV_pp of lib/insulation-margin, which its use statement does not set" ||
		d.Hint != "set PDIV_pp in the use statement of 01-ins.md at 2:1" {
		t.Errorf("got %v (hint %q)", d, d.Hint)
	}
	if r := s.Calc.Result(s.Calc.Lookup("T")); r.Status != engine.OK {
		t.Errorf("the hot spot is taken all the same: %v", r.Status)
	}
}
