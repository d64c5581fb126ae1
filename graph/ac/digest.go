package ac

import (
	"crypto/sha256"
	"encoding/binary"
	"hash"
)

// digest hashes a run of 64-bit words in 4 KiB writes: the remembered loop
// searches and the memo's responses are keyed by what their systems are
// built from, word by word, and both need the same buffered SHA-256.
type digest struct {
	h   hash.Hash
	buf []byte
}

func (d *digest) put(vs ...uint64) {
	if d.h == nil {
		d.h = sha256.New()
		// a small piece's key fits at once and a whole block's grows
		// in a few doublings, not from eight bytes up
		d.buf = make([]byte, 0, 1024)
	}
	for _, v := range vs {
		d.buf = binary.LittleEndian.AppendUint64(d.buf, v)
	}
	if len(d.buf) > 4096 {
		d.h.Write(d.buf)
		d.buf = d.buf[:0]
	}
}

func (d *digest) sum() [sha256.Size]byte {
	if d.h == nil {
		d.h = sha256.New()
	}
	d.h.Write(d.buf)
	var out [sha256.Size]byte
	d.h.Sum(out[:0])
	return out
}
