// Statistics for incidence: the normal quantile and the Wilson score interval.
import { requireCount, requireOpenFraction } from './check';

/**
 * Inverse of the standard normal CDF: the z with P(Z ≤ z) = p, for 0 < p < 1. Wichura's algorithm
 * AS241 (PPND16; Applied Statistics 37:477–484, 1988), accurate to about 1e-16: the coarser probit
 * in simple-statistics is off by about 0.003 at p = 0.975, too much to reproduce published intervals.
 * The published 20-digit coefficients are written as the doubles they round to, which is all a
 * JavaScript number can hold anyway.
 */
export function normalQuantile(p: number): number {
  requireOpenFraction('p', p);
  const q = p - 0.5;
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (
      (q *
        (((((((2509.0809287301227 * r + 33430.57558358813) * r + 67265.7709270087) * r + 45921.95393154987) * r + 13731.69376550946) * r + 1971.5909503065513) *
          r +
          133.14166789178438) *
          r +
          3.3871328727963665)) /
      (((((((5226.495278852546 * r + 28729.085735721943) * r + 39307.89580009271) * r + 21213.794301586597) * r + 5394.196021424751) * r + 687.1870074920579) *
        r +
        42.31333070160091) *
        r +
        1)
    );
  }
  let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
  let z: number;
  if (r <= 5) {
    r -= 1.6;
    z =
      (((((((0.0007745450142783414 * r + 0.022723844989269184) * r + 0.2417807251774506) * r + 1.2704582524523684) * r + 3.6478483247632045) * r +
        5.769497221460691) *
        r +
        4.630337846156546) *
        r +
        1.4234371107496835) /
      (((((((1.0507500716444169e-9 * r + 0.0005475938084995345) * r + 0.015198666563616457) * r + 0.14810397642748008) * r + 0.6897673349851) * r +
        1.6763848301838038) *
        r +
        2.053191626637759) *
        r +
        1);
  } else {
    r -= 5;
    z =
      (((((((2.0103343992922881e-7 * r + 0.000027115555687434876) * r + 0.0012426609473880784) * r + 0.026532189526576124) * r + 0.29656057182850487) * r +
        1.7848265399172913) *
        r +
        5.463784911164114) *
        r +
        6.657904643501103) /
      (((((((2.0442631033899397e-15 * r + 1.421511758316446e-7) * r + 0.000018463183175100548) * r + 0.0007868691311456133) * r + 0.014875361290850615) * r +
        0.1369298809227358) *
        r +
        0.599832206555888) *
        r +
        1);
  }
  return q < 0 ? -z : z;
}

/** The two-sided critical value: 1.959964 for 95% confidence. */
export function zForConfidence(confidence: number): number {
  requireOpenFraction('confidence', confidence);
  return normalQuantile((1 + confidence) / 2);
}

export interface ProportionInterval {
  estimate: number;
  lower: number;
  upper: number;
}

/**
 * Wilson score interval for `successes` out of `trials` (Wilson 1927, JASA 22:209–212), as
 * proportions 0–1:
 *   (p̂ + z²/2n ± z·√(p̂(1−p̂)/n + z²/4n²)) / (1 + z²/n).
 * Chosen over the textbook p̂ ± z·√(p̂(1−p̂)/n) because incidence on a block is often 0 or a handful
 * of vines, where that interval collapses to zero width or leaves [0, 1]; Newcombe (1998) and Agresti &
 * Coull (1998) recommend Wilson for exactly this.
 */
export function wilsonInterval(successes: number, trials: number, confidence = 0.95): ProportionInterval {
  requireCount('successes', successes);
  requireCount('trials', trials);
  if (trials === 0) throw new RangeError('trials must be at least 1 to estimate a proportion');
  if (successes > trials) throw new RangeError(`successes (${successes}) cannot exceed trials (${trials})`);
  const z = zForConfidence(confidence);
  const n = trials;
  const estimate = successes / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const centre = (estimate + z2 / (2 * n)) / denominator;
  const halfWidth = (z * Math.sqrt((estimate * (1 - estimate)) / n + z2 / (4 * n * n))) / denominator;
  // At 0 or n the exact bound is 0 or 1; floating point would leave it a hair off.
  const lower = successes === 0 ? 0 : Math.min(estimate, Math.max(0, centre - halfWidth));
  const upper = successes === trials ? 1 : Math.max(estimate, Math.min(1, centre + halfWidth));
  return { estimate, lower, upper };
}

/**
 * Sample coefficient of variation in percent: the standard deviation with n − 1 over the mean × 100.
 * Needs at least two values and a mean above 0.
 */
export function coefficientOfVariationPercent(values: readonly number[]): number {
  if (values.length < 2) throw new RangeError('values must hold at least 2 numbers to give a coefficient of variation');
  for (const v of values) {
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) throw new RangeError(`values must be finite numbers of 0 or more, got ${String(v)}`);
  }
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  if (mean <= 0) throw new RangeError('values must have a mean greater than 0');
  const variance = values.reduce((a, v) => a + (v - mean) ** 2, 0) / (values.length - 1);
  return (Math.sqrt(variance) / mean) * 100;
}
