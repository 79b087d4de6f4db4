package main

import (
	"fmt"
	"io"
	"os"
	"strings"
	"sync"
	"time"

	"wedgebound/certify"
	"wedgebound/certify/relaxation"
)

// progress draws a one-line progress display on a terminal; it stays silent
// when stderr is not a terminal or when quiet. It shows what is really done
// (pieces, cells proved, enclosures computed, search rounds), the rate and,
// where the total is known, an estimate of the time left.
type progress struct {
	mu    sync.Mutex
	w     io.Writer
	on    bool
	last  time.Time
	drawn bool
	start time.Time
	// stage and stageStart: the current stage and when it began (rates and
	// estimates are per stage).
	stage      string
	stageStart time.Time
}

func newProgress(w io.Writer, quiet bool) *progress {
	on := false
	if f, ok := w.(*os.File); ok && !quiet {
		if st, err := f.Stat(); err == nil && st.Mode()&os.ModeCharDevice != 0 {
			on = true
		}
	}
	now := time.Now()
	return &progress{w: w, on: on, start: now, stageStart: now}
}

// enter notes the stage and returns the time spent in it (call with mu held).
func (p *progress) enter(stage string, now time.Time) time.Duration {
	if stage != p.stage {
		p.stage, p.stageStart = stage, now
	}
	return now.Sub(p.stageStart)
}

// due reports whether a redraw is due (at most 5 per second; final states
// always draw). Call with mu held.
func (p *progress) due(now time.Time, final bool) bool {
	if now.Sub(p.last) < 200*time.Millisecond && !final {
		return false
	}
	p.last = now
	return true
}

func (p *progress) draw(line string) {
	fmt.Fprintf(p.w, "\r%s\033[K", line)
	p.drawn = true
}

// update shows a count done of total (a round counter when total is 0).
func (p *progress) update(stage string, done, total int) {
	if !p.on {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	now := time.Now()
	in := p.enter(stage, now)
	if !p.due(now, done == total) {
		return
	}
	el := now.Sub(p.start).Round(time.Second)
	if total > 0 {
		n := 30 * done / total
		p.draw(fmt.Sprintf("%-12s [%s%s] %d/%d%s %v", stage, strings.Repeat("#", n), strings.Repeat(".", 30-n), done, total, timeLeft(in, done, total), el))
	} else {
		p.draw(fmt.Sprintf("%-12s round %d %v", stage, done, el))
	}
}

// cover shows the status of a running cover: pieces, cells proved,
// enclosures computed against the work bound, the rate and the time left
// (from the pieces done, which the cells of the remaining pieces may
// change: it is an estimate).
func (p *progress) cover(stage string, st certify.CoverStatus) {
	if !p.on {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	now := time.Now()
	in := p.enter(stage, now)
	if !p.due(now, st.PiecesDone == st.Pieces) {
		return
	}
	rate := ""
	if s := in.Seconds(); s > 0.5 {
		rate = fmt.Sprintf(", %.0f/s", float64(st.Evaluations)/s)
	}
	p.draw(fmt.Sprintf("%-12s pieces %d/%d, %d cells proved, %d enclosures (%.1f%% of the work bound)%s%s %v",
		stage, st.PiecesDone, st.Pieces, st.Cells, st.Evaluations, 100*float64(st.Evaluations)/float64(max(st.Budget, 1)),
		rate, timeLeft(in, st.PiecesDone, st.Pieces), now.Sub(p.start).Round(time.Second)))
}

// work shows a certify.Run event.
func (p *progress) work(w relaxation.Work) {
	if !p.on {
		return
	}
	switch {
	case w.Cover != nil:
		p.cover("cover", *w.Cover)
		return
	case w.Search != nil:
		p.mu.Lock()
		defer p.mu.Unlock()
		now := time.Now()
		in := p.enter(w.Stage, now)
		if !p.due(now, false) {
			return
		}
		s := w.Search
		rate := ""
		if sec := in.Seconds(); sec > 0.5 {
			rate = fmt.Sprintf(", %.2f rounds/s", float64(s.Iter)/sec)
		}
		p.draw(fmt.Sprintf("%-12s round %d (at most %d), %d cuts, best value %.6g, LP model %.6g%s %v",
			"search", s.Iter, w.MaxRounds, s.Cuts, s.Best, s.Model, rate, now.Sub(p.start).Round(time.Second)))
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	now := time.Now()
	p.enter(w.Stage, now)
	p.last = now
	p.draw(fmt.Sprintf("%-12s ... %v", w.Stage, now.Sub(p.start).Round(time.Second)))
}

// timeLeft estimates the time left from the fraction done so far of a
// stage that has run for in.
func timeLeft(in time.Duration, done, total int) string {
	if done <= 0 || done >= total || in < time.Second {
		return ""
	}
	left := time.Duration(float64(in) * float64(total-done) / float64(done))
	return fmt.Sprintf(", about %v left", left.Round(time.Second))
}

func (p *progress) done() {
	if p.on && p.drawn {
		fmt.Fprint(p.w, "\r\033[K")
	}
}
