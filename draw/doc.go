// Package draw renders layouts as SVG arc diagrams (Scalable Vector Graphics
// 1.1, W3C Recommendation, 2011).
//
// The spine is a horizontal band holding the vertex labels in spine order;
// every edge is an arc between its two ends. Pages alternate above and below
// the spine (page 1 above, page 2 below, ...) and are told apart by colour,
// with a dash pattern once the palette repeats, and by a legend naming each
// page's number, kind and side. A highlight set (for example a Kuratowski
// subgraph) is drawn dark and thick over the other edges, which are dimmed.
//
// draw trusts the layout only as far as its shape: every vertex must be on
// the spine once and every edge must have a page in 1..Pages(). It does not
// check for crossings or nestings (cert.Validate does); a layout with
// conflicts is drawn as it is. Output is deterministic.
package draw
