// Package lsp is hmb's language server: errors, states and qualities as the user types, over the
// Language Server Protocol on stdio. The files of this package are thin shims, one per method:
// decode, find the document's snapshot, call the feature (package feature) and reply. Analysis
// runs off the request path (see diagnostics.go).
package lsp

import (
	"context"
	"errors"
	"fmt"
	"io"
	"sync"
	"time"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// defaultDebounce is how long the solver waits, during a burst of edits, for the next one: long
// enough that typing a word solves once, short enough not to be noticed.
const defaultDebounce = 30 * time.Millisecond

// options configure a server; tests set them.
type options struct {
	// solve is the solver; the one hmb check runs unless a test stands in another.
	solve    cache.SolveFunc
	debounce time.Duration
	// onPublish, when set, learns of each publication of diagnostics as it is queued, and
	// whether it is the complete set for its version (the check's errors go out before the solve).
	onPublish func(uri protocol.DocumentURI, version int32, final bool)
}

// Run serves one client on in and out until the client exits or in ends. Only protocol goes to
// out; log receives the server's own messages (which also go to the client as
// window/logMessage). It returns nil after an orderly shutdown and exit, or when in ends.
func Run(ctx context.Context, in io.Reader, out io.Writer, log io.Writer) error {
	return run(ctx, in, out, log, options{solve: cache.Solve, debounce: defaultDebounce})
}

func run(ctx context.Context, in io.Reader, out io.Writer, log io.Writer, opts options) error {
	if log == nil {
		log = io.Discard
	}
	closer := func() error { return nil }
	if c, ok := in.(io.Closer); ok {
		closer = c.Close
	}
	st := newStream(in, out, closer, log)
	conn := jsonrpc2.NewConn(st)
	s := newServer(conn, log, opts)
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	conn.Go(ctx, s.handle)
	go s.notifier.run(ctx)
	select {
	case <-conn.Done():
	case <-s.exited:
	case <-ctx.Done():
	}
	// Answer what is still running (a client may send exit right behind its last requests);
	// what has not ended after a while is cancelled, solves included, and answered so.
	if !s.drainReplies(drainTimeout) {
		s.session.Shutdown()
		s.cancelAll()
		s.drainReplies(drainTimeout)
	}
	s.session.Shutdown()
	s.notifier.close()
	if s.exitedWithoutShutdown() {
		return errors.New("exit without shutdown")
	}
	err := conn.Err()
	if err == nil || errors.Is(err, io.EOF) || errors.Is(err, io.ErrClosedPipe) || s.isExited() {
		return nil
	}
	return err
}

// state is where the server is in the protocol's lifecycle.
type state int

const (
	stateNew state = iota
	stateInitialized
	stateShutdown
)

// Server is one client's server.
type Server struct {
	conn     jsonrpc2.Conn
	log      io.Writer
	opts     options
	session  *cache.Session
	notifier *notifier

	mu       sync.Mutex
	state    state
	inflight map[jsonrpc2.ID]context.CancelFunc
	busy     map[protocol.DocumentURI]*cache.Snapshot // the snapshot each document is being analysed at
	// replies counts requests not yet answered, so that run does not return (and the process
	// exit) with answers unwritten; drained is closed when it falls to zero after closing.
	replies    int
	closing    bool
	wasDrained bool
	drained    chan struct{}

	exitOnce sync.Once
	exited   chan struct{}
	// exitNoShutdown records an exit before shutdown (the protocol's exit code 1).
	exitNoShutdown bool
}

func newServer(conn jsonrpc2.Conn, log io.Writer, opts options) *Server {
	if opts.debounce < 0 {
		opts.debounce = 0
	}
	return &Server{
		conn:     conn,
		log:      log,
		opts:     opts,
		session:  cache.NewSession(opts.solve, log),
		notifier: newNotifier(conn, log),
		inflight: make(map[jsonrpc2.ID]context.CancelFunc),
		busy:     make(map[protocol.DocumentURI]*cache.Snapshot),
		drained:  make(chan struct{}),
		exited:   make(chan struct{}),
	}
}

// drainTimeout bounds each of run's two waits, at the end, for requests still being answered.
const drainTimeout = time.Second

// cancelAll cancels every request in flight.
func (s *Server) cancelAll() {
	s.mu.Lock()
	defer s.mu.Unlock()
	for _, cancel := range s.inflight {
		cancel()
	}
}

// startReply counts a request that will be answered; endReply, its answer.
func (s *Server) startReply() {
	s.mu.Lock()
	s.replies++
	s.mu.Unlock()
}

func (s *Server) endReply() {
	s.mu.Lock()
	s.replies--
	s.signalDrained()
	s.mu.Unlock()
}

// signalDrained closes drained, once, when closing and nothing is left to answer. s.mu is held.
func (s *Server) signalDrained() {
	if s.closing && s.replies == 0 && !s.wasDrained {
		s.wasDrained = true
		close(s.drained)
	}
}

// drainReplies waits until every request has been answered, or d has passed; it reports
// whether all were.
func (s *Server) drainReplies(d time.Duration) bool {
	s.mu.Lock()
	s.closing = true
	s.signalDrained()
	s.mu.Unlock()
	t := time.NewTimer(d)
	defer t.Stop()
	select {
	case <-s.drained:
		return true
	case <-t.C:
		fmt.Fprintln(s.log, "hmb lsp: requests still running at exit")
		return false
	}
}

func (s *Server) isExited() bool {
	select {
	case <-s.exited:
		return true
	default:
		return false
	}
}

func (s *Server) exitedWithoutShutdown() bool {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.isExited() && s.exitNoShutdown
}

// logf writes to the log and, as window/logMessage, to the client.
func (s *Server) logf(typ protocol.MessageType, format string, a ...any) {
	msg := fmt.Sprintf(format, a...)
	fmt.Fprintln(s.log, "hmb lsp: "+msg)
	s.notifier.send(protocol.MethodWindowLogMessage, &protocol.LogMessageParams{Type: typ, Message: msg})
}
