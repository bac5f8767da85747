import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CACHES, IDB, LOCAL, OUTBOX_CHANNEL, PERSONAL_LOCAL_KEY, SYNC_TAG } from '@/lib/device-keys';

describe('names kept on the phone', () => {
  it('keeps the names phones in the field already hold, so an update never orphans an outbox', () => {
    expect(IDB.outboxPrefix).toBe('vineward');
    expect(IDB.tasks).toEqual(['vineward-tasks', 'tasks']);
    expect(LOCAL.lastSynced).toBe('vineward-last-synced');
    expect(LOCAL.crew).toBe('vineward-crew');
    expect(LOCAL.lastValues('cane-diameter')).toBe('vineward-last-cane-diameter');
    expect(LOCAL.rowWorkDefaults('u1')).toBe('vineward-row-work:u1');
    expect([CACHES.pages, CACHES.layout, CACHES.icons, SYNC_TAG, OUTBOX_CHANNEL]).toEqual([
      'vineward-pages',
      'vineward-layout',
      'vineward-icons',
      'vineward-sync',
      'vineward-outbox',
    ]);
  });

  it('forgets every personal localStorage key at sign-out and nothing of another site', () => {
    for (const key of [LOCAL.lastSynced, LOCAL.crew, LOCAL.lastValues('x'), LOCAL.rowWorkDefaults('y')]) expect(PERSONAL_LOCAL_KEY.test(key)).toBe(true);
    expect(PERSONAL_LOCAL_KEY.test('other-app-key')).toBe(false);
  });

  it('is the only client module that spells a name kept on the phone', () => {
    const root = path.resolve(__dirname, '../..');
    const spelled: string[] = [];
    const walk = (dir: string): void => {
      for (const entry of readdirSync(path.join(root, dir), { withFileTypes: true })) {
        const rel = path.join(dir, entry.name);
        if (rel === path.join('lib', 'server')) continue;
        if (entry.isDirectory()) walk(rel);
        else if (/\.tsx?$/.test(entry.name) && rel !== path.join('lib', 'device-keys.ts')) {
          if (/['"`]vineward-/.test(readFileSync(path.join(root, rel), 'utf8'))) spelled.push(rel);
        }
      }
    };
    for (const dir of ['app', 'components', 'lib', 'service-worker']) walk(dir);
    expect(spelled).toEqual([]);
  });
});
