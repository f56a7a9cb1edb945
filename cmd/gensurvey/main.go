// Command gensurvey writes a large invented line survey for benchmarks and
// scale runs: the demo plant's Site, Atmospheres and Materials sheets, and N
// objects spread over stations (about 200 objects each) whose rows repeat the
// demo's object rows as patterns with their own IDs and slightly varied
// readings. Every value is invented for the demo.
//
// Usage:
//
//	go run ./cmd/gensurvey -n 1048575 -o /tmp/big.xlsx
package main

import (
	"flag"
	"fmt"
	"os"

	"github.com/sparkmargin/sparkmargin/inventory"
)

func main() {
	n := flag.Int("n", 10000, "number of objects (at most 1048575, the row limit of a sheet less the header)")
	per := flag.Int("per-station", inventory.GeneratedObjectsPerStation, "objects per station")
	out := flag.String("o", "", "survey workbook to write (required)")
	flag.Parse()
	if *out == "" || *n < 0 || *per <= 0 {
		fmt.Fprintln(os.Stderr, "usage: gensurvey -n OBJECTS [-per-station K] -o FILE.xlsx")
		os.Exit(2)
	}
	if err := write(*out, *n, *per); err != nil {
		fmt.Fprintln(os.Stderr, "gensurvey:", err)
		os.Exit(1)
	}
}

func write(path string, n, per int) error {
	tmp, err := os.CreateTemp(dirOf(path), ".gensurvey-*.xlsx")
	if err != nil {
		return err
	}
	defer os.Remove(tmp.Name())
	if err := inventory.WriteGeneratedSurvey(tmp, inventory.GenerateOptions{Objects: n, ObjectsPerStation: per}); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	return os.Rename(tmp.Name(), path)
}

func dirOf(p string) string {
	for i := len(p) - 1; i >= 0; i-- {
		if p[i] == '/' || p[i] == os.PathSeparator {
			return p[:i+1]
		}
	}
	return "."
}
