package cubejob

import (
	"context"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

// Status is the state of a work directory's cubes.
type Status struct {
	Total     int
	Done      int // a finished, checked result
	Failed    int // no result, and the last attempt ended undecided
	Running   int // no result, in an array task squeue reports running
	Queued    int // no result, in an array task squeue reports pending
	Remaining int // no result and not in the queue (Failed included)
	Refuted   *RefutedRecord
	Tasks     []TaskState // what squeue reports for the directory's jobs
	QueueErr  error       // why squeue could not be asked (nil when it was, or no job was submitted)
	Scratch   int         // scratch directories of tasks that are running, or were killed
	CPU       float64     // solver CPU seconds of the done cubes
}

// Status reads the work directory and, when jobs were submitted, the
// queue. It counts every cube in exactly one of Done, Running, Queued or
// Remaining.
func (w *Work) Status(ctx context.Context, squeue string) *Status {
	st := &Status{Total: len(w.Cubes)}
	st.Refuted, _ = w.ReadRefuted()
	subs, _ := w.Submissions()
	if len(subs) > 0 {
		st.Tasks, st.QueueErr = w.Queue(ctx, subs, squeue)
	}
	inTask := map[int]string{} // cube -> scheduler state
	for _, ts := range st.Tasks {
		job, task, ok := strings.Cut(ts.ID, "_")
		if !ok {
			continue
		}
		t, err := strconv.Atoi(task)
		if err != nil {
			continue
		}
		for _, s := range subs {
			if s.SlurmID == job && t < s.Tasks() {
				for _, i := range s.Slice(t) {
					inTask[i] = ts.State
				}
			}
		}
	}
	for i := range w.Cubes {
		if r, err := w.ReadResult(i, false); err == nil {
			st.Done++
			st.CPU += r.CPUSeconds
			continue
		}
		switch inTask[i] {
		case "RUNNING", "COMPLETING":
			st.Running++
			continue
		case "PENDING", "CONFIGURING":
			st.Queued++
			continue
		}
		st.Remaining++
		if _, err := os.Stat(filepath.Join(w.Dir, FailuresDir, resultName(i))); err == nil {
			st.Failed++
		}
	}
	if entries, err := os.ReadDir(filepath.Join(w.Dir, TmpDir)); err == nil {
		st.Scratch = len(entries)
	}
	return st
}
