// Package cube splits a CNF formula into cubes and checks that a set of
// cubes covers every assignment, the two facts a split proof rests on.
//
// A cube is a conjunction of literals. Let F be a formula over the
// variables 1 … V and c₁ … cₙ cubes over the same variables. If every
// assignment α of 1 … V satisfies some cube (coverage) and every F ∧ cᵢ is
// unsatisfiable, then F is unsatisfiable: a model α of F would satisfy
// some cᵢ and so be a model of F ∧ cᵢ. Nothing else is needed for
// soundness; disjointness (no assignment satisfies two cubes) only keeps
// the work from being done twice.
//
// # Cube files
//
// One cube per line, "a LIT … 0": the letter a, the literals as non-zero
// DIMACS integers, a closing 0 (the convention cube-and-conquer tools
// share; "a" for assumptions). Lines starting with c are comments. [Read]
// rejects everything else with the file, line and column, and refuses a
// cube that repeats a variable.
//
// # Coverage by shape: the decision-tree check (spinecert-cover-tree-1)
//
// [CheckTree] accepts a set S of cubes, each written root first, when S
// is the set of leaves of a complete binary decision tree:
//
//   - S = {ε} (one empty cube), or
//   - every cube in S has a first literal on one and the same variable v,
//     S⁺ = {c : c = v·c′} and S⁻ = {c : c = ¬v·c′} are both non-empty, and
//     the tails {c′} of S⁺ and of S⁻ are again such sets.
//
// Claim: then every assignment α satisfies exactly one cube of S. By
// induction on the length of the longest cube. For S = {ε} the empty
// cube holds under every α, and it is the only cube. Otherwise, if
// α(v) = true, no cube of S⁻ holds (its first literal is false); the cubes
// of S⁺ hold under α exactly when their tails do, and by induction exactly
// one tail does. The case α(v) = false is symmetric. The check visits every
// literal once. A cube that is a prefix of another (both hold wherever the
// longer does) or a repeated cube is reported as an overlap.
//
// # Coverage by proof
//
// Cubes of any shape cover the space exactly when [CoverageCNF], the
// clauses ¬cᵢ (one per cube), is unsatisfiable: an assignment satisfies
// every ¬cᵢ exactly when it satisfies no cube. A refutation of it checked
// by spinecert's DRAT and LRAT checkers is coverage evidence; a model of it
// is an uncovered assignment ([Uncovered] names it). [CheckDisjoint]
// compares the cubes pair by pair: two cubes are disjoint exactly when one
// holds a literal whose negation the other holds.
//
// # Splitting
//
// [Split] grows a complete binary decision tree by one of two rules
// ([RuleLookahead]: look-ahead scoring by unit propagation; [RuleOccurrence]:
// the most frequent free variable). Nothing the splitter computes is
// trusted: its cubes go through the checks above like any others.
package cube
