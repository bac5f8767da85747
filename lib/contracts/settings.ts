/** The judgement settings screen: what GET and PUT /api/settings and /api/blocks/[id]/settings answer. */
import type { LayeredSettings, SettingKey, SettingLevel, SettingMeta, SettingValue } from '@/lib/viticulture';

export interface SettingView extends SettingMeta {
  key: SettingKey;
  default: SettingValue;
  /** What this level falls back to: the default for the organisation, the organisation's for a block. */
  inherited: SettingValue;
  inheritedFrom: SettingLevel;
  /** This level's own value, or null when it keeps what it inherits. */
  own: SettingValue | null;
  value: SettingValue;
  origin: SettingLevel;
}

export interface SettingsView {
  level: 'organisation' | 'block';
  block: { id: string; name: string } | null;
  updatedAt: string | null;
  updatedByName: string | null;
  ignored: LayeredSettings['ignored'];
  settings: SettingView[];
}
