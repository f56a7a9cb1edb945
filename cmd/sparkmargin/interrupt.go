package main

import (
	"fmt"
	"io"
	"os"
	"os/signal"
	"strings"
	"syscall"

	"github.com/sparkmargin/sparkmargin/report/outfile"
)

// onInterrupt makes SIGINT and SIGTERM stop the run cleanly: the handler
// removes the run's temporary files (waiting for a pair of outputs being
// renamed into place, so that a workbook and its JSON are replaced together),
// says which outputs are kept, and exits with exitInterrupted. The returned
// function stops the handling.
func onInterrupt(ws *outfile.Workspace, stderr io.Writer) (stop func()) {
	sig := make(chan os.Signal, 1)
	done := make(chan struct{})
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM)
	go func() {
		select {
		case s := <-sig:
			written := ws.Abort()
			fmt.Fprintln(stderr, interruptMessage(s, written))
			os.Exit(exitInterrupted)
		case <-done:
		}
	}()
	return func() {
		signal.Stop(sig)
		close(done)
	}
}

// interruptMessage says what an interrupt left: the previous outputs are kept.
func interruptMessage(s os.Signal, written []string) string {
	name := "SIGTERM"
	if s == os.Interrupt {
		name = "SIGINT"
	}
	msg := fmt.Sprintf("\nsparkmargin: interrupted (%s); temporary files removed; ", name)
	if len(written) == 0 {
		return msg + "nothing was replaced: the previous audit, if any, is kept as it was"
	}
	shown := make([]string, len(written))
	for i, w := range written {
		shown[i] = outfile.ShownPath(w) // "-" is standard output
	}
	return msg + fmt.Sprintf("written whole before the interrupt: %s; the output in progress was not written and its previous file, if any, is kept as it was",
		strings.Join(shown, ", "))
}
