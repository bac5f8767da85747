import { describe, expect, it } from 'vitest';
import { escapeHtml } from '@/lib/html';

describe('escapeHtml', () => {
  it('escapes what HTML gives meaning to in text and double-quoted attributes', () => {
    // The references as HTML 5 names them (WHATWG HTML, "named character references").
    expect(escapeHtml(`<a href="x">Tom & Ana</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;Tom &amp; Ana&lt;/a&gt;');
  });

  it('leaves other text alone, apostrophes and replacement patterns included', () => {
    expect(escapeHtml("Row 14 · post 6 · it's $' $& $1 — viña")).toBe("Row 14 · post 6 · it's $' $&amp; $1 — viña");
  });
});
