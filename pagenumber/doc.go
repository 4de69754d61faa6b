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
//     independent checker planarcert.Check accepted; a maximal planar graph
//     (3n − 6 edges, a checked planar embedding) with a set S of vertices
//     whose removal leaves more than |S| components needs 3 pages, since on
//     2 pages it would be Hamiltonian (Bernhart and Kainen 1979) and a
//     Hamiltonian graph is 1-tough (Chvátal, "Tough graphs and Hamiltonian
//     circuits", Discrete Math. 5, 1973) — the set is found by a greedy
//     search here and accepted only by the separate checker toughcert.Check;
//   - a refutation of one page fewer decided by verify.DecideLayout (two
//     solvers answering UNSAT and a proof accepted by package proof).
//
// The bounds are also applied to every block (biconnected component), since
// a layout of the graph restricts to a layout of each block.
//
// The order keeps solver calls few on large graphs: the theorem-based lower
// bounds first (linear or near-linear time), then the heuristic layout; when
// they meet, no solver runs. Otherwise the first solver step asks for a
// layout on one page fewer than the best layout so far — the one refutation
// a matching lower bound needs — and only when it finds a layout does the
// next step go one page further down.
package pagenumber
