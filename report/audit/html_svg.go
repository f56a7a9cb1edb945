package audit

import (
	"fmt"
	"math"
	"strconv"

	"github.com/sparkmargin/sparkmargin/report/assess"
	"github.com/sparkmargin/sparkmargin/report/book"
)

// The plots of the HTML report are laid out here as numbers (positions in the
// SVG's own units) and plain strings; html.tmpl draws them, escaping every
// label. Nothing here writes markup.

// Plot widths in SVG units (the SVG scales to the page width).
const (
	svgWidth    = 920.0
	svgPlotX0   = 250.0 // row labels left of it
	svgPlotX1   = 740.0 // values right of it
	svgRowH     = 22.0
	svgTop      = 36.0 // room for the axis title above the rows
	svgBottom   = 40.0 // room for the axis labels
	svgMaxDecad = 12   // widest energy axis drawn, in decades
)

// rowChart is plot (a) (Spread false) or plot (c) (Spread true): one row per
// object, energy on a log axis, the object's MIE and its margin line.
type rowChart struct {
	Width, Height float64
	X0, X1, Top   float64
	AxisY         float64
	Ticks         []axisTick
	Rows          []chartRow
	Spread        bool
	Empty         bool
}

type axisTick struct {
	X     float64
	Label string
}

type chartRow struct {
	Y, Y0, Y1         float64 // centre, top and bottom of the row's marks
	LabelY            float64
	Label             string // "station / object"
	Verdict, Class    string
	Mark              string // SVG path of the verdict mark at the energy
	MIEX, MarginX     float64
	BandW             float64 // MIEX - MarginX
	P05X, P50X, P95X  float64 // spread rows
	Value             string  // right-hand text: ratio, or p05-p95
	Title             string  // tooltip
	ClippedLo, ClipHi bool
}

// logAxis maps energies (J) to x on a log scale over whole decades.
type logAxis struct{ lo, hi int } // decades of joules: 10^lo .. 10^hi

func (ax logAxis) x(e float64) (float64, bool) {
	if !(e > 0) {
		return svgPlotX0, true
	}
	l := math.Log10(e)
	clipped := false
	if l < float64(ax.lo) {
		l, clipped = float64(ax.lo), true
	}
	if l > float64(ax.hi) {
		l, clipped = float64(ax.hi), true
	}
	return round1(svgPlotX0 + (l-float64(ax.lo))/float64(ax.hi-ax.lo)*(svgPlotX1-svgPlotX0)), clipped
}

func round1(v float64) float64 { return math.Round(v*10) / 10 }

// energyAxis spans every energy, MIE and margin line of the rows in whole
// decades (at least two), at most svgMaxDecad decades ending at the highest.
func energyAxis(ps []energyPoint, margin float64, spread bool) logAxis {
	lo, hi := math.Inf(1), math.Inf(-1)
	see := func(v float64) {
		if v > 0 && !math.IsInf(v, 0) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	for _, p := range ps {
		see(p.energy)
		see(p.mie)
		see(p.mie / margin)
		if spread && p.prob != nil {
			see(p.prob.EnergyP05)
			see(p.prob.EnergyP95)
		}
	}
	if math.IsInf(lo, 1) {
		return logAxis{-6, -1}
	}
	// Whole decades with room on both sides: a value on a decade is drawn
	// inside the axis, never on its edge.
	ax := logAxis{int(math.Ceil(math.Log10(lo))) - 1, int(math.Floor(math.Log10(hi))) + 1}
	if ax.hi-ax.lo < 2 {
		ax.hi = ax.lo + 2
	}
	if ax.hi-ax.lo > svgMaxDecad {
		ax.lo = ax.hi - svgMaxDecad
	}
	return ax
}

// energyTickLabel names a decade of joules in millijoules: 1e-3 J is "1 mJ".
func energyTickLabel(decade int) string {
	k := decade + 3 // decades of mJ
	if k >= -3 && k <= 5 {
		return strconv.FormatFloat(math.Pow(10, float64(k)), 'f', -1, 64) + " mJ"
	}
	return fmt.Sprintf("1e%d mJ", k)
}

// energyChart lays out the rows of plot (a) or (c).
func energyChart(ps []energyPoint, margin float64, spread bool) *rowChart {
	c := &rowChart{Width: svgWidth, X0: svgPlotX0, X1: svgPlotX1, Top: svgTop, Spread: spread, Empty: len(ps) == 0}
	ax := energyAxis(ps, margin, spread)
	for i, p := range ps {
		y := svgTop + svgRowH*float64(i) + svgRowH/2
		r := chartRow{Y: y, Y0: y - svgRowH/2 + 2, Y1: y + svgRowH/2 - 2, LabelY: y + 4,
			Label: truncate(p.station+" / "+p.object, 30), Verdict: p.verdict.String(), Class: verdictClass(p.verdict)}
		clipped := false
		r.MIEX, _ = ax.x(p.mie)
		r.MarginX, _ = ax.x(p.mie / margin)
		r.BandW = round1(r.MIEX - r.MarginX)
		x, cl := ax.x(p.energy)
		clipped = clipped || cl
		if spread && p.prob != nil {
			var c1, c2 bool
			r.P05X, c1 = ax.x(p.prob.EnergyP05)
			r.P50X, _ = ax.x(p.prob.EnergyP50)
			r.P95X, c2 = ax.x(p.prob.EnergyP95)
			clipped = clipped || c1 || c2
			r.Value = book.UnitMJ.Text(p.prob.EnergyP05) + " – " + book.UnitMJ.Text(p.prob.EnergyP95)
			r.Title = fmt.Sprintf("%s at station %s: %s (point energy %s); sampled energy p05 %s, p50 %s, p95 %s; MIE %s; P(incendive) %s, P(marginal) %s, P(non-incendive) %s",
				p.object, p.station, p.verdict, pointEnergyText(p.energy), book.UnitMJ.Text(p.prob.EnergyP05), book.UnitMJ.Text(p.prob.EnergyP50), book.UnitMJ.Text(p.prob.EnergyP95),
				book.UnitMJ.Text(p.mie), book.UnitProbability.Text(p.prob.Incendive), book.UnitProbability.Text(p.prob.Marginal), book.UnitProbability.Text(p.prob.NonIncendive))
		} else {
			r.Value = book.UnitRatio.Text(p.ratio)
			r.Title = fmt.Sprintf("%s at station %s: %s; effective energy %s; MIE %s; MIE / margin %s",
				p.object, p.station, p.verdict, book.UnitMJ.Text(p.energy), book.UnitMJ.Text(p.mie), book.UnitMJ.Text(p.mie/margin))
			if p.assumedR {
				r.Value = assess.RatioAssumedText
				r.Title = fmt.Sprintf("%s at station %s: %s; energy rests on an assumed input (not measured): drawn at the MIE %s (ratio 1), %s",
					p.object, p.station, p.verdict, book.UnitMJ.Text(p.mie), assess.RatioAssumedText)
			}
		}
		r.Mark = markPath(p.verdict, x, y, 6)
		r.ClipHi = clipped
		c.Rows = append(c.Rows, r)
	}
	c.AxisY = svgTop + svgRowH*float64(len(ps)) + 4
	c.Height = c.AxisY + svgBottom
	for d := ax.lo; d <= ax.hi; d++ {
		x, _ := ax.x(math.Pow(10, float64(d)))
		c.Ticks = append(c.Ticks, axisTick{X: x, Label: energyTickLabel(d)})
	}
	return c
}

// markPath is the SVG path of a verdict's mark centred at (x, y) with radius
// r: a diamond for incendive, a triangle for marginal, a circle for
// non-incendive and a square for not assessed, so that the verdicts read
// apart in black-and-white print and for readers who do not tell red from
// green.
func markPath(v assess.Verdict, x, y, r float64) string {
	f := func(v float64) string { return strconv.FormatFloat(round1(v), 'f', -1, 64) }
	switch v {
	case assess.Incendive:
		return "M" + f(x) + " " + f(y-r) + "L" + f(x+r) + " " + f(y) + "L" + f(x) + " " + f(y+r) + "L" + f(x-r) + " " + f(y) + "Z"
	case assess.Marginal:
		return "M" + f(x) + " " + f(y-r) + "L" + f(x+r) + " " + f(y+0.8*r) + "L" + f(x-r) + " " + f(y+0.8*r) + "Z"
	case assess.NonIncendive:
		return "M" + f(x-r) + " " + f(y) + "A" + f(r) + " " + f(r) + " 0 1 0 " + f(x+r) + " " + f(y) + "A" + f(r) + " " + f(r) + " 0 1 0 " + f(x-r) + " " + f(y) + "Z"
	}
	q := 0.8 * r
	return "M" + f(x-q) + " " + f(y-q) + "H" + f(x+q) + "V" + f(y+q) + "H" + f(x-q) + "Z"
}

// gridChart is plot (b): stations down, relative humidity across, the
// verdict at each step as a tinted cell with its mark.
type gridChart struct {
	Width, Height float64
	X0, CellW     float64
	Top, Bottom   float64
	Cols          []axisTick
	Rows          []gridRow
	Clearances    []gridClearance
}

type gridRow struct {
	Y, LabelY float64
	Label     string
	Cells     []gridCell
	HasRH     bool
	RHX       float64
	RHTitle   string
}

type gridCell struct {
	X, W  float64
	Class string
	Mark  string
	Title string
}

type gridClearance struct {
	ID, Name, Text string
}

// humidityChart lays out plot (b) with the stations in the audit's rank order
// (then any station the audit does not rank) and, on each row, a tick at the
// humidity the survey gives for the station (its own, else the site's).
func humidityChart(g *HumidityGrid, a *assess.Audit) *gridChart {
	n := len(g.RH)
	cellW := math.Min(64, math.Floor((svgWidth-svgPlotX0-10)/float64(n)))
	c := &gridChart{Width: svgWidth, X0: svgPlotX0, CellW: cellW, Top: svgTop}
	for i, rh := range g.RH {
		c.Cols = append(c.Cols, axisTick{X: round1(svgPlotX0 + cellW*(float64(i)+0.5)), Label: plainNumber(rh)})
	}
	byID := map[string]*HumidityStation{}
	for i := range g.Stations {
		byID[g.Stations[i].ID] = &g.Stations[i]
	}
	var order []*HumidityStation
	seen := map[string]bool{}
	for i := range a.Stations {
		if hs := byID[a.Stations[i].Station.ID]; hs != nil && !seen[hs.ID] {
			order = append(order, hs)
			seen[hs.ID] = true
		}
	}
	for i := range g.Stations {
		if !seen[g.Stations[i].ID] {
			order = append(order, &g.Stations[i])
			seen[g.Stations[i].ID] = true
		}
	}
	site := a.Survey.Site.RelativeHumidity
	for j, hs := range order {
		y := svgTop + svgRowH*float64(j)
		name := ""
		rh := site
		if st, ok := a.Survey.Station(hs.ID); ok {
			name = st.Name
			if st.RelativeHumidity.Known {
				rh = st.RelativeHumidity
			}
		}
		label := hs.ID
		if name != "" {
			label += " " + name
		}
		row := gridRow{Y: y, LabelY: y + svgRowH/2 + 4, Label: truncate(label, 30)}
		for i, v := range hs.Verdicts {
			if i >= n {
				break
			}
			x := svgPlotX0 + cellW*float64(i)
			row.Cells = append(row.Cells, gridCell{X: round1(x + 1), W: cellW - 2, Class: verdictClass(v),
				Mark:  markPath(v, x+cellW/2, y+10, 5),
				Title: fmt.Sprintf("%s at %s %% RH: %s", hs.ID, plainNumber(g.RH[i]), v)})
		}
		if rh.Known && n > 1 {
			lo, hi := g.RH[0], g.RH[n-1]
			f := (rh.Value - lo) / (hi - lo)
			f = math.Max(0, math.Min(1, f))
			row.HasRH = true
			row.RHX = round1(svgPlotX0 + cellW/2 + f*cellW*float64(n-1) - 1) // the bar is 2 wide
			row.RHTitle = fmt.Sprintf("%s as surveyed: %s %% RH", hs.ID, plainNumber(rh.Value))
		}
		c.Rows = append(c.Rows, row)
		c.Clearances = append(c.Clearances, gridClearance{ID: hs.ID, Name: name, Text: hs.Text})
	}
	c.Bottom = svgTop + svgRowH*float64(len(order))
	c.Height = c.Bottom + 30
	return c
}

// truncate shortens a label to at most n runes, marking the cut with "…".
func truncate(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// plainNumber writes a humidity as people say it: 35, 37.5 (no trailing zeros).
func plainNumber(v float64) string { return strconv.FormatFloat(math.Round(v*1000)/1000, 'f', -1, 64) }

// pointEnergyText is the point estimate's effective energy, or "no
// discharge" when it is 0 (its mark then sits at the axis' left end).
func pointEnergyText(e float64) string {
	if !(e > 0) {
		return "no discharge"
	}
	return book.UnitMJ.Text(e)
}
