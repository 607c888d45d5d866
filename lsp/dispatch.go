package lsp

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"runtime/debug"
	"strings"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
)

// The server dispatches with its own table rather than protocol.ServerHandler, whose
// protocol.Handlers wrapper runs one request at a time and whose fallback is ignored.
// Notifications run on the connection's reading goroutine, in order, and return at once (text
// sync only applies edits). Each request takes the snapshot of its document there, in order with
// the edits, and then runs in a goroutine of its own, under a context that $/cancelRequest
// cancels. A panic anywhere becomes an error reply, never the end of the process.

// method handles one request. When doc is set, it finds the document the params name, and snap
// is that document's snapshot as of the request's arrival (nil when the document is not open).
type method struct {
	doc  func(params json.RawMessage) protocol.DocumentURI
	call func(s *Server, ctx context.Context, snap *cache.Snapshot, params json.RawMessage) (any, error)
}

var methods map[string]method

func init() {
	methods = map[string]method{
		protocol.MethodInitialize:                 {call: (*Server).initialize},
		protocol.MethodShutdown:                   {call: (*Server).shutdown},
		protocol.MethodTextDocumentHover:          docMethod((*Server).hover),
		"textDocument/inlayHint":                  docMethod((*Server).inlayHint),
		protocol.MethodTextDocumentCompletion:     docMethod((*Server).completion),
		protocol.MethodTextDocumentDefinition:     docMethod((*Server).definition),
		protocol.MethodTextDocumentReferences:     docMethod((*Server).references),
		protocol.MethodTextDocumentPrepareRename:  docMethod((*Server).prepareRename),
		protocol.MethodTextDocumentRename:         docMethod((*Server).rename),
		protocol.MethodTextDocumentDocumentSymbol: docMethod((*Server).documentSymbol),
		protocol.MethodSemanticTokensFull:         docMethod((*Server).semanticTokens),
		protocol.MethodTextDocumentFormatting:     docMethod((*Server).formatting),
		protocol.MethodTextDocumentCodeAction:     docMethod((*Server).codeAction),
		protocol.MethodWorkspaceExecuteCommand:    {doc: commandURI, call: (*Server).executeCommand},
	}
}

// docMethod adapts a typed handler. A request for a document that is not open gets a null result:
// editors ask about files they have not opened, and an error would only be noise.
func docMethod[P any, R any](f func(s *Server, ctx context.Context, snap *cache.Snapshot, p *P) (R, error)) method {
	return method{doc: documentURI, call: func(s *Server, ctx context.Context, snap *cache.Snapshot, raw json.RawMessage) (any, error) {
		var p P
		if err := decode(raw, &p); err != nil {
			return nil, err
		}
		if snap == nil {
			return nil, nil
		}
		return f(s, ctx, snap, &p)
	}}
}

func decode(raw json.RawMessage, v any) error {
	if len(raw) == 0 || string(raw) == "null" {
		return jsonrpc2.NewError(jsonrpc2.InvalidParams, "missing params")
	}
	if err := json.Unmarshal(raw, v); err != nil {
		return jsonrpc2.Errorf(jsonrpc2.InvalidParams, "invalid params: %v", err)
	}
	return nil
}

// handle is the connection's handler. It never returns an error: jsonrpc2 would end the
// connection.
func (s *Server) handle(ctx context.Context, reply jsonrpc2.Replier, req jsonrpc2.Request) error {
	defer func() {
		if r := recover(); r != nil {
			s.logf(protocol.MessageTypeError, "panic handling %s: %v\n%s", req.Method(), r, debug.Stack())
			if _, ok := req.(*jsonrpc2.Call); ok {
				s.replyLater(reply, req.Method(), nil, jsonrpc2.Errorf(jsonrpc2.InternalError, "internal error: %v", r))
			}
		}
	}()
	switch req := req.(type) {
	case *jsonrpc2.Call:
		s.dispatchCall(ctx, reply, req)
	case *jsonrpc2.Notification:
		s.dispatchNotification(ctx, req)
	}
	return nil
}

func (s *Server) dispatchCall(ctx context.Context, reply jsonrpc2.Replier, req *jsonrpc2.Call) {
	s.mu.Lock()
	st := s.state
	s.mu.Unlock()
	var err error
	switch {
	case req.Method() == protocol.MethodInitialize && st != stateNew:
		err = jsonrpc2.NewError(jsonrpc2.InvalidRequest, "initialize sent twice")
	case req.Method() != protocol.MethodInitialize && st == stateNew:
		err = jsonrpc2.NewError(jsonrpc2.ServerNotInitialized, "server not initialized")
	case st == stateShutdown:
		err = jsonrpc2.NewError(jsonrpc2.InvalidRequest, "server is shut down")
	}
	m, ok := methods[req.Method()]
	if err == nil && !ok {
		err = jsonrpc2.Errorf(jsonrpc2.MethodNotFound, "method not found: %s", req.Method())
	}
	if err != nil {
		s.replyLater(reply, req.Method(), nil, err)
		return
	}
	switch req.Method() {
	case protocol.MethodInitialize:
		s.mu.Lock()
		s.state = stateInitialized
		s.mu.Unlock()
	case protocol.MethodShutdown:
		s.mu.Lock()
		s.state = stateShutdown
		s.mu.Unlock()
	}
	var snap *cache.Snapshot
	if m.doc != nil {
		snap = s.session.Snapshot(m.doc(req.Params()))
	}
	ctx, cancel := context.WithCancel(ctx)
	s.mu.Lock()
	s.inflight[req.ID()] = cancel
	s.mu.Unlock()
	s.startReply()
	go func() {
		defer s.endReply()
		var result any
		var err error
		defer func() {
			if r := recover(); r != nil {
				s.logf(protocol.MessageTypeError, "panic in %s: %v\n%s", req.Method(), r, debug.Stack())
				result, err = nil, jsonrpc2.Errorf(jsonrpc2.InternalError, "internal error in %s: %v", req.Method(), r)
			}
			s.mu.Lock()
			delete(s.inflight, req.ID())
			s.mu.Unlock()
			if ctx.Err() != nil && err == nil {
				result, err = nil, jsonrpc2.NewError(requestCancelled, "request cancelled")
			}
			cancel()
			if rerr := reply(context.Background(), result, err); rerr != nil {
				fmt.Fprintf(s.log, "hmb lsp: replying to %s: %v\n", req.Method(), rerr)
			}
		}()
		result, err = m.call(s, ctx, snap, req.Params())
		if err != nil && ctx.Err() != nil {
			err = nil // replaced by the cancellation error above
		}
		var rpcErr *jsonrpc2.Error
		if err != nil && !errors.As(err, &rpcErr) {
			// A feature's own refusal (a file that does not parse, a name already taken): the
			// request was well formed, so the protocol's RequestFailed, not jsonrpc2's code 0.
			err = jsonrpc2.NewError(requestFailed, err.Error())
		}
	}()
}

// replyLater replies off the reading goroutine: a write can block on a client that is itself
// blocked writing to us. run waits for these replies before it returns.
func (s *Server) replyLater(reply jsonrpc2.Replier, method string, result any, err error) {
	s.startReply()
	go func() {
		defer s.endReply()
		if rerr := reply(context.Background(), result, err); rerr != nil {
			fmt.Fprintf(s.log, "hmb lsp: replying to %s: %v\n", method, rerr)
		}
	}()
}

// The protocol's own error codes (LSP 3.17, ErrorCodes / LSPErrorCodes).
const (
	requestCancelled jsonrpc2.Code = -32800
	requestFailed    jsonrpc2.Code = -32803
)

// documentURI reads params.textDocument.uri, or "".
func documentURI(raw json.RawMessage) protocol.DocumentURI {
	var p struct {
		TextDocument struct {
			URI protocol.DocumentURI `json:"uri"`
		} `json:"textDocument"`
	}
	_ = json.Unmarshal(raw, &p)
	return p.TextDocument.URI
}

func (s *Server) dispatchNotification(ctx context.Context, req *jsonrpc2.Notification) {
	s.mu.Lock()
	st := s.state
	s.mu.Unlock()
	if req.Method() == protocol.MethodExit {
		s.mu.Lock()
		s.exitNoShutdown = st != stateShutdown
		s.mu.Unlock()
		s.exitOnce.Do(func() { close(s.exited) })
		return
	}
	if st != stateInitialized {
		return // before initialize, or after shutdown: notifications are dropped
	}
	var err error
	switch req.Method() {
	case protocol.MethodCancelRequest:
		err = s.cancelRequest(req.Params())
	case protocol.MethodTextDocumentDidOpen:
		err = s.didOpen(req.Params())
	case protocol.MethodTextDocumentDidChange:
		err = s.didChange(req.Params())
	case protocol.MethodTextDocumentDidClose:
		err = s.didClose(req.Params())
	case protocol.MethodTextDocumentDidSave, protocol.MethodInitialized:
	default:
		if !strings.HasPrefix(req.Method(), "$/") {
			fmt.Fprintf(s.log, "hmb lsp: ignoring notification %s\n", req.Method())
		}
	}
	if err != nil {
		s.logf(protocol.MessageTypeError, "%s: %v", req.Method(), err)
	}
}

// cancelRequest cancels an in-flight request. JSON numbers decode as float64; jsonrpc2 keys its
// requests by int32 or string.
func (s *Server) cancelRequest(raw json.RawMessage) error {
	var p struct {
		ID any `json:"id"`
	}
	if err := decode(raw, &p); err != nil {
		return err
	}
	var id jsonrpc2.ID
	switch v := p.ID.(type) {
	case float64:
		if v != float64(int32(v)) {
			return fmt.Errorf("request id %v is not an int32", v)
		}
		id = jsonrpc2.NewNumberID(int32(v))
	case string:
		if v == "" {
			v = emptyID // as the stream renamed the request (stream.go)
		}
		id = jsonrpc2.NewStringID(v)
	default:
		return fmt.Errorf("bad request id %v", p.ID)
	}
	s.mu.Lock()
	cancel := s.inflight[id]
	s.mu.Unlock()
	if cancel != nil {
		cancel()
	}
	return nil
}
