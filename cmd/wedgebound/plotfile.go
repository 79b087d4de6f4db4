package main

import (
	"bytes"
	"fmt"

	"github.com/spf13/pflag"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"

	"wedgebound/certificates"
)

// plotFiles holds the image flags shared by the plotting commands: one
// file per format, any subset.
type plotFiles struct {
	svg, png, pdf string
}

func (f *plotFiles) add(fs *pflag.FlagSet, what string) {
	fs.StringVar(&f.svg, "svg", "", "write "+what+" as SVG (fonts embedded) to this file")
	fs.StringVar(&f.png, "png", "", "write "+what+" as PNG to this file")
	fs.StringVar(&f.pdf, "pdf", "", "write "+what+" as PDF (fonts embedded) to this file")
}

func (f *plotFiles) any() bool { return f.svg != "" || f.png != "" || f.pdf != "" }

// check checks that every requested file can be written.
func (f *plotFiles) check() error {
	for _, o := range [][2]string{{"--svg", f.svg}, {"--png", f.png}, {"--pdf", f.pdf}} {
		if err := checkOutput(o[0], o[1]); err != nil {
			return err
		}
	}
	return nil
}

// write renders the plot into every requested format and writes each file
// atomically.
func (f *plotFiles) write(p *plot.Plot, leg plot.Legend, w, h vg.Length) error {
	for _, o := range [][2]string{{"svg", f.svg}, {"png", f.png}, {"pdf", f.pdf}} {
		if o[1] == "" {
			continue
		}
		img, err := renderPlot(p, leg, w, h, o[0])
		if err != nil {
			return err
		}
		if err := certificates.WriteAtomic(o[1], img); err != nil {
			return err
		}
	}
	return nil
}

// renderPlot draws p with the legend leg in a strip of its own below the
// axes (never over the data), in format "svg", "png" or "pdf". The text
// is laid out with the metrics of the font that is then embedded (SVG,
// PDF) or rasterised (PNG), so no viewer font can make it overrun.
func renderPlot(p *plot.Plot, leg plot.Legend, w, h vg.Length, format string) ([]byte, error) {
	var c vg.CanvasWriterTo
	switch format {
	case "svg":
		c = vgsvg.NewWith(vgsvg.UseWH(w, h), vgsvg.EmbedFonts(true))
	case "pdf":
		pc := vgpdf.New(w, h)
		pc.EmbedFonts(true)
		c = pc
	case "png":
		c = vgimg.PngCanvas{Canvas: vgimg.New(w, h)}
	default:
		return nil, fmt.Errorf("unknown image format %q", format)
	}
	dc := draw.New(c)
	leg.Top, leg.Left = true, true
	leg.XOffs = vg.Points(8)
	legH := leg.Rectangle(dc).Size().Y + vg.Points(10)
	if legH > h/2 {
		return nil, fmt.Errorf("the legend needs %v of the %v image height", legH, h)
	}
	plotArea := draw.Crop(dc, 0, 0, legH, 0)
	q := *p
	q.Legend = plot.NewLegend() // drawn below instead
	q.Draw(plotArea)
	legArea := dc
	legArea.Max.Y = dc.Min.Y + legH - vg.Points(4)
	leg.Draw(legArea)
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}
