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
	prodCase // a case's or sweep's header, through unitParser
	prodOverride
	prodRange
	prodShow
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

// localShapes fronts the shared cache for one parse. A short piece's shape packs into a word
// (the production tag, then five bits a token), looked up in a small open-addressed table: no
// lock, no string hashing, for the thousands of pieces of a large file that share a few shapes.
type localShapes struct {
	keys [localSlots]uint64 // 0: empty slot (a packed shape starts with a tag, never 0)
	vals [localSlots]any
	n    int
}

const (
	localSlots = 64
	localMax   = localSlots * 3 / 4 // keep probes short and a free slot always there
	packMax    = 12                 // tokens that fit in a packed shape: 3 + 12*5 bits
)

func localSlot(k uint64) int { return int(k * 0x9E3779B97F4A7C15 >> 58) } // Fibonacci hashing, 6 bits

func (l *localShapes) get(k uint64) (any, bool) {
	for i := localSlot(k); ; i = (i + 1) % localSlots {
		switch l.keys[i] {
		case k:
			return l.vals[i], true
		case 0:
			return nil, false
		}
	}
}

func (l *localShapes) put(k uint64, r any) {
	if l.n >= localMax {
		return
	}
	i := localSlot(k)
	for l.keys[i] != 0 {
		i = (i + 1) % localSlots
	}
	l.keys[i], l.vals[i] = k, r
	l.n++
}
