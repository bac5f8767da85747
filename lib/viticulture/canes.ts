// Fruit-cane judgement at pruning time: which one-year canes are worth keeping, and how long.
import { formatNumber, requireNonNegative, requireOneOf, requirePositive } from './check';
import { EXPOSURES, WOOD_ORIGINS, type Exposure, type WoodOrigin } from './observations';
import { resolveSettings, type BudRange, type SettingsOverride, type ViticultureSettings } from './settings';

export interface CaneInput {
  baseDiameterMm: number;
  longestInternodeMm?: number;
  exposure?: Exposure;
  colourGood?: boolean;
  flat?: boolean;
  origin?: WoodOrigin;
  injured?: boolean;
}

export type CaneVerdict = 'fruit-cane' | 'if-nothing-better' | 'remove';

export interface CaneAssessment {
  verdict: CaneVerdict;
  /** "code: message" strings, disqualifying faults first; see CANE_REASON_CODES. Empty for a good fruit cane. */
  reasons: string[];
}

/**
 * The stable codes that open every reason string ("shade-cane: longest internode 140 mm exceeds
 * 100 mm"). The UI translates by code (see caneReasonCode); the English after the colon carries the
 * measured values and is for logs, reports and people reading the raw data.
 */
export const CANE_REASON_CODES = ['injured', 'trunk-shoot', 'very-thin', 'thin', 'bull-cane', 'shade-cane', 'poor-colour', 'flat', 'older-wood'] as const;
export type CaneReasonCode = (typeof CANE_REASON_CODES)[number];

// A major fault rules the cane out on its own; minor ones make it a second choice, and enough of
// them together (settings.canes.minorFaultsToRemove) rule it out too.
// A bull cane is a major fault: eXtension calls bull canes "poorly fruitful or unfruitful, less
// cold-hardy than normal-sized canes" and "poor selections ... to keep for spurs or fruiting canes".
const MAJOR_FAULTS: ReadonlySet<CaneReasonCode> = new Set(['injured', 'trunk-shoot', 'very-thin', 'bull-cane']);

export interface CaneFinding {
  code: CaneReasonCode;
  message: string;
}

/** The code at the start of a reason string, or undefined for text that is not one. */
export function caneReasonCode(reason: string): CaneReasonCode | undefined {
  const code = reason.split(':', 1)[0] ?? '';
  return (CANE_REASON_CODES as readonly string[]).includes(code) ? (code as CaneReasonCode) : undefined;
}

/**
 * Fruit-cane suitability. Faults and where their limits come from (all limits are settings):
 * - injured, or arising from the trunk (a trunk shoot is for trunk renewal, not fruit): remove;
 * - base diameter under `veryThinBelowMm`: remove; over `bullAboveMm` (1/2 in, a bull cane): remove,
 *   a poor selection however vigorous (eXtension); under `thinBelowMm` (5/16 in, Westover): minor;
 * - shade cane, from a longest internode over `shadeInternodeAboveMm` or growth in shade: minor.
 *   Long internodes come from shade or excess vigour, and their buds are less fruitful (Mid Valley Ag
 *   Services, Lodi, 2008; grovida.us on sun-exposed canes);
 * - poor colour (poorly matured wood), flat rather than round, or arising from wood older than two
 *   years: minor.
 * No fault: fruit-cane. Minor faults only: if-nothing-better, until there are
 * `minorFaultsToRemove` of them. Fields left out are taken as unknown, never as faults.
 */
export function assessCane(input: CaneInput, settings?: SettingsOverride): CaneAssessment {
  requirePositive('baseDiameterMm', input.baseDiameterMm);
  const s = resolveSettings(settings);
  return judge(caneFindings(input, s), s);
}

/** Findings for a cane whose diameter may be unknown (a shade-cane observation need not carry it). */
export function caneFindings(input: Partial<CaneInput>, s: ViticultureSettings): CaneFinding[] {
  const findings: CaneFinding[] = [];
  const { baseDiameterMm: diameter, longestInternodeMm: internode } = input;
  if (internode !== undefined) requireNonNegative('longestInternodeMm', internode);
  if (input.exposure !== undefined) requireOneOf('exposure', input.exposure, EXPOSURES);
  if (input.origin !== undefined) requireOneOf('origin', input.origin, WOOD_ORIGINS);

  if (input.injured === true) findings.push({ code: 'injured', message: 'cane is injured' });
  if (input.origin === 'trunk') {
    findings.push({ code: 'trunk-shoot', message: 'arises from the trunk; keep it only for trunk renewal' });
  }
  if (diameter !== undefined) {
    requirePositive('baseDiameterMm', diameter);
    const { veryThinBelowMm, thinBelowMm, bullAboveMm } = s.canes;
    if (diameter < veryThinBelowMm) {
      findings.push({ code: 'very-thin', message: `base diameter ${mm(diameter)} is under ${mm(veryThinBelowMm)}` });
    } else if (diameter < thinBelowMm) {
      findings.push({ code: 'thin', message: `base diameter ${mm(diameter)} is under ${mm(thinBelowMm)}` });
    } else if (diameter > bullAboveMm) {
      findings.push({ code: 'bull-cane', message: `base diameter ${mm(diameter)} exceeds ${mm(bullAboveMm)}` });
    }
  }
  const shadeSigns: string[] = [];
  if (internode !== undefined && internode > s.canes.shadeInternodeAboveMm) {
    shadeSigns.push(`longest internode ${mm(internode)} exceeds ${mm(s.canes.shadeInternodeAboveMm)}`);
  }
  if (input.exposure === 'shade') shadeSigns.push('grew in shade');
  // Long internodes and shade are two signs of one fault; counting them twice would remove canes
  // that are merely shaded.
  if (shadeSigns.length > 0) findings.push({ code: 'shade-cane', message: shadeSigns.join('; ') });
  if (input.colourGood === false) findings.push({ code: 'poor-colour', message: 'wood colour shows poor maturity' });
  if (input.flat === true) findings.push({ code: 'flat', message: 'cane is flat, not round' });
  if (input.origin === 'older-wood') findings.push({ code: 'older-wood', message: 'arises from wood older than two years' });
  return findings;
}

export function judge(findings: CaneFinding[], s: ViticultureSettings): CaneAssessment {
  const majors = findings.filter((f) => MAJOR_FAULTS.has(f.code)).length;
  const minors = findings.length - majors;
  const verdict: CaneVerdict = majors > 0 || minors >= Math.max(1, s.canes.minorFaultsToRemove) ? 'remove' : minors > 0 ? 'if-nothing-better' : 'fruit-cane';
  return { verdict, reasons: findings.map((f) => `${f.code}: ${f.message}`) };
}

/**
 * Buds to leave on a fruit cane, by its base diameter: a thicker cane grew on a more vigorous shoot
 * and can ripen more fruit, up to the bull cane. Bands split at `canes.thinBelowMm` (5/16 in, the
 * same limit assessCane calls thin) and `budsPerCane.thickFromMm` (7/16 in): thin 8–10, normal
 * 12–14, thick 16–18 buds by default. A bull cane (over `canes.bullAboveMm`) gets no extra buds:
 * it is poorly fruitful and should not be kept (eXtension), so if it is kept it gets the normal band.
 */
export function recommendedBudsPerCane(baseDiameterMm: number, settings?: SettingsOverride): BudRange {
  requirePositive('baseDiameterMm', baseDiameterMm);
  const s = resolveSettings(settings);
  const { thickFromMm, thin, normal, thick } = s.budsPerCane;
  const band = baseDiameterMm > s.canes.bullAboveMm ? normal : baseDiameterMm >= thickFromMm ? thick : baseDiameterMm >= s.canes.thinBelowMm ? normal : thin;
  return { min: band.min, max: band.max };
}

function mm(value: number): string {
  return `${formatNumber(value)} mm`;
}
