//go:build linux

package main

import (
	"io"
	"os"
	"path/filepath"
	"syscall"
	"testing"

	"spinecert.dev/archive"
)

// Writing -o to a character device writes to it and leaves it a device;
// atomic writes would rename a regular file over it (as root, over
// /dev/null). The device is a null device made in a temporary directory, so
// that a failure of the test cannot touch the system's /dev/null; making it
// needs root, and the test is skipped without.
func TestWriteToDeviceKeepsDevice(t *testing.T) {
	dev := filepath.Join(t.TempDir(), "null")
	if err := syscall.Mknod(dev, syscall.S_IFCHR|0o666, 1<<8|3); err != nil { // major 1, minor 3: /dev/null on Linux
		t.Skipf("cannot make a device node: %v", err)
	}
	if err := writeFileAtomic(dev, nil, func(w io.Writer) error {
		_, err := io.WriteString(w, "p cnf 0 0\n")
		return err
	}); err != nil {
		t.Fatal(err)
	}
	if err := archive.WriteFile(t.Context(), dev, []archive.Source{archive.BytesSource("manifest.json", []byte("{}\n"))}); err != nil {
		t.Fatal(err)
	}
	fi, err := os.Lstat(dev)
	if err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		t.Fatalf("%s is no longer a character device: %v %v", dev, fi.Mode(), err)
	}
	if left, _ := filepath.Glob(filepath.Join(filepath.Dir(dev), ".*")); len(left) > 0 {
		t.Fatalf("temporary files left: %v", left)
	}
}
