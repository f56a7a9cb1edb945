package assess

import (
	"fmt"
	"reflect"
	"testing"
)

// TestResultsIndependentOfBatchAndWorkers: the audit of the demo survey
// (stations, ranks, findings in order, counts, defaults, options,
// probabilities, and the object results in order) does not depend on the
// size of the batches the objects arrive in nor on the number of Monte Carlo
// workers, with or without sampling (derived: every object's draws come from
// its own stream, and the ranking and finding order use survey positions).
func TestResultsIndependentOfBatchAndWorkers(t *testing.T) {
	s := demoSurvey(t)
	for _, samples := range []int{0, 200} {
		want := Assess(s, Options{Samples: samples, Workers: 2})
		for _, batch := range []int{1, 7, len(s.Objects)} {
			t.Run(fmt.Sprintf("samples=%d/batch=%d", samples, batch), func(t *testing.T) {
				st := NewStreamer(s, Options{Samples: samples, Workers: 3})
				var got []ObjectResult
				for i := 0; i < len(s.Objects); i += batch {
					for _, r := range st.Add(s.Objects[i:min(i+batch, len(s.Objects))]) {
						got = append(got, r)
					}
				}
				a := st.Finish()
				if a.Objects != nil {
					t.Error("Finish kept the objects")
				}
				if len(got) != len(want.Objects) {
					t.Fatalf("%d results, want %d", len(got), len(want.Objects))
				}
				for i := range got {
					g, w := &got[i], &want.Objects[i]
					if g.Object.ID != w.Object.ID || g.Verdict != w.Verdict || g.Reason != w.Reason ||
						fmt.Sprint(g.Eval) != fmt.Sprint(w.Eval) || !reflect.DeepEqual(g.Findings, w.Findings) ||
						!reflect.DeepEqual(g.Marks, w.Marks) || !reflect.DeepEqual(g.Ratio, w.Ratio) ||
						fmt.Sprint(deref(g.Probability)) != fmt.Sprint(deref(w.Probability)) {
						t.Errorf("object %d (%s) differs", i, w.Object.ID)
					}
				}
				for _, c := range []struct {
					name      string
					got, want any
				}{
					{"Stations", a.Stations, want.Stations}, {"Findings", a.Findings, want.Findings},
					{"Counts", a.Counts, want.Counts}, {"MethodDefaults", a.MethodDefaults, want.MethodDefaults},
					{"Options.Seed", a.Options.Seed, want.Options.Seed}, {"Options.Limits", fmt.Sprint(a.Options.Limits), fmt.Sprint(want.Options.Limits)},
					{"Options.Uncertainties", a.Options.Uncertainties, want.Options.Uncertainties},
				} {
					if !reflect.DeepEqual(c.got, c.want) {
						t.Errorf("%s differ:\nstreamed %+v\nassessed %+v", c.name, c.got, c.want)
					}
				}
			})
		}
	}
}

func deref(p *Probability) Probability {
	if p == nil {
		return Probability{Samples: -1}
	}
	return *p
}
