package inventory

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"testing"
)

// streamed reads path with StreamFile, collecting the objects handed over.
func streamed(t *testing.T, path string) (*Survey, []Object) {
	t.Helper()
	var objs []Object
	began := false
	s, err := readFile(path, ReadOptions{}, &streamHooks{begin: func(s *Survey) error {
		began = true
		if s.Path != path || s.SHA256 == "" {
			t.Errorf("begin: survey path %q sha %q", s.Path, s.SHA256)
		}
		return nil
	}, each: func(o Object) error {
		if !began {
			t.Error("an object came before begin")
		}
		objs = append(objs, o)
		return nil
	}})
	if err != nil {
		t.Fatalf("StreamFile %s: %v", path, err)
	}
	return s, objs
}

// TestStreamFileMatchesReadFile: streaming gives the survey ReadFile gives,
// with the objects handed over in sheet order instead of kept, on the demo,
// every broken test survey, and a generated survey with fewer rows held back
// than it has (rows then go through one by one, as in a sheet larger than the
// boolean check's bound; the generated survey has no booleans to find).
func TestStreamFileMatchesReadFile(t *testing.T) {
	dir := t.TempDir()
	big := filepath.Join(dir, "generated.xlsx")
	var buf bytes.Buffer
	if err := WriteGeneratedSurvey(&buf, GenerateOptions{Objects: 300, ObjectsPerStation: 40}); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(big, buf.Bytes(), 0o600); err != nil {
		t.Fatal(err)
	}
	paths := []string{filepath.Join("..", "testdata", "demo", "demo-survey.xlsx"), big}
	broken, _ := filepath.Glob(filepath.Join("..", "testdata", "broken", "*.xlsx"))
	paths = append(paths, broken...)
	for _, p := range paths {
		t.Run(filepath.Base(p), func(t *testing.T) {
			want, err := ReadFile(p, ReadOptions{})
			if err != nil {
				t.Skipf("unreadable: %v", err)
			}
			got, objs := streamed(t, p)
			if !reflect.DeepEqual(objs, want.Objects) && !(len(objs) == 0 && len(want.Objects) == 0) {
				t.Errorf("objects: streamed %d, read %d (or they differ)", len(objs), len(want.Objects))
			}
			if got.Objects != nil {
				t.Error("StreamFile kept Survey.Objects")
			}
			got.Objects = want.Objects
			for _, c := range []struct {
				name      string
				got, want any
			}{
				{"Problems", got.Problems, want.Problems}, {"Rejected", got.Rejected, want.Rejected},
				{"Counts", got.Counts, want.Counts}, {"Stations", got.Stations, want.Stations},
				{"Changes", got.Changes, want.Changes}, {"Site", got.Site, want.Site},
			} {
				if !reflect.DeepEqual(c.got, c.want) {
					t.Errorf("%s differ:\nstreamed %+v\nread     %+v", c.name, c.got, c.want)
				}
			}
			gv, wv := reflect.ValueOf(got).Elem(), reflect.ValueOf(want).Elem()
			for i := 0; i < gv.NumField(); i++ {
				// %v, not DeepEqual: material properties hold NaN for unknown.
				if fmt.Sprintf("%+v", gv.Field(i).Interface()) != fmt.Sprintf("%+v", wv.Field(i).Interface()) {
					t.Errorf("Survey.%s differs", gv.Type().Field(i).Name)
				}
			}
		})
	}
}

// TestGeneratedSurvey: the generator gives a readable survey with the asked
// number of object rows, every one read (accepted or rejected).
func TestGeneratedSurvey(t *testing.T) {
	for _, n := range []int{0, 1, 37, 450} {
		var buf bytes.Buffer
		if err := WriteGeneratedSurvey(&buf, GenerateOptions{Objects: n, ObjectsPerStation: 40}); err != nil {
			t.Fatal(err)
		}
		s, err := Read(buf.Bytes(), "generated.xlsx", ReadOptions{})
		if err != nil {
			t.Fatalf("n=%d: %v", n, err)
		}
		var objs SheetCount
		for _, c := range s.Counts {
			if c.Sheet == SheetObjects {
				objs = c
			}
		}
		if objs.Read != n {
			t.Errorf("n=%d: %d object rows read", n, objs.Read)
		}
		if n > 0 && objs.Accepted < n*9/10 {
			t.Errorf("n=%d: only %d of the rows accepted: %v", n, objs.Accepted, s.Errors())
		}
		if want := (n + 39) / 40; len(s.Stations) != want {
			t.Errorf("n=%d: %d stations, want %d", n, len(s.Stations), want)
		}
	}
}
