package cubejob

import "errors"

// ErrBadWork is wrapped when a work directory is incomplete, altered or
// of another claim; the message names the file and, for results, the cube.
var ErrBadWork = errors.New("cubejob: bad work directory")

// ErrRefuted is wrapped when a cube is satisfiable: a layout was found and
// checked directly, so the claim that none exists is refuted.
var ErrRefuted = errors.New("cubejob: the claim is refuted")

// ErrSubgraphLayout is wrapped when a cube of a job on a subgraph is
// satisfiable: the subgraph has a layout, so this job cannot refute the
// graph (whose claim is then still open).
var ErrSubgraphLayout = errors.New("cubejob: the subgraph has a layout")

// ErrIncomplete is wrapped by Gather when some cube has no finished result.
var ErrIncomplete = errors.New("cubejob: cubes without a finished result")

// ErrBusy is wrapped when a Slurm job of the work directory is still queued
// or running, so submitting again would run its cubes twice.
var ErrBusy = errors.New("cubejob: a job of this work directory is still in the queue")
