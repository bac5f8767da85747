import { describe, expect, it } from 'vitest';
import { envSetting, getEnv } from '@/lib/env';

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

  it('reads one setting by the same rule, with its default, without the rest of the environment', () => {
    expect(envSetting('BCRYPT_COST', {})).toBe(12);
    expect(envSetting('BCRYPT_COST', { BCRYPT_COST: '10' })).toBe(10);
    expect(envSetting('DIGEST_HOUR_UTC', { DIGEST_HOUR_UTC: '0' })).toBe(0);
    expect(envSetting('NEXT_DIST_DIR', {})).toBe('.next');
    expect(() => envSetting('BCRYPT_COST', { BCRYPT_COST: '3' })).toThrowError(/BCRYPT_COST: must be 4 or more/);
    expect(() => envSetting('DIGEST_HOUR_UTC', { DIGEST_HOUR_UTC: '24' })).toThrowError(/DIGEST_HOUR_UTC: must be 0 to 23/);
    expect(() => envSetting('MAIL_POLL_MS', { MAIL_POLL_MS: 'soon' })).toThrowError(/MAIL_POLL_MS/);
  });
});
