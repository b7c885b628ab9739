package preview

import (
	"math"
	"strconv"

	"github.com/fogleman/gg"
	"golang.org/x/image/font"
)

// legendItem is one entry of the legend: a sample drawn in a box of
// sampleW × rowH design units at (x, yMid), and its label.
type legendItem struct {
	label  string
	sample func(dc *gg.Context, x, y, w, u float64)
}

// legendPlan is the legend laid out in rows.
type legendPlan struct {
	items  []legendItem
	rows   [][]int // item indices per row
	height float64 // strip height in pixels
	scaleW float64 // room kept for the scale bar in pixels
}

const (
	sampleW     = 44  // width of a legend sample, design units
	rowH        = 30  // height of a legend row, design units
	maxScaleBar = 220 // longest scale bar, design units
)

// textWidth measures s in face f.
func textWidth(f font.Face, s string) float64 {
	return float64(font.MeasureString(f, s)) / 64
}

// planLegend chooses the legend entries for the styles present and wraps
// them into rows next to the scale bar.
func (pic *picture) planLegend(u float64) legendPlan {
	an, r := pic.an, pic.opts
	var lp legendPlan
	ref := pic.extentRef()
	if an.hasCut {
		label := "cut"
		if an.zHi > an.zLo {
			label = "cut, Z " + formatLength(an.zHi, ref) + " (light) to " + formatLength(an.zLo, ref) + " (dark)"
		}
		deep := an.zHi > an.zLo
		lp.items = append(lp.items, legendItem{label, func(dc *gg.Context, x, y, w, u float64) {
			if !deep {
				dc.SetColor(shade(depthShades - 1))
				dc.SetLineWidth(2.6 * u)
				dc.DrawLine(x, y, x+w, y)
				dc.Stroke()
				return
			}
			step := w / depthShades
			for k := 0; k < depthShades; k++ {
				dc.SetColor(shade(k))
				dc.DrawRectangle(x+float64(k)*step, y-5*u, step+0.5, 10*u)
				dc.Fill()
			}
		}})
	}
	if an.hasTrav {
		lp.items = append(lp.items, legendItem{"travel", func(dc *gg.Context, x, y, w, u float64) {
			dc.SetColor(travelColor)
			dc.SetLineWidth(1.5 * u)
			dc.SetLineCapButt()
			dc.SetDash(9*u, 6*u)
			dc.DrawLine(x, y, x+w, y)
			dc.Stroke()
			dc.SetDash()
			dc.SetLineCapRound()
		}})
	}
	if r.toolWidth > 0 && an.hasCut {
		lp.items = append(lp.items, legendItem{"tool width " + formatLength(r.toolWidth, r.toolWidth*10) + " " + r.unit, func(dc *gg.Context, x, y, w, u float64) {
			dc.SetColor(bandColor)
			dc.DrawRectangle(x, y-8*u, w, 16*u)
			dc.Fill()
			dc.SetColor(shade(depthShades - 1))
			dc.SetLineWidth(2.6 * u)
			dc.DrawLine(x, y, x+w, y)
			dc.Stroke()
		}})
	}
	if len(r.intended) > 0 {
		lp.items = append(lp.items, legendItem{"intended shape", func(dc *gg.Context, x, y, w, u float64) {
			dc.SetColor(inkColor)
			dc.SetLineWidth(1.2 * u)
			dc.DrawLine(x, y, x+w, y)
			dc.Stroke()
		}})
	}
	if an.hasTab {
		lp.items = append(lp.items, legendItem{"holding tab", func(dc *gg.Context, x, y, w, u float64) {
			dc.SetColor(inkColor)
			dc.SetLineWidth(9 * u)
			dc.DrawLine(x+6*u, y, x+w-6*u, y)
			dc.Stroke()
			dc.SetColor(paperColor)
			dc.SetLineWidth(4.5 * u)
			dc.DrawLine(x+6*u, y, x+w-6*u, y)
			dc.Stroke()
		}})
	}
	if len(an.holes) > 0 {
		label := "hole or mark"
		if len(an.holes) > 1 {
			label += " (" + strconv.Itoa(len(an.holes)) + ")"
		}
		lp.items = append(lp.items, legendItem{label, func(dc *gg.Context, x, y, w, u float64) {
			drawHoleMark(dc, x+w/2, y, u)
		}})
	}
	if an.hasStart {
		lp.items = append(lp.items, legendItem{"start, cutting direction", func(dc *gg.Context, x, y, w, u float64) {
			drawStartMark(dc, x+8*u, y, u)
			drawArrow(dc, x+w-10*u, y, 1, 0, u)
		}})
	}
	// Wrap: the first row shares its width with the scale bar; an entry
	// that does not fit starts the next row.
	lp.scaleW = (maxScaleBar + 110) * u
	m := 28 * u
	full := float64(r.width) - 2*m
	avail := full - lp.scaleW
	x := 0.0
	var row []int
	for i, it := range lp.items {
		w := (sampleW+10)*u + textWidth(pic.faces.small, it.label) + 26*u
		if x+w > avail && (len(row) > 0 || len(lp.rows) == 0) {
			lp.rows = append(lp.rows, row)
			row, x, avail = nil, 0, full
		}
		row = append(row, i)
		x += w
	}
	if len(row) > 0 {
		lp.rows = append(lp.rows, row)
	}
	lp.height = float64(max(1, len(lp.rows)))*rowH*u + 24*u
	return lp
}

// extentRef is the size used to choose decimals in labels.
func (pic *picture) extentRef() float64 {
	an := pic.an
	return max(an.cutMaxX-an.cutMinX, an.cutMaxY-an.cutMinY)
}

// drawLegend draws the scale bar and the legend rows in the bottom strip.
func (pic *picture) drawLegend() {
	dc, l, u := pic.dc, pic.lay, pic.lay.unit
	m := 28 * u
	y0 := float64(l.height) - pic.legend.height + 12*u
	dc.SetFontFace(pic.faces.small)
	// The scale bar: the longest round length that fits in a quarter of
	// the drawing width or maxScaleBar, as black and white halves so it
	// reads on any background.
	want := math.Min((l.areaX1-l.areaX0)/4, maxScaleBar*u)
	length := roundLength(want / l.scale)
	bw := length * l.scale
	yMid := y0 + rowH*u/2
	dc.SetColor(inkColor)
	dc.SetLineWidth(1.2 * u)
	dc.DrawRectangle(m, yMid-4*u, bw, 8*u)
	dc.Stroke()
	dc.DrawRectangle(m, yMid-4*u, bw/2, 8*u)
	dc.Fill()
	dc.DrawStringAnchored(formatLength(length, length*100)+" "+pic.opts.unit, m+bw+10*u, yMid, 0, 0.35)
	for r, row := range pic.legend.rows {
		x := m
		if r == 0 {
			x += pic.legend.scaleW
		}
		y := y0 + float64(r)*rowH*u + rowH*u/2
		for _, i := range row {
			it := pic.legend.items[i]
			it.sample(dc, x, y, sampleW*u, u)
			dc.SetColor(inkColor)
			dc.SetFontFace(pic.faces.small)
			tx := x + (sampleW+10)*u
			dc.DrawStringAnchored(it.label, tx, y, 0, 0.35)
			x = tx + textWidth(pic.faces.small, it.label) + 26*u
		}
	}
}

// drawHeader draws the title and the line of overall figures.
func (pic *picture) drawHeader() {
	dc, u, an, r := pic.dc, pic.lay.unit, pic.an, pic.opts
	m := 28 * u
	y := 20 * u
	if r.title != "" {
		dc.SetFontFace(pic.faces.title)
		dc.SetColor(inkColor)
		dc.DrawStringAnchored(fitText(pic.faces.title, r.title, float64(r.width)-2*m), m, y, 0, 0.8)
		y += 34 * u
	}
	ref := pic.extentRef()
	what := "extent of cuts "
	if !an.hasCut && len(an.holes) == 0 {
		what = "extent of moves "
	}
	// The figures in order of importance; those that do not fit the
	// width are left out.
	parts := []string{what + formatLength(an.cutMaxX-an.cutMinX, ref) + " × " + formatLength(an.cutMaxY-an.cutMinY, ref) + " " + r.unit}
	if an.hasCut {
		parts = append(parts, "cut length "+formatLength(an.cutLength, an.cutLength)+" "+r.unit)
	}
	if lo, hi, ok := pic.path.ZRange(); ok {
		parts = append(parts, "Z "+formatLength(lo, ref)+" to "+formatLength(hi, ref)+" "+r.unit)
	}
	if an.hasTrav {
		parts = append(parts, "travel "+formatLength(an.travelLength, an.travelLength)+" "+r.unit)
	}
	parts = append(parts, strconv.Itoa(len(pic.path))+" segments")
	line := parts[0]
	for _, p := range parts[1:] {
		if next := line + "   ·   " + p; textWidth(pic.faces.text, next) <= float64(r.width)-2*m {
			line = next
		}
	}
	dc.SetFontFace(pic.faces.text)
	dc.SetColor(noteColor)
	dc.DrawStringAnchored(line, m, y, 0, 0.8)
}

// fitText returns s on one line, control characters as spaces, cut short
// with an ellipsis when wider than w pixels in face f.
func fitText(f font.Face, s string, w float64) string {
	rs := []rune(s)
	for i, c := range rs {
		if c < ' ' || c == 0x7f {
			rs[i] = ' '
		}
	}
	if textWidth(f, string(rs)) <= w {
		return string(rs)
	}
	for len(rs) > 1 && textWidth(f, string(rs)+"…") > w {
		rs = rs[:len(rs)-1]
	}
	return string(rs) + "…"
}
