package cubejob

import (
	"encoding/json"
	"os"
	"path/filepath"
	"testing"
)

// FuzzParseJob: the job reader never panics, and a job it accepts writes
// back to JSON that it reads again as the same job.
func FuzzParseJob(f *testing.F) {
	seed, err := os.ReadFile(filepath.Join("testdata", "job.json"))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(seed)
	f.Add([]byte(`{"format":"spinecert-cube-job","Format":"x"}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		job, err := parseJob(data, "job.json")
		if err != nil {
			return
		}
		out, err := json.Marshal(job)
		if err != nil {
			t.Fatal(err)
		}
		again, err := parseJob(out, "again")
		if err != nil {
			t.Fatalf("a job read back from its own JSON is refused: %v", err)
		}
		out2, _ := json.Marshal(again)
		if string(out) != string(out2) {
			t.Fatal("job round trip changed it")
		}
	})
}

// FuzzParseResult: as FuzzParseJob, for result files.
func FuzzParseResult(f *testing.F) {
	seed, err := os.ReadFile(filepath.Join("testdata", "result.json"))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(seed)
	f.Fuzz(func(t *testing.T, data []byte) {
		r, err := parseResult(data, "r.json")
		if err != nil {
			return
		}
		out, err := json.Marshal(r)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := parseResult(out, "again"); err != nil {
			t.Fatalf("a result read back from its own JSON is refused: %v", err)
		}
	})
}

func TestParseJobSeed(t *testing.T) {
	data, err := os.ReadFile(filepath.Join("testdata", "job.json"))
	if err != nil {
		t.Fatal(err)
	}
	job, err := parseJob(data, "job.json")
	if err != nil {
		t.Fatal(err)
	}
	if job.Claim.Pages != 3 || job.Cubes.Count != 16 || job.Cubes.Shape != ShapeTree {
		t.Fatalf("job %+v", job)
	}
	for _, bad := range []string{
		`{"format":"spinecert-cube-job","format":"x"}`,
		string(data) + "{}",
		`{"format":"other","format_version":1}`,
	} {
		if _, err := parseJob([]byte(bad), "job.json"); err == nil {
			t.Errorf("accepted %.60q", bad)
		}
	}
}
