'use client';

import { createContext, useContext, useMemo, type ReactNode } from 'react';
import { useFieldLayout } from '@/lib/offline/use-field-layout';
import { DEFAULT_SETTINGS, mergeSettings, type ViticultureSettings } from '@/lib/viticulture';

const FieldSettings = createContext<ViticultureSettings>(DEFAULT_SETTINGS);
const VineSpacing = createContext<number | undefined>(undefined);

/**
 * The block's judgement settings for the phone's verdicts, from the field layout it caches for
 * offline walking (GET /api/field/blocks/[id]). A copy cached before settings were sent, or one
 * this build cannot read, falls back to the defaults rather than breaking the form.
 */
export function FieldSettingsProvider({ settings, vineSpacingM, children }: { settings: unknown; vineSpacingM?: number; children: ReactNode }) {
  const value = useMemo(() => {
    if (settings === null || typeof settings !== 'object') return DEFAULT_SETTINGS;
    try {
      return mergeSettings(settings);
    } catch {
      return DEFAULT_SETTINGS;
    }
  }, [settings]);
  return (
    <FieldSettings.Provider value={value}>
      <VineSpacing.Provider value={vineSpacingM}>{children}</VineSpacing.Provider>
    </FieldSettings.Provider>
  );
}

/** The same, for a screen that knows only the block id (the outbox's fix-a-record form). */
export function BlockSettingsProvider({ blockId, children }: { blockId: string; children: ReactNode }) {
  const { data } = useFieldLayout(blockId);
  return (
    <FieldSettingsProvider settings={data?.settings} vineSpacingM={data?.block.vineSpacingM}>
      {children}
    </FieldSettingsProvider>
  );
}

export function useFieldSettings(): ViticultureSettings {
  return useContext(FieldSettings);
}

/** The block's vine spacing in metres, when the phone's copy of the layout has it. */
export function useVineSpacing(): number | undefined {
  return useContext(VineSpacing);
}
