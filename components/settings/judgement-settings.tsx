'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Input, Notice, Select } from '@/components/ui/field';
import { apiGet, apiSend, ApiError } from '@/lib/api-client';
import type { SettingsView, SettingView } from '@/lib/contracts/settings';
import type { BudRange, SettingValue } from '@/lib/viticulture';

type Draft = Record<string, string>;

const LEVEL_NAME = { default: 'default', organisation: 'organisation', block: 'block' } as const;

function show(value: SettingValue, unit: string): string {
  if (typeof value === 'number') return `${Number(value.toFixed(4))} ${unit}`;
  if ('min' in value) return `${value.min}–${(value as BudRange).max} ${unit}`;
  return `${value.firstUnitBuds} + ${value.perAdditionalUnitBuds} per ${value.unit}`;
}

/** The form's text fields for one setting: `key`, or `key.min`/`key.max`, or the formula's parts. */
function parts(s: SettingView): string[] {
  if (s.kind === 'range') return [`${s.key}.min`, `${s.key}.max`];
  if (s.kind === 'formula') return [`${s.key}.firstUnitBuds`, `${s.key}.perAdditionalUnitBuds`, `${s.key}.unit`];
  return [s.key];
}

function draftOf(view: SettingsView): Draft {
  const draft: Draft = {};
  for (const s of view.settings) {
    const own = s.own as Record<string, unknown> | number | null;
    for (const part of parts(s)) {
      const sub = part.slice(s.key.length + 1);
      draft[part] = own === null ? '' : typeof own === 'number' ? String(own) : String(own[sub] ?? '');
    }
  }
  return draft;
}

const toNumber = (text: string) => (text.trim() === '' ? null : Number(text));

/** The override the form holds: blank fields keep what the level inherits. */
function overridesOf(view: SettingsView, draft: Draft) {
  const out: Record<string, Record<string, unknown>> = {};
  for (const s of view.settings) {
    const [group, name] = s.key.split('.') as [string, string];
    const fields = parts(s);
    if (fields.every((f) => (draft[f] ?? '').trim() === '' || f.endsWith('.unit'))) continue;
    let value: unknown;
    if (s.kind === 'range') value = { min: toNumber(draft[fields[0]!]!), max: toNumber(draft[fields[1]!]!) };
    else if (s.kind === 'formula')
      value = { firstUnitBuds: toNumber(draft[fields[0]!]!), perAdditionalUnitBuds: toNumber(draft[fields[1]!]!), unit: draft[fields[2]!] || 'lb' };
    else value = toNumber(draft[s.key]!);
    (out[group] ??= {})[name] = value;
  }
  return out;
}

function errorFor(fields: Record<string, string[]>, key: string): string | undefined {
  const hits = Object.entries(fields).filter(([f]) => f === `overrides.${key}` || f.startsWith(`overrides.${key}.`));
  return hits.length ? [...new Set(hits.flatMap(([, m]) => m))].join(' ') : undefined;
}

export function JudgementSettings({ initial, blocks, canEdit }: { initial: SettingsView; blocks: { id: string; name: string }[]; canEdit: boolean }) {
  const [view, setView] = useState(initial);
  const [draft, setDraft] = useState(() => draftOf(initial));
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ ok: boolean; text: string }>();
  const [busy, setBusy] = useState(false);
  const url = view.block ? `/api/blocks/${view.block.id}/settings` : '/api/settings';

  const present = (next: SettingsView) => {
    setView(next);
    setDraft(draftOf(next));
    setFields({});
  };

  async function choose(blockId: string) {
    setMessage(undefined);
    setBusy(true);
    try {
      present(await apiGet<SettingsView>(blockId ? `/api/blocks/${blockId}/settings` : '/api/settings'));
    } catch {
      setMessage({ ok: false, text: 'Those settings could not be loaded. Try again when there is signal.' });
    } finally {
      setBusy(false);
    }
  }

  async function save(event: React.FormEvent) {
    event.preventDefault();
    setBusy(true);
    setMessage(undefined);
    try {
      present(
        await apiSend<SettingsView>(
          'PUT',
          url,
          { overrides: overridesOf(view, draft) },
          { fallback: 'Not saved: the server did not say why. Nothing was changed.' },
        ),
      );
      setMessage({ ok: true, text: `Saved. ${view.block ? view.block.name : 'The organisation'}'s judgements now use these settings.` });
    } catch (err) {
      if (err instanceof ApiError && !err.unanswered) {
        setFields(err.fields ?? {});
        setMessage({ ok: false, text: err.message });
      } else setMessage({ ok: false, text: 'Not saved: no answer from the server. Nothing was changed.' });
    } finally {
      setBusy(false);
    }
  }

  const groups = [...new Set(view.settings.map((s) => s.key.split('.')[0]!))];
  return (
    <form onSubmit={save} className="flex flex-col gap-4" aria-busy={busy} data-testid="judgement-settings">
      <label className="flex flex-col gap-1 font-bold">
        Settings for
        <Select value={view.block?.id ?? ''} onChange={(e) => void choose(e.target.value)} disabled={busy} data-testid="settings-level" className="max-w-sm">
          <option value="">The whole organisation</option>
          {blocks.map((b) => (
            <option key={b.id} value={b.id}>
              Block: {b.name}
            </option>
          ))}
        </Select>
      </label>
      <p className="text-sm text-bark-soft">
        {view.block
          ? `A value typed here is ${view.block.name}'s own; a blank field keeps the organisation's setting (or the default).`
          : 'A value typed here applies to every block that has no setting of its own; a blank field keeps the default.'}{' '}
        {view.updatedAt && `Last changed ${view.updatedAt.slice(0, 16).replace('T', ' ')} UTC${view.updatedByName ? ` by ${view.updatedByName}` : ''}.`}
      </p>
      {view.ignored.map((i) => (
        <Notice key={i.level} tone="warn">
          The {i.level}&apos;s stored settings no longer hold together and are not used: {i.message}
        </Notice>
      ))}
      {groups.map((group) => (
        <fieldset key={group} className="rounded-xl border-2 border-line p-3" disabled={busy}>
          <legend className="px-1 font-bold">{group}</legend>
          <ul className="flex flex-col gap-3">
            {view.settings
              .filter((s) => s.key.startsWith(`${group}.`))
              .map((s) => {
                const error = errorFor(fields, s.key);
                const id = `setting-${s.key}`;
                const own = parts(s).some((p) => !p.endsWith('.unit') && (draft[p] ?? '').trim() !== '');
                return (
                  <li key={s.key} className="flex flex-col gap-1" data-testid={`setting-${s.key}`}>
                    <label htmlFor={parts(s)[0] === s.key ? id : `${id}.${parts(s)[0]!.slice(s.key.length + 1)}`} className="font-bold">
                      {s.label} <span className="font-normal text-bark-soft">({s.unit})</span>
                    </label>
                    {canEdit ? (
                      <div className="flex flex-wrap items-center gap-2">
                        {parts(s).map((p) => {
                          const sub = p.slice(s.key.length + 1);
                          const pid = sub ? `${id}.${sub}` : id;
                          if (sub === 'unit') {
                            return (
                              <Select
                                key={p}
                                id={pid}
                                aria-label={`${s.label}: unit`}
                                value={draft[p] || 'lb'}
                                onChange={(e) => setDraft({ ...draft, [p]: e.target.value })}
                              >
                                <option value="lb">per lb</option>
                                <option value="kg">per kg</option>
                              </Select>
                            );
                          }
                          return (
                            <Input
                              key={p}
                              id={pid}
                              type="number"
                              inputMode="decimal"
                              step="any"
                              aria-label={sub ? `${s.label}: ${sub}` : undefined}
                              aria-invalid={error ? true : undefined}
                              aria-describedby={`${id}-hint${error ? ` ${id}-error` : ''}`}
                              placeholder={show(s.inherited, '').trim()}
                              value={draft[p] ?? ''}
                              onChange={(e) => setDraft({ ...draft, [p]: e.target.value })}
                              className="w-32"
                            />
                          );
                        })}
                        {own && (
                          <Button
                            type="button"
                            variant="quiet"
                            onClick={() => setDraft({ ...draft, ...Object.fromEntries(parts(s).map((p) => [p, ''])) })}
                            data-testid={`reset-${s.key}`}
                          >
                            {view.block ? 'Reset to the organisation’s' : 'Reset to default'}
                          </Button>
                        )}
                      </div>
                    ) : (
                      <p>
                        <strong>{show(s.value, s.unit)}</strong> ({LEVEL_NAME[s.origin]})
                      </p>
                    )}
                    {error && (
                      <p id={`${id}-error`} className="text-sm font-bold text-alarm" role="alert">
                        {error}
                      </p>
                    )}
                    <p id={`${id}-hint`} className="text-sm text-bark-soft">
                      Default {show(s.default, s.unit)}: {s.source}
                      {view.block && s.inheritedFrom === 'organisation' && ` The organisation sets ${show(s.inherited, s.unit)}.`}
                      {canEdit && ` In use: ${show(s.value, s.unit)} (${LEVEL_NAME[s.origin]}).`}
                    </p>
                  </li>
                );
              })}
          </ul>
        </fieldset>
      ))}
      <div aria-live="polite">{message && <Notice tone={message.ok ? 'ok' : 'error'}>{message.text}</Notice>}</div>
      {canEdit ? (
        <Button type="submit" disabled={busy} className="self-start" data-testid="save-settings">
          {busy ? 'Saving…' : view.block ? `Save ${view.block.name}'s settings` : 'Save the organisation’s settings'}
        </Button>
      ) : (
        <p>A manager can change these.</p>
      )}
    </form>
  );
}
