package main

import "github.com/schollz/progressbar/v3"

// spineTheme draws a determinate bar as a spine: a dotted line the work
// fills solid, with a vertex at its head, between two end ticks.
var spineTheme = progressbar.Theme{
	Saucer:        "━",
	SaucerHead:    "●",
	SaucerPadding: "┄",
	BarStart:      "├",
	BarEnd:        "┤",
}

// spineFrames animate an indeterminate wait: an arc walks along the spine,
// then widens back over it and shrinks to where it began, as the arcs of
// one page nest.
var spineFrames = []string{
	"╭╮┄┄┄", "┄╭╮┄┄", "┄┄╭╮┄", "┄┄┄╭╮",
	"┄┄╭─╮", "┄╭──╮", "╭───╮", "╭──╮┄", "╭─╮┄┄",
}

// spineLook gives a progress bar spinecert's own look; progress is drawn
// only on terminals (see solveProgressOn and newProofBar).
func spineLook() progressbar.Option {
	return func(p *progressbar.ProgressBar) {
		progressbar.OptionSetTheme(spineTheme)(p)
		progressbar.OptionSpinnerCustom(spineFrames)(p)
	}
}
