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

	"hmb/lsp/analysis"
	"hmb/lsp/cache"
)

// defaultDebounce is how long the solver waits after an edit for the next one: long enough that
// typing a word solves once, short enough not to be noticed.
const defaultDebounce = 30 * time.Millisecond

// options configure a server; tests set them.
type options struct {
	analyzer cache.Analyzer
	debounce time.Duration
}

// Run serves one client on in and out until the client exits or in ends. Only protocol goes to
// out; log receives the server's own messages (which also go to the client as
// window/logMessage). It returns nil after an orderly shutdown and exit, or when in ends.
func Run(ctx context.Context, in io.Reader, out io.Writer, log io.Writer) error {
	return run(ctx, in, out, log, options{analyzer: defaultAnalyzer(), debounce: defaultDebounce})
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
		session:  cache.NewSession(opts.analyzer, log),
		notifier: newNotifier(conn, log),
		inflight: make(map[jsonrpc2.ID]context.CancelFunc),
		exited:   make(chan struct{}),
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

// defaultAnalyzer is the notation and the solver the command line uses.
func defaultAnalyzer() cache.Analyzer { return analysis.New(nil) }
