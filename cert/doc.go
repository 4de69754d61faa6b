// Package cert holds spinecert's graphs and layouts and checks layouts directly.
//
// A graph.Graph is simple and undirected with labelled vertices, numbered in
// canonical label order so that its identity (graph.Graph.ID) depends only on the
// labels and the edge set. Readers accept edge lists, the DIMACS graph format
// (DIMACS Clique and Coloring Problems graph.Graph graph.Format, 1993) and graph6/sparse6
// (B. McKay, formats.txt).
//
// A Layout puts the vertices on a spine and every edge on a page. A stack page
// holds no two crossing edges (never a < c < b < d in spine positions), a
// queue page no two nested edges (never a < c < d < b). The checker trusts
// nothing in the layout: it matches vertices and edges against the graph and
// scans every page in O(m log m) time, reporting each problem with a witness.
//
// planar.Decide is decided by the left-right planarity test (U. Brandes, "The
// Left-Right planar.Decide Test", 2009), written for spinecert and linear in the size
// of the graph. Its answers come with certificates — a rotation system for a
// planar graph, a subdivision of planarcert.K5 or K3,3 otherwise — and each certificate
// is checked by planar_cert_check.go, which uses only the graph.Graph API and
// shares no code with the test that found it.
package cert
