// Package planarcert holds planarity certificates, their JSON file format,
// and their checker.
//
// A [Cert] is either an [Embedding] (a rotation system) for a planar graph
// or a [Kuratowski] subdivision of K5 or K3,3 for a non-planar one. [Check]
// trusts nothing in it:
//   - an embedding must list every neighbour of every vertex exactly once,
//     and the faces traced from it, component by component, must satisfy
//     Euler's formula V − E + F = 2C (a rotation system of genus 0 is a
//     planar embedding);
//   - a Kuratowski subgraph must have branch vertices and one path per edge
//     of K5 or K3,3, internally disjoint, every step an edge of the graph.
//
// This package imports only the graph model and the position errors, so the
// compiler keeps it apart from the planarity test in package planar that
// finds the certificates: the checker shares no code with the finder (a
// test in internal/layers enforces the imports).
//
// The file format ([Write], [Read]) is spinecert's own JSON object, format
// tag [Format], version [Version]; the README lists its fields.
package planarcert
