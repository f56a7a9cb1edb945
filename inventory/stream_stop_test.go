package inventory

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// An error or a panic in each stops the streaming at that object, while the
// rows are read ahead in a goroutine of their own: the error comes back as
// it is (a panic as an error naming it), each is not called again, and no
// goroutine is left waiting. 1200 objects with 50 held back pass several
// batches of objectBatch through the reading goroutine (counts invented for
// the demo).
func TestStreamFileStopsAtEachsError(t *testing.T) {
	p := filepath.Join(t.TempDir(), "gen.xlsx")
	fh, err := os.Create(p)
	if err != nil {
		t.Fatal(err)
	}
	if err := WriteGeneratedSurvey(fh, GenerateOptions{Objects: 1200}); err != nil {
		t.Fatal(err)
	}
	if err := fh.Close(); err != nil {
		t.Fatal(err)
	}
	errStop := errors.New("caller stops")
	for _, stopAt := range []int{1, objectBatch, objectBatch + 1, 700} {
		for _, panics := range []bool{false, true} {
			calls := 0
			_, err := readFile(p, ReadOptions{}, &streamHooks{begin: func(*Survey) error { return nil }, each: func(Object) error {
				calls++
				if calls == stopAt {
					if panics {
						panic("caller fault")
					}
					return errStop
				}
				return nil
			}})
			switch {
			case calls != stopAt:
				t.Errorf("stop at %d (panic %v): each called %d times", stopAt, panics, calls)
			case panics && (err == nil || !strings.Contains(err.Error(), "panic while handling a survey object: caller fault")):
				t.Errorf("stop at %d: a panic in each gave %v", stopAt, err)
			case !panics && !errors.Is(err, errStop):
				t.Errorf("stop at %d: each's error came back as %v", stopAt, err)
			case errors.Is(err, ErrUnreadable):
				t.Errorf("stop at %d: the caller's fault reported as an unreadable survey: %v", stopAt, err)
			}
		}
	}
}
