// Statistics for incidence: the normal quantile and the Wilson score interval.
import { requireCount, requireOpenFraction } from './check';

/**
 * Inverse of the standard normal CDF: the z with P(Z ≤ z) = p, for 0 < p < 1. Wichura's algorithm
 * AS241 (PPND16; Applied Statistics 37:477–484, 1988), accurate to about 1e-16: the coarser probit
 * in simple-statistics is off by about 0.003 at p = 0.975, too much to reproduce published intervals.
 */
export function normalQuantile(p: number): number {
  requireOpenFraction('p', p);
  const q = p - 0.5;
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (
      (q *
        (((((((2509.0809287301226727 * r + 33430.575583588128105) * r + 67265.770927008700853) * r +
          45921.953931549871457) * r + 13731.693765509461125) * r + 1971.5909503065514427) * r +
          133.14166789178437745) * r + 3.387132872796366608)) /
      (((((((5226.495278852545925 * r + 28729.085735721942674) * r + 39307.89580009271061) * r +
        21213.794301586595867) * r + 5394.1960214247511077) * r + 687.1870074920579083) * r +
        42.313330701600911252) * r + 1)
    );
  }
  let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
  let z: number;
  if (r <= 5) {
    r -= 1.6;
    z =
      (((((((7.7454501427834140764e-4 * r + 0.0227238449892691845833) * r + 0.24178072517745061177) * r +
        1.27045825245236838258) * r + 3.64784832476320460504) * r + 5.7694972214606914055) * r +
        4.6303378461565452959) * r + 1.42343711074968357734) /
      (((((((1.05075007164441684324e-9 * r + 5.475938084995344946e-4) * r + 0.0151986665636164571966) * r +
        0.14810397642748007459) * r + 0.68976733498510000455) * r + 1.6763848301838038494) * r +
        2.05319162663775882187) * r + 1);
  } else {
    r -= 5;
    z =
      (((((((2.01033439929228813265e-7 * r + 2.71155556874348757815e-5) * r + 0.0012426609473880784386) * r +
        0.026532189526576123093) * r + 0.29656057182850489123) * r + 1.7848265399172913358) * r +
        5.4637849111641143699) * r + 6.6579046435011037772) /
      (((((((2.04426310338993978564e-15 * r + 1.4215117583164458887e-7) * r + 1.8463183175100546818e-5) * r +
        7.868691311456132591e-4) * r + 0.0148753612908506148525) * r + 0.13692988092273580531) * r +
        0.59983220655588793769) * r + 1);
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
