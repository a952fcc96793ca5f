package figures

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"

	"github.com/galley-econ/galley/analysis/series"
)

// minus is the typographic minus sign used in tick labels.
const minus = "\u2212"

// valueTicks labels a value axis with 4 to 7 round numbers, all printed
// with the same number of decimals.
type valueTicks struct{}

func (valueTicks) Ticks(min, max float64) []plot.Tick {
	if !(max > min) {
		return []plot.Tick{{Value: min, Label: formatValue(min, 0)}}
	}
	var step float64
	for _, target := range []float64{5, 7, 10, 14} {
		step = niceStep((max-min)/target, []float64{1, 2, 2.5, 5, 10})
		if math.Floor(max/step+1e-9)-math.Ceil(min/step-1e-9)+1 >= 4 {
			break
		}
	}
	dec := decimals(step)
	var ticks []plot.Tick
	for k := math.Ceil(min/step - 1e-9); k*step <= max+step*1e-9; k++ {
		v := k * step
		if math.Abs(v) < step*1e-9 {
			v = 0
		}
		ticks = append(ticks, plot.Tick{Value: v, Label: formatValue(v, dec)})
		// unlabelled minor tick half way
		if h := v + step/2; h <= max {
			ticks = append(ticks, plot.Tick{Value: h})
		}
	}
	if h := math.Ceil(min/step-1e-9)*step - step/2; h >= min {
		ticks = append(ticks, plot.Tick{Value: h})
	}
	return ticks
}

// niceStep returns the smallest m·10^e ≥ raw with m from mult.
func niceStep(raw float64, mult []float64) float64 {
	if raw <= 0 || math.IsNaN(raw) || math.IsInf(raw, 0) {
		return 1
	}
	e := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, m := range mult {
		if m*e >= raw*(1-1e-12) {
			return m * e
		}
	}
	return 10 * e
}

// decimals is the number of decimals needed to print multiples of step.
func decimals(step float64) int {
	for d := 0; d < 10; d++ {
		s := step * math.Pow(10, float64(d))
		if math.Abs(s-math.Round(s)) < 1e-9*s {
			return d
		}
	}
	return 10
}

func formatValue(v float64, dec int) string {
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.HasPrefix(s, "-") {
		s = minus + s[1:]
	}
	return s
}

// DateTicks places ticks on a date axis whose coordinates are fractional
// years (series.Date.Decimal). For spans of more than about three years
// the labelled ticks are whole years at a step of 1, 2, 4, 5, 10, 20, 25,
// 50 or 100 years — the smallest giving at most MaxLabels labels — placed
// at multiples of the step, with unlabelled ticks at the years (or
// decades) between. For shorter spans of monthly or daily data the
// labels are months (2009-03) at a step of 1, 2, 3, 4 or 6 months, and for
// quarterly data quarters (2009Q1) at a step of 1 or 2 quarters (or years
// when even that is crowded).
type DateTicks struct {
	Freq      series.Freq
	MaxLabels int // at most this many labels; 0 means 6
}

// Ticks implements plot.Ticker.
func (d DateTicks) Ticks(min, max float64) []plot.Tick {
	maxLabels := d.MaxLabels
	if maxLabels <= 0 {
		maxLabels = 6
	}
	if d.Freq == series.Undated {
		return integerTicks(min, max, maxLabels)
	}
	span := max - min
	if span <= 3 && (d.Freq == series.Monthly || d.Freq == series.Daily) {
		if t := subYearTicks(min, max, 12, []int{1, 2, 3, 4, 6}, maxLabels, func(y, m int) string {
			return fmt.Sprintf("%d-%02d", y, m)
		}); t != nil {
			return t
		}
	}
	if span <= 3 && d.Freq == series.Quarterly {
		if t := subYearTicks(min, max, 4, []int{1, 2}, maxLabels, func(y, q int) string {
			return fmt.Sprintf("%dQ%d", y, q)
		}); t != nil {
			return t
		}
	}
	return yearTicks(min, max, maxLabels)
}

var yearSteps = []int{1, 2, 4, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000}

func yearTicks(min, max float64, maxLabels int) []plot.Tick {
	first := int(math.Ceil(min - 1e-9))
	last := int(math.Floor(max + 1e-9))
	step := yearSteps[len(yearSteps)-1]
	for _, s := range yearSteps {
		if countMultiples(first, last, s) <= maxLabels {
			step = s
			break
		}
	}
	minor := 1
	switch {
	case step >= 100:
		minor = step / 5
	case step >= 20:
		minor = 5
	case step == 10:
		minor = 2
	}
	if step == 1 {
		minor = 0
	}
	var ticks []plot.Tick
	for y := first; y <= last; y++ {
		switch {
		case mod(y, step) == 0:
			ticks = append(ticks, plot.Tick{Value: float64(y), Label: strconv.Itoa(y)})
		case minor > 0 && mod(y, minor) == 0:
			ticks = append(ticks, plot.Tick{Value: float64(y)})
		}
	}
	if len(ticks) == 0 || allUnlabelled(ticks) { // span inside one year
		ticks = append(ticks, plot.Tick{Value: min, Label: strconv.Itoa(int(math.Floor(min)))})
	}
	return ticks
}

// subYearTicks labels periods of 1/per year at the first step (in
// periods) from steps giving at most maxLabels labels, aligned so that
// labelled periods are multiples of the step counted from the start of
// the year. It returns nil if none fits.
func subYearTicks(min, max float64, per int, steps []int, maxLabels int, label func(y, sub int) string) []plot.Tick {
	first := int(math.Ceil(min*float64(per) - 1e-6))
	last := int(math.Floor(max*float64(per) + 1e-6))
	for _, s := range steps {
		if countMultiples(first, last, s) > maxLabels {
			continue
		}
		var ticks []plot.Tick
		for k := first; k <= last; k++ {
			v := float64(k) / float64(per)
			if mod(k, s) == 0 {
				ticks = append(ticks, plot.Tick{Value: v, Label: label(floorDiv(k, per), mod(k, per)+1)})
			} else {
				ticks = append(ticks, plot.Tick{Value: v})
			}
		}
		return ticks
	}
	return nil
}

func integerTicks(min, max float64, maxLabels int) []plot.Tick {
	first := int(math.Ceil(min - 1e-9))
	last := int(math.Floor(max + 1e-9))
	steps := []int{1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000, 10000}
	step := steps[len(steps)-1]
	for _, s := range steps {
		if countMultiples(first, last, s) <= maxLabels {
			step = s
			break
		}
	}
	var ticks []plot.Tick
	for k := first; k <= last; k++ {
		if mod(k, step) == 0 {
			ticks = append(ticks, plot.Tick{Value: float64(k), Label: strconv.Itoa(k)})
		}
	}
	return ticks
}

func countMultiples(first, last, s int) int {
	n := 0
	for k := first; k <= last; k++ {
		if mod(k, s) == 0 {
			n++
		}
	}
	return n
}

func allUnlabelled(t []plot.Tick) bool {
	for _, x := range t {
		if x.Label != "" {
			return false
		}
	}
	return true
}

func mod(a, b int) int { return ((a % b) + b) % b }

func floorDiv(a, b int) int { return (a - mod(a, b)) / b }

// blankLabels keeps another ticker's marks but drops their labels, for the
// upper panels of a stacked figure that share the bottom panel's axis.
type blankLabels struct{ plot.Ticker }

func (b blankLabels) Ticks(min, max float64) []plot.Tick {
	t := b.Ticker.Ticks(min, max)
	for i := range t {
		t[i].Label = ""
	}
	return t
}
