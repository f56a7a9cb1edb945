package main

import (
	"go/parser"
	"go/token"
	"io/fs"
	"path"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
)

// The arrows of the code map (DEVELOPERS.md): cmd -> report -> report/* ->
// inventory, model, templates. This test reads the import lines of every
// non-test Go file of the module and fails on an import against the flow, so
// the layout holds without anyone having to remember it.

const modulePath = "github.com/sparkmargin/sparkmargin"

// forbiddenArrow says that no package matching from may import a package
// matching to. A pattern ending in "/..." matches the package and every
// package below it; "report/*" matches only the packages below report.
type forbiddenArrow struct {
	from, to string
	why      string
}

var forbiddenArrows = []forbiddenArrow{
	{"inventory/...", "model/...", "the survey format knows no physics"},
	{"model/...", "inventory/...", "the physics knows no survey format"},
	{"inventory/...", "report/...", "inventory is below report"},
	{"model/...", "report/...", "model is below report"},
	{"templates/...", "report/...", "templates hold text only"},
	{"templates/...", "inventory/...", "templates hold text only"},
	{"templates/...", "model/...", "templates hold text only"},
	{"report/*", "report", "a stage of report builds on its siblings, never on the pipeline root"},
	{"report/outfile", "report/...", "safe file writing knows no stage: every stage and the pipeline may use it"},
	{"report/outfile", "inventory/...", "safe file writing knows no survey"},
	{"report/outfile", "model/...", "safe file writing knows no physics"},
	{"report/outfile", "templates/...", "safe file writing holds no text of the audit"},
	{"report/book", "report/...", "the workbook kit knows no stage: no verdicts, no audit, no reruns"},
	{"report/book", "inventory/...", "the workbook kit knows no survey"},
	{"report/book", "model/...", "the workbook kit knows no physics"},
	{"report/assess", "report/...", "the judging engine writes nothing: outputs build on it, not it on them"},
	{"report/audit", "report/rerun", "reruns build on the audit outputs, not the other way"},
	{"inventory/...", "cmd/...", "nothing imports a command"},
	{"model/...", "cmd/...", "nothing imports a command"},
	{"report/...", "cmd/...", "nothing imports a command"},
}

// knownArrowExceptions lists arrows against the flow that exist today and are
// being removed; an entry that no longer occurs fails the test so the list
// only shrinks.
var knownArrowExceptions = map[string]bool{}

func matchPkg(pattern, pkg string) bool {
	switch {
	case strings.HasSuffix(pattern, "/..."):
		base := strings.TrimSuffix(pattern, "/...")
		return pkg == base || strings.HasPrefix(pkg, base+"/")
	case strings.HasSuffix(pattern, "/*"):
		return strings.HasPrefix(pkg, strings.TrimSuffix(pattern, "*"))
	default:
		return pkg == pattern
	}
}

// moduleImports returns, per package directory (relative to the module root,
// slash-separated), the module-internal packages its non-test files import.
func moduleImports(t *testing.T, root string) map[string]map[string]bool {
	t.Helper()
	out := map[string]map[string]bool{}
	fset := token.NewFileSet()
	err := filepath.WalkDir(root, func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() {
			name := d.Name()
			if p != root && (name == "testdata" || strings.HasPrefix(name, ".") || strings.HasPrefix(name, "_")) {
				return filepath.SkipDir
			}
			return nil
		}
		if !strings.HasSuffix(p, ".go") || strings.HasSuffix(p, "_test.go") {
			return nil
		}
		f, err := parser.ParseFile(fset, p, nil, parser.ImportsOnly)
		if err != nil {
			return err
		}
		rel, err := filepath.Rel(root, filepath.Dir(p))
		if err != nil {
			return err
		}
		pkg := filepath.ToSlash(rel)
		if out[pkg] == nil {
			out[pkg] = map[string]bool{}
		}
		for _, imp := range f.Imports {
			ip, err := strconv.Unquote(imp.Path.Value)
			if err != nil {
				return err
			}
			if ip == modulePath || strings.HasPrefix(ip, modulePath+"/") {
				out[pkg][path.Clean(strings.TrimPrefix(strings.TrimPrefix(ip, modulePath), "/"))] = true
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	return out
}

func TestImportArrowsFollowTheFlow(t *testing.T) {
	imports := moduleImports(t, filepath.Join("..", ".."))
	if len(imports["report/audit"]) == 0 || len(imports["cmd/sparkmargin"]) == 0 {
		t.Fatalf("the module walk found no imports of report/audit or cmd/sparkmargin: wrong root?")
	}
	if _, ok := imports["report/outfile"]; !ok {
		t.Fatalf("the module walk did not find report/outfile: wrong root?")
	}
	var pkgs []string
	for p := range imports {
		pkgs = append(pkgs, p)
	}
	sort.Strings(pkgs)
	seen := map[string]bool{}
	for _, from := range pkgs {
		var tos []string
		for to := range imports[from] {
			tos = append(tos, to)
		}
		sort.Strings(tos)
		for _, to := range tos {
			for _, a := range forbiddenArrows {
				if !matchPkg(a.from, from) || !matchPkg(a.to, to) {
					continue
				}
				arrow := from + " -> " + to
				if knownArrowExceptions[arrow] {
					seen[arrow] = true
					continue
				}
				t.Errorf("%s imports %s against the flow: %s", from, to, a.why)
			}
		}
	}
	for arrow := range knownArrowExceptions {
		if !seen[arrow] {
			t.Errorf("known exception %q no longer occurs: remove it from knownArrowExceptions", arrow)
		}
	}
}

func TestMatchPkg(t *testing.T) {
	cases := []struct {
		pattern, pkg string
		want         bool
	}{
		{"report/*", "report", false},
		{"report/*", "report/rerun", true},
		{"report", "report", true},
		{"report", "report/assess", false},
		{"report/...", "report", true},
		{"report/...", "report/assess", true},
		{"report/...", "reporting", false},
		{"model/...", "model", true},
	}
	for _, c := range cases {
		if got := matchPkg(c.pattern, c.pkg); got != c.want {
			t.Errorf("matchPkg(%q, %q) = %v, want %v", c.pattern, c.pkg, got, c.want)
		}
	}
}
