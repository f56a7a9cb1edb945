package rerun

import (
	"io"

	"github.com/sparkmargin/sparkmargin/report"
	"github.com/sparkmargin/sparkmargin/report/assess"
)

func writeAuditJSON(w io.Writer, a *assess.Audit) error {
	return report.WriteJSON(w, a, report.RunInfo{ToolVersion: "test"})
}
