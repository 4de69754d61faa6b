// Package cubejob runs a refutation split into cubes: a work directory that
// spinecert split makes, spinecert conquer fills (on this machine or as a
// Slurm job array) and spinecert gather turns into one evidence bundle.
//
// # The work directory (job format spinecert-cube-job version 1)
//
//	job.json       the claim (graph identity, kind, refuted pages), the
//	               encoder version and options, and the SHA-256 of every
//	               file below; its own SHA-256 is the job ID
//	graph.txt      the graph, spinecert's canonical edge list
//	subgraph.txt   the subgraph the CNF encodes, when the claim was narrowed
//	formula.cnf    the CNF, as spinecert's encoder writes it
//	cubes.txt      the cubes, "a LIT … 0" per line (package cube)
//	results/       NNNNNN.json and its proof, one per finished cube
//	failures/      the reason of the last undecided attempt per cube
//	slurm/         submit-NNN.json (the cubes of one job array), its script and task logs
//	tmp/           per-cube scratch space
//	refuted.json   a satisfiable cube, with layout.json
//
// job.json is written last, so a directory without it is not a work
// directory. [Open] trusts nothing in it: the graph is read and its identity
// compared with the claim, the subgraph is checked to be one, the CNF is
// encoded again by this spinecert and compared by hash, the cubes are read
// and hashed.
//
// # What a result means, and when it is written
//
// [Work.SolveCube] decides formula ∧ cube (the cube's literals as unit
// clauses) with [verify.DecideCNF] under the verdict policy: UNSAT from two
// independent backends and a proof accepted by spinecert's DRAT checker and
// the LRAT re-check of its output. Only then are the proof and the result
// written, each through a temporary file renamed into place, the result
// last; a task killed at any moment leaves the cube either with a complete
// result or without one, and a cube without one is simply run again. A
// result names the job ID, the cube's number and its literals, so a result
// copied from another work directory or for another cube is not taken. A
// satisfiable cube is decoded into a layout, which must pass cert.Validate,
// and ends the job: the claim is refuted ([ErrRefuted]); for a job on a
// subgraph it only shows that the subgraph has a layout ([ErrSubgraphLayout]).
//
// # Gathering
//
// [Work.Evidence] checks, before anything is written, that every cube has
// a result of this job with the recorded proof hash and UNSAT runs from
// enough backends, and coverage: cubes from split are the leaves of a
// decision tree (cube.CheckTree); cubes given from elsewhere must be
// pairwise disjoint (cube.CheckDisjoint) and their coverage formula refuted
// by the solvers with a proof spinecert's checkers accept. archive.Build
// then checks every cube's proof again against formula ∧ cube, and the
// bundle records the cubes, the proofs and the coverage evidence, which
// archive.Verify re-checks from scratch. The results' solver answers are
// records of the run; the bundle's claim rests on the proofs and the
// coverage check alone (see package cube for the argument).
//
// # Slurm
//
// [Work.Submit] writes the cubes without a result to slurm/submit-NNN.json
// and submits one job array with sbatch, each array task running
// "spinecert conquer DIR --array-task T --submission NNN" on its slice
// ([Work.ArrayTask]). It refuses while an earlier job of the directory is
// still in the queue ([ErrBusy]), so no cube runs twice at once; two tasks
// that still decide the same cube write the same kind of result to the same
// name, and the last rename wins: nothing is counted twice.
package cubejob
