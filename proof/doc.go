// Package proof is spinecert's trusted core for refutations: it reads DRAT
// and LRAT proofs, checks them with checkers of spinecert's own, and writes
// LRAT. [CheckRefutation] checks a refutation end to end (DRAT checker, then
// the LRAT checker on the LRAT it wrote); package verify calls it on solver
// proofs and package archive on the proofs in bundles. Nothing here runs a
// solver.
//
// # Proof formats
//
// DRAT text and binary are specified by Wetzler, Heule, Hunt, "DRAT-trim:
// Efficient Checking and Trimming Using Expressive Clausal Proofs" (SAT
// 2014). A text step is an optional "d", literals, and 0; lines starting
// with "c" are comments. A binary step is the byte 'a' (addition) or 'd'
// (deletion), literals as unsigned LEB128 numbers 2*v+sign (sign 1 for a
// negative literal) and a 0 byte. [DetectFormat] tells them apart: a proof
// is binary when one of its first 1024 bytes is neither printable ASCII nor
// white space. "rup" names DRAT text without deletions whose lemmas must all
// be RUP. Proofs may be plain, gzip or zstd (dimacs.Decompress, which
// refuses more than 1000 decompressed bytes per compressed byte beyond the
// first 64 MiB).
//
// # Size of a step
//
// Both readers stream a step literal by literal (LRAT hints are checked as
// they are read, so no hint list is held) and refuse a step, DRAT addition
// or deletion or LRAT lemma, of more than 2·V+16 literals as written,
// repeats included, where V is the number of variables the formula and the
// proof have mentioned before it (DRAT: the variables the checker keeps in
// place, bounded by the formula's size, plus every other variable a step
// named; LRAT: the same with the lemmas read). A clause without repeated
// literals has at most two literals per variable, tautologies included, and
// a lemma may introduce new variables (RAT allows it), each adding one; so a
// lemma that repeats no literal and is no tautology is refused only when it
// introduces more than V+16 new variables at once. The refusal is a read
// error (a *textpos.Error at the literal that went over), not a rejection,
// and it keeps the memory of one step in proportion to what was read before.
//
// LRAT text is specified by Cruz-Filipe, Heule, Hunt, Kaufmann,
// Schneider-Kamp, "Efficient certified RAT verification" (CADE 2017): "id
// lits 0 hints 0" and "id d ids 0".
//
// # The DRAT checker ([CheckDRAT])
//
// It trusts the DIMACS reader for the formula and its own code: the proof
// reader, unit propagation with two watched literals, and conflict analysis.
// It trusts nothing the solver says. A lemma is accepted when it is RUP
// (assigning its negation and propagating yields a conflict) or, failing
// that, RAT on its first literal p as written (every resolvent on p with a
// current clause containing -p is RUP). A proof is accepted only when it
// adds the empty clause and the empty clause is RUP where it stands (unit
// propagation refutes the formula and the lemmas before it); a proof that
// never states the empty clause is rejected even when propagation would
// refute the formula with its lemmas. The one exception is a formula that
// unit propagation refutes by itself, before any lemma: that is a complete
// refutation, any proof is accepted for it (solvers write an empty proof
// then), and the LRAT written for it is the single empty-clause step.
//
// Deletions are matched by a hash of the clause's literal set. Like
// drat-trim in its default mode, the checker ignores a deletion of a clause
// that is the reason of a unit at the top level at that moment (counted in
// DRATResult.IgnoredDeletions) and a deletion that names no current clause
// (MissingDeletions). Ignoring a deletion keeps more clauses and so can only
// make more lemmas pass; the refutation is still sound because every kept
// clause is an original clause or a lemma that is itself checked when used.
//
// Backward mode (the default) first propagates forward through the proof,
// recording its steps, up to the first top-level conflict; lemmas after it
// are not checked. It then walks back, marking as core only the clauses
// that the conflict and the checks of core lemmas used, and checks only the
// core lemmas. Forward mode checks every lemma in proof order and keeps no
// record of the steps; deleted clauses are freed. Memory is linear in the
// clauses of the formula and the proof, and follows the variables used, not
// their numbers (any variable up to 2^31-1 is allowed); counters are 64-bit.
// Clauses live in flat arrays of 32-bit words (literals, offsets, hash
// chains, flags) made at the formula's size before it is loaded, and a watch
// is two words, so a clause of three literals costs 25 bytes, 16 more for
// its two watches and 4 to 8 in the hash table of deletions; the checker holds at most 2^31-2 clauses and 2^32-1 literals
// at once and says so in an error beyond that. It keeps no reference to the
// caller's formula once it is loaded. A RAT check
// scans the current clauses for the negated pivot, so proofs with many RAT
// lemmas cost time proportional to their number times the formula size.
//
// With DRATOptions.LRAT the checked proof is written as LRAT: RUP hints in
// the order propagation used them, the falsified clause last; RAT lemmas with
// one group "-j hints" per clause j containing the negated pivot, each group
// complete on its own. In backward mode only core lemmas are written.
//
// # Trimmed proofs
//
// With DRATOptions.Trimmed (RefutationOptions.TrimmedPath) an accepted
// proof is also written trimmed, as binary DRAT: the core lemmas in proof
// order (the first literal as written, the RAT pivot, first, the others by
// variable), the deletions that took effect of formula clauses and core
// lemmas, and the empty clause; lemmas after the refutation and deletions
// the checker ignored are left out. In a proof without RAT lemmas, a core
// lemma is written shrunk to the literals whose negations its check's
// conflict analysis reached, when that drops some (assigning just those
// negations propagates the same implication graph to the same conflict, so
// the shrunk lemma is RUP there, and it subsumes the lemma, so every later
// check that used the lemma still propagates at least as much; a RAT check
// could lose a resolvent literal, hence not with RAT lemmas; deletions of
// the lemma name the shrunk clause). Trimming is not trusted: whoever keeps a
// trimmed proof checks it again with [CheckRefutation], as package archive
// does. Why it passes that check: unit propagation is monotone (more clauses
// never stop it from reaching a conflict), and every clause that a core
// lemma's check and the final conflict used is a formula clause or a core
// lemma, present at that point of the trimmed proof, so every RUP check and
// every resolvent check still succeeds; the clauses holding the negated
// pivot of a RAT lemma are a subset of those in the original check, except
// where a deletion the checker ignores in the trimmed proof keeps a clause,
// and then the re-check decides.
//
// # The LRAT checker ([CheckLRAT])
//
// A second, deliberately small checker in its own file, sharing no code with
// the DRAT checker beyond the DIMACS reader. It trusts the DIMACS reader and
// its own few lines; it performs no search. Each hint must be unit (its one
// unassigned literal is then set) or falsified (the check succeeds); a hint
// that is satisfied or has two unassigned literals is an error. When the
// hints before the first negative one do not reach a conflict, the lemma
// must be RAT on its first literal p: every current clause containing -p
// must have a group, and its hints must refute the negated resolvent. Clause
// ids must increase; deletions must name existing clauses; the proof must add
// the empty clause.
package proof
