// Package planar decides planarity and finds the certificates that
// package planarcert checks.
//
// [Decide] runs the left-right planarity test (U. Brandes, "The Left-Right
// Planarity Test", 2009), written for spinecert and linear in the size of the
// graph. A planar graph gets a rotation system ([planarcert.Embedding]); a
// non-planar one a subdivision of K5 or K3,3 ([planarcert.Kuratowski]),
// found by [FindKuratowski]. Nothing here is trusted: [DecideChecked] runs
// the independent checker [planarcert.Check] on the certificate before it
// returns, and every caller that bases a verdict on planarity uses it.
package planar
