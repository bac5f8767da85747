/** The browser's parts for the outbox and its engine: thin, so that everything else can be tested in Node. */
import { OUTBOX_CHANNEL } from '@/lib/device-keys';
import type { Clock, Lock, Transport } from '@/lib/offline/engine';
import { idbStore } from '@/lib/offline/idb-store';
import { createOutbox, type Outbox, type OutboxOptions } from '@/lib/offline/queue';

const REQUEST_TIMEOUT_MS = 30_000;
const UPLOAD_TIMEOUT_MS = 120_000;

export function fetchTransport(): Transport {
  return {
    async post(path, body) {
      const res = await fetch(path, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify(body),
        credentials: 'same-origin',
        signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
      });
      const json = res.headers.get('content-type')?.includes('application/json') ? await res.json().catch(() => undefined) : undefined;
      return { status: res.status, json };
    },
    put: (url, blob, contentType, onProgress) =>
      // XMLHttpRequest, not fetch: only it reports upload progress.
      new Promise((resolve, reject) => {
        const xhr = new XMLHttpRequest();
        xhr.open('PUT', url);
        xhr.setRequestHeader('content-type', contentType);
        xhr.timeout = UPLOAD_TIMEOUT_MS;
        xhr.upload.onprogress = (e) => onProgress(e.loaded);
        xhr.onload = () => resolve({ status: xhr.status });
        xhr.onerror = xhr.ontimeout = () => reject(new Error('upload interrupted'));
        xhr.send(blob);
      }),
  };
}

/** Web Locks across the tabs of this phone; one drain per tab where the browser has none. */
export function webLock(name: string): Lock {
  let busy = false;
  return {
    async ifFree(fn) {
      if (typeof navigator !== 'undefined' && navigator.locks) {
        await navigator.locks.request(name, { ifAvailable: true }, async (lock) => {
          if (lock) await fn();
        });
      } else if (!busy) {
        busy = true;
        try {
          await fn();
        } finally {
          busy = false;
        }
      }
    },
  };
}

export const realClock: Clock = {
  now: () => Date.now(),
  later(fn, ms) {
    const timer = setTimeout(fn, ms);
    return () => clearTimeout(timer);
  },
};

function broadcast(name: string): OutboxOptions['channel'] {
  if (typeof BroadcastChannel === 'undefined') return undefined;
  const channel = new BroadcastChannel(name);
  return {
    post: () => channel.postMessage('changed'),
    listen(fn) {
      channel.addEventListener('message', fn);
      return () => channel.removeEventListener('message', fn);
    },
  };
}

let outbox: Outbox | undefined;

/** The phone's one outbox, in IndexedDB, shared with its other tabs. */
export const browserOutbox = () => (outbox ??= createOutbox(idbStore(), { channel: broadcast(OUTBOX_CHANNEL) }));
