package draw

// The page palette: eight hues chosen to stay distinct for the common forms
// of colour-vision deficiency (they differ in lightness as well as hue) and
// against the paper colour. Pages beyond eight reuse them with a dash.
const (
	harbourBlue = "#1d5fa0"
	ember       = "#e07b00"
	lagoon      = "#2a9d8f"
	plum        = "#9c3f8e"
	skyline     = "#5aaee0"
	rust        = "#a4452c"
	moss        = "#6b8e23"
	slate       = "#57606f"

	paper       = "#fffdf8"
	ink         = "#222222"
	spineFill   = "#efece4"
	spineStroke = "#b8b2a4"
	highlight   = "#c8102e"
)

var palette = []string{harbourBlue, ember, lagoon, plum, skyline, rust, moss, slate}

// dashes for the second, third, ... round through the palette.
var dashes = []string{"", "6 3", "2 3", "8 3 2 3"}

type style struct{ colour, dash string }

func pageStyle(p int) style {
	i := p - 1
	return style{palette[i%len(palette)], dashes[(i/len(palette))%len(dashes)]}
}
