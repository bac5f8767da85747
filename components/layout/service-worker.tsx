'use client';

import type { Workbox } from 'workbox-window';
import { useEffect, useRef, useState } from 'react';

/**
 * Registers the service worker and, when a new version is waiting, asks before switching:
 * swapping code under a scout in the middle of a form would be worse than a stale page.
 */
export function ServiceWorker({ labels }: { labels: { update: string; reload: string } }) {
  const [waiting, setWaiting] = useState<Workbox>();
  const accepted = useRef(false);
  useEffect(() => {
    if (!('serviceWorker' in navigator) || process.env.NODE_ENV !== 'production') return;
    let interval: number | undefined;
    let stopped = false;
    // workbox-window loads after the page has shown, so it costs the first paint nothing.
    const start = async () => {
      const { Workbox } = await import('workbox-window');
      if (stopped) return;
      const wb = new Workbox('/sw.js', { scope: '/' });
      wb.addEventListener('waiting', () => setWaiting(wb));
      // Reload only for an update the person accepted: the first worker takes over quietly, so a
      // half-filled form is never wiped.
      wb.addEventListener('controlling', () => {
        if (accepted.current) window.location.reload();
      });
      // Blocked or unsupported (private modes, some managed phones): the app still works online.
      wb.register().catch(() => undefined);
      interval = window.setInterval(() => void wb.update().catch(() => undefined), 30 * 60 * 1000);
    };
    const begin = () => void start().catch(() => undefined);
    if (document.readyState === 'complete') begin();
    else window.addEventListener('load', begin, { once: true });
    return () => {
      stopped = true;
      window.removeEventListener('load', begin);
      window.clearInterval(interval);
    };
  }, []);
  if (!waiting) return null;
  return (
    <div
      role="alert"
      data-testid="sw-update"
      className="fixed inset-x-3 bottom-3 z-50 mx-auto flex max-w-md items-center gap-3 rounded-xl border-2 border-rootstock bg-panel p-3 shadow-lg"
    >
      <span className="font-bold">{labels.update}</span>
      <button
        type="button"
        className="ml-auto min-h-touch rounded-lg bg-rootstock px-4 font-bold text-white"
        onClick={() => {
          accepted.current = true;
          waiting.messageSkipWaiting();
        }}
      >
        {labels.reload}
      </button>
    </div>
  );
}
