package cubejob

import (
	"os"
	"testing"

	"spinecert.dev/internal/fixture/backends"
)

func TestMain(m *testing.M) {
	backends.ServeChild()
	os.Exit(m.Run())
}
