package inventory

import "flag"

// update rewrites generated testdata files (the demo and broken survey
// workbooks) instead of comparing with them: go test ./inventory -update.
// Hand-written golden files are never rewritten by it.
var update = flag.Bool("update", false, "rewrite generated testdata files instead of comparing with them")
