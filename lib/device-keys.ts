/**
 * Every name Vineward keeps on a phone: localStorage keys, IndexedDB databases, Cache Storage
 * caches, the sync lock and its wake-up message. In one place so that sign-out forgets exactly a
 * person's own copies and never the outbox. Phones in the field hold these names: never rename one.
 */

/** localStorage: a person's copies, forgotten at sign-out (lib/shared-phone.ts). */
export const LOCAL = {
  lastSynced: 'vineward-last-synced',
  crew: 'vineward-crew',
  lastValues: (kind: string) => `vineward-last-${kind}`,
  rowWorkDefaults: (owner: string) => `vineward-row-work:${owner}`,
} as const;
/** Matches every key in LOCAL. */
export const PERSONAL_LOCAL_KEY = /^vineward-/;

/** IndexedDB: [database, object store]. The outbox survives sign-out; the task copy does not. */
export const IDB = {
  outboxPrefix: 'vineward',
  tasks: ['vineward-tasks', 'tasks'],
} as const;

/** Cache Storage, filled by the service worker. Icons survive sign-out; pages and layout data do not. */
export const CACHES = {
  pages: 'vineward-pages',
  layout: 'vineward-layout',
  icons: 'vineward-icons',
  precachePrefix: 'workbox-precache',
} as const;

/** One name for the sync's Web Lock, its Background Sync tag and the worker's wake-up message. */
export const SYNC_TAG = 'vineward-sync';
/** The BroadcastChannel over which tabs tell each other the outbox changed. */
export const OUTBOX_CHANNEL = 'vineward-outbox';
