package draw

// The page palette: eight of the nine colours of Paul Tol's "muted"
// qualitative scheme (P. Tol, "Colour Schemes", SRON technical note
// SRON/EPS/TN/09-002, 2021; hex values from memory), made to stay distinct
// for the common forms of colour-vision deficiency. The scheme's sand
// (#ddcc77) is left out: thin arcs in it fade on the paper colour. The order
// is spinecert's own: neighbouring pages differ in lightness as well as hue.
// Pages beyond eight reuse the colours with a dash.
const (
	wine   = "#882255"
	teal   = "#44aa99"
	indigo = "#332288"
	olive  = "#999933"
	rose   = "#cc6677"
	green  = "#117733"
	purple = "#aa4499"
	cyan   = "#88ccee"

	paper       = "#fffdf8"
	ink         = "#222222"
	spineFill   = "#efece4"
	spineStroke = "#b8b2a4"
	highlight   = "#c8102e"
)

var palette = []string{wine, teal, indigo, olive, rose, green, purple, cyan}

// dashes for the second, third, ... round through the palette.
var dashes = []string{"", "6 3", "2 3", "8 3 2 3"}

type style struct{ colour, dash string }

func pageStyle(p int) style {
	i := p - 1
	return style{palette[i%len(palette)], dashes[(i/len(palette))%len(dashes)]}
}
