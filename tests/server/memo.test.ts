// The per-load memo of derived answers is bounded in bytes, not entries: a few large PDFs or
// thousands of small formula details, whichever fills it first; the least recently used go first.
import { describe, expect, it } from 'vitest';
import { memoSize, newMemo } from '../../server/routes/data.ts';

describe('the memo of derived answers', () => {
  it('counts buffers, kept answers and other values by their bytes', () => {
    expect(memoSize(Buffer.alloc(500))).toBe(500);
    expect(memoSize({ body: Buffer.alloc(500), etag: 'W/"x"' })).toBe(564);
    expect(memoSize({ mixes: [1, 2, 3] })).toBe(JSON.stringify({ mixes: [1, 2, 3] }).length);
  });

  it('drops the least recently used once the bytes are spent', () => {
    const memo = newMemo(1_000);
    memo.set('a', Buffer.alloc(400));
    memo.set('b', Buffer.alloc(400));
    memo.get('a');
    memo.set('c', Buffer.alloc(400));
    expect([...memo.keys()].sort()).toEqual(['a', 'c']);
    expect(memo.calculatedSize).toBe(800);
    // Larger than the whole budget: not kept at all.
    memo.set('huge', Buffer.alloc(5_000));
    expect(memo.has('huge')).toBe(false);
  });
});
