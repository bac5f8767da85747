import { spawnSync } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';

// Phones PUT photos straight to object storage from the app's origin, so the bucket must answer
// the browser's CORS preflight for that origin, and for no other.
const bucketUrl = () => `${process.env.S3_ENDPOINT}/${process.env.S3_BUCKET}/probe.jpg`;
const appOrigin = () => new URL(process.env.NEXTAUTH_URL!).origin;

async function preflight(origin: string) {
  const res = await fetch(bucketUrl(), {
    method: 'OPTIONS',
    headers: { origin, 'access-control-request-method': 'PUT', 'access-control-request-headers': 'content-type' },
  });
  // A store may echo the origin or answer '*' for a matched rule (the S3 fake does the latter);
  // an unmatched origin gets 403 and no allow header.
  return { status: res.status, allowed: res.headers.get('access-control-allow-origin') !== null };
}

function setCors(...extraOrigins: string[]) {
  const result = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/storage-cors.ts', ...extraOrigins], { encoding: 'utf8', env: process.env });
  expect(result.status, result.stderr).toBe(0);
  return result.stdout;
}

describe('the bucket upload CORS rule', () => {
  afterAll(() => {
    setCors();
  });

  it('lets the app origin PUT and refuses another origin', async () => {
    expect(await preflight(appOrigin())).toEqual({ status: 200, allowed: true });
    expect(await preflight('https://elsewhere.example')).toEqual({ status: 403, allowed: false });
  });

  it('is set on a bucket by `npm run storage:cors`, with extra origins from its arguments', async () => {
    const out = setCors('https://desk.example');
    expect(out).toContain(`uploads from ${appOrigin()}, https://desk.example`);
    expect(await preflight('https://desk.example')).toEqual({ status: 200, allowed: true });
    expect(await preflight(appOrigin())).toEqual({ status: 200, allowed: true });
    expect(await preflight('https://elsewhere.example')).toEqual({ status: 403, allowed: false });
  });
});
