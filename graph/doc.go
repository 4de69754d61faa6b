// Package graph is spinecert's graph model and its four file formats.
//
// A [Graph] is simple and undirected with labelled vertices, numbered in
// canonical label order so that its identity ([Graph.ID]) depends only on
// the labels and the edge set. A [Builder] collects labels and edges;
// [Graph.Blocks] gives the biconnected components.
//
// [Read] and [ReadFile] accept, with the format detected from the content
// ([DetectFormat]):
//   - edge lists (one edge per line, spinecert's own plain format);
//   - the DIMACS graph format (DIMACS Clique and Coloring Problems Graph
//     Format, 1993): "p edge N M" and "e U V" lines;
//   - graph6 and sparse6 (B. McKay, formats.txt), with optional headers and
//     the long size forms.
//
// Every reader reports bad input as a [*textpos.Error] with file, line and
// column, never panics, and sizes its memory by the input's real content.
// [WriteEdgeList], [WriteDIMACS], [WriteGraph6] and [WriteSparse6] write
// what the readers read back to the same graph.
package graph
