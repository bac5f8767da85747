import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatAddress, formatPostVine, fromPostAddress, parseAddress, postsInRow, toPostAddress } from '@/lib/address';

// Convention (lib/address.ts): posts are counted from the origin end of the row, post 1 is the end
// post before vine 1, and "vine k" is the k-th vine past its post.
describe('vine addresses by line post', () => {
  it('reads slot 28 of row 14 at 5 vines per panel as row 14, post 6, vine 3', () => {
    expect(toPostAddress(14, 28, 5)).toEqual({ row: 14, post: 6, vine: 3 });
    expect(formatAddress(14, 28, 5)).toBe('row 14, post 6, vine 3');
  });

  it('puts vine 1 just past post 1, the last vine of a panel just before the next post', () => {
    expect(toPostAddress(1, 1, 5)).toEqual({ row: 1, post: 1, vine: 1 });
    expect(toPostAddress(1, 5, 5)).toEqual({ row: 1, post: 1, vine: 5 });
    expect(toPostAddress(1, 6, 5)).toEqual({ row: 1, post: 2, vine: 1 });
    expect(formatPostVine(30, 5)).toBe('post 6, vine 5');
  });

  it('goes back from post and vine to the slot number', () => {
    expect(fromPostAddress({ row: 14, post: 6, vine: 3 }, 5)).toEqual({ row: 14, position: 28 });
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1000 }), fc.integer({ min: 1, max: 2000 }), fc.integer({ min: 1, max: 12 }), (row, position, n) => {
        const post = toPostAddress(row, position, n);
        expect(post.vine).toBeGreaterThanOrEqual(1);
        expect(post.vine).toBeLessThanOrEqual(n);
        expect(fromPostAddress(post, n)).toEqual({ row, position });
      }),
    );
  });

  it('counts the end posts: 10 vines at 5 per panel stand between 3 posts, 11 vines need 4', () => {
    expect(postsInRow(10, 5)).toBe(3);
    expect(postsInRow(11, 5)).toBe(4);
  });

  it('falls back to the slot number when the block records no vines per panel', () => {
    expect(formatAddress(14, 28, null)).toBe('row 14, vine 28');
    expect(formatPostVine(28)).toBe('vine 28');
  });

  it('reads both written forms back, and refuses a vine past the panel', () => {
    expect(parseAddress('row 14, post 6, vine 3', 5)).toEqual({ row: 14, position: 28 });
    expect(parseAddress('Row 14 Post 6 Vine 3', 5)).toEqual({ row: 14, position: 28 });
    expect(parseAddress('row 14, vine 28')).toEqual({ row: 14, position: 28 });
    expect(parseAddress('row 14, post 6, vine 6', 5)).toBeNull();
    expect(parseAddress('row 14, post 6, vine 3', null)).toBeNull();
    expect(parseAddress('somewhere near the shed', 5)).toBeNull();
  });

  it('throws a RangeError naming the argument for impossible input', () => {
    expect(() => toPostAddress(1, 0, 5)).toThrow(/position/);
    expect(() => toPostAddress(1, 3, 0)).toThrow(/vinesPerPanel/);
    expect(() => fromPostAddress({ row: 1, post: 2, vine: 6 }, 5)).toThrow(/vine must be between 1 and 5/);
  });
});
