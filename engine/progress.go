package engine

import (
	"fmt"
	"io"
	"os"
	"strings"
	"time"
)

// crit: simulate — the progress report of a long simulation.

// simProgress reports a long simulation: nothing for runs shorter than
// simQuiet; after that a redrawn bar when out is a terminal, otherwise
// (or through Options.Progress) a plain line at each quarter.
type simProgress struct {
	label    string
	short    string // the label beside a terminal's bar ("" = label)
	sink     func(string)
	out      io.Writer
	tty      bool
	start    time.Time
	shown    bool
	lastDraw time.Time
	nextQ    int // next quarter to print, plain mode
	lastDone int
}

// simQuiet is how long a simulation runs before it is reported.
const simQuiet = time.Second

// newSimProgress returns the report of a simulation starting now: lines
// to sink when it is set, else to out, with a redrawn bar when out is a
// terminal.
func newSimProgress(label string, sink func(string), out io.Writer) *simProgress {
	p := &simProgress{label: label, sink: sink, out: out, start: time.Now()}
	if sink == nil {
		if f, ok := out.(*os.File); ok {
			if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
				p.tty = true
			}
		}
	}
	return p
}

// line writes one plain line of the report.
func (p *simProgress) line(s string) {
	if p.sink != nil {
		p.sink(s)
	} else if p.out != nil {
		fmt.Fprintln(p.out, s)
	}
}

// update reports done of total replications: nothing in the first
// simQuiet, then the bar (at most every 100 ms) or a line per quarter.
func (p *simProgress) update(done, total int) {
	p.lastDone = done
	now := time.Now()
	el := now.Sub(p.start)
	if el < simQuiet || done >= total {
		return // finish reports the end
	}
	if p.tty {
		if p.shown && now.Sub(p.lastDraw) < 100*time.Millisecond {
			return
		}
		p.shown, p.lastDraw = true, now
		const width = 30
		fill := width * done / total
		eta := time.Duration(float64(el) / float64(done) * float64(total-done))
		lab := p.short
		if lab == "" {
			lab = p.label
		}
		fmt.Fprintf(p.out, "\r%s [%s%s] %3d%% %s left ", lab, strings.Repeat("#", fill), strings.Repeat(".", width-fill),
			100*done/total, eta.Round(time.Second))
		return
	}
	q := 4 * done / total // quarters done
	if !p.shown || q >= p.nextQ {
		p.shown = true
		p.nextQ = q + 1
		p.line(fmt.Sprintf("%s: %d%% after %s", p.label, 100*done/total, el.Round(100*time.Millisecond)))
	}
}

// finish ends the report: quiet for a short successful run.
func (p *simProgress) finish(err error) {
	el := time.Since(p.start).Round(100 * time.Millisecond)
	if p.tty && p.shown {
		fmt.Fprintln(p.out)
	}
	if err == nil && !p.shown && el < simQuiet {
		return
	}
	if err != nil {
		p.line(fmt.Sprintf("%s: stopped after %s", p.label, el))
		return
	}
	p.line(fmt.Sprintf("%s: done in %s", p.label, el))
}
