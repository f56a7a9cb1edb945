package templates

import (
	_ "embed"
	"strings"
)

//go:embed method.txt
var method string

//go:embed principles.txt
var principles string

// Principle is one safety principle every rule of the assessment follows.
type Principle struct {
	Title string
	Text  string
}

// Principles returns the safety principles, in the order of principles.txt.
func Principles() []Principle {
	var out []Principle
	for _, l := range strings.Split(principles, "\n") {
		l = strings.TrimSpace(l)
		if l == "" || strings.HasPrefix(l, "#") {
			continue
		}
		title, text, _ := strings.Cut(l, "|")
		out = append(out, Principle{Title: strings.TrimSpace(title), Text: strings.TrimSpace(text)})
	}
	return out
}

// MethodNote is one formula of the Method sheet with where it applies and its source.
type MethodNote struct {
	Quantity  string
	Formula   string
	AppliesTo string
	Source    string
}

// MethodNotes returns the formulas the model applies, in the order of method.txt.
func MethodNotes() []MethodNote {
	var out []MethodNote
	for _, l := range strings.Split(method, "\n") {
		l = strings.TrimSpace(l)
		if l == "" || strings.HasPrefix(l, "#") {
			continue
		}
		f := strings.Split(l, "|")
		for len(f) < 4 {
			f = append(f, "")
		}
		out = append(out, MethodNote{
			Quantity:  strings.TrimSpace(f[0]),
			Formula:   strings.TrimSpace(f[1]),
			AppliesTo: strings.TrimSpace(f[2]),
			Source:    strings.TrimSpace(f[3]),
		})
	}
	return out
}
