// Input guards shared by the calculations. Every public function rejects bad numbers with a
// RangeError that names the argument, so a form or a sync handler can show the message as is.

function show(value: number): string {
  return Number.isNaN(value) ? 'NaN' : String(value);
}

export function requireNonNegative(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new RangeError(`${name} must be a finite number of 0 or more, got ${show(value)}`);
  }
  return value;
}

export function requirePositive(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${name} must be a finite number greater than 0, got ${show(value)}`);
  }
  return value;
}

export function requireCount(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) {
    throw new RangeError(`${name} must be a whole number of 0 or more, got ${show(value)}`);
  }
  return value;
}

export function requireFraction(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0 || value > 1) {
    throw new RangeError(`${name} must be between 0 and 1, got ${show(value)}`);
  }
  return value;
}

/** Strictly between 0 and 1: confidence levels and margins, where both ends are meaningless. */
export function requireOpenFraction(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || value >= 1) {
    throw new RangeError(`${name} must be greater than 0 and less than 1, got ${show(value)}`);
  }
  return value;
}

export function requirePercent(name: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0 || value > 100) {
    throw new RangeError(`${name} must be between 0 and 100, got ${show(value)}`);
  }
  return value;
}

export function requireOneOf<T extends string>(name: string, value: T, allowed: readonly T[]): T {
  if (!allowed.includes(value)) {
    throw new RangeError(`${name} must be one of ${allowed.join(', ')}, got ${String(value)}`);
  }
  return value;
}

/** Two decimals at most, trailing zeros dropped: reason texts read "6.35 mm", "140 mm". */
export function formatNumber(value: number): string {
  return String(Number(value.toFixed(2)));
}
