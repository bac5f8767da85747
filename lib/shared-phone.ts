/**
 * Phones are shared in a crew: what one person leaves on it must not open for the next. Sign-out
 * forgets the person's pages and API answers kept by the service worker and their local copies,
 * but never the outbox: records saved with no signal belong to whoever saved them, wait for that
 * person's next sign-in here (lib/offline/sync.ts sends only the signed-in owner's entries), and
 * are only ever counted here, through the outbox's own API.
 */
import { clear, createStore } from 'idb-keyval';
import { CACHES, IDB, PERSONAL_LOCAL_KEY } from '@/lib/device-keys';
import { listObservations, listPhotos } from '@/lib/offline/outbox';

export interface Waiting {
  records: number;
  photos: number;
}

export async function waitingOnThisPhone(): Promise<Waiting> {
  const [records, photos] = await Promise.all([listObservations(), listPhotos()]);
  return { records: records.length, photos: photos.length };
}

const count = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;

/** "1 record", "3 records and 1 photo": what waits, and whether to say it or them. */
export function describeWaiting({ records, photos }: Waiting) {
  const parts = [records ? count(records, 'record') : '', photos ? count(photos, 'photo') : ''].filter(Boolean);
  return { text: parts.join(' and '), one: records + photos === 1 };
}

// The service worker's build precache holds only static files and the offline page; icons are the app's own.
const keep = (cache: string) => cache.startsWith(CACHES.precachePrefix) || cache === CACHES.icons;

/** Forgets everything of the signed-in person on this phone except the outbox. */
export async function forgetSignedInPerson() {
  if (typeof caches !== 'undefined') {
    for (const name of await caches.keys()) if (!keep(name)) await caches.delete(name);
  }
  for (const key of Object.keys(localStorage)) if (PERSONAL_LOCAL_KEY.test(key)) localStorage.removeItem(key);
  sessionStorage.clear();
  // Emptied rather than deleted: an open connection would block a deletion until the tab closes.
  await clear(createStore(...IDB.tasks)).catch(() => undefined);
}
