/**
 * Lengths and areas as people type and read them, in their organisation's unit system: metres
 * and millimetres, or feet, inches and fractions of an inch. Stored values are always metric
 * (metres, millimetres, square metres); every conversion goes through the exact factors of
 * lib/viticulture. Pure, so the server, the desk and the field app format numbers the same way.
 */
import { SQ_M_PER_HA, acToHa, ftToM, haToAc, inToMm, mToFt, mmToIn, vinesPerArea } from '@/lib/viticulture';

export const UNIT_SYSTEMS = ['metric', 'imperial'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** A fixed locale, so that the server render and the browser agree on separators. */
const LOCALE = 'en-US';

function decimals(value: number, max: number) {
  return new Intl.NumberFormat(LOCALE, { maximumFractionDigits: max }).format(value);
}

export function formatCount(value: number) {
  return new Intl.NumberFormat(LOCALE, { maximumFractionDigits: 0 }).format(value);
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** 10.5 in → "10 1/2", 0.375 → "3/8"; `denominator` sets the finest step (a power of two). */
function inchesText(inches: number, denominator: number) {
  const steps = Math.round(inches * denominator);
  const whole = Math.floor(steps / denominator);
  const rest = steps % denominator;
  if (rest === 0) return String(whole);
  const d = gcd(rest, denominator);
  const fraction = `${rest / d}/${denominator / d}`;
  return whole ? `${whole} ${fraction}` : fraction;
}

/**
 * A spacing or distance: "2.4 m" (to the millimetre), or "7 ft 10 1/2 in" (to the eighth of an
 * inch, about 3 mm, which is finer than anyone sets a vine by).
 */
export function formatLengthM(metres: number, system: UnitSystem): string {
  if (system === 'metric') return `${decimals(metres, 3)} m`;
  const eighths = Math.round(mmToIn(metres * 1000) * 8);
  const feet = Math.floor(eighths / 96);
  const inches = (eighths - feet * 96) / 8;
  if (feet === 0) return `${inchesText(inches, 8)} in`;
  return inches === 0 ? `${feet} ft` : `${feet} ft ${inchesText(inches, 8)} in`;
}

/** A small size (cane diameter, trunk girth): "9.5 mm", or "3/8 in" to the sixteenth of an inch. */
export function formatLengthMm(mm: number, system: UnitSystem): string {
  if (system === 'metric') return `${decimals(mm, 1)} mm`;
  return `${inchesText(mmToIn(mm), 16)} in`;
}

type LengthUnit = 'mm' | 'cm' | 'm' | 'in' | 'ft';

const UNIT_WORDS: [RegExp, LengthUnit][] = [
  [/^(mm|millimet(re|er)s?)$/, 'mm'],
  [/^(cm|centimet(re|er)s?)$/, 'cm'],
  [/^(m|met(re|er)s?)$/, 'm'],
  [/^(in|inch|inches|"|″|'')$/, 'in'],
  [/^(ft|foot|feet|'|′)$/, 'ft'],
];

const FRACTIONS: Record<string, string> = { '½': ' 1/2', '¼': ' 1/4', '¾': ' 3/4', '⅛': ' 1/8', '⅜': ' 3/8', '⅝': ' 5/8', '⅞': ' 7/8' };

function toMm(value: number, unit: LengthUnit) {
  switch (unit) {
    case 'mm':
      return value;
    case 'cm':
      return value * 10;
    case 'm':
      return value * 1000;
    case 'in':
      return inToMm(value);
    case 'ft':
      return ftToM(value) * 1000;
  }
}

// A number ("2.4", "10 1/2", "3/8") followed by an optional unit word or mark.
const TOKEN =
  /^\s*(\d+\s+\d+\/\d+|\d+\/\d+|\d+(?:\.\d+)?|\.\d+)\s*(millimet(?:re|er)s?|centimet(?:re|er)s?|met(?:re|er)s?|inch(?:es)?|feet|foot|mm|cm|ft|in|m|''|["″'′])?/;

function numberOf(text: string) {
  const [whole, fraction] = text.includes('/') ? (text.includes(' ') ? text.split(/\s+/) : ['0', text]) : [text, undefined];
  let value = Number(whole);
  if (fraction) {
    const [n, d] = fraction.split('/').map(Number);
    if (!d) return NaN;
    value += n! / d;
  }
  return value;
}

/**
 * What a person typed, as a length in `unit` (metres or millimetres), or null when it cannot be
 * read. Bare numbers are taken in the organisation's usual unit for that size: metres or feet for
 * spacings (`unit` 'm'), millimetres or inches for small sizes (`unit` 'mm'). Any explicit unit
 * is accepted whatever the preference ("2.4 m" on an imperial estate), and feet may be followed
 * by bare inches: "7' 6", "7 ft 6 1/2 in", "7′6″". A decimal comma ("2,4") is read as a point.
 */
export function parseLength(text: string, system: UnitSystem, unit: 'm' | 'mm'): number | null {
  let rest = text.trim().toLowerCase();
  for (const [glyph, ascii] of Object.entries(FRACTIONS)) rest = rest.replaceAll(glyph, ascii);
  if (!rest.includes('.')) rest = rest.replace(/(\d),(\d)/, '$1.$2');
  if (!rest) return null;
  const bare: LengthUnit = unit === 'm' ? (system === 'metric' ? 'm' : 'ft') : system === 'metric' ? 'mm' : 'in';
  let totalMm = 0;
  let previous: LengthUnit | undefined;
  while (rest) {
    const match = TOKEN.exec(rest);
    if (!match) return null;
    const value = numberOf(match[1]!.trim());
    if (!Number.isFinite(value)) return null;
    const word = match[2];
    let tokenUnit: LengthUnit | undefined = word ? UNIT_WORDS.find(([re]) => re.test(word))?.[1] : undefined;
    if (word && !tokenUnit) return null;
    tokenUnit ??= previous === 'ft' ? 'in' : bare;
    // Only feet then inches (or metres then centimetres…) may follow each other; "2 m 3 ft" is a typo.
    if (previous && !(previous === 'ft' && tokenUnit === 'in') && !(previous === 'm' && (tokenUnit === 'cm' || tokenUnit === 'mm'))) return null;
    totalMm += toMm(value, tokenUnit);
    previous = tokenUnit;
    rest = rest.slice(match[0].length).trim();
  }
  return unit === 'm' ? totalMm / 1000 : totalMm;
}

export function lengthUnitLabel(system: UnitSystem, size: 'm' | 'mm'): string {
  if (size === 'm') return system === 'metric' ? 'metres' : 'feet and inches';
  return system === 'metric' ? 'millimetres' : 'inches';
}

/** An example of what can be typed, for form hints. */
export function lengthExample(system: UnitSystem, size: 'm' | 'mm'): string {
  if (size === 'm') return system === 'metric' ? 'e.g. 2.4 or 2.4 m' : 'e.g. 8, 8 ft or 7 ft 6 in';
  return system === 'metric' ? 'e.g. 9.5 or 9.5 mm' : 'e.g. 3/8 or 0.375 in';
}

export function areaUnit(system: UnitSystem): 'ha' | 'acre' {
  return system === 'metric' ? 'ha' : 'acre';
}

/** An area from square metres: "1.23 ha" or "3.04 acres". */
export function formatAreaM2(squareMetres: number, system: UnitSystem): string {
  const ha = squareMetres / SQ_M_PER_HA;
  const value = system === 'metric' ? ha : haToAc(ha);
  const text = decimals(value, value < 10 ? 2 : 1);
  if (system === 'metric') return `${text} ha`;
  return `${text} ${text === '1' ? 'acre' : 'acres'}`;
}

/** An area typed in hectares or acres (bare numbers in the organisation's unit), as square metres. */
export function parseAreaM2(text: string, system: UnitSystem): number | null {
  const match = /^\s*(\d+(?:[.,]\d+)?)\s*(ha|hectares?|ac|acres?)?\s*$/i.exec(text);
  if (!match) return null;
  const value = Number(match[1]!.replace(',', '.'));
  const unit = match[2]?.toLowerCase().startsWith('h') ? 'ha' : match[2] ? 'acre' : areaUnit(system);
  const ha = unit === 'ha' ? value : acToHa(value);
  return ha * SQ_M_PER_HA;
}

/** Vines per hectare or per acre for the spacings, unrounded (lib/viticulture's formula). */
export function vinesPerAreaFor(rowSpacingM: number, vineSpacingM: number, system: UnitSystem): number {
  return system === 'metric' ? vinesPerArea(rowSpacingM, vineSpacingM, 'ha') : vinesPerArea(mToFt(rowSpacingM), mToFt(vineSpacingM), 'acre');
}

/** "3,333 vines/ha" or "1,349 vines/acre", rounded to the vine as published tables do. */
export function formatVinesPerArea(rowSpacingM: number, vineSpacingM: number, system: UnitSystem): string {
  return `${formatCount(vinesPerAreaFor(rowSpacingM, vineSpacingM, system))} vines/${areaUnit(system)}`;
}
