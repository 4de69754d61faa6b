// Package pagenumber finds the exact page number (or queue number) of a
// graph with evidence on both sides.
//
// [Compute] takes its upper bound from a layout that passed the direct check
// (cert.Validate): first one found without a solver, then layouts decoded
// from solver models. Its lower bound is the best of:
//   - theorem-based bounds ([Bound]), each naming its theorem: a graph with
//     more than (k+1)n − 3k edges needs more than k pages; a graph that is
//     not planar needs more than 2 pages and one that is not outerplanar more
//     than 1 (Bernhart and Kainen, "The book thickness of a graph", JCTB 27,
//     1979), non-planarity shown by a Kuratowski subgraph that the
//     independent checker planarcert.Check accepted;
//   - a refutation of one page fewer decided by verify.DecideLayout (two
//     solvers answering UNSAT and a proof accepted by package proof).
//
// The bounds are also applied to every block (biconnected component), since
// a layout of the graph restricts to a layout of each block.
package pagenumber
