// Exact international factors. The inch (25.4 mm), foot (0.3048 m) and avoirdupois pound
// (0.45359237 kg) were fixed by the 1959 international yard and pound agreement; NIST Handbook 44
// (2026) Appendix C lists the acre as 43 560 ft² and 0.404 685 642 24 ha, both exactly. The older US
// survey acre (≈ 4046.873 m²) is deliberately not used.
import { requireNonNegative } from './check';

export const MM_PER_IN = 25.4;
export const M_PER_FT = 0.3048;
export const KG_PER_LB = 0.45359237;
export const SQ_FT_PER_ACRE = 43_560;
export const SQ_M_PER_HA = 10_000;
/** 43 560 × 0.3048², exactly. */
export const SQ_M_PER_ACRE = 4046.8564224;

export function inToMm(inches: number): number {
  return requireNonNegative('inches', inches) * MM_PER_IN;
}

export function mmToIn(mm: number): number {
  return requireNonNegative('mm', mm) / MM_PER_IN;
}

export function lbToKg(lb: number): number {
  return requireNonNegative('lb', lb) * KG_PER_LB;
}

export function kgToLb(kg: number): number {
  return requireNonNegative('kg', kg) / KG_PER_LB;
}

export function ftToM(ft: number): number {
  return requireNonNegative('ft', ft) * M_PER_FT;
}

export function mToFt(m: number): number {
  return requireNonNegative('m', m) / M_PER_FT;
}

export function acToHa(acres: number): number {
  return (requireNonNegative('acres', acres) * SQ_M_PER_ACRE) / SQ_M_PER_HA;
}

export function haToAc(hectares: number): number {
  return (requireNonNegative('hectares', hectares) * SQ_M_PER_HA) / SQ_M_PER_ACRE;
}
