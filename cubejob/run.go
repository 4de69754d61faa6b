package cubejob

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"sync"
)

// Event reports the end of one cube in RunCubes.
type Event struct {
	Cube    int // 0-based
	Outcome Outcome
	Detail  string // the reason of a failure
}

// Summary counts what RunCubes did.
type Summary struct {
	Done, Skipped, Failed int
	// Refuted is set (wrapping ErrRefuted or ErrSubgraphLayout) when a cube
	// was satisfiable; the remaining cubes were then not run.
	Refuted error
}

// RunCubes decides the cubes with the given 0-based indices, jobs at a
// time, and stops early (cancelling the cubes being decided) once one is
// satisfiable or refuted.json appears (written by another task). Cubes
// that already have a result are skipped. report, when not nil, is called
// after each cube, from one goroutine at a time.
func (w *Work) RunCubes(ctx context.Context, indices []int, jobs int, opt SolveOptions, report func(Event)) (Summary, error) {
	jobs = max(1, jobs)
	w.CleanScratch(false)
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	var (
		mu      sync.Mutex
		sum     Summary
		firstEr error
		wg      sync.WaitGroup
	)
	next := make(chan int)
	for range jobs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				if w.refutedExists() {
					cancel()
					continue
				}
				out, detail, err := w.SolveCube(ctx, i, opt)
				mu.Lock()
				switch {
				case IsRefuted(err):
					if sum.Refuted == nil {
						sum.Refuted = err
					}
					cancel()
				case err != nil && ctx.Err() != nil:
					// cancelled: the cube stays remaining
				case err != nil:
					if firstEr == nil {
						firstEr = err
					}
					cancel()
				default:
					switch out {
					case Done:
						sum.Done++
					case Skipped:
						sum.Skipped++
					case Failed:
						sum.Failed++
					}
					if report != nil {
						report(Event{Cube: i, Outcome: out, Detail: detail})
					}
				}
				mu.Unlock()
			}
		}()
	}
feed:
	for _, i := range indices {
		select {
		case next <- i:
		case <-ctx.Done():
			break feed
		}
	}
	close(next)
	wg.Wait()
	if sum.Refuted == nil && firstEr == nil {
		if rec, err := w.ReadRefuted(); err == nil && rec != nil {
			sum.Refuted = refutedErr(w, rec)
		}
	}
	if firstEr != nil {
		return sum, firstEr
	}
	if sum.Refuted == nil && ctx.Err() != nil && !errors.Is(ctx.Err(), context.Canceled) {
		return sum, ctx.Err()
	}
	return sum, nil
}

func (w *Work) refutedExists() bool {
	_, err := os.Stat(filepath.Join(w.Dir, RefutedFile))
	return err == nil
}
