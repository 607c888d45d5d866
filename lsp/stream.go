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
			s.writeRaw(parseErrorResponse(err))
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
		s.writeRaw(parseErrorResponse(fmt.Errorf("missing or bad Content-Length")))
		return nil, total, nil
	}
	data := make([]byte, length)
	n, err := io.ReadFull(s.in, data)
	total += int64(n)
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

func parseErrorResponse(err error) []byte {
	b, _ := json.Marshal(map[string]any{
		"jsonrpc": "2.0",
		"id":      nil,
		"error":   map[string]any{"code": jsonrpc2.ParseError, "message": "parse error: " + err.Error()},
	})
	return b
}

func truncate(s string, n int) string {
	if len(s) > n {
		return s[:n] + "..."
	}
	return s
}
