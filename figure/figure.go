// Package figure draws hatsieve's figures for slides and papers: the BDFE
// ladder (donors and acceptors on one energy axis with the H2 line across)
// and the pairing map (donors × acceptors coloured by ΔG°(HAT)). Each figure
// is drawn from a plain input struct (labels, values, σ, tendencies, the H2
// line, caption text) and written to an io.Writer as SVG or PNG; the
// package touches no file and no terminal. LadderFrom and MapFrom build the
// inputs from an evaluated library.
//
// Drawing is done with gonum.org/v1/plot, whose Liberation fonts come with
// the module, so a figure looks the same on every machine.
package figure

import (
	"bytes"
	"errors"
	"fmt"
	"image/color"
	"io"
	"path/filepath"
	"strings"
	"sync"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/font/liberation"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"github.com/hatsieve/hatsieve/data"
)

// The default page is a 16:9 slide, 10 in × 5.625 in (25.4 cm × 14.29 cm);
// a PNG has 192 dots per inch, so 1920 × 1080 pixels.
const (
	DefaultWidth  = 10 * vg.Inch
	DefaultHeight = 5.625 * vg.Inch
	DefaultDPI    = 192
)

// Page is the size of a figure. Zero fields take the defaults.
type Page struct {
	Width, Height vg.Length
	DPI           int // dots per inch of a PNG
}

func (pg Page) withDefaults() Page {
	if pg.Width <= 0 {
		pg.Width = DefaultWidth
	}
	if pg.Height <= 0 {
		pg.Height = DefaultHeight
	}
	if pg.DPI <= 0 {
		pg.DPI = DefaultDPI
	}
	return pg
}

// PixelSize is the size in pixels of a PNG of this page.
func (pg Page) PixelSize() (w, h int) {
	pg = pg.withDefaults()
	dots := func(l vg.Length) int { return int(l/vg.Inch*vg.Length(pg.DPI) + 0.5) }
	return dots(pg.Width), dots(pg.Height)
}

// Formats are the formats a figure can be written in, by file extension.
// PDF is not among them: gonum's PDF writer encodes text in code page 1252
// (so Δ, σ, ▼ and − would be lost) and finds no bold Liberation face; an
// SVG converts to PDF without loss.
var Formats = []string{"svg", "png"}

// FormatOf returns the format a file name's extension asks for.
func FormatOf(path string) (string, error) {
	ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(path), "."))
	for _, f := range Formats {
		if ext == f {
			return f, nil
		}
	}
	switch ext {
	case "":
		return "", fmt.Errorf("%s has no extension: want .svg or .png", data.Printable(path))
	case "pdf":
		return "", fmt.Errorf(".pdf is not offered (its text would lose Δ, σ and ▼): write .svg and convert it")
	}
	return "", fmt.Errorf("unknown figure format .%s: want .svg or .png", data.Printable(ext))
}

// Page sizes a figure may take: small enough for any slide or page, large
// enough to hold a caption.
const (
	minSide = 5 * vg.Centimeter
	maxSide = 100 * vg.Centimeter
	maxDPI  = 1200
)

func (pg Page) check() error {
	for _, s := range []struct {
		name string
		v    vg.Length
	}{{"width", pg.Width}, {"height", pg.Height}} {
		if s.v < minSide || s.v > maxSide {
			return fmt.Errorf("%s %.3gcm: want 5cm to 100cm", s.name, s.v/vg.Centimeter)
		}
	}
	if pg.DPI < 30 || pg.DPI > maxDPI {
		return fmt.Errorf("dpi %d: want 30 to %d", pg.DPI, maxDPI)
	}
	return nil
}

// render makes the canvas of format, lets paint draw on it and writes it.
func render(w io.Writer, format string, pg Page, paint func(dc draw.Canvas) error) error {
	pg = pg.withDefaults()
	if err := pg.check(); err != nil {
		return err
	}
	var cw vg.CanvasWriterTo
	switch format {
	case "svg":
		cw = vgsvg.New(pg.Width, pg.Height)
	case "png":
		cw = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(pg.Width, pg.Height), vgimg.UseDPI(pg.DPI))}
	default:
		return fmt.Errorf("unknown figure format %q: want svg or png", data.Printable(format))
	}
	if err := paint(draw.New(cw)); err != nil {
		return err // nothing written
	}
	if format != "svg" {
		_, err := cw.WriteTo(w)
		return err
	}
	var buf bytes.Buffer
	if _, err := cw.WriteTo(&buf); err != nil {
		return err
	}
	// Liberation Sans has the metrics of Arial: a viewer without it falls
	// back to a font of the same widths, so the labels keep their room.
	out := bytes.ReplaceAll(buf.Bytes(), []byte("font-family:Liberation Sans;"),
		[]byte("font-family:'Liberation Sans',Arial,Helvetica,sans-serif;"))
	_, err := w.Write(out)
	return err
}

// sans is the typeface of every text; sizes are in points.
var sans = font.Font{Typeface: "Liberation", Variant: "Sans"}

func textStyle(size vg.Length, bold bool) draw.TextStyle {
	f := font.From(sans, size)
	if bold {
		f.Weight = xfont.WeightBold
	}
	return draw.TextStyle{Color: color.Black, Font: f, Handler: textHandler()}
}

// textHandler lays text out in the Liberation fonts. It is made on first
// use: reading the fonts (as gonum's plot package does when it starts)
// would cost every command, not only figure, a millisecond at start.
var textHandler = sync.OnceValue(func() text.Handler {
	return text.Plain{Fonts: font.NewCache(liberation.Collection())}
})

// maxLabel is the longest label drawn, in characters; a longer one ends in
// "…" (the whole id is in the caption's library, the CSV and the screens).
const maxLabel = 28

// label makes a library text safe to draw: escaped by the one sanitiser
// (control characters and invalid UTF-8 become visible escapes; the SVG
// writer escapes < > & and quotes) and cut to maxLabel characters.
func label(s string) string {
	s = data.Printable(s)
	r := []rune(s)
	if len(r) > maxLabel {
		s = string(r[:maxLabel-1]) + "…"
	}
	return s
}

// title makes a library text safe to draw as a title: escaped, not cut.
func title(s string) string { return data.Printable(s) }

// wrap breaks text into lines no wider than w in style st.
func wrap(st draw.TextStyle, text string, w vg.Length) []string {
	var lines []string
	for _, para := range strings.Split(text, "\n") {
		line := ""
		for _, word := range strings.Fields(para) {
			try := word
			if line != "" {
				try = line + " " + word
			}
			if line != "" && st.Width(try) > w {
				lines = append(lines, line)
				try = word
			}
			line = try
		}
		lines = append(lines, line)
	}
	return lines
}

// Colours, from the palette of Okabe and Ito ("Color Universal Design",
// 2008; hex values from memory), told apart by people with any common colour-vision deficiency;
// every colour also has a shape or a word beside it.
var (
	colDownhill = color.RGBA{0xD5, 0x5E, 0x00, 0xFF} // vermillion
	colNear     = color.RGBA{0xCC, 0x79, 0xA7, 0xFF} // reddish purple
	colUphill   = color.RGBA{0x00, 0x72, 0xB2, 0xFF} // blue
	colAcceptor = color.RGBA{0x33, 0x33, 0x33, 0xFF}
	colH2       = color.RGBA{0x00, 0x00, 0x00, 0xFF}
	colLeader   = color.RGBA{0x99, 0x99, 0x99, 0xFF}
	colGrid     = color.RGBA{0xE3, 0xE3, 0xE3, 0xFF}
)

// ErrTooSmall is wrapped by the error of a page too small for its figure.
var ErrTooSmall = errors.New("page too small")

// tooSmall is the error of a page too small for the figure.
func tooSmall(what string, pg Page) error {
	pg = pg.withDefaults()
	return fmt.Errorf("%w: a %.3gcm × %.3gcm page cannot hold %s and its caption; make it wider or taller",
		ErrTooSmall, pg.Width/vg.Centimeter, pg.Height/vg.Centimeter, what)
}
