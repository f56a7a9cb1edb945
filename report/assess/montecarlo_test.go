package assess

import (
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// onlyResistance is an uncertainty table that draws the resistance to earth alone
// (0.5 decade), so the Monte Carlo has a closed form.
func onlyResistance() []Uncertainty {
	t := DefaultUncertainties()
	for i := range t {
		if t[i].Input != UncResistance {
			t[i].Spread = 0
		}
	}
	return t
}

// chargedPart is an unearthed metal part charged by a steady current I through
// its resistance to earth R: V = I R, W = C V^2 / 2 (no diameter: no corona cap).
// Values invented for the demo: C 100 pF, I 1 µA, R 1e9 Ω, toluene MIE 0.24 mJ.
func chargedPart(id string, r inventory.Quantity) inventory.Object {
	return inventory.Object{ID: id, Station: "S1", Kind: inventory.KindPart,
		Capacitance: known(100e-12), ChargingCurrent: known(1e-6), Resistance: r}
}

// binomialTol is 4 standard deviations of a share p estimated from n draws (at least 1/n).
func binomialTol(p float64, n int) float64 {
	return math.Max(4*math.Sqrt(p*(1-p)/float64(n)), 1/float64(n))
}

func TestMonteCarloLogNormalResistanceClosedForm(t *testing.T) {
	const n = 4000
	const c, i, mie = 100e-12, 1e-6, 0.24e-3 // invented for the demo; MIE of toluene, reference section 4 (from memory)
	// derived: W >= MIE  <=>  R >= R* = sqrt(2 MIE / C) / I.
	rStar := math.Sqrt(2*mie/c) / i
	cases := []struct {
		name    string
		r       inventory.Quantity
		sigmaLn float64 // of ln R
	}{
		// Table default: 0.5 decade, sigma(ln R) = 0.5 ln 10 (the table's documented choice).
		{"table 0.5 decade", known(1e9), 0.5 * math.Ln10},
		// Cell "1e9 Ω ±100%": a log-normal factor 1 + 1 = 2, sigma(ln R) = ln 2 (derived: CellSpread).
		{"cell ±100%", inventory.Quantity{Value: 1e9, Known: true, RelUncertainty: 1}, math.Ln2},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			atm := atmToluene
			s := newSurvey([]inventory.Atmosphere{atm}, []inventory.Station{{ID: "S1", Atmosphere: atm.ID}},
				[]inventory.Object{chargedPart("P1", tc.r)}, nil)
			a := Assess(s, Options{Samples: n, Seed: 42, Uncertainties: onlyResistance()})
			p := a.Objects[0].Probability
			if p == nil {
				t.Fatal("no probability")
			}
			// derived: P(R >= R*) = 1 - Phi((ln R* - ln R0) / sigma) for R log-normal of median R0.
			z := (math.Log(rStar) - math.Log(1e9)) / tc.sigmaLn
			want := 1 - distuv.UnitNormal.CDF(z)
			if got := p.Incendive; math.Abs(got-want) > binomialTol(want, n) {
				t.Errorf("P(incendive) = %.4f, want %.4f ± %.4f", got, want, binomialTol(want, n))
			}
			// The part is unearthed (R > 1e6 Ω, IEC TS 60079-32-1): never non-incendive.
			if got := p.Marginal; math.Abs(got-(1-want)) > binomialTol(want, n) {
				t.Errorf("P(marginal) = %.4f, want %.4f", got, 1-want)
			}
			if p.NonIncendive != 0 || p.NotAssessed != 0 {
				t.Errorf("P(non-incendive) = %v, P(not assessed) = %v, want 0", p.NonIncendive, p.NotAssessed)
			}
			// derived: W = C (I R)^2 / 2 rises with R, so its quantile q is at R0 exp(sigma z_q):
			// W_q = W0 exp(2 sigma z_q). Tolerance: 4 sigma of the sample quantile of ln R,
			// sqrt(q (1-q) / n) / phi(z_q) x sigma, doubled for W.
			w0 := c * (i * 1e9) * (i * 1e9) / 2
			for _, q := range []struct {
				p   float64
				got float64
			}{{0.05, p.EnergyP05}, {0.50, p.EnergyP50}, {0.95, p.EnergyP95}} {
				zq := distuv.UnitNormal.Quantile(q.p)
				want := w0 * math.Exp(2*tc.sigmaLn*zq)
				// Below the Paschen floor no spark is possible and the effective energy is 0.
				if v := i * 1e9 * math.Exp(tc.sigmaLn*zq); v < model.DefaultLimits().SparkMinPotential {
					if q.got != 0 {
						t.Errorf("energy P%02.0f = %.3g J at %.0f V, want 0 (no spark below the Paschen floor)", q.p*100, q.got, v)
					}
					continue
				}
				tol := 4 * 2 * tc.sigmaLn * math.Sqrt(q.p*(1-q.p)/n) / distuv.UnitNormal.Prob(zq)
				if d := math.Abs(math.Log(q.got / want)); !(d <= tol) {
					t.Errorf("energy P%02.0f = %.3g J, want %.3g J (ln ratio %.3f > %.3f)", q.p*100, q.got, want, d, tol)
				}
			}
			if st := a.Stations[0].ProbabilityAnyIncendive; st == nil || !scalar.EqualWithinAbs(*st, p.Incendive, 1e-12) {
				t.Errorf("station P(any incendive) = %v, want the one object's %v", st, p.Incendive)
			}
		})
	}
}

// demoSurvey reads the demo survey the tool ships (an invented plant).
func demoSurvey(t testing.TB) *inventory.Survey {
	t.Helper()
	b, err := inventory.DemoSurveyBytes()
	if err != nil {
		t.Fatal(err)
	}
	s, err := inventory.Read(b, "demo-survey.xlsx", inventory.ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func probabilities(a *Audit) map[string]Probability {
	out := map[string]Probability{}
	for i := range a.Objects {
		out[a.Objects[i].Object.ID] = *a.Objects[i].Probability
	}
	return out
}

func sameProbability(a, b Probability) bool {
	eq := func(x, y float64) bool { return x == y || (math.IsNaN(x) && math.IsNaN(y)) }
	return a.Samples == b.Samples && a.Incendive == b.Incendive && a.Marginal == b.Marginal &&
		a.NonIncendive == b.NonIncendive && a.NotAssessed == b.NotAssessed &&
		eq(a.EnergyP05, b.EnergyP05) && eq(a.EnergyP50, b.EnergyP50) && eq(a.EnergyP95, b.EnergyP95)
}

func TestMonteCarloReproducible(t *testing.T) {
	s := demoSurvey(t)
	const n = 200
	one := Assess(s, Options{Samples: n, Seed: 7, Workers: 1})
	two := Assess(s, Options{Samples: n, Seed: 7, Workers: 2})
	// The same rows in another order.
	shuffled := *s
	shuffled.Objects = append([]inventory.Object(nil), s.Objects...)
	rand.New(rand.NewPCG(3, 4)).Shuffle(len(shuffled.Objects), func(i, j int) {
		shuffled.Objects[i], shuffled.Objects[j] = shuffled.Objects[j], shuffled.Objects[i]
	})
	mixed := Assess(&shuffled, Options{Samples: n, Seed: 7, Workers: 2})
	other := Assess(s, Options{Samples: n, Seed: 8, Workers: 2})

	p1, p2, pm, po := probabilities(one), probabilities(two), probabilities(mixed), probabilities(other)
	differs := false
	for id, p := range p1 {
		if !sameProbability(p, p2[id]) {
			t.Errorf("%s: 1 worker %+v, 2 workers %+v", id, p, p2[id])
		}
		if !sameProbability(p, pm[id]) {
			t.Errorf("%s: survey order %+v, shuffled %+v", id, p, pm[id])
		}
		if !sameProbability(p, po[id]) {
			differs = true
		}
	}
	if !differs {
		t.Error("seeds 7 and 8 gave identical results for every object: the seed is not used")
	}
	if one.Options.Seed != 7 {
		t.Errorf("recorded seed %d, want 7", one.Options.Seed)
	}
	if d := Assess(s, Options{Samples: 10}); d.Options.Seed != DefaultSeed || d.Options.Uncertainties == nil {
		t.Errorf("seed 0: recorded seed %d, table %d rows; want DefaultSeed and the table used", d.Options.Seed, len(d.Options.Uncertainties))
	}
	for k := range one.Stations {
		a, b := one.Stations[k].ProbabilityAnyIncendive, two.Stations[k].ProbabilityAnyIncendive
		if a == nil || b == nil || *a != *b {
			t.Errorf("station %s: P(any incendive) %v vs %v", one.Stations[k].Station.ID, a, b)
		}
	}
}

func TestMonteCarloDemo(t *testing.T) {
	s := demoSurvey(t)
	a := Assess(s, Options{Samples: 1000})
	if len(a.Objects) == 0 {
		t.Fatal("demo survey has no objects")
	}
	for i := range a.Objects {
		o := &a.Objects[i]
		p := o.Probability
		if p == nil || p.Samples != 1000 {
			t.Fatalf("%s: probability %+v, want 1000 samples", o.Object.ID, p)
		}
		// Each draw gives exactly one verdict.
		if sum := p.Incendive + p.Marginal + p.NonIncendive + p.NotAssessed; !scalar.EqualWithinAbs(sum, 1, 1e-9) {
			t.Errorf("%s: probabilities sum to %v", o.Object.ID, sum)
		}
		if !(p.EnergyP05 <= p.EnergyP50 && p.EnergyP50 <= p.EnergyP95) && !math.IsNaN(p.EnergyP50) {
			t.Errorf("%s: percentiles out of order %v %v %v", o.Object.ID, p.EnergyP05, p.EnergyP50, p.EnergyP95)
		}
	}
	// An earthed steel drum (earth clamp, resistance well below 1e6 Ω in the demo):
	// even a decade of resistance error leaves its potential far below any spark
	// (derived: V = I R; common practice, no source, that earthed metal does not spark).
	for _, id := range []string{"DRM-DRUM", "PWD-DRU2"} {
		found := false
		for i := range a.Objects {
			if o := &a.Objects[i]; o.Object.ID == id {
				found = true
				if o.Probability.Incendive > 0.001 {
					t.Errorf("%s (earthed drum): P(incendive) = %v, want about 0", id, o.Probability.Incendive)
				}
			}
		}
		if !found {
			t.Errorf("demo object %s not found", id)
		}
	}
	for _, st := range a.Stations {
		if st.ProbabilityAnyIncendive == nil || *st.ProbabilityAnyIncendive < 0 || *st.ProbabilityAnyIncendive > 1 {
			t.Errorf("station %s: P(any incendive) = %v", st.Station.ID, st.ProbabilityAnyIncendive)
		}
	}
}

func TestMonteCarloStationIndependence(t *testing.T) {
	// Two unearthed parts at one station: P(any) = 1 - (1 - p1)(1 - p2) (derived: independence).
	atm := atmToluene
	s := newSurvey([]inventory.Atmosphere{atm}, []inventory.Station{{ID: "S1", Atmosphere: atm.ID}},
		[]inventory.Object{chargedPart("P1", known(1e9)), chargedPart("P2", known(2e9))}, nil)
	a := Assess(s, Options{Samples: 300, Uncertainties: onlyResistance()})
	p1, p2 := a.Objects[0].Probability.Incendive, a.Objects[1].Probability.Incendive
	want := 1 - (1-p1)*(1-p2)
	if got := *a.Stations[0].ProbabilityAnyIncendive; !scalar.EqualWithinAbs(got, want, 1e-12) {
		t.Errorf("P(any incendive) = %v, want %v", got, want)
	}
}

func TestMonteCarloNotAssessedObject(t *testing.T) {
	// A row whose station is not on the Stations sheet is not assessed in every draw.
	s := newSurvey(nil, []inventory.Station{{ID: "S1"}}, []inventory.Object{chargedPart("P1", known(1e9))}, nil)
	s.Objects[0].Station = "NOWHERE"
	a := Assess(s, Options{Samples: 50})
	if p := a.Objects[0].Probability; p.NotAssessed != 1 || !math.IsNaN(p.EnergyP50) {
		t.Errorf("probability %+v, want not assessed 1 and no energy", p)
	}
}

func TestDrawStaysPhysical(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	// A 10 mm distance with a 10 mm spread (the table default) and humidity near 100 %RH.
	dist := drawSpec{target: tFieldDistance, dist: NormalAbsolute, mu: 0.01, sigma: 0.01}
	rh := drawSpec{target: tRelativeHumidity, dist: NormalAbsolute, mu: 97, sigma: 5, upper: 100}
	neg := drawSpec{target: tField, dist: NormalRelative, mu: -1e5, sigma: 1e5}
	for k := 0; k < 2000; k++ {
		if x := dist.draw(rng); x < 0 {
			t.Fatalf("distance drawn negative: %v", x)
		}
		if x := rh.draw(rng); x < 0 || x > 100 {
			t.Fatalf("humidity drawn outside 0-100: %v", x)
		}
		if x := neg.draw(rng); x > 0 {
			t.Fatalf("negative field reading changed sign: %v", x)
		}
	}
}

func TestUncertaintiesFromSite(t *testing.T) {
	items := []inventory.SiteItem{
		{Item: "Uncertainty field [%]", Value: "20", Row: 10},
		{Item: "Uncertainty resistance [decades]", Value: "1", Row: 11},
		{Item: "Uncertainty field distance", Value: "5 mm", Row: 12},
		{Item: "Uncertainty MIE dust", Value: "3", Row: 13}, // factor, the row's unit
		{Item: "Uncertainty estimated capacitance [%]", Value: "50", Row: 14},
		{Item: "Uncertainty size [%]", Value: "0", Row: 15},           // off
		{Item: "Uncertainty speed [mm]", Value: "5", Row: 16},         // wrong unit: error
		{Item: "Uncertainty of everything", Value: "5", Row: 17},      // unknown: warning
		{Item: "Uncertainty MIE gas [factor]", Value: "0.5", Row: 18}, // factor below 1: error
		{Item: "Shock energy [mJ]", Value: "300", Row: 19},            // a limit: left alone
	}
	for i := range items {
		items[i].Key = inventory.NormalizeName(items[i].Item)
	}
	site, probs := siteWith(items)
	tab := UncertaintiesFromSite(site, DefaultUncertainties())
	byInput := uncertaintyTable(tab)
	// derived: conversions of the units documented on UncertaintiesFromSite.
	checks := []struct {
		in   UncertainInput
		want float64
	}{
		{UncField, 0.20},
		{UncResistance, math.Ln10},
		{UncFieldDistance, 5e-3},
		{UncMIEDust, math.Log(3)},
		{UncCapacitanceEstimated, math.Log(1.5)},
		{UncSize, 0},
		{UncSpeed, 0.05},           // kept: the default (documented choice)
		{UncMIEGas, math.Log(1.2)}, // kept
	}
	for _, c := range checks {
		if got := byInput[c.in].Spread; !scalar.EqualWithinRel(got, c.want, 1e-12) && !(got == 0 && c.want == 0) {
			t.Errorf("%s: spread %v, want %v", byInput[c.in].Name, got, c.want)
		}
	}
	if !byInput[UncField].Overridden || byInput[UncSpeed].Overridden {
		t.Error("Overridden not recorded as set")
	}
	rows := map[int]inventory.Severity{}
	for _, p := range probs {
		rows[p.Row] = p.Severity
	}
	want := map[int]inventory.Severity{16: inventory.Error, 17: inventory.Warning, 18: inventory.Error}
	if len(rows) != len(want) {
		t.Errorf("problems on rows %v, want %v", rows, want)
	}
	for r, sev := range want {
		if got, ok := rows[r]; !ok || got != sev {
			t.Errorf("row %d: problem %v (present %v), want %v", r, got, ok, sev)
		}
	}
	// LimitsFromSite leaves the uncertainty items alone and still reads the limit.
	lim := LimitsFromSite(site, model.DefaultLimits())
	if !scalar.EqualWithinRel(lim.ShockEnergy, 0.3, 1e-12) {
		t.Errorf("shock energy %v, want 0.3 J", lim.ShockEnergy)
	}
}

func TestUncertaintyText(t *testing.T) {
	// The defaults as the Method sheet shows them (the table's documented choices).
	tab := uncertaintyTable(DefaultUncertainties())
	for _, c := range []struct {
		in   UncertainInput
		want string
	}{
		{UncField, "±10 %"},
		{UncFieldDistance, "±10 mm"},
		{UncResistance, "±0.5 decade"},
		{UncMIEDust, "×/÷ 2 (95 % band ×/÷ 3.89)"}, // derived: 2^1.96
		{UncRelativeHumidity, "±5 %RH"},
	} {
		if got := tab[c.in].Text(); got != c.want {
			t.Errorf("%s: %q, want %q", tab[c.in].Name, got, c.want)
		}
	}
	if n := len(DefaultUncertainties()); n != int(NumUncertainInputs) {
		t.Errorf("default table has %d rows, want %d", n, NumUncertainInputs)
	}
	keys := UncertaintyKeys()
	if len(keys) != int(NumUncertainInputs) {
		t.Error("UncertaintyKeys does not list every row")
	}
	// Each listed item, written on a Site sheet, is read back onto its own row.
	for i, k := range keys {
		it := inventory.SiteItem{Item: k, Key: inventory.NormalizeName(k), Value: "1", Row: i + 2}
		site, probs := siteWith([]inventory.SiteItem{it})
		tab := UncertaintiesFromSite(site, DefaultUncertainties())
		if len(probs) != 0 || !tab[i].Overridden {
			t.Errorf("item %q: problems %v, overridden %v", k, probs, tab[i].Overridden)
		}
	}
	if got := tab[UncMIEDust].SiteItem(); got != "Uncertainty MIE dust [factor]" {
		t.Errorf("MIE dust item %q", got)
	}
}

// benchObjects returns the demo survey's assessed objects (an invented plant
// with every kind), the audit, and the one unearthed part of the closed-form test.
func benchObjects(b *testing.B) (*Audit, *ObjectResult) {
	a := Assess(demoSurvey(b), Options{})
	atm := atmToluene
	s := newSurvey([]inventory.Atmosphere{atm}, []inventory.Station{{ID: "S1", Atmosphere: atm.ID}},
		[]inventory.Object{chargedPart("P1", known(1e9))}, nil)
	return a, &Assess(s, Options{}).Objects[0]
}

// reportCPUPerObject reports the CPU time (user + system) per object of the
// benchmark's loop, from c0 taken before it: on a shared machine it is the
// figure to compare, the wall time depends on the neighbours.
func reportCPUPerObject(b *testing.B, c0 float64, objects int) {
	if c1, ok := processCPU(); ok && b.N > 0 {
		b.ReportMetric((c1-c0)*1e9/float64(b.N*objects), "cpu-ns/object")
	}
}

// BenchmarkEvaluateClassify is one model evaluation and classification per
// object of the demo survey; ns/object is the figure to compare.
func BenchmarkEvaluateClassify(b *testing.B) {
	a, _ := benchObjects(b)
	lim := a.Options.Limits
	b.ReportAllocs()
	var sink Verdict
	c0, _ := processCPU()
	for b.Loop() {
		for i := range a.Objects {
			r := &a.Objects[i]
			ev := model.Evaluate(r.Input, r.Environment, lim)
			sink += Classify(&r.Input, &r.Environment, &ev, &lim, DefaultMargin).Verdict
		}
	}
	reportCPUPerObject(b, c0, len(a.Objects))
	_ = sink
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(a.Objects)), "ns/object")
}

// BenchmarkMonteCarlo is the Monte Carlo at 1000 samples of every object of the
// demo survey on one worker; ns/object over 1000 x BenchmarkEvaluateClassify's
// ns/object is the overhead ratio (target <= 1.1). 0 allocs/op: the sample loop
// reuses its buffers.
func BenchmarkMonteCarlo(b *testing.B) {
	a, _ := benchObjects(b)
	tab := uncertaintyTable(DefaultUncertainties())
	s := newSampler(DefaultSeed, 1000, &a.Options.Limits, DefaultMargin, &tab, a.Survey.Site.RelativeHumidity)
	b.ReportAllocs()
	c0, _ := processCPU()
	for b.Loop() {
		for i := range a.Objects {
			_ = s.object(&a.Objects[i])
		}
	}
	reportCPUPerObject(b, c0, len(a.Objects))
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(a.Objects)), "ns/object")
}

// BenchmarkEvaluateClassifyPart and BenchmarkMonteCarloPart are the same for
// the cheapest object to evaluate, an unearthed part with four drawn inputs
// (the worst case of the overhead ratio).
func BenchmarkEvaluateClassifyPart(b *testing.B) {
	a, r := benchObjects(b)
	lim := a.Options.Limits
	b.ReportAllocs()
	var sink Verdict
	for b.Loop() {
		ev := model.Evaluate(r.Input, r.Environment, lim)
		sink += Classify(&r.Input, &r.Environment, &ev, &lim, DefaultMargin).Verdict
	}
	_ = sink
}

// BenchmarkMonteCarloPart: see BenchmarkEvaluateClassifyPart (one op = 1000 samples).
func BenchmarkMonteCarloPart(b *testing.B) {
	a, r := benchObjects(b)
	tab := uncertaintyTable(DefaultUncertainties())
	s := newSampler(DefaultSeed, 1000, &a.Options.Limits, DefaultMargin, &tab, inventory.Quantity{})
	b.ReportAllocs()
	for b.Loop() {
		_ = s.object(r)
	}
}

func benchmarkMonteCarloWorkers(b *testing.B, workers int) {
	if runtime.NumCPU() < workers {
		b.Skipf("%d workers need as many cores, the machine has %d", workers, runtime.NumCPU())
	}
	// GOMAXPROCS is the number of workers whatever -cpu says, so the ratio
	// Workers1 / Workers2 is one core against two.
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(workers))
	s := demoSurvey(b)
	// 8 copies of the demo's objects with distinct IDs, so each worker has work.
	base := s.Objects
	s.Objects = nil
	for k := 0; k < 8; k++ {
		for _, o := range base {
			o.ID = o.ID + "-" + string(rune('a'+k))
			s.Objects = append(s.Objects, o)
		}
	}
	b.ReportAllocs()
	for b.Loop() {
		_ = Assess(s, Options{Samples: 1000, Workers: workers})
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(s.Objects)), "ns/object")
}

// BenchmarkMonteCarloWorkers1 assesses 8 x the demo survey at 1000 samples on
// one worker and GOMAXPROCS 1.
func BenchmarkMonteCarloWorkers1(b *testing.B) { benchmarkMonteCarloWorkers(b, 1) }

// BenchmarkMonteCarloWorkers2 is the same on two workers and GOMAXPROCS 2; its
// ns/object over Workers1's is the two-core speed-up (target >= 1.8).
func BenchmarkMonteCarloWorkers2(b *testing.B) { benchmarkMonteCarloWorkers(b, 2) }

func TestPercentilesMatchSortedQuantile(t *testing.T) {
	// The selection gives what gonum's stat.Quantile (Empirical) gives on the sorted values.
	rng := rand.New(rand.NewPCG(5, 6))
	for _, n := range []int{1, 2, 3, 19, 20, 21, 100, 1000, 1001} {
		for rep := 0; rep < 5; rep++ {
			x := make([]float64, n)
			for i := range x {
				x[i] = math.Floor(rng.Float64() * 50) // ties on purpose
			}
			sorted := append([]float64(nil), x...)
			slices.Sort(sorted)
			p05, p50, p95 := percentiles(x)
			for _, c := range []struct{ p, got float64 }{{0.05, p05}, {0.5, p50}, {0.95, p95}} {
				if want := stat.Quantile(c.p, stat.Empirical, sorted, nil); c.got != want {
					t.Errorf("n %d: P%v = %v, want %v", n, c.p, c.got, want)
				}
			}
		}
	}
}

func TestMonteCarloSampleLoopDoesNotAllocate(t *testing.T) {
	a := Assess(demoSurvey(t), Options{})
	tab := uncertaintyTable(DefaultUncertainties())
	s := newSampler(DefaultSeed, 100, &a.Options.Limits, DefaultMargin, &tab, a.Survey.Site.RelativeHumidity)
	allocs := testing.AllocsPerRun(3, func() {
		for i := range a.Objects {
			_ = s.object(&a.Objects[i])
		}
	})
	if allocs != 0 {
		t.Errorf("%v allocations per run of the sample loop over the demo objects, want 0", allocs)
	}
}

func TestMonteCarloSiteOverride(t *testing.T) {
	// With every Site uncertainty item at 0 the draws equal the point estimate:
	// the part of the closed-form test (1 kV, 50 µJ < MIE 0.24 mJ; derived: C V^2 / 2)
	// is marginal (unearthed) in every draw.
	s := newSurvey([]inventory.Atmosphere{atmToluene}, []inventory.Station{{ID: "S1", Atmosphere: atmToluene.ID}},
		[]inventory.Object{chargedPart("P1", known(1e9))}, nil)
	var items []inventory.SiteItem
	for i, k := range UncertaintyKeys() {
		items = append(items, inventory.SiteItem{Item: k, Key: inventory.NormalizeName(k), Value: "0", Row: i + 5})
	}
	ss, _ := siteWith(items)
	s.Site.Items, s.Site.Limits, s.Site.Uncertainties = ss.Items, ss.Limits, ss.Uncertainties
	a := Assess(s, Options{Samples: 100})
	p := a.Objects[0].Probability
	if p.Marginal != 1 || !scalar.EqualWithinRel(p.EnergyP05, 50e-6, 1e-9) || !scalar.EqualWithinRel(p.EnergyP95, 50e-6, 1e-9) {
		t.Errorf("probability %+v, want marginal 1 and energy 50 µJ throughout", p)
	}
	for _, u := range a.Options.Uncertainties {
		if !u.Overridden || u.Spread != 0 {
			t.Errorf("%s: recorded %v (overridden %v), want 0 from the Site sheet", u.Name, u.Spread, u.Overridden)
		}
	}
}

func TestPrunedInputsFeedNothing(t *testing.T) {
	// Every input the sampler leaves out of a demo object's draws must change
	// neither the verdict nor the energy at any of 500 joint draws of all the
	// object's inputs (derived: an input left out must not feed the result).
	a := Assess(demoSurvey(t), Options{})
	tab := uncertaintyTable(DefaultUncertainties())
	s := newSampler(DefaultSeed, 10, &a.Options.Limits, DefaultMargin, &tab, a.Survey.Site.RelativeHumidity)
	rng := rand.New(rand.NewPCG(3, 4))
	total, drawn := 0, 0
	for i := range a.Objects {
		r := &a.Objects[i]
		full := planFor(r, s.tab, s.siteRH)
		plan := full
		in, env := r.Input, r.Environment
		var fields [numTargets]*float64
		for j := 0; j < plan.n; j++ {
			fields[j] = plan.draws[j].target.field(&in, &env)
		}
		s.prune(&plan, &fields, &in, &env)
		total, drawn = total+full.n, drawn+plan.n
		kept := map[sampleTarget]bool{}
		for j := 0; j < plan.n; j++ {
			kept[plan.draws[j].target] = true
		}
		var all [numTargets]*float64
		for j := 0; j < full.n; j++ {
			all[j] = full.draws[j].target.field(&in, &env)
		}
		for k := 0; k < 500; k++ {
			for j := 0; j < full.n; j++ {
				*all[j] = full.draws[j].draw(rng)
			}
			ev0 := model.Evaluate(in, env, *s.lim)
			c0 := Classify(&in, &env, &ev0, s.lim, s.margin)
			for j := 0; j < full.n; j++ {
				if kept[full.draws[j].target] {
					continue
				}
				base := *all[j]
				*all[j] = full.draws[j].draw(rng)
				ev := model.Evaluate(in, env, *s.lim)
				c := Classify(&in, &env, &ev, s.lim, s.margin)
				if c.Verdict != c0.Verdict || !sameBytes(&c.Energy, &c0.Energy) {
					t.Fatalf("%s: input %d was left out but changes the result (%v, %v J -> %v, %v J)",
						r.Object.ID, full.draws[j].target, c0.Verdict, c0.Energy, c.Verdict, c.Energy)
				}
				*all[j] = base
			}
		}
	}
	if drawn >= total {
		t.Errorf("no input left out of the demo's draws (%d of %d drawn)", drawn, total)
	}
	t.Logf("%d of %d inputs drawn", drawn, total)
}

// onlyInputs is an uncertainty table that draws the given inputs alone.
func onlyInputs(keep ...UncertainInput) []Uncertainty {
	t := DefaultUncertainties()
	for i := range t {
		drawn := false
		for _, k := range keep {
			drawn = drawn || t[i].Input == k
		}
		if !drawn {
			t[i].Spread = 0
		}
	}
	return t
}

// TestMonteCarloCapacitanceBands: a person's typical 200 pF is drawn within the
// body's own band and a vessel's size-table estimate within ×/÷ 3 read as a 95 %
// band, not as one standard deviation (review item 10).
func TestMonteCarloCapacitanceBands(t *testing.T) {
	const n = 4000
	cases := []struct {
		name    string
		obj     inventory.Object
		w0      float64 // J, the point value
		sigmaLn float64 // of ln C
		maxP95  float64 // J, the sourced ceiling of the p95
	}{
		// Person at a measured 10 kV: W0 = 200 pF x (10 kV)^2 / 2 = 10 mJ. The body is
		// 100-300 pF (reference section 2, Saito 1963): sigma(ln C) = ln 1.5 / 1.96 = 0.2069,
		// p95 = 10 mJ x exp(1.645 x 0.2069) = 14.05 mJ, within the about 15 mJ a person
		// stores at most (TRGS 727, reference section 10.3). Derived.
		{"person 200 pF", inventory.Object{ID: "OP", Station: "S1", Kind: "person", SurfacePotential: known(10e3)}, 10e-3, math.Log(1.5) / 1.959964, 15e-3},
		// Container of unknown size at a measured 8 kV: 1000 pF from the size table, W0 =
		// 1 nF x (8 kV)^2 / 2 = 32 mJ; ×/÷ 3 as a 95 % band: sigma(ln C) = ln 3 / 1.96 = 0.5605,
		// p95 = 32 mJ x exp(1.645 x 0.5605) = 80.4 mJ (one standard deviation gave 195 mJ). Derived.
		{"vessel size table", inventory.Object{ID: "DR", Station: "S1", Kind: "container", SurfacePotential: known(8e3)}, 32e-3, math.Log(3) / 1.959964, 100e-3}, // ceiling: well below the 195 mJ of the one-sigma reading
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			s := newSurvey([]inventory.Atmosphere{atmToluene}, []inventory.Station{{ID: "S1", Atmosphere: atmToluene.ID}},
				[]inventory.Object{tc.obj}, nil)
			a := Assess(s, Options{Samples: n, Seed: 7, Uncertainties: onlyInputs(UncCapacitanceEstimated, UncCapacitancePerson)})
			p := a.Objects[0].Probability
			if p == nil {
				t.Fatal("no probability")
			}
			zq := distuv.UnitNormal.Quantile(0.95)
			want := tc.w0 * math.Exp(tc.sigmaLn*zq)
			tol := 4 * tc.sigmaLn * math.Sqrt(0.95*0.05/n) / distuv.UnitNormal.Prob(zq)
			if d := math.Abs(math.Log(p.EnergyP95 / want)); !(d <= tol) {
				t.Errorf("energy p95 %.4g J, want %.4g J (ln ratio %.3f > %.3f)", p.EnergyP95, want, d, tol)
			}
			if p.EnergyP95 > tc.maxP95 {
				t.Errorf("energy p95 %.4g J above %.4g J", p.EnergyP95, tc.maxP95)
			}
		})
	}
	tab := uncertaintyTable(DefaultUncertainties())
	if got := tab[UncCapacitanceEstimated].Text(); got != "×/÷ 1.75 (95 % band ×/÷ 3)" {
		t.Errorf("estimated capacitance shown as %q", got)
	}
	if got := tab[UncCapacitancePerson].Text(); got != "×/÷ 1.23 (95 % band ×/÷ 1.5)" {
		t.Errorf("person capacitance shown as %q", got)
	}
}
