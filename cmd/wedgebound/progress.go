package main

import (
	"fmt"
	"io"
	"os"
	"strings"
	"sync"
	"time"
)

// progress draws a one-line progress display on a terminal; it stays silent
// when stderr is not a terminal or when quiet.
type progress struct {
	mu    sync.Mutex
	w     io.Writer
	on    bool
	last  time.Time
	drawn bool
	start time.Time
}

func newProgress(w io.Writer, quiet bool) *progress {
	on := false
	if f, ok := w.(*os.File); ok && !quiet {
		if st, err := f.Stat(); err == nil && st.Mode()&os.ModeCharDevice != 0 {
			on = true
		}
	}
	return &progress{w: w, on: on, start: time.Now()}
}

func (p *progress) update(stage string, done, total int) {
	if !p.on {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	now := time.Now()
	if now.Sub(p.last) < 200*time.Millisecond && done != total {
		return
	}
	p.last = now
	el := now.Sub(p.start).Round(time.Second)
	if total > 0 {
		n := 30 * done / total
		fmt.Fprintf(p.w, "\r%-12s [%s%s] %d/%d %v ", stage, strings.Repeat("#", n), strings.Repeat(".", 30-n), done, total, el)
	} else {
		fmt.Fprintf(p.w, "\r%-12s round %d %v ", stage, done, el)
	}
	p.drawn = true
}

func (p *progress) done() {
	if p.on && p.drawn {
		fmt.Fprint(p.w, "\r\033[K")
	}
}
