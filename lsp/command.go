package lsp

import (
	"context"
	"encoding/json"

	"go.lsp.dev/jsonrpc2"
	"go.lsp.dev/protocol"

	"hmb/lsp/cache"
	"hmb/lsp/feature"
)

// commands are the commands workspace/executeCommand runs, as initialize announces them.
var commands = []string{feature.CommandStreamTable, feature.CommandFlowsheet}

// commandParams are executeCommand's parameters. The one argument of every command is the
// document: its URI as a string, or an object with a uri field (a TextDocumentIdentifier).
type commandParams struct {
	Command   string            `json:"command"`
	Arguments []json.RawMessage `json:"arguments"`
}

// commandURI finds the document a command names, or "".
func commandURI(raw json.RawMessage) protocol.DocumentURI {
	var p commandParams
	if json.Unmarshal(raw, &p) != nil || len(p.Arguments) == 0 {
		return ""
	}
	var s string
	if json.Unmarshal(p.Arguments[0], &s) == nil {
		return protocol.DocumentURI(s)
	}
	var id struct {
		URI protocol.DocumentURI `json:"uri"`
	}
	_ = json.Unmarshal(p.Arguments[0], &id)
	return id.URI
}

// executeCommand runs a command on the snapshot of its document taken when the request arrived.
func (s *Server) executeCommand(ctx context.Context, snap *cache.Snapshot, raw json.RawMessage) (any, error) {
	var p commandParams
	if err := decode(raw, &p); err != nil {
		return nil, err
	}
	switch p.Command {
	case feature.CommandStreamTable, feature.CommandFlowsheet:
		if len(p.Arguments) != 1 || commandURI(raw) == "" {
			return nil, jsonrpc2.Errorf(jsonrpc2.InvalidParams, "%s takes one argument, the document's URI", p.Command)
		}
		if snap == nil {
			return nil, jsonrpc2.Errorf(jsonrpc2.InvalidParams, "%s: %s is not open", p.Command, commandURI(raw))
		}
		if p.Command == feature.CommandFlowsheet {
			svg, err := feature.Flowsheet(ctx, snap)
			if err != nil && ctx.Err() == nil {
				return nil, jsonrpc2.Errorf(jsonrpc2.InvalidRequest, "%s: %v", p.Command, err)
			}
			return svg, err
		}
		return feature.Tables(ctx, snap)
	}
	return nil, jsonrpc2.Errorf(jsonrpc2.InvalidParams, "unknown command %q", p.Command)
}
