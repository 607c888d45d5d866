package lsp

import (
	"context"
	"fmt"
	"io"
	"sync"

	"go.lsp.dev/jsonrpc2"

	"hmb/lsp/cache"
)

// notifier sends notifications to the client from one goroutine, in the order they were queued.
// Handlers never write to the client themselves: a write can block on a client that is itself
// blocked writing to us, and the connection reads our input on the goroutine that calls them.
type notifier struct {
	conn jsonrpc2.Conn
	log  io.Writer

	mu     sync.Mutex
	cond   *sync.Cond
	queue  []note
	closed bool
}

// note is one queued notification. When snap is set, the note is dropped if a newer version has
// superseded snap by the time it would be sent: results for old text must not reach the editor.
type note struct {
	method string
	params any
	snap   *cache.Snapshot
}

func newNotifier(conn jsonrpc2.Conn, log io.Writer) *notifier {
	n := &notifier{conn: conn, log: log}
	n.cond = sync.NewCond(&n.mu)
	return n
}

func (n *notifier) send(method string, params any) { n.enqueue(note{method: method, params: params}) }

func (n *notifier) enqueue(x note) {
	n.mu.Lock()
	if !n.closed {
		n.queue = append(n.queue, x)
		n.cond.Signal()
	}
	n.mu.Unlock()
}

func (n *notifier) close() {
	n.mu.Lock()
	n.closed = true
	n.queue = nil
	n.cond.Broadcast()
	n.mu.Unlock()
}

func (n *notifier) run(ctx context.Context) {
	for {
		n.mu.Lock()
		for len(n.queue) == 0 && !n.closed {
			n.cond.Wait()
		}
		if n.closed {
			n.mu.Unlock()
			return
		}
		x := n.queue[0]
		n.queue[0] = note{}
		n.queue = n.queue[1:]
		n.mu.Unlock()
		if x.snap != nil && x.snap.Superseded() {
			continue
		}
		if err := n.conn.Notify(ctx, x.method, x.params); err != nil {
			fmt.Fprintf(n.log, "hmb lsp: sending %s: %v\n", x.method, err)
		}
	}
}
