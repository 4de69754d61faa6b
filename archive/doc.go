// Package archive makes and re-checks spinecert evidence bundles.
//
// A bundle is one file, NAME.spinecert.tar.zst: a tar stream (POSIX ustar,
// IEEE Std 1003.1-1988, as written by the standard library's archive/tar)
// compressed as one zstd frame (RFC 8878), so `tar --zstd -xf` opens it
// without spinecert. Its first member is SHA256SUMS, in the format GNU coreutils
// `sha256sum -c` reads (one "<64 lowercase hex>  <name>" line per member,
// sorted by name); then every other member sorted by name. Members have mode
// 0644, owner and group 0 with empty names and modification time Unix 0; the
// zstd settings are fixed (see [Settings]), so the same members always give
// the same bytes with a given version of github.com/klauspost/compress.
//
// What the reader trusts: nothing. [Walk] streams a bundle member by member and
// rejects, each with a *[BundleError] of a distinct kind, anything but regular
// files with safe relative names (no absolute paths, no "..", no links,
// devices or directories), duplicates, members out of order, members not
// listed in SHA256SUMS or listed but absent, hash mismatches, members over
// [MaxMemberSize], more than [MaxTotalSize] decompressed bytes, a compression
// ratio over [MaxRatio] (decompression bombs), truncated input and data after
// the end of the archive. It also re-compresses what it read and reports
// whether the file is byte for byte what spinecert would write (Canonical), so a
// changed byte that zstd would ignore is still noticed. [Extract] never writes
// outside its target directory (it writes through an os.Root) and leaves
// nothing behind when the bundle is bad.
//
// The manifest (manifest.json, schema [FormatName] version [FormatVersion], see
// the [Manifest] type) states the claim — graph identity (graph.Graph.ID),
// layout kind, page kinds, and at_most K (evidence: a layout), at_least K
// (evidence: a refutation of K-1 pages) or exact (both) — and the evidence:
// encoder version and options, the SHA-256 of the CNF as spinecert writes it,
// the solver runs, each proof with its format, size, hash and checker
// result, and every member with its size and hash. It is read strictly
// (unknown fields, trailing data and inconsistencies are errors). No
// wall-clock time is recorded unless the caller gives one (Created), and no
// solver run time (bundles of earlier versions hold them and still read), so
// building the same claim twice gives the same bytes.
//
// [Build] stores a DRAT proof trimmed to the lemmas its backward check used
// (see package proof) when the same checkers, proof.CheckRefutation, accept
// the trimmed proof again from scratch and it is smaller; the manifest then
// records the proof it came from (trimmed_from: size, SHA-256, lemmas and
// core lemmas). A trimmed proof is a proof like any other for [Verify]: it
// refutes the same CNF or it fails. Manifests with trimmed_from are not
// read by spinecert versions before it.
//
// [Verify] re-checks a bundle from scratch and streams it once: layouts with
// cert.Check; proofs (binary DRAT as stored; text DRAT given to [Build] is
// converted to binary) with proof.CheckDRAT, whose LRAT output is checked
// again by proof.CheckLRAT, against the CNF rebuilt from the graph by the
// current encoder. When the current encoder gives another CNF for the claim
// (encoder drift), the report says so with both versions; the CNF is then
// rebuilt with the recorded version if the encoder can still reproduce it
// (dimacs.EncodeVersion), else the bundle fails unless the caller's Resolve
// re-solves the current encoding. A proof for a CNF spinecert did not make
// (foreign) is checked against that CNF but never establishes the claim.
package archive
