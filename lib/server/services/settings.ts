import 'server-only';
import type { SettingsView, SettingView } from '@/lib/contracts/settings';
import type { Member } from '@/lib/server/auth/guard';
import { db, type Db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getBlock, listBlocks } from '@/lib/server/queries/blocks';
import {
  getBlockOverride,
  getOrganisationOverride,
  listBlockOverrides,
  lockOrganisationSettings,
  saveBlockOverride,
  saveOrganisationOverride,
  type StoredOverride,
} from '@/lib/server/queries/settings';
import {
  DEFAULT_SETTINGS,
  layerSettings,
  mergeSettings,
  overlaySettings,
  overriddenKeys,
  SETTING_KEYS,
  SETTINGS_META,
  settingValue,
  type LayeredSettings,
  type SettingKey,
  type SettingsOverride,
  type SettingValue,
  type ViticultureSettings,
} from '@/lib/viticulture';

/** The settings a block's judgements use: defaults ← organisation ← block. */
export async function settingsForBlock(database: Db, organisationId: string, blockId: string): Promise<LayeredSettings> {
  const [org, block] = await Promise.all([getOrganisationOverride(database, organisationId), getBlockOverride(database, organisationId, blockId)]);
  return layerSettings(org?.overrides, block?.overrides);
}

/** Settings for many blocks from two queries: a lookup that gives the organisation's for a block without its own. */
export async function settingsForBlocks(database: Db, organisationId: string, blockIds?: readonly string[]): Promise<(blockId: string) => ViticultureSettings> {
  const [org, blocks] = await Promise.all([getOrganisationOverride(database, organisationId), listBlockOverrides(database, organisationId, blockIds)]);
  const orgLevel = layerSettings(org?.overrides).settings;
  const byBlock = new Map([...blocks].map(([id, o]) => [id, layerSettings(org?.overrides, o).settings]));
  return (blockId) => byBlock.get(blockId) ?? orgLevel;
}

function ownValue(override: SettingsOverride, key: SettingKey): SettingValue {
  const [group, name] = key.split('.') as [string, string];
  return (override as Record<string, Record<string, SettingValue>>)[group]![name]!;
}

function view(
  level: SettingsView['level'],
  block: SettingsView['block'],
  stored: StoredOverride | undefined,
  below: LayeredSettings,
  effective: LayeredSettings,
): SettingsView {
  const own = new Set(overriddenKeys(stored?.overrides));
  return {
    level,
    block,
    updatedAt: stored ? new Date(stored.updatedAt).toISOString() : null,
    updatedByName: stored?.updatedByName ?? null,
    ignored: effective.ignored,
    settings: SETTING_KEYS.map((key) => ({
      key,
      ...SETTINGS_META[key],
      default: settingValue(DEFAULT_SETTINGS, key),
      inherited: settingValue(below.settings, key),
      inheritedFrom: below.origin[key],
      own: own.has(key) ? ownValue(stored!.overrides, key) : null,
      value: settingValue(effective.settings, key),
      origin: effective.origin[key],
    })),
  };
}

export async function loadOrganisationSettings(member: Member): Promise<SettingsView> {
  const stored = await getOrganisationOverride(db(), member.organisationId);
  return view('organisation', null, stored, layerSettings(), layerSettings(stored?.overrides));
}

export async function loadBlockSettings(member: Member, blockId: string): Promise<SettingsView> {
  const database = db();
  const block = await getBlock(database, member.organisationId, blockId);
  if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
  const [org, stored] = await Promise.all([
    getOrganisationOverride(database, member.organisationId),
    getBlockOverride(database, member.organisationId, block.id),
  ]);
  return view('block', { id: block.id, name: block.name }, stored, layerSettings(org?.overrides), layerSettings(org?.overrides, stored?.overrides));
}

/** Which of the submitted settings a RangeError from mergeSettings is about, as `overrides.group.key`. */
function fieldsFor(message: string, override: SettingsOverride): Record<string, string[]> {
  const keys = overriddenKeys(override);
  const named = keys.filter((key) => {
    const [group, name] = key.split('.') as [string, string];
    const word = new RegExp(`\\b${name}\\b`);
    return message.includes(key) || (message.includes(`settings.${group}:`) && word.test(message)) || (name === 'formula' && message.includes('formula'));
  });
  const percent = /percent settings/.test(message)
    ? keys.filter((k) => ['budbreak.weakBelowPercent', 'budInjury.minimalAbovePercent', 'trunkInjury.urgentAbovePercent'].includes(k))
    : [];
  const hit = [...new Set([...named, ...percent])];
  return hit.length ? Object.fromEntries(hit.map((k) => [`overrides.${k}`, [message]])) : { overrides: [message] };
}

/** Checks the override over what it lays on: a 422 naming the settings that do not hold together. */
function check(under: SettingsOverride, override: SettingsOverride, what: string) {
  try {
    mergeSettings(overlaySettings(under, override));
  } catch (err) {
    if (!(err instanceof RangeError)) throw err;
    throw new AppError('invalid-input', `${what}: ${err.message.replace(/^settings[.:]?\s*/, '')}`, fieldsFor(err.message, override));
  }
}

/** Only the keys that set something, so a stored override never carries empty groups. */
function compact(override: SettingsOverride): SettingsOverride {
  const out: Record<string, Record<string, unknown>> = {};
  for (const key of overriddenKeys(override)) {
    const [group, name] = key.split('.') as [string, string];
    (out[group] ??= {})[name] = (override as Record<string, Record<string, unknown>>)[group]![name];
  }
  return out as SettingsOverride;
}

/**
 * Replaces the organisation's override (a setting left out goes back to its default). It must hold
 * over the defaults and under every block's own override, or nothing is stored.
 */
export async function saveOrganisationSettings(member: Member, overrides: SettingsOverride): Promise<SettingsView> {
  const override = compact(overrides);
  check({}, override, 'These settings do not hold together');
  await db().transaction(async (trx) => {
    await lockOrganisationSettings(trx, member.organisationId);
    const [blocks, names] = await Promise.all([listBlockOverrides(trx, member.organisationId), listBlocks(trx, member.organisationId, { archived: true })]);
    for (const [blockId, own] of blocks) {
      const name = names.find((b) => b.id === blockId)?.name ?? 'A block';
      try {
        mergeSettings(overlaySettings(override, own));
      } catch (err) {
        if (!(err instanceof RangeError)) throw err;
        throw new AppError(
          'invalid-input',
          `${name}'s own settings would no longer hold with these: ${err.message}. Change that block's settings first.`,
          fieldsFor(err.message, override),
        );
      }
    }
    await saveOrganisationOverride(trx, member.organisationId, override, member.userId);
  });
  return loadOrganisationSettings(member);
}

/** Replaces a block's override; it must hold over the organisation's settings, or nothing is stored. */
export async function saveBlockSettings(member: Member, blockId: string, overrides: SettingsOverride): Promise<SettingsView> {
  const override = compact(overrides);
  await db().transaction(async (trx) => {
    const block = await getBlock(trx, member.organisationId, blockId);
    if (!block) throw new AppError('not-found', 'There is no such block in your organisation.');
    await lockOrganisationSettings(trx, member.organisationId);
    const org = await getOrganisationOverride(trx, member.organisationId);
    // An organisation override that no longer holds is left out of the block's settings too.
    const base = layerSettings(org?.overrides).ignored.length ? {} : (org?.overrides ?? {});
    check(base, override, `${block.name}: these settings do not hold together`);
    await saveBlockOverride(trx, member.organisationId, block.id, override, member.userId);
  });
  return loadBlockSettings(member, blockId);
}

/** The settings screen: the organisation's view and the blocks a manager can pick instead. */
export async function loadSettingsScreen(member: Member) {
  const [organisation, blocks] = await Promise.all([loadOrganisationSettings(member), listBlocks(db(), member.organisationId)]);
  return { organisation, blocks: blocks.map((b) => ({ id: b.id, name: b.name })) };
}

export type { SettingsView, SettingView };
