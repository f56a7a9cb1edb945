package templates

import (
	_ "embed"
	"strings"
)

//go:embed mitigations.txt
var mitigations string

// Mitigation returns the mitigation text for a finding key: a check name
// ("conductor-earthing") or a check family and an object class
// ("energy.conductor"). A key "a.b" with no text of its own falls back to "a".
// It returns "" when neither is known.
func Mitigation(key string) string {
	for {
		if t, ok := lookupMitigation(key); ok {
			return t
		}
		i := strings.LastIndexByte(key, '.')
		if i < 0 {
			return ""
		}
		key = key[:i]
	}
}

// MitigationKeys returns every key of the mitigation texts, in file order.
func MitigationKeys() []string {
	var keys []string
	for _, l := range strings.Split(mitigations, "\n") {
		if k, _, ok := splitMitigation(l); ok {
			keys = append(keys, k)
		}
	}
	return keys
}

func lookupMitigation(key string) (string, bool) {
	for _, l := range strings.Split(mitigations, "\n") {
		if k, t, ok := splitMitigation(l); ok && k == key {
			return t, true
		}
	}
	return "", false
}

func splitMitigation(line string) (key, text string, ok bool) {
	line = strings.TrimSpace(line)
	if line == "" || strings.HasPrefix(line, "#") {
		return "", "", false
	}
	k, t, found := strings.Cut(line, "=")
	if !found {
		return "", "", false
	}
	return strings.TrimSpace(k), strings.TrimSpace(t), true
}
