import { describe, expect, it } from 'vitest';
import { contentHash, stableStringify } from './stable-json.js';

describe('stableStringify', () => {
  it('sorts keys at every level and drops undefined, keeping array order', () => {
    expect(stableStringify({ b: 1, a: { d: [3, 1], c: undefined, b: null } })).toBe(
      '{"a":{"b":null,"d":[3,1]},"b":1}',
    );
  });
  it('equal content gives equal hashes, different content different ones', () => {
    expect(contentHash({ x: 1, y: [1, 2] })).toBe(contentHash({ y: [1, 2], x: 1 }));
    expect(contentHash({ x: 1, y: [2, 1] })).not.toBe(contentHash({ x: 1, y: [1, 2] }));
    // SHA-256 of the empty object's text "{}" (any sha256 tool gives the same).
    expect(contentHash({})).toBe('44136fa355b3678a1146ad16f7e8649e94fb4fc21fe77e8310c060f61caaff8a');
  });
});
