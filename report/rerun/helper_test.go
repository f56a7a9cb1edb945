package rerun

import (
	"io"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/audit"
)

func writeAuditJSON(w io.Writer, a *assess.Audit) error {
	return audit.WriteJSON(w, a, audit.RunInfo{ToolVersion: "test"})
}
