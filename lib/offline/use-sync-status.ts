'use client';

import { useSyncExternalStore } from 'react';
import { getSyncStatus, subscribeSyncStatus } from '@/lib/offline/sync';

export const useSyncStatus = () => useSyncExternalStore(subscribeSyncStatus, getSyncStatus, getSyncStatus);
