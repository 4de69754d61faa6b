// Package toughcert holds certificates that a maximal planar graph needs at
// least three stack pages, and their checker.
//
// A [Cert] is a planar rotation system of the graph G and a set S of its
// vertices. [Check] trusts nothing in it and accepts when
//   - G has n ≥ 3 vertices and exactly 3n − 6 edges, and the rotation
//     system passes planarcert.CheckEmbedding: a simple planar graph has at
//     most 3n − 6 edges (Euler's formula), so no edge can be added to G
//     keeping it planar — G is maximal planar;
//   - S is non-empty, its vertices are valid and distinct, and G − S has
//     more than |S| connected components, counted here by a union-find of
//     this package's own ([CheckSet] checks this part alone).
//
// Why this shows that G needs three pages. Suppose G had a layout on at
// most two stack pages, with spine order v1, …, vn. Add the edges
// v1v2, …, v(n−1)vn and vnv1 to the first page: no edge can cross one
// joining spine neighbours, nor one joining the two spine ends, so the
// layout stays a 2-page layout, and a graph with a 2-page layout is planar
// (Bernhart and Kainen, "The book thickness of a graph", JCTB 27, 1979:
// book thickness at most 2 iff subhamiltonian planar). G is maximal planar
// and simple, so those edges were in G already: v1…vn is a Hamiltonian
// cycle of G. Removing a non-empty set S from a cycle through every vertex
// leaves at most |S| paths, and G − S contains them as a spanning subgraph,
// so G − S has at most |S| components: a Hamiltonian graph is 1-tough
// (Chvátal, "Tough graphs and Hamiltonian circuits", Discrete Math. 5,
// 1973). A set S whose removal leaves more than |S| components therefore
// rules out two pages (and one).
//
// The empty set is rejected: G itself is one component, more than zero,
// and the argument above needs S non-empty.
//
// This package imports only the graph model and the planarity certificate
// checker, and shares no code with the search for S in package pagenumber
// (a test in internal/layers enforces the imports).
package toughcert
