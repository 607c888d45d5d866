package lsp

import (
	"bytes"
	"context"
	"encoding/json"
	"net"
	"strings"
	"sync"
	"testing"
	"time"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/thermo/model"
	"hmb/thermo/solve"
)

// solveDouble is the solver these tests of the server run: hmb check's own, except that a model
// titled "slow" never finishes before its context is cancelled.
func solveDouble(ctx context.Context, m *model.Model) *solve.Result {
	if m.Title == "slow" {
		<-ctx.Done()
		return nil
	}
	return cache.Solve(ctx, m)
}

// client drives a server in-process over a pipe, on the same jsonrpc2 package editors' clients
// are built on.
type client struct {
	t      testing.TB
	conn   jsonrpc2.Conn
	ctx    context.Context
	done   chan error
	log    *syncBuffer
	mu     sync.Mutex
	diags  []*protocol.PublishDiagnosticsParams
	notify chan struct{}
	sent   map[string][]jsonrpc2.ID // the ids of the calls written, by method
	queued map[pubKey]int           // publications the server queued, by document version
	final  map[pubKey]int           // the number of the complete one among them
}

type pubKey struct {
	uri     protocol.DocumentURI
	version int32
}

// tapStream records the id of every call the client writes, so that a test can cancel a call
// it sent from another goroutine.
type tapStream struct {
	jsonrpc2.Stream
	c *client
}

func (s tapStream) Write(ctx context.Context, msg jsonrpc2.Message) (int64, error) {
	n, err := s.Stream.Write(ctx, msg)
	if call, ok := msg.(*jsonrpc2.Call); ok && err == nil {
		s.c.mu.Lock()
		s.c.sent[call.Method()] = append(s.c.sent[call.Method()], call.ID())
		s.c.mu.Unlock()
	}
	return n, err
}

// sentID waits until the client has written a call of method and returns the id of the first.
func (c *client) sentID(method string) jsonrpc2.ID {
	c.t.Helper()
	deadline := time.Now().Add(waitLimit)
	for time.Now().Before(deadline) {
		c.mu.Lock()
		ids := c.sent[method]
		c.mu.Unlock()
		if len(ids) > 0 {
			return ids[0]
		}
		time.Sleep(time.Millisecond)
	}
	c.t.Fatalf("no %s call was sent", method)
	return jsonrpc2.ID{}
}

type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (b *syncBuffer) Write(p []byte) (int, error) {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.b.Write(p)
}

func (b *syncBuffer) String() string {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.b.String()
}

func newTestOptions(debounce time.Duration) options {
	return options{solve: solveDouble, debounce: debounce}
}

// startServer starts a server and a client and initializes the session.
func startServer(t testing.TB, opts options) *client {
	t.Helper()
	c := startRaw(t, opts)
	var res map[string]any
	if err := c.call(protocol.MethodInitialize, map[string]any{"processId": nil, "rootUri": nil, "capabilities": map[string]any{}}, &res); err != nil {
		t.Fatal(err)
	}
	c.notifyServer(protocol.MethodInitialized, map[string]any{})
	return c
}

// startRaw starts a server and a client without initializing.
func startRaw(t testing.TB, opts options) *client {
	t.Helper()
	sc, cc := net.Pipe()
	ctx, cancel := context.WithCancel(context.Background())
	c := &client{t: t, ctx: ctx, done: make(chan error, 1), log: &syncBuffer{}, notify: make(chan struct{}, 1),
		sent: map[string][]jsonrpc2.ID{}, queued: map[pubKey]int{}, final: map[pubKey]int{}}
	opts.onPublish = func(uri protocol.DocumentURI, version int32, final bool) {
		c.mu.Lock()
		defer c.mu.Unlock()
		k := pubKey{uri, version}
		c.queued[k]++
		if final {
			c.final[k] = c.queued[k]
		}
	}
	go func() { c.done <- run(ctx, sc, sc, c.log, opts) }()
	c.conn = jsonrpc2.NewConn(tapStream{jsonrpc2.NewStream(cc), c})
	c.conn.Go(ctx, func(ctx context.Context, reply jsonrpc2.Replier, req jsonrpc2.Request) error {
		if req.Method() == protocol.MethodTextDocumentPublishDiagnostics {
			var p protocol.PublishDiagnosticsParams
			if err := json.Unmarshal(req.Params(), &p); err != nil {
				t.Errorf("bad publishDiagnostics: %v", err)
			}
			c.mu.Lock()
			c.diags = append(c.diags, &p)
			c.mu.Unlock()
			select {
			case c.notify <- struct{}{}:
			default:
			}
		}
		return reply(ctx, nil, nil)
	})
	t.Cleanup(func() {
		cancel()
		cc.Close()
		sc.Close()
	})
	return c
}

func (c *client) call(method string, params, result any) error {
	ctx, cancel := context.WithTimeout(c.ctx, 10*time.Second)
	defer cancel()
	_, err := c.conn.Call(ctx, method, params, result)
	return err
}

func (c *client) mustCall(method string, params, result any) {
	c.t.Helper()
	if err := c.call(method, params, result); err != nil {
		c.t.Fatalf("%s: %v", method, err)
	}
}

func (c *client) notifyServer(method string, params any) {
	c.t.Helper()
	if err := c.conn.Notify(c.ctx, method, params); err != nil {
		c.t.Fatalf("notify %s: %v", method, err)
	}
}

func (c *client) open(uri protocol.DocumentURI, version int32, text string) {
	c.notifyServer(protocol.MethodTextDocumentDidOpen, &protocol.DidOpenTextDocumentParams{
		TextDocument: protocol.TextDocumentItem{URI: uri, LanguageID: "hmb", Version: version, Text: text}})
}

func (c *client) change(uri protocol.DocumentURI, version int32, changes ...map[string]any) {
	c.notifyServer(protocol.MethodTextDocumentDidChange, map[string]any{
		"textDocument":   map[string]any{"uri": uri, "version": version},
		"contentChanges": changes,
	})
}

// waitDiags waits for the complete set of diagnostics for uri at version (the server may first
// publish the check's errors alone) and returns it.
func (c *client) waitDiags(uri protocol.DocumentURI, version int32) []protocol.Diagnostic {
	c.t.Helper()
	timeout := time.After(waitLimit)
	key := pubKey{uri, version}
	for {
		c.mu.Lock()
		var got []*protocol.PublishDiagnosticsParams
		for _, p := range c.diags {
			if p.URI == uri && int32(p.Version) == version {
				got = append(got, p)
			}
		}
		n := c.final[key]
		c.mu.Unlock()
		// The notifier sends in order: once as many have come as were queued up to the final
		// one, the last is the final one.
		if n > 0 && len(got) >= n {
			return got[n-1].Diagnostics
		}
		select {
		case <-c.notify:
		case <-time.After(5 * time.Millisecond):
		case <-timeout:
			c.t.Fatalf("no diagnostics for %s version %d; got %d publications", uri, version, len(c.published()))
			return nil
		}
	}
}

// waitPublished waits for the first publication for uri at version.
func (c *client) waitPublished(uri protocol.DocumentURI, version int32) []protocol.Diagnostic {
	c.t.Helper()
	timeout := time.After(waitLimit)
	for {
		c.mu.Lock()
		for _, p := range c.diags {
			if p.URI == uri && int32(p.Version) == version {
				c.mu.Unlock()
				return p.Diagnostics
			}
		}
		c.mu.Unlock()
		select {
		case <-c.notify:
		case <-timeout:
			c.t.Fatalf("no diagnostics for %s version %d", uri, version)
			return nil
		}
	}
}

func (c *client) published() []*protocol.PublishDiagnosticsParams {
	c.mu.Lock()
	defer c.mu.Unlock()
	return append([]*protocol.PublishDiagnosticsParams(nil), c.diags...)
}

// at returns the protocol position of the n-th byte after the first occurrence of marker in src.
func at(t testing.TB, src, marker string, n int) protocol.Position {
	t.Helper()
	i := strings.Index(src, marker)
	if i < 0 {
		t.Fatalf("marker %q not in source", marker)
	}
	return cache.NewMapper("", []byte(src)).Position(i + n)
}

func docPos(uri protocol.DocumentURI, p protocol.Position) map[string]any {
	return map[string]any{"textDocument": map[string]any{"uri": uri}, "position": p}
}

// withoutCode drops the diagnostics of one code: the solver's under-specification (HMB501) of a
// test file of bare streams, say, where a test is about something else.
func withoutCode(ds []protocol.Diagnostic, code string) []protocol.Diagnostic {
	var out []protocol.Diagnostic
	for _, d := range ds {
		if d.Code != code {
			out = append(out, d)
		}
	}
	return out
}

// waitLimit bounds every wait of these tests for something the server must do. It only ends a
// test that would hang; the machine the tests run on may be shared and busy, so it is generous.
const waitLimit = 2 * time.Minute
