/**
 * The phone's outbox as the field screens use it: the functions of lib/offline/queue.ts bound to
 * the IndexedDB outbox (lib/offline/browser.ts). The state machine itself is in queue.ts.
 */
import { browserOutbox } from '@/lib/offline/browser';
import type { Outbox } from '@/lib/offline/queue';

export type { Collection, EntryState, RecordEntry, PhotoEntry, PhotoState } from '@/lib/offline/store';
export { collectionOf } from '@/lib/offline/queue';

const bound =
  <K extends keyof Outbox>(name: K) =>
  (...args: Parameters<Outbox[K]>): ReturnType<Outbox[K]> =>
    (browserOutbox()[name] as (...a: Parameters<Outbox[K]>) => ReturnType<Outbox[K]>)(...args);

export const onOutboxChange = bound('onChange');
export const enqueueRecord = bound('enqueueRecord');
export const enqueueObservation = bound('enqueueObservation');
export const enqueuePhoto = bound('enqueuePhoto');
export const listObservations = bound('listObservations');
export const listPhotos = bound('listPhotos');
export const getObservationEntry = bound('getObservationEntry');
export const patchObservations = bound('patchObservations');
export const patchPhoto = bound('patchPhoto');
export const removeObservation = bound('removeObservation');
export const removePhoto = bound('removePhoto');
export const replaceObservation = bound('replaceObservation');
export const reissueObservation = bound('reissueObservation');
export const recoverInterrupted = bound('recoverInterrupted');
