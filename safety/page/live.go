package page

import (
	"bytes"
	"context"
	"crypto/sha256"
	"fmt"
	"html"
	"html/template"
	"net/http"
	"strings"
	"sync"
	"time"

	"beamledger/safety/report"
)

// Live serves the page of a setup file while it is edited: it reads the
// file every Poll, and when its bytes change, builds the document anew
// (Build) and pushes the page's new content to every open page over
// server-sent events. While the file does not load, the page shows the
// error and keeps the last document that loaded, greyed. Nothing is
// written to disk.
type Live struct {
	// Read returns the setup file's bytes; Build makes the document of
	// them, or the error that stops them loading (with file, line and key).
	Read  func() ([]byte, error)
	Build func(data []byte) (*report.Document, error)
	Poll  time.Duration

	mu      sync.Mutex
	hash    [sha256.Size]byte
	read    bool
	title   string
	good    template.HTML // the last document that loaded
	problem string        // why the file does not load now ("" when it does)
	version int
	subs    map[chan struct{}]bool
}

// Refresh reads the file and, when it changed, builds the document again;
// it reports whether the page changed.
func (l *Live) Refresh() bool {
	data, err := l.Read()
	if err != nil {
		return l.set(nil, "", err.Error())
	}
	sum := sha256.Sum256(data)
	l.mu.Lock()
	same := l.read && sum == l.hash
	l.mu.Unlock()
	if same {
		return false
	}
	doc, err := l.Build(data)
	l.mu.Lock()
	l.hash, l.read = sum, true
	l.mu.Unlock()
	if err != nil {
		return l.set(nil, "", err.Error())
	}
	body, err := Body(doc)
	if err != nil {
		return l.set(nil, "", err.Error())
	}
	return l.set(&body, doc.Title, "")
}

// set records a new state and wakes the open pages.
func (l *Live) set(body *template.HTML, title, problem string) bool {
	l.mu.Lock()
	defer l.mu.Unlock()
	if body != nil {
		l.good, l.title = *body, title
	}
	if body == nil && problem == l.problem {
		return false
	}
	l.problem = problem
	l.version++
	for c := range l.subs {
		select {
		case c <- struct{}{}:
		default: // it has an update waiting already
		}
	}
	return true
}

// Content is what the page's main element holds now: the document, or
// the error above the last document that loaded, greyed.
func (l *Live) Content() template.HTML {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.content()
}

func (l *Live) content() template.HTML {
	if l.problem == "" {
		return l.good
	}
	var b strings.Builder
	b.WriteString(`<div class="load-error" role="alert"><p>The setup file does not load; the last result that did is shown greyed below.</p><pre>`)
	b.WriteString(html.EscapeString(l.problem))
	b.WriteString(`</pre></div>`)
	if l.good != "" {
		b.WriteString(`<div class="stale" aria-label="the last result that loaded">` + string(l.good) + `</div>`)
	}
	return template.HTML(b.String())
}

// liveScript replaces the main element's content with each update.
const liveScript template.JS = `(function(){var d=document.getElementById("document");var es=new EventSource("/events");es.onmessage=function(e){d.innerHTML=e.data;};})();`

// Handler serves the page (/), its content alone (/content) and the
// updates (/events).
func (l *Live) Handler() http.Handler {
	mux := http.NewServeMux()
	mux.HandleFunc("GET /{$}", func(w http.ResponseWriter, r *http.Request) {
		l.mu.Lock()
		title, content := l.title, l.content()
		l.mu.Unlock()
		if title == "" {
			title = "beamledger"
		}
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		w.Header().Set("Cache-Control", "no-store")
		var b bytes.Buffer
		if err := Shell(&b, title+" (live)", content, liveScript); err != nil {
			http.Error(w, err.Error(), http.StatusInternalServerError)
			return
		}
		w.Write(b.Bytes())
	})
	mux.HandleFunc("GET /content", func(w http.ResponseWriter, r *http.Request) {
		w.Header().Set("Content-Type", "text/html; charset=utf-8")
		w.Header().Set("Cache-Control", "no-store")
		w.Write([]byte(l.Content()))
	})
	mux.HandleFunc("GET /events", l.events)
	return mux
}

// events streams the page's content after every change, as server-sent
// events (one data line per line of HTML).
func (l *Live) events(w http.ResponseWriter, r *http.Request) {
	fl, ok := w.(http.Flusher)
	if !ok {
		http.Error(w, "streaming unsupported", http.StatusInternalServerError)
		return
	}
	c := make(chan struct{}, 1)
	l.mu.Lock()
	if l.subs == nil {
		l.subs = map[chan struct{}]bool{}
	}
	l.subs[c] = true
	l.mu.Unlock()
	defer func() {
		l.mu.Lock()
		delete(l.subs, c)
		l.mu.Unlock()
	}()
	w.Header().Set("Content-Type", "text/event-stream")
	w.Header().Set("Cache-Control", "no-store")
	fmt.Fprint(w, ": connected\n\n")
	fl.Flush()
	for {
		select {
		case <-r.Context().Done():
			return
		case <-c:
			var b strings.Builder
			for _, line := range strings.Split(string(l.Content()), "\n") {
				b.WriteString("data: " + line + "\n")
			}
			b.WriteString("\n")
			if _, err := fmt.Fprint(w, b.String()); err != nil {
				return
			}
			fl.Flush()
		}
	}
}

// Run refreshes every Poll until ctx ends.
func (l *Live) Run(ctx context.Context) {
	t := time.NewTicker(l.Poll)
	defer t.Stop()
	for {
		select {
		case <-ctx.Done():
			return
		case <-t.C:
			l.Refresh()
		}
	}
}
