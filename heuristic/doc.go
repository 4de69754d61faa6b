// Package heuristic finds stack and queue layouts of large graphs quickly,
// without a SAT solver. The page counts it reaches are upper bounds only: a
// layout it returns is a claim to be checked (cert.Validate), and it says
// nothing about whether fewer pages would do.
//
// The method has two stages. First, several spine orders are tried: the
// input order, depth-first orders (good for stack layouts: a long DFS path
// puts the tree edges on one page) and breadth-first orders (good for queue
// layouts: Heath, Leighton and Rosenberg, "Comparing queues and stacks as
// mechanisms for laying out graphs", SIAM J. Discrete Math. 5(3), 1992, lay
// out every tree in one queue with a BFS order). Second, for each order the
// edges are put on pages by a sweep over the spine, never by building the
// quadratic conflict graph:
//
//   - stack pages: edges sorted by left end ascending and right end
//     descending go first-fit onto pages, each page a stack of open arcs
//     (O(m·k) for k pages); a second pass takes edges longest first and asks
//     a segment tree per page whether an edge crosses the page; then edges of
//     the highest page are moved down, directly or by displacing one blocking
//     edge to another page;
//   - queue pages: for a fixed spine the least number of queues is the
//     longest chain of nested edges (Mirsky's theorem for the nesting order),
//     and the sweep assigns every edge 1 + the highest page of an edge
//     nesting over it, with a Fenwick tree over right ends (O(m log n)).
//
// On planar graphs the candidates include orders taken from the embedding:
// for queue layouts a breadth-first order that runs each layer around the
// one before, for stack layouts a ring-by-ring order (peelOrder): the
// breadth-first layers from a root, each vertex placed below its neighbour
// in the layer before that comes first on the spine, siblings in rotation
// order, the whole in preorder, so that the tree edges nest and the edges
// between two rings mostly run side by side. Neither carries a page bound.
//
// Complete graphs get the classical ⌈n/2⌉-page stack layout (Bernhart and
// Kainen, "The book thickness of a graph", J. Combin. Theory Ser. B 27, 1979).
//
// Results are deterministic for a given [Options.Seed] and Options.Candidates
// unless Options.TimeLimit cuts the search short.
package heuristic
