package lsp

import (
	"bufio"
	"bytes"
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
//
// A frame whose Content-Length is wrong must not throw every later frame out of step: a body
// that runs past its message into the next frame (a length too long) is cut where its JSON value
// ends, and the rest is read again as the start of the next frame; header lines that begin in
// the middle of a body (a length too short) are read from the Content-Length they carry.
type stream struct {
	in      *bufio.Reader
	pending []byte // bytes given back after a bad frame, read before in
	out     io.Writer
	closer  func() error
	log     io.Writer

	mu sync.Mutex // serialises writes: Conn's own lock does not cover writeRaw
}

// contentLength is the header every frame starts with; a resynchronising reader looks for it.
const contentLength = "content-length:"

// headerAt returns where a Content-Length header starts in b, at a line start or after the end
// of a JSON value, or -1.
func headerAt(b []byte) int {
	lower := bytes.ToLower(b)
	for from := 0; ; {
		k := bytes.Index(lower[from:], []byte(contentLength))
		if k < 0 {
			return -1
		}
		k += from
		if k == 0 || strings.ContainsRune("\n}]", rune(b[k-1])) {
			return k
		}
		from = k + 1
	}
}

// overrun returns where the JSON value a body starts with ends, when bytes other than space
// follow it (the body's length was too long and took in the next frame), or 0. A message ends in
// "}", so a body that does is not looked into.
func overrun(data []byte) int {
	t := bytes.TrimRight(data, " \t\r\n")
	if len(t) == 0 || t[len(t)-1] == '}' {
		return 0
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	var v json.RawMessage
	if dec.Decode(&v) != nil {
		return 0
	}
	if k := int(dec.InputOffset()); k < len(data) && len(bytes.TrimSpace(data[k:])) > 0 {
		return k
	}
	return 0
}

// readLine reads a header line, the given-back bytes first.
func (s *stream) readLine() (string, error) {
	if len(s.pending) > 0 {
		if k := bytes.IndexByte(s.pending, '\n'); k >= 0 {
			line := string(s.pending[:k+1])
			s.pending = s.pending[k+1:]
			return line, nil
		}
		head := string(s.pending)
		s.pending = nil
		rest, err := s.in.ReadString('\n')
		return head + rest, err
	}
	return s.in.ReadString('\n')
}

// readBody reads n bytes of a body, the given-back bytes first. It reads what arrives rather
// than allocating n: a header may lie.
func (s *stream) readBody(n int64) ([]byte, error) {
	var data []byte
	if len(s.pending) > 0 {
		k := min(int64(len(s.pending)), n)
		data = append(data, s.pending[:k]...)
		s.pending = s.pending[k:]
		n -= k
	}
	rest, err := io.ReadAll(io.LimitReader(s.in, n))
	data = append(data, rest...)
	if err == nil && int64(len(rest)) < n {
		err = io.ErrUnexpectedEOF
	}
	return data, err
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
		if k := overrun(data); k > 0 {
			// The length ran into the next frame: give that back, and read this body without it.
			s.pending = append(append([]byte(nil), data[k:]...), s.pending...)
			fmt.Fprintf(s.log, "hmb lsp: Content-Length too long: %d byte(s) after the message given back\n", len(data)-k)
			data = data[:k]
		}
		msg, err := jsonrpc2.DecodeMessage(data)
		if err == nil {
			msg = emptyIDIn(msg, data)
		}
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
		line, err := s.readLine()
		total += int64(len(line))
		if err != nil {
			return nil, total, err
		}
		if k := headerAt([]byte(line)); k > 0 {
			// The rest of a body whose length was too short runs up to the next frame's header.
			fmt.Fprintf(s.log, "hmb lsp: skipping %d byte(s) before a Content-Length header\n", k)
			line = line[k:]
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
	data, err := s.readBody(length)
	total += int64(len(data))
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
	return s.writeRaw(emptyIDOut(msg, data))
}

// emptyID stands, inside the server, for a request id that is the empty string: jsonrpc2's ID
// cannot hold "" (it reads it as the number 0, and would answer with "id": 0, or confuse the
// request with one whose id is 0). A reply to it is written with the id the client sent.
const emptyID = "\x00hmb:empty-id"

var emptyIDJSON, _ = json.Marshal(emptyID)

// emptyIDIn gives a call whose id is "" the id emptyID.
func emptyIDIn(msg jsonrpc2.Message, data []byte) jsonrpc2.Message {
	call, ok := msg.(*jsonrpc2.Call)
	if !ok || call.ID() != jsonrpc2.NewNumberID(0) || !bytes.Contains(data, []byte(`""`)) {
		return msg
	}
	var raw struct {
		ID json.RawMessage `json:"id"`
	}
	if json.Unmarshal(data, &raw) != nil || string(bytes.TrimSpace(raw.ID)) != `""` {
		return msg
	}
	c, err := jsonrpc2.NewCall(jsonrpc2.NewStringID(emptyID), call.Method(), call.Params())
	if err != nil {
		return msg
	}
	return c
}

// emptyIDOut writes the id of a reply to a call emptyIDIn renamed back as "".
func emptyIDOut(msg jsonrpc2.Message, data []byte) []byte {
	if r, ok := msg.(*jsonrpc2.Response); ok && r.ID() == jsonrpc2.NewStringID(emptyID) {
		return bytes.Replace(data, emptyIDJSON, []byte(`""`), 1)
	}
	return data
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
