// Command gensurvey writes a large invented line survey for benchmarks and
// scale runs: the demo plant's Site, Atmospheres and Materials sheets, and N
// objects spread over stations (about 200 objects each) whose rows repeat the
// demo's object rows as patterns with their own IDs and slightly varied
// readings. Every value is invented for the demo.
//
// Usage:
//
//	go run ./cmd/gensurvey -n 1048575 -o /tmp/big.xlsx
//
// Its temporary files (spill files, and the survey before it is renamed into
// place) belong to one outfile.Workspace, removed on exit and on SIGINT or SIGTERM.
package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/report/outfile"
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
	ws := outfile.NewWorkspace("")
	sig := make(chan os.Signal, 1)
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM)
	go func() {
		<-sig
		ws.Abort()
		fmt.Fprintln(os.Stderr, "gensurvey: interrupted; temporary files removed")
		os.Exit(130)
	}()
	err := write(ws, *out, *n, *per)
	_ = ws.Close()
	if err != nil {
		fmt.Fprintln(os.Stderr, "gensurvey:", err)
		os.Exit(1)
	}
}

func write(ws *outfile.Workspace, path string, n, per int) error {
	tmp, err := ws.Dir()
	if err != nil {
		return err
	}
	return ws.WriteFile(path, func(w io.Writer) error {
		return inventory.WriteGeneratedSurvey(w, inventory.GenerateOptions{Objects: n, ObjectsPerStation: per, TmpDir: tmp})
	})
}
