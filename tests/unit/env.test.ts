import { describe, expect, it } from 'vitest';
import { getEnv } from '@/lib/env';

const good = {
  DATABASE_URL: 'postgres://u:p@127.0.0.1:5432/db',
  S3_ENDPOINT: 'http://127.0.0.1:4569',
  S3_REGION: 'local',
  S3_BUCKET: 'vineward',
  S3_ACCESS_KEY_ID: 'S3RVER',
  S3_SECRET_ACCESS_KEY: 'S3RVER',
  SMTP_URL: 'smtp://127.0.0.1:2525',
  NEXTAUTH_SECRET: 'x'.repeat(32),
  NEXTAUTH_URL: 'http://localhost:3000',
};

describe('environment check', () => {
  it('accepts a complete environment', () => {
    expect(getEnv({ ...good }).S3_BUCKET).toBe('vineward');
  });

  it('names every missing or malformed variable in one message', () => {
    const { DATABASE_URL: _d, ...rest } = good;
    expect(() => getEnv({ ...rest, SMTP_URL: 'mail.example.com', NEXTAUTH_SECRET: 'short' })).toThrowError(
      /DATABASE_URL[\s\S]*SMTP_URL: must be an smtp:\/\/ or smtps:\/\/ URL[\s\S]*NEXTAUTH_SECRET: must be at least 32/,
    );
  });

  it('trusts no proxy unless told how many there are, and refuses a count it cannot use', () => {
    expect(getEnv({ ...good }).TRUSTED_PROXY_HOPS).toBe(0);
    expect(getEnv({ ...good, TRUSTED_PROXY_HOPS: '2' }).TRUSTED_PROXY_HOPS).toBe(2);
    expect(() => getEnv({ ...good, TRUSTED_PROXY_HOPS: '-1' })).toThrowError(/TRUSTED_PROXY_HOPS: must be 0 \(no proxy\) or more/);
    expect(() => getEnv({ ...good, TRUSTED_PROXY_HOPS: '1.5' })).toThrowError(/TRUSTED_PROXY_HOPS: must be a whole number/);
  });
});
