// Package evidence gathers the evidence for a claim about a graph's page
// number and makes its bundle: [Make] solves what the claim needs with
// package verify (a layout for an upper bound, a checked refutation of one
// page fewer for a lower bound), or takes a layout or a proof made
// elsewhere, adds a checked planarity certificate when asked, and hands it
// all to package archive, which checks every piece again before it writes
// the bundle atomically. With Request.FindExact it finds the page number K
// first (pagenumber.Compute with a checked refutation as its lower bound)
// and bundles the claim exact K.
//
// It trusts what those packages trust and adds no check of its own: a
// layout must pass cert.Validate, a refutation must pass proof.CheckRefutation
// (twice: once when solving, once when archive builds the bundle), and the
// planarity certificate must pass planarcert.Check.
package evidence
