package preview

import (
	"image"
	"image/draw"
	"image/png"
	"io"
	"math"

	"github.com/focitools/foci/toolpath"
	"github.com/focitools/foci/toolpath/internal/plan"
	"github.com/fogleman/gg"
)

// Render draws path as a picture according to opts. It returns an
// [*Error] for options out of range, an empty path or a non-finite
// coordinate; it never panics on a path.
func Render(path toolpath.Path, opts Options) (image.Image, error) {
	r, err := resolve(opts)
	if err != nil {
		return nil, err
	}
	if err := checkPath(path); err != nil {
		return nil, err
	}
	pic := newPicture(path, &r)
	pic.draw()
	return pic.dc.Image(), nil
}

// WritePNG renders path and encodes the picture as PNG to w.
func WritePNG(w io.Writer, path toolpath.Path, opts Options) error {
	img, err := Render(path, opts)
	if err != nil {
		return err
	}
	return png.Encode(w, img)
}

// picture is one drawing in progress.
type picture struct {
	path  toolpath.Path
	opts  *resolved
	an    *analysis
	lay   *layout
	dc    *gg.Context
	faces faces
	// legend strip height, computed before the layout
	legend legendPlan
}

func newPicture(path toolpath.Path, r *resolved) *picture {
	pic := &picture{path: path, opts: r, an: analyse(path)}
	u := designUnit(r.width, r.height)
	pic.faces = newFaces(u)
	pic.dc = gg.NewContext(r.width, r.height)
	pic.legend = pic.planLegend(u)
	top := 20 * u
	if r.title != "" {
		top += 34 * u
	}
	top += 22 * u
	minX, minY, maxX, maxY := frameBox(pic.an, r)
	pic.lay = newLayout(r.width, r.height, top, pic.legend.height, minX, minY, maxX, maxY)
	return pic
}

// draw paints every layer, back to front.
func (pic *picture) draw() {
	dc := pic.dc
	dc.SetColor(paperColor)
	dc.Clear()
	dc.SetLineCapRound()
	dc.SetLineJoinRound()
	pic.drawBand()
	pic.drawCuts()
	pic.drawTravel()
	pic.drawIntended()
	pic.drawTabs()
	pic.drawHoles()
	pic.drawDirection()
	pic.drawHeader()
	pic.drawLegend()
}

// collect builds a polyline of the segments whose class satisfies keep.
func (pic *picture) collect(keep func(i int) bool) *polyline {
	pl := &polyline{}
	for i := range pic.path {
		if keep(i) {
			addSegment(pl, pic.lay, &pic.path[i])
		}
	}
	return pl
}

// strokeLayer strokes pl with the current colour at width w pixels.
func (pic *picture) strokeLayer(pl *polyline, w float64) {
	if pl.empty() {
		return
	}
	pic.dc.SetLineWidth(w)
	pl.replay(pic.dc)
	pic.dc.Stroke()
}

// drawBand draws the tool's width along every cut as one faint band, so
// that overlapping passes do not darken it: the band is stroked opaque
// into a mask of its own, in chunks (the rasterizer slows down with the
// number of cells on a row, and dense passes make many), and the mask is
// laid on the picture once in the band colour.
func (pic *picture) drawBand() {
	if pic.opts.toolWidth <= 0 || !pic.an.hasCut {
		return
	}
	w := pic.opts.toolWidth * pic.lay.scale
	if w < 1 {
		return
	}
	pl := pic.collect(func(i int) bool { return pic.an.classes[i].Cuts() })
	mask := gg.NewContext(pic.opts.width, pic.opts.height)
	mask.SetColor(inkColor)
	mask.SetLineWidth(w)
	mask.SetLineCapRound()
	mask.SetLineJoinRound()
	pl.replayChunks(mask, bandChunk)
	img := pic.dc.Image().(*image.RGBA)
	draw.DrawMask(img, img.Bounds(), image.NewUniform(bandColor), image.Point{}, mask.Image(), image.Point{}, draw.Over)
}

// bandChunk is the number of polyline points stroked at a time for the
// tool band.
const bandChunk = 4096

// drawCuts draws the cutting moves in depth shades, shallow first so that
// the deepest pass lies on top.
func (pic *picture) drawCuts() {
	if !pic.an.hasCut {
		return
	}
	var layers [depthShades]*polyline
	for k := range layers {
		layers[k] = &polyline{}
	}
	for i := range pic.path {
		if !pic.an.classes[i].Cuts() {
			continue
		}
		s := &pic.path[i]
		k := bucket((s.Start.Z+s.End.Z)/2, pic.an.zLo, pic.an.zHi)
		addSegment(layers[k], pic.lay, s)
	}
	for k, pl := range layers {
		pic.dc.SetColor(shade(k))
		pic.strokeLayer(pl, 2.6*pic.lay.unit)
	}
}

// drawTravel draws the travel moves as thin dashed lines.
func (pic *picture) drawTravel() {
	if !pic.an.hasTrav {
		return
	}
	u := pic.lay.unit
	pl := pic.collect(func(i int) bool { return pic.an.classes[i] == plan.Travel })
	pic.dc.SetColor(travelColor)
	pic.dc.SetDash(9*u, 6*u)
	pic.dc.SetLineCapButt()
	pic.strokeLayer(pl, 1.5*u)
	pic.dc.SetLineCapRound()
	pic.dc.SetDash()
}

// drawIntended draws the intended shapes as thin black lines, sampled
// finely enough that the polygon stays within a quarter pixel.
func (pic *picture) drawIntended() {
	for _, c := range pic.opts.intended {
		per := c.Length() * pic.lay.scale
		n := int(math.Min(math.Max(per/2, 64), 50000))
		pl := &polyline{}
		for k := 0; k <= n; k++ {
			q := c.PointAt(2 * math.Pi * float64(k) / float64(n))
			x, y := pic.lay.px(q.X, q.Y)
			if k == 0 {
				pl.moveTo(x, y)
			} else {
				pl.lineTo(x, y)
			}
		}
		pic.dc.SetColor(inkColor)
		pic.strokeLayer(pl, 1.2*pic.lay.unit)
	}
}
