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
// A large layout can be drawn in part: [Options].Window keeps a stretch of
// the spine, [Options].Vertices a vertex set ([Around] gives a ball around a
// vertex), both kept in spine order, so the drawn arcs cross and nest as in
// the whole layout. An edge with both ends drawn is drawn in full; an edge
// leaving the drawn part is a dotted stub ending in the gap of the spine
// where its other end lies, or is left out with [Options].OmitLeaving. The
// SVG says what part is drawn, in its desc element and in the legend, with
// the counts of vertices and edges drawn, stubbed and left out, and each
// drawn vertex label carries its 1-based spine position in data-pos.
//
// draw trusts the layout only as far as its shape: every vertex must be on
// the spine once and every edge must have a page in 1..Pages(). It does not
// check for crossings or nestings (cert.Validate does); a layout with
// conflicts is drawn as it is. Output is deterministic.
package draw
