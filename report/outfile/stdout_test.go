package outfile

import (
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

// TestStdoutOutput: an output named "-" is written whole, then copied to the
// workspace's standard output at Commit, after the workbook's rename; a
// failure half-way prints nothing; no file named "-" appears; without a
// standard output the name is refused.
func TestStdoutOutput(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	ws := NewWorkspace(t.TempDir())
	defer ws.Close()
	var out bytes.Buffer
	ws.SetStdout(&out)
	book := filepath.Join(dir, "b.xlsx")
	err := ws.WritePair(book, Stdout,
		func(w io.Writer) error { _, err := io.WriteString(w, "book"); return err },
		func(w io.Writer) error { _, err := io.WriteString(w, `{"a":1}`); return err })
	if err != nil {
		t.Fatal(err)
	}
	if out.String() != `{"a":1}` {
		t.Errorf("standard output %q, want the JSON", out.String())
	}
	if b, err := os.ReadFile(book); err != nil || string(b) != "book" {
		t.Errorf("workbook %q, %v", b, err)
	}
	out.Reset()
	err = ws.WritePair("", Stdout, nil, func(w io.Writer) error {
		io.WriteString(w, `{"half":`)
		return errors.New("broken")
	})
	if err == nil || out.Len() != 0 {
		t.Errorf("failed write: err %v, standard output %q; want an error and nothing printed", err, out.String())
	}
	if _, err := os.Stat(filepath.Join(dir, Stdout)); err == nil {
		t.Error(`a file named "-" was written`)
	}
	bare := NewWorkspace(t.TempDir())
	defer bare.Close()
	if err := bare.WriteFile(Stdout, func(w io.Writer) error { return nil }); err == nil {
		t.Error("a workspace with no standard output accepted -")
	}
}
