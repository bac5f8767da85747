/**
 * A vine's address inside a block, and its "post" reading for crews who count line posts.
 *
 * Convention: planting slots are numbered 1, 2, 3… from the block's agreed origin end of every
 * row (its `positionOrigin`), and line posts are counted from that same end. Post 1 is the end
 * post before vine 1; the panel between post k and post k + 1 holds vines (k − 1)·n + 1 … k·n,
 * where n is the block's vines per panel. "Vine 3 after post 6" is the third vine past post 6.
 * With 5 vines per panel, slot 28 of row 14 reads "row 14, post 6, vine 3", and slot 30 (the last
 * vine of that panel) "row 14, post 6, vine 5". A row of v vines has ⌈v / n⌉ + 1 posts.
 */

// Type aliases rather than interfaces, so an address passes where a plain record of values is expected.
export type SlotAddress = {
  row: number;
  position: number;
};

export type PostAddress = {
  row: number;
  post: number;
  /** 1 … vinesPerPanel, counted from the post towards the far end of the row. */
  vine: number;
};

function whole(name: string, value: number, min = 1) {
  if (!Number.isInteger(value) || value < min) throw new RangeError(`${name} must be a whole number of ${min} or more, got ${String(value)}`);
  return value;
}

export function toPostAddress(row: number, position: number, vinesPerPanel: number): PostAddress {
  whole('row', row, 0);
  whole('position', position);
  whole('vinesPerPanel', vinesPerPanel);
  return { row, post: Math.floor((position - 1) / vinesPerPanel) + 1, vine: ((position - 1) % vinesPerPanel) + 1 };
}

export function fromPostAddress(address: PostAddress, vinesPerPanel: number): SlotAddress {
  whole('row', address.row, 0);
  whole('post', address.post);
  whole('vinesPerPanel', vinesPerPanel);
  if (!Number.isInteger(address.vine) || address.vine < 1 || address.vine > vinesPerPanel) {
    throw new RangeError(`vine must be between 1 and ${vinesPerPanel} (the vines per panel), got ${String(address.vine)}`);
  }
  return { row: address.row, position: (address.post - 1) * vinesPerPanel + address.vine };
}

/** How many line posts stand in a row of `vineCount` vines, end posts included. */
export function postsInRow(vineCount: number, vinesPerPanel: number): number {
  return Math.ceil(whole('vineCount', vineCount) / whole('vinesPerPanel', vinesPerPanel)) + 1;
}

/** "row 14, post 6, vine 3" when the block records vines per panel, otherwise "row 14, vine 28". */
export function formatAddress(row: number, position: number, vinesPerPanel?: number | null): string {
  if (!vinesPerPanel) return `row ${whole('row', row, 0)}, vine ${whole('position', position)}`;
  const a = toPostAddress(row, position, vinesPerPanel);
  return `row ${a.row}, post ${a.post}, vine ${a.vine}`;
}

/** The post part alone, "post 6, vine 3", for places where the row is already shown. */
export function formatPostVine(position: number, vinesPerPanel?: number | null): string {
  if (!vinesPerPanel) return `vine ${whole('position', position)}`;
  const a = toPostAddress(0, position, vinesPerPanel);
  return `post ${a.post}, vine ${a.vine}`;
}

/**
 * Reads either form back: "row 14, post 6, vine 3" (needs vines per panel) or "row 14, vine 28",
 * case-insensitive, commas optional. Returns null for anything else.
 */
export function parseAddress(text: string, vinesPerPanel?: number | null): SlotAddress | null {
  const withPost = /^\s*row\s+(\d+)\s*,?\s*post\s+(\d+)\s*,?\s*vine\s+(\d+)\s*$/i.exec(text);
  if (withPost) {
    if (!vinesPerPanel) return null;
    const [row, post, vine] = withPost.slice(1).map(Number) as [number, number, number];
    if (post < 1 || vine < 1 || vine > vinesPerPanel) return null;
    return fromPostAddress({ row, post, vine }, vinesPerPanel);
  }
  const plain = /^\s*row\s+(\d+)\s*,?\s*vine\s+(\d+)\s*$/i.exec(text);
  if (!plain) return null;
  const [row, position] = plain.slice(1).map(Number) as [number, number];
  return position >= 1 ? { row, position } : null;
}
