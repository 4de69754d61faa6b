// Package cert checks layouts directly: spinecert's positive-result checker.
//
// A [Layout] puts the vertices of a [graph.Graph] on a spine and every edge on
// a page. A stack page holds no two crossing edges (never a < c < b < d in
// spine positions), a queue page no two nested edges (never a < c < d < b).
// Layouts are read and written in spinecert's JSON layout format
// ([ReadLayoutFile], [WriteLayoutJSON]; the fields are described in the
// README). [Resolve] matches a layout read from a file with the graph, and
// [Validate] scans every page in O(m log m) time; [Check] does both. The
// [Report] lists every problem with a witness, not only the first.
//
// What it trusts: the graph model of package graph and its own code. It
// trusts nothing in the layout: every vertex and edge of the graph must be
// placed exactly once. The checker is cross-checked in the tests against a
// brute-force O(m²) scan of every pair of edges on thousands of random layouts.
package cert
