package parser

import "sync"

// Production tags of the shape cache's keys.
const (
	prodStream byte = iota + 1
	prodUnit
	prodSetting
	prodExpect
	prodGiven
	prodNames
)

// maxShapes bounds the cache: ordinary files have a few dozen shapes, and a hostile or random
// file must not grow it without end. Past the bound, pieces are parsed without caching.
const maxShapes = 1 << 14

// maxShapeLen bounds a cached shape's key (a production tag, then a byte per token): a long piece (a list of a hundred stream
// names, a line of pasted numbers) is rare and would make a key as long as itself, so that a
// language server running for days could hold megabytes per entry.
const maxShapeLen = 64

// shapeCache maps a piece's shape to participle's result for it (a *G template or a *parseErr).
// It is shared by every parse in the process: the language server parses concurrently.
type shapeCache struct {
	mu sync.RWMutex
	m  map[string]any
}

var cache = shapeCache{m: map[string]any{}}

func (c *shapeCache) get(key []byte) (any, bool) {
	c.mu.RLock()
	r, ok := c.m[string(key)]
	c.mu.RUnlock()
	return r, ok
}

func (c *shapeCache) put(key string, r any) {
	c.mu.Lock()
	if len(c.m) < maxShapes {
		c.m[key] = r
	}
	c.mu.Unlock()
}
