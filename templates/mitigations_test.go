package templates

import (
	"strings"
	"testing"
)

func TestMitigationFile(t *testing.T) {
	seen := map[string]bool{}
	for _, l := range strings.Split(mitigations, "\n") {
		l = strings.TrimSpace(l)
		if l == "" || strings.HasPrefix(l, "#") {
			continue
		}
		k, text, ok := splitMitigation(l)
		if !ok || k == "" || text == "" {
			t.Errorf("line %q is not `key = text`", l)
			continue
		}
		if seen[k] {
			t.Errorf("key %q given twice", k)
		}
		seen[k] = true
		if !strings.HasSuffix(text, ".") {
			t.Errorf("text of %q does not end a sentence", k)
		}
	}
	if len(MitigationKeys()) != len(seen) {
		t.Errorf("MitigationKeys lists %d keys, the file has %d", len(MitigationKeys()), len(seen))
	}
}

func TestMitigationFallback(t *testing.T) {
	tests := []struct{ key, want string }{
		{"conductor-earthing", "conductor-earthing"},
		{"conductor-earthing.person", "conductor-earthing"}, // no text of its own: the family's
		{"energy.person", "energy.person"},
		{"bag-type.unknown", "bag-type.unknown"},
	}
	for _, tc := range tests {
		want, _ := lookupMitigation(tc.want)
		if got := Mitigation(tc.key); got != want || got == "" {
			t.Errorf("Mitigation(%q) = %q, want the text of %q", tc.key, got, tc.want)
		}
	}
	if got := Mitigation("no-such-check"); got != "" {
		t.Errorf("unknown key gave %q", got)
	}
}
