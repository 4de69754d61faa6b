package archive_test

import (
	"bytes"
	"context"
	"fmt"
	"io"

	"spinecert.dev/archive"
)

// A bundle is written from named members and read back member by member;
// SHA256SUMS comes first and every hash is checked on the way. (The hashes
// below are those GNU coreutils sha256sum prints for the two contents.)
func ExampleWalk() {
	var b bytes.Buffer
	err := archive.Write(context.Background(), &b, []archive.Source{
		archive.BytesSource("notes/b.txt", []byte("second\n")),
		archive.BytesSource("notes/a.txt", []byte("first\n")),
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	c, err := archive.Walk(context.Background(), &b, "example"+archive.Suffix, archive.DefaultLimits(),
		func(m archive.Member, r io.Reader) error {
			data, err := io.ReadAll(r)
			fmt.Printf("%s: %q\n", m.Name, data)
			return err
		})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s", c.Sums)
	// Output:
	// notes/a.txt: "first\n"
	// notes/b.txt: "second\n"
	// b640e840b19d378660b32fb51ae18d67dccb4a8596a29e7bd72c1b2ae5928f41  notes/a.txt
	// 480c2336b410f1ad5f8bf1b28944490255804b65350c527787e74ebdd511e3a4  notes/b.txt
}
