package render_test

import (
	"bytes"
	"encoding/json"
	"testing"

	"github.com/sheaf-calc/sheaf/engine"
	"github.com/sheaf-calc/sheaf/project"
	"github.com/sheaf-calc/sheaf/render"
)

// FuzzPipeline takes a whole Markdown sheet through the package loader and
// every renderer. None may panic or fail; every output is non-empty; the
// JSON is valid and its summary agrees with the package's own counts.
func FuzzPipeline(f *testing.F) {
	for _, seed := range []string{
		"---\ntitle: Field coil\nproject: Tarnwick Weir\ndigits: 5\n---\n# Coil\n\n```sheaf\nN = 120\nI = 12 A\nl_g = 2.5 mm\nA_g = 0.01 m^2\nR_g [kA/Wb] = l_g / (mu_0 * A_g)\nPhi = N*I/R_g\ncheck Phi <= 50 mWb\n```\n",
		"# Excitation\n\n```sheaf\nV = 6.35 kV ∠ 0 deg\nI = 525 A /_ -31.79 deg\nZ = 0.04 Ω + 11.5j Ω\nE [kV] = V + I * Z\nd [deg] = arg(E)\ncheck abs(E) <= 12 kV\nw = E / (0 V + 0j V)\nI_b = 4j A\nc = I_b * I_b\n```\n",
		"# Speed\n\n```sheaf\nn = 1500 rpm\nomega [rad/s] = 2*pi*n\nf [Hz] = omega\n```\n",
		"# Heat\n\n```sheaf\nT_a = 40 degC\nT_h = T_a + 80 K\ndT = T_h - T_a\ncheck T_h <= 155 degC\ncheck dT > 100 K\n```\n",
		"# Errors\n\n```sheaf\na = 1 V + 2 A\nb = a * 2\nc = 1 / 0\nd = c + 1\n```\n\n```sheaf\n```\n",
		"---\ntitle: [open\n---\n# T\n",
		"---\ntitle: never closed\n\n```sheaf\nx = 1\n```\n",
		"# Prose only, with <b>html</b> & entities\n\n| a | b |\n|---|---|\n| 1 | 2 |\n",
		"```sheaf\nx = (1 +\n  2)\ny [mm] = x * 1 m ; a note ; source: sketch 4\n```\n```go\nfunc main() {}\n```\n",
		"```sheaf\nu = 2 \xff m\n```\nbad \xfe prose\n",
		"> ```sheaf\n> a = -3 kV\n> check a < 0 V\n> ```\n",
		"```sheaf\nc_1 = c_2\nc_2 = c_1\ncheck 1 < 2 < 3\n```\n",
		"```sheaf\nx = 1e308 * 10\ny = -1e-320\nz = 0\ncheck z == 0\ncheck y >= -1 m\n```\n",
		"Table T: turns\n\n| k [1] | phi [mWb] |\n|---:|---:|\n| 1 | 2.4 |\n| 2 | 2.3 |\n\n```sheaf\nphi_k = [2.41 mWb, 2.38 mWb,\n    2.30 mWb] ; flux per turn group ; source: field plot FP-3\nlambda = sum(phi_k) + sum(T.phi)\nth [deg] = 0 deg .. 360 deg by 10 deg\ne = cos(th) * lambda / 1 s\ncheck max(e) <= 1 V\nk = 1 when lambda > 1 Wb else phi_k[2] / lambda\n```\n",
		"```sheaf\nV = 6.35 kV\nU = V ∠ [0 deg, -120 deg, 120 deg]\nS = sum(U)\nz = [1 V + 2j V, 3 V] / [1, 0]\nm = max(U)\nW = U * conj(U) - 1 V^2\nx = U[2] + mean(U)\na [deg] = arg(U)\n```\n",
		"```sheaf\nk_p(nu) = sin(nu * y * pi / 2) ; pitch factor\ny = 7 / 9\nw = k_p([1, 5, 7])\nf(x) = f(x) + 1\nz = f(2)\n```\n",
		"```sheaf\nU = 24 V ± 5 % ; supply\nR = 3 ohm in 2.9 ohm .. 3.2 ohm\ng = 4.0 mm ± σ 0.05 mm\nk = 1300 ± 15 % triangular\nI = U / R * k * g / 1 m\ncheck I <= 9 A\ncase low: U = 20 V\ncase high: U = 28 V, R = 2.9 ohm\nsweep su: U over 18 V .. 30 V by 1 V in high show I\nsweep sl: R over [3 ohm, 2 ohm, 0 ohm]\nsample 2000 times, seed 4\n```\n",
		"```sheaf\nx = 1 ± 2\ny = 1 / x\ncheck y < 1\ncase c: x = 0\nsweep s: x over -1 .. 1 by 0.5 show y\n```\n",
		"```sheaf\nth [deg] = 0 deg .. 360 deg by 10 deg\ns = series(sin(th) * 2 V, th) ; draw: spectrum\nr = series(th / 1 deg * 1 V, th) ; draw: spectrum\nV = 1 V ∠ 0 deg\nU = 2j V ; draw: phasors V, U, E ; draw: phasors V, Q\nE = V + U ; draw: pie\n```\n",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		pkg := project.FromFiles("pkg", map[string][]byte{"s.md": data})
		opt := render.Options{Version: "fuzz"}

		files, err := render.HTML(pkg, opt)
		if err != nil {
			t.Fatalf("HTML: %v", err)
		}
		// The index, the inputs, assumptions and standards registers, and one page per sheet.
		if len(files) != 4+len(pkg.Sheets) {
			t.Fatalf("%d HTML files for %d sheets", len(files), len(pkg.Sheets))
		}
		for _, fl := range files {
			if len(fl.Data) == 0 || !bytes.Contains(fl.Data, []byte("</html>")) {
				t.Fatalf("%s: empty or cut short", fl.Path)
			}
		}

		data, err = render.JSON(pkg, opt)
		if err != nil {
			t.Fatalf("JSON: %v", err)
		}
		if !json.Valid(data) {
			t.Fatalf("JSON not valid:\n%s", data)
		}
		var doc render.JSONDoc
		if err := json.Unmarshal(data, &doc); err != nil {
			t.Fatalf("JSON does not decode: %v", err)
		}
		c := pkg.Counts()
		want := render.JSONSummary{Sheets: len(pkg.Sheets), Results: c.Results, Inputs: c.Inputs, Pass: c.Pass,
			Fail: c.Fail, Fixed: c.Fixed, Errors: c.Errors, Blocked: c.Blocked}
		if doc.Summary != want {
			t.Fatalf("JSON summary %+v, package counts %+v", doc.Summary, want)
		}
		if len(doc.Diags) != len(pkg.Diags) {
			t.Fatalf("JSON has %d diagnostics, the package %d", len(doc.Diags), len(pkg.Diags))
		}

		var out, errs bytes.Buffer
		render.Terminal(pkg, opt, &out, &errs)
		if out.Len() == 0 {
			t.Fatal("terminal report empty")
		}
		if len(pkg.Diags) > 0 && errs.Len() == 0 {
			t.Fatal("diagnostics missing from the terminal")
		}
	})
}

// FuzzCSVTable reads arbitrary bytes as the CSV file a sheet's table
// names. No file may make the pipeline panic; the pages, the JSON and the
// terminal report are made whatever the file holds, and an error in the
// file is reported in it.
func FuzzCSVTable(f *testing.F) {
	for _, seed := range []string{
		"H [A/m],B [T]\n0,0\n250,0.40\n400,0.70\n",
		"H [A/m],B [T]\n0,0\n250,x\n",
		"H [A/m],B [Tx]\n0,0\n1,1\n",
		"H [A/m],B [T]\n0,0\n1,\"2\n",
		"H [A/m],B [T]\n0,0\n1,2,3\n",
		"H [A/m]\n0\n1\n",
		"\xef\xbb\xbf# demo\r\nH [A/m],B [T]\r\n0,0\r\n400,0.7\r\n",
		"",
	} {
		f.Add([]byte(seed))
	}
	sheet := []byte("Table BH from data/bh.csv: curve\n\n```sheaf\nH = 300 A/m ; field ; source: demo\nB [T] = interp(BH.B, BH.H, H)\n```\n")
	f.Fuzz(func(t *testing.T, data []byte) {
		pkg := project.FromFiles("pkg", map[string][]byte{"s.md": sheet, "data/bh.csv": data})
		opt := render.Options{Version: "fuzz"}
		if _, err := render.HTML(pkg, opt); err != nil {
			t.Fatalf("HTML: %v", err)
		}
		js, err := render.JSON(pkg, opt)
		if err != nil || !json.Valid(js) {
			t.Fatalf("JSON: %v", err)
		}
		var out, errs bytes.Buffer
		render.Terminal(pkg, opt, &out, &errs)
		for _, d := range pkg.Diags {
			if d.Pos.File != "s.md" && d.Pos.File != "data/bh.csv" {
				t.Fatalf("diagnostic in no file of the package: %s", d.Error())
			}
		}
		if r := pkg.Sheets[0].Calc.Result(pkg.Sheets[0].Calc.Lookup("B")); r.Status == engine.OK && len(pkg.Diags) > 0 && pkg.Sheets[0].Calc.Tables[0].Err != nil {
			t.Fatal("B evaluated from a table with an error")
		}
	})
}
