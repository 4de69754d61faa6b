// Package verify runs solver backends on CNF formulas and applies the
// verdict policy: which answers, models and checked proofs decide a claim.
//
// Proofs are checked by package proof ([proof.CheckRefutation]); this
// package trusts those checkers and the model check, nothing a solver says.
//
// # Solvers
//
// [Solver] backends run behind one interface; an answer they give is a claim
// until a model is checked against the formula or a proof passes the
// checkers above. gini runs in process; gophersat runs in a child spinecert
// process (its search cannot be interrupted) that is killed with its process
// group at the time limit; external solvers (cadical, kissat, minisat, or
// any command line) are read by the SAT competition output conventions and
// must exit 10 or 20 to match their answer. A crash, a time-out, output that
// breaks the conventions or an exit status against the answer is UNKNOWN;
// a model that violates a clause marks its backend suspect.
//
// # Verdicts (Decide)
//
// [Decide] trusts the model check and the two proof checkers, nothing else. A
// checked model decides "satisfiable" ([DecideLayout] then decodes it and
// checks the layout directly with cert.Validate). "Unsatisfiable" needs
// UNSAT from at least two differently named backends and at least one of
// their proofs accepted by proof.CheckDRAT and, on the LRAT it writes, by
// proof.CheckLRAT ([DefaultPolicy]). A suspect backend, or a model beside an UNSAT
// claim, is a conflict and no verdict. Package pagenumber builds on this: its upper
// bound is always a directly checked layout; its lower bound is a counting
// or Kuratowski argument (the Kuratowski subgraph checked by
// planarcert.CheckKuratowski) or an "unsatisfiable" verdict for one page fewer.
package verify
