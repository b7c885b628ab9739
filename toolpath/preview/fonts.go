package preview

import (
	"github.com/golang/freetype/truetype"
	"golang.org/x/image/font"
	"golang.org/x/image/font/basicfont"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
)

// faces holds the text faces of one picture. Faces are not safe for
// concurrent use, so every Render makes its own.
type faces struct {
	title, text, small font.Face
}

// newFaces loads the Go fonts (bundled with golang.org/x/image) at sizes
// scaled by the design unit u, falling back to a fixed bitmap face.
func newFaces(u float64) faces {
	regular, err1 := truetype.Parse(goregular.TTF)
	bold, err2 := truetype.Parse(gobold.TTF)
	if err1 != nil || err2 != nil {
		return faces{basicfont.Face7x13, basicfont.Face7x13, basicfont.Face7x13}
	}
	face := func(f *truetype.Font, size float64) font.Face {
		return truetype.NewFace(f, &truetype.Options{Size: size, DPI: 72, Hinting: font.HintingFull})
	}
	return faces{
		title: face(bold, 26*u),
		text:  face(regular, 17*u),
		small: face(regular, 15*u),
	}
}
