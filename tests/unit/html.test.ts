import { describe, expect, it } from 'vitest';
import { escapeHtml } from '@/lib/html';

describe('escapeHtml', () => {
  it('escapes the five characters HTML gives meaning to in text and quoted attributes', () => {
    // The five characters and their references as HTML 5 names them (WHATWG HTML, "named character references").
    expect(escapeHtml(`<a href="x" title='y'>Tom & Ana</a>`)).toBe('&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;Tom &amp; Ana&lt;/a&gt;');
  });

  it('leaves other text alone, replacement patterns included', () => {
    expect(escapeHtml("Row 14 · post 6 · $' $& $1 — viña")).toBe("Row 14 · post 6 · $&#39; $&amp; $1 — viña");
  });
});
