import { afterAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeTeam, PASSWORD } from '../helpers/fixtures';
import { APP_URL, Client } from '../helpers/http';
import { resetClientLimits } from '../helpers/limits';

afterAll(async () => {
  await resetClientLimits();
  await closeTestDb();
});

/**
 * Targets a crafted link may carry. Browsers read a backslash as a slash and drop tabs and newlines
 * inside URLs (WHATWG URL Standard, "URL parsing": special schemes and the ASCII tab or newline
 * rule), so `/\evil.example` and `/\t/evil.example` both mean `//evil.example`.
 */
const HOSTILE = [
  '/\\evil.example/x',
  '/\\\\evil',
  '//evil.example',
  '///evil.example',
  'https://evil.example',
  'http:evil.example',
  '\\/evil.example',
  ' //evil.example',
  '/\t/evil.example',
  '/\n/evil.example',
  '/\r\n/evil.example',
  '/.//evil.example',
  'javascript:alert(document.cookie)',
  'JaVaScRiPt:alert(1)',
  'data:text/html,<script>alert(1)</script>',
];

const onSite = (target: string | null | undefined) => {
  expect(target).toBeTruthy();
  const url = new URL(target!, APP_URL);
  expect(url.origin, `${JSON.stringify(target)} leaves the site`).toBe(new URL(APP_URL).origin);
  // A path that starts with two slashes would be read as another host by whatever follows it.
  expect(url.pathname.startsWith('//'), `${JSON.stringify(target)}`).toBe(false);
};

describe('redirects after sign-in stay on the site', () => {
  it('sends a signed-in person who opens /signin with a hostile callbackUrl to a page of this site', async () => {
    const { scout } = await makeTeam();
    const client = new Client();
    expect((await client.signIn(scout.email, PASSWORD)).status).toBe(200);
    // The raw query of the finding, exactly as reported.
    const raw = await client.fetch('/signin?callbackUrl=/%5Cevil.example/x');
    expect(raw.status).toBe(307);
    onSite(raw.headers.get('location'));
    for (const target of HOSTILE) {
      const res = await client.fetch(`/signin?callbackUrl=${encodeURIComponent(target)}`);
      expect(res.status, JSON.stringify(target)).toBe(307);
      onSite(res.headers.get('location'));
    }
  });

  it('keeps a same-site callbackUrl with its query', async () => {
    const { scout } = await makeTeam();
    const client = new Client();
    await client.signIn(scout.email, PASSWORD);
    const res = await client.fetch(`/signin?callbackUrl=${encodeURIComponent('/field/outbox?tab=rejected')}`);
    expect(new URL(res.headers.get('location')!, APP_URL).pathname + new URL(res.headers.get('location')!, APP_URL).search).toBe('/field/outbox?tab=rejected');
  });

  it('answers the sign-in request with a URL of this site for every hostile callbackUrl', async () => {
    const { pruner } = await makeTeam();
    for (const target of HOSTILE) {
      const client = new Client();
      const csrfToken = await client.csrf();
      const res = await client.postForm('/api/auth/callback/credentials', {
        email: pruner.email,
        password: PASSWORD,
        csrfToken,
        json: 'true',
        callbackUrl: target,
      });
      expect(res.status).toBe(200);
      onSite(((await res.json()) as { url: string }).url);
    }
  });
});
