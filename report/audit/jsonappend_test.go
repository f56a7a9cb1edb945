package audit

import (
	"bytes"
	"encoding/json"
	"math"
	"testing"
)

// The numbers are invented for the test (edge cases of float formatting); the expected bytes
// are encoding/json's own for the same value (Source: the Go standard library, the outside oracle).

// encodingJSON is what encoding/json writes for v with HTML escaping off.
func encodingJSON(t testing.TB, v any) string {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		t.Fatal(err)
	}
	return string(bytes.TrimSuffix(buf.Bytes(), []byte("\n")))
}

// The appender's strings and numbers are encoding/json's (the reference).
func TestJSONAppendScalars(t *testing.T) {
	for _, s := range []string{"", "plain", `"quoted" \\ back`, "<html> & 'x'", "tab\tnl\ncr\r", "\x00\x01\x1f\x7f", "\b\f",
		"bad \xff utf8", "\u2028\u2029", "é中😀", "_x0041_", "=SUM(A1)"} {
		if got, want := string(appendJSONString(nil, s)), encodingJSON(t, s); got != want {
			t.Errorf("string %q: %s, encoding/json %s", s, got, want)
		}
	}
	for _, f := range []float64{0, math.Copysign(0, -1), 1, -1.5, 1e-6, 9.99e-7, 1e-7, 1e20, 1e21, 1.234e-12, 3.5e-9, 1e100, 1e-100, 0.1 + 0.2, 123456789} {
		if got, want := string(appendJSONFloat(nil, f)), encodingJSON(t, f); got != want {
			t.Errorf("float %v: %s, encoding/json %s", f, got, want)
		}
	}
}

func FuzzJSONAppendScalars(f *testing.F) {
	f.Add("a\"b\\c\x00\u2028", 1.5e-9)
	f.Fuzz(func(t *testing.T, s string, x float64) {
		if got, want := string(appendJSONString(nil, s)), encodingJSON(t, s); got != want {
			t.Fatalf("string %q: %s, encoding/json %s", s, got, want)
		}
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return
		}
		if got, want := string(appendJSONFloat(nil, x)), encodingJSON(t, x); got != want {
			t.Fatalf("float %v: %s, encoding/json %s", x, got, want)
		}
	})
}
