package inventory

import "testing"

func TestSmokeValid(t *testing.T) {
	s := utReadBook(t, utValidBook())
	t.Logf("counts %+v\n%s", s.Counts, utDump(s))
	if len(s.Errors()) != 0 {
		t.Fatalf("errors:\n%s", utDump(s))
	}
}

func TestSmokeDemo(t *testing.T) {
	data, err := DemoSurveyBytes()
	if err != nil {
		t.Skip(err)
	}
	s, err := Read(data, "demo.xlsx", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	utAccounted(t, s)
	t.Logf("counts %+v\n%s", s.Counts, utDump(s))
}
