package lsp

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"strings"
	"sync"

	"go.lsp.dev/jsonrpc2"
)

// maxMessage bounds one message's Content-Length: far above a 5 MB document escaped into JSON,
// far below what would exhaust memory.
const maxMessage = 256 << 20

// stream frames messages with Content-Length headers like jsonrpc2.NewStream, but survives bad
// input: jsonrpc2's stream ends the connection on the first message it cannot decode, and its
// Conn then stops. Here a body that is not a JSON-RPC message gets a parse error response (id
// null, as JSON-RPC 2.0 asks) and reading goes on; a bad header line is skipped; an absurd length
// is refused without allocating it. Only the end of input or a read error ends the stream.
type stream struct {
	in     *bufio.Reader
	out    io.Writer
	closer func() error
	log    io.Writer

	mu sync.Mutex // serialises writes: Conn's own lock does not cover writeRaw
}

func newStream(in io.Reader, out io.Writer, closer func() error, log io.Writer) *stream {
	return &stream{in: bufio.NewReaderSize(in, 64<<10), out: out, closer: closer, log: log}
}

func (s *stream) Read(ctx context.Context) (jsonrpc2.Message, int64, error) {
	for {
		if err := ctx.Err(); err != nil {
			return nil, 0, err
		}
		data, n, err := s.readFrame()
		if err != nil {
			return nil, n, err
		}
		if data == nil {
			continue // a bad frame, already reported
		}
		msg, err := jsonrpc2.DecodeMessage(data)
		if err != nil {
			fmt.Fprintf(s.log, "hmb lsp: bad message: %v\n", err)
			if resp := errorResponse(data, err); resp != nil {
				s.writeRaw(resp)
			}
			continue
		}
		return msg, n, nil
	}
}

// readFrame reads one header block and body. It returns nil data, without error, for a frame it
// skipped.
func (s *stream) readFrame() ([]byte, int64, error) {
	var total, length int64
	sawHeader := false
	for {
		line, err := s.in.ReadString('\n')
		total += int64(len(line))
		if err != nil {
			return nil, total, err
		}
		line = strings.TrimSpace(line)
		if line == "" {
			if !sawHeader {
				continue // blank lines between messages
			}
			break
		}
		sawHeader = true
		name, value, ok := strings.Cut(line, ":")
		if !ok {
			fmt.Fprintf(s.log, "hmb lsp: skipping bad header line %q\n", truncate(line, 80))
			continue
		}
		if strings.EqualFold(strings.TrimSpace(name), "Content-Length") {
			length, err = strconv.ParseInt(strings.TrimSpace(value), 10, 64)
			if err != nil || length <= 0 || length > maxMessage {
				fmt.Fprintf(s.log, "hmb lsp: bad Content-Length %q\n", truncate(value, 40))
				length = -1
			}
		}
	}
	if length <= 0 {
		if length == 0 {
			fmt.Fprintf(s.log, "hmb lsp: message without Content-Length\n")
		}
		s.writeRaw(errorResponse(nil, fmt.Errorf("missing or bad Content-Length")))
		return nil, total, nil
	}
	// Read what arrives rather than allocating the announced length: a header may lie.
	data, err := io.ReadAll(io.LimitReader(s.in, length))
	total += int64(len(data))
	if err == nil && int64(len(data)) < length {
		err = io.ErrUnexpectedEOF
	}
	if err != nil {
		return nil, total, err
	}
	return data, total, nil
}

func (s *stream) Write(ctx context.Context, msg jsonrpc2.Message) (int64, error) {
	data, err := json.Marshal(msg)
	if err != nil {
		return 0, fmt.Errorf("marshaling message: %w", err)
	}
	return s.writeRaw(data)
}

func (s *stream) writeRaw(data []byte) (int64, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	n, err := fmt.Fprintf(s.out, "Content-Length: %d\r\n\r\n", len(data))
	if err != nil {
		return int64(n), err
	}
	m, err := s.out.Write(data)
	return int64(n + m), err
}

func (s *stream) Close() error {
	if s.closer != nil {
		return s.closer()
	}
	return nil
}

// errorResponse answers a body jsonrpc2 could not decode, as JSON-RPC 2.0 asks: a parse error
// when it is not JSON, an invalid request when it is JSON but not a message jsonrpc2 represents
// (an id such as 1.5, true or 2^40; a wrong version tag; a batch). The id is echoed when it is a
// number or a string, so that the client can fail the call it made; otherwise it is null. A
// response the client sent that cannot be read gets no answer (nil).
func errorResponse(data []byte, err error) []byte {
	code, msg := jsonrpc2.ParseError, "parse error: "+err.Error()
	id := json.RawMessage("null")
	if data != nil && json.Valid(data) {
		code, msg = jsonrpc2.InvalidRequest, "invalid request: "+err.Error()
		var m struct {
			ID     json.RawMessage `json:"id"`
			Method json.RawMessage `json:"method"`
		}
		ok := json.Unmarshal(data, &m) == nil
		if ok && len(m.ID) > 0 && len(m.Method) == 0 {
			return nil // a response to us we cannot read: answering it would start a loop
		}
		if ok && len(m.ID) > 0 {
			var v any
			if json.Unmarshal(m.ID, &v) == nil {
				switch v.(type) {
				case float64, string:
					id = m.ID
				}
			}
		}
	}
	b, _ := json.Marshal(struct {
		Version string          `json:"jsonrpc"`
		ID      json.RawMessage `json:"id"`
		Error   jsonrpc2.Error  `json:"error"`
	}{"2.0", id, jsonrpc2.Error{Code: code, Message: msg}})
	return b
}

func truncate(s string, n int) string {
	if len(s) > n {
		return s[:n] + "..."
	}
	return s
}
