package chart

import (
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// TestFiguresPaintOnPaper paints each test figure on a raster canvas and
// checks that its ground is the page's paper; with CHART_OUT naming a
// folder it also writes them as PNG, for a person to look at.
func TestFiguresPaintOnPaper(t *testing.T) {
	dir := os.Getenv("CHART_OUT")
	for name, f := range map[string]func() (figure, error){
		"line":    func() (figure, error) { return lineFigure(magnetisation()) },
		"bars":    func() (figure, error) { return barFigure(spectrum()) },
		"phasors": func() (figure, error) { return phasorFigure(generator()) },
	} {
		fig, err := f()
		if err != nil {
			t.Fatal(err)
		}
		c := vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(fig.w, fig.h), vgimg.UseDPI(150))}
		fig.paint(draw.New(c))
		r, g, b, _ := c.Image().At(1, 1).RGBA()
		if pr, pg, pb, _ := paper.RGBA(); r != pr || g != pg || b != pb {
			t.Errorf("%s: the corner is %x %x %x, not the paper %x %x %x", name, r>>8, g>>8, b>>8, pr>>8, pg>>8, pb>>8)
		}
		if dir == "" {
			continue
		}
		out, err := os.Create(filepath.Join(dir, name+".png"))
		if err != nil {
			t.Fatal(err)
		}
		if _, err := c.WriteTo(out); err != nil {
			t.Fatal(err)
		}
		out.Close()
	}
}
