import { useSyncExternalStore } from 'react';

const subscribe = () => () => {};

/**
 * False in the server render and until React has hydrated the page. Forms keep their controls
 * disabled until then: typed values and a submit before hydration would be lost.
 */
export function useHydrated() {
  return useSyncExternalStore(
    subscribe,
    () => true,
    () => false,
  );
}
