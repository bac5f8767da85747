import { describe, expect, it } from 'vitest';
import { sameOriginPath } from '@/lib/safe-redirect';

const SITE = 'https://vines.example.com';

// WHATWG URL Standard, "URL parsing": for special schemes a backslash is read as a slash, and
// ASCII tab and newline are removed from the input, so each of these names another host.
const HOSTILE = [
  '/\\evil.example/x',
  '/\\\\evil',
  '\\\\evil.example',
  '//evil.example',
  '///evil.example',
  'https://evil.example',
  '/\t/evil.example',
  '/\n/evil.example',
  ' //evil.example',
  '/.//evil.example',
  'javascript:alert(1)',
  'data:text/html,<script>alert(1)</script>',
  'http://vines.example.com/x', // same host, other scheme: another origin
  'https://vines.example.com.evil.example/',
  'https://vines.example.com@evil.example/',
];

describe('redirect targets', () => {
  it('sends every target that leaves the site to the fallback', () => {
    for (const target of HOSTILE) expect(sameOriginPath(target, SITE), JSON.stringify(target)).toBe('/');
    expect(sameOriginPath('//evil.example', SITE, '/field')).toBe('/field');
  });

  it('keeps paths of the site with their query and fragment, absolute or relative', () => {
    expect(sameOriginPath('/field/outbox?tab=rejected#top', SITE)).toBe('/field/outbox?tab=rejected#top');
    expect(sameOriginPath('https://vines.example.com/desk', SITE)).toBe('/desk');
    expect(sameOriginPath('/%5Cevil.example', SITE)).toBe('/%5Cevil.example');
    // Same scheme and no slashes is a relative path in the URL Standard; the browser stays here too.
    expect(sameOriginPath('https:evil.example', SITE)).toBe('/evil.example');
  });

  it('treats a missing or non-text target as the fallback', () => {
    for (const target of [undefined, null, '', ['/desk'], 42]) expect(sameOriginPath(target, SITE)).toBe('/');
  });
});
