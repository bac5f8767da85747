'use client';

import { useSyncExternalStore } from 'react';

const subscribe = () => () => {};

/** False in the server's HTML and during hydration, true once React runs the page. */
export const useHydrated = () =>
  useSyncExternalStore(
    subscribe,
    () => true,
    () => false,
  );
