package audit

import (
	"math"
	"testing"

	"github.com/sparkmargin/sparkmargin/report/assess"
)

// Review N5: an object whose ratio rests on an assumed input (RatioAssumed:
// its energy is an artefact of the assumption, reference section 12) is drawn
// in the HTML energy plot at its MIE (ratio 1) and labelled
// assess.RatioAssumedText, as the Summary chart does; never at its artefact size.
func TestHTMLDrawsAssumedObjectAtTheMIE(t *testing.T) {
	a := demoAudit(t, 0)
	h := NewHTMLWriter()
	if err := h.Add(a.Objects); err != nil {
		t.Fatal(err)
	}
	found := false
	for i, p := range h.energy {
		if !p.assumedR {
			continue
		}
		found = true
		if math.Abs(p.energy-p.mie) > 1e-12*p.mie || p.ratio != 1 {
			t.Errorf("%s drawn at %g J (ratio %g); want its MIE %g J, ratio 1", p.object, p.energy, p.ratio, p.mie)
		}
		c := energyChart(h.energy, 1, false)
		if c.Rows[i].Value != assess.RatioAssumedText {
			t.Errorf("%s labelled %q, want %q", p.object, c.Rows[i].Value, assess.RatioAssumedText)
		}
	}
	if !found {
		t.Fatal("the demo has no drawn object on an assumed input")
	}
}
