// Package dimacs reads and writes DIMACS CNF and encodes layout claims about
// graphs as CNF formulas.
//
// # CNF input and output
//
// The format is the one of the DIMACS Challenge ("Satisfiability Suggested
// Format", 1993) as used by the SAT competitions: optional comment lines
// starting with "c", one header line "p cnf VARS CLAUSES", then clauses as
// signed decimal integers, each clause ended by 0 and free to span lines.
// Parse streams a formula to a Visitor; input compressed with gzip (RFC 1952)
// or zstd (RFC 8878) is recognised by its magic bytes and decompressed on the
// fly. Strict mode, the default, enforces the header counts and the variable
// range; lenient mode accepts what solvers commonly accept and reports every
// thing it forgave through ReadOptions.Warn. Errors in the input are
// *cert.ParseError values carrying file, line and column. Numbers that do not
// fit in an int32 are rejected in both modes. The parser trusts nothing in its
// input and never allocates more than the input justifies.
//
// Writer writes the same format; CNF.WriteTo writes a whole formula.
package dimacs
