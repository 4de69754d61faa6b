// Package archive makes and re-checks quire evidence bundles.
//
// A bundle is one file, NAME.quire.tar.zst: a tar stream (POSIX ustar,
// IEEE Std 1003.1-1988, as written by the standard library's archive/tar)
// compressed as one zstd frame (RFC 8878), so `tar --zstd -xf` opens it
// without quire. Its first member is SHA256SUMS, in the format GNU coreutils
// `sha256sum -c` reads (one "<64 lowercase hex>  <name>" line per member,
// sorted by name); then every other member sorted by name. Members have mode
// 0644, owner and group 0 with empty names and modification time Unix 0; the
// zstd settings are fixed (see Settings), so the same members always give
// the same bytes with a given version of github.com/klauspost/compress.
//
// What the reader trusts: nothing. Walk streams a bundle member by member and
// rejects, each with a *BundleError of a distinct kind, anything but regular
// files with safe relative names (no absolute paths, no "..", no links,
// devices or directories), duplicates, members out of order, members not
// listed in SHA256SUMS or listed but absent, hash mismatches, members over
// MaxMemberSize, more than MaxTotalSize decompressed bytes, a compression
// ratio over MaxRatio (decompression bombs), truncated input and data after
// the end of the archive. It also re-compresses what it read and reports
// whether the file is byte for byte what quire would write (Canonical), so a
// changed byte that zstd would ignore is still noticed. Extract never writes
// outside its target directory (it writes through an os.Root) and leaves
// nothing behind when the bundle is bad.
//
// The manifest (manifest.json) states the claim and the evidence; its
// schema is described in manifest.go and checked strictly on reading.
package archive
