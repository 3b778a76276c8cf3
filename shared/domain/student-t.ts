/**
 * Quantiles of Student's t distribution, for confidence intervals of fitted parameters.
 *
 * Written here rather than taken from a package because the statistics packages in use
 * (simple-statistics) give t tests but no t quantile; this is the textbook route: the
 * regularised incomplete beta function by Lentz's continued fraction, inverted by Newton steps
 * with bisection as a guard. Results are memoised per (probability, degrees of freedom): a fit
 * asks the same few quantiles thousands of times. The memo is a pure cache (same input, same
 * output), not state that changes results.
 */

const memo = new Map<string, number>();

/**
 * The `probability` quantile of Student's t with `degreesOfFreedom` (≥ 1, may be fractional).
 *
 * @param probability - in (0, 1), e.g. 0.975 for a two-sided 95 % interval
 * @param degreesOfFreedom - ≥ 1; `Infinity` gives the normal quantile
 * @returns t such that P(T ≤ t) = probability
 * @example
 * tQuantile(0.975, 10) // ≈ 2.228
 * tQuantile(0.975, Infinity) // ≈ 1.960
 */
export function tQuantile(probability: number, degreesOfFreedom: number): number {
  if (!(probability > 0 && probability < 1)) {
    throw new RangeError(`probability must be in (0, 1), got ${probability}`);
  }
  if (!(degreesOfFreedom >= 1)) {
    throw new RangeError(`degreesOfFreedom must be at least 1, got ${degreesOfFreedom}`);
  }
  const key = `${probability}|${degreesOfFreedom}`;
  const known = memo.get(key);
  if (known !== undefined) return known;
  const value = computeTQuantile(probability, degreesOfFreedom);
  if (memo.size > 10_000) memo.clear();
  memo.set(key, value);
  return value;
}

/**
 * Cumulative distribution of Student's t: P(T ≤ t).
 *
 * @example
 * tCdf(2.228, 10) // ≈ 0.975
 */
export function tCdf(t: number, degreesOfFreedom: number): number {
  if (degreesOfFreedom === Infinity) return normalCdf(t);
  const x = degreesOfFreedom / (degreesOfFreedom + t * t);
  const tail = 0.5 * regularisedIncompleteBeta(x, degreesOfFreedom / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/**
 * The `probability` quantile of the standard normal distribution (Acklam's rational
 * approximation, relative error below 1.2e-9).
 *
 * @example
 * normalQuantile(0.975) // ≈ 1.959964
 */
export function normalQuantile(probability: number): number {
  const p = probability;
  const a = [
    -39.69683028665376, 220.9460984245205, -275.9285104469687, 138.357751867269, -30.66479806614716,
    2.506628277459239,
  ];
  const b = [
    -54.47609879822406, 161.5858368580409, -155.6989798598866, 66.80131188771972,
    -13.28068155288572,
  ];
  const c = [
    -0.007784894002430293, -0.3223964580411365, -2.400758277161838, -2.549732539343734,
    4.374664141464968, 2.938163982698783,
  ];
  const d = [0.007784695709041462, 0.3224671290700398, 2.445134137142996, 3.754408661907416];
  const low = 0.02425;
  let x: number;
  if (p < low) {
    const q = Math.sqrt(-2 * Math.log(p));
    x =
      (((((c[0]! * q + c[1]!) * q + c[2]!) * q + c[3]!) * q + c[4]!) * q + c[5]!) /
      ((((d[0]! * q + d[1]!) * q + d[2]!) * q + d[3]!) * q + 1);
  } else if (p <= 1 - low) {
    const q = p - 0.5;
    const r = q * q;
    x =
      ((((((a[0]! * r + a[1]!) * r + a[2]!) * r + a[3]!) * r + a[4]!) * r + a[5]!) * q) /
      (((((b[0]! * r + b[1]!) * r + b[2]!) * r + b[3]!) * r + b[4]!) * r + 1);
  } else {
    const q = Math.sqrt(-2 * Math.log(1 - p));
    x =
      -(((((c[0]! * q + c[1]!) * q + c[2]!) * q + c[3]!) * q + c[4]!) * q + c[5]!) /
      ((((d[0]! * q + d[1]!) * q + d[2]!) * q + d[3]!) * q + 1);
  }
  return x;
}

/** Standard normal CDF via the complementary error function. */
function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

/** Complementary error function (Numerical Recipes' Chebyshev fit, relative error < 1.2e-7). */
function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t *
                      (-0.18628806 +
                        t *
                          (0.27886807 +
                            t *
                              (-1.13520398 +
                                t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? r : 2 - r;
}

function computeTQuantile(probability: number, degreesOfFreedom: number): number {
  if (degreesOfFreedom === Infinity) return normalQuantile(probability);
  if (probability === 0.5) return 0;
  const upper = probability > 0.5;
  const p = upper ? probability : 1 - probability; // solve on the upper half, mirror at the end
  // Bracket [0, hi] with P(T <= hi) >= p, then Newton steps guarded by bisection.
  let lo = 0;
  let hi = Math.max(1, normalQuantile(p) * 2);
  while (tCdf(hi, degreesOfFreedom) < p) {
    lo = hi;
    hi *= 2;
  }
  let x = Math.min(Math.max(normalQuantile(p), lo), hi);
  for (let iteration = 0; iteration < 100; iteration++) {
    const f = tCdf(x, degreesOfFreedom) - p;
    if (Math.abs(f) < 1e-14) break;
    if (f < 0) lo = x;
    else hi = x;
    const density = tDensity(x, degreesOfFreedom);
    let next = x - f / density;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - x) <= 1e-13 * Math.max(1, Math.abs(x))) {
      x = next;
      break;
    }
    x = next;
  }
  return upper ? x : -x;
}

function tDensity(t: number, nu: number): number {
  const logC = logGamma((nu + 1) / 2) - logGamma(nu / 2) - 0.5 * Math.log(nu * Math.PI);
  return Math.exp(logC - ((nu + 1) / 2) * Math.log1p((t * t) / nu));
}

/** ln Γ(x) for x > 0 (Lanczos approximation, g = 7, n = 9). */
function logGamma(x: number): number {
  const g = 7;
  const coefficients = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
    -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
    1.5056327351493116e-7,
  ];
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let sum = coefficients[0]!;
  for (let i = 1; i < g + 2; i++) sum += coefficients[i]! / (z + i);
  const t = z + g + 0.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/** Regularised incomplete beta I_x(a, b), by the continued fraction (modified Lentz). */
function regularisedIncompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const logFront =
    logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log1p(-x);
  // The continued fraction converges fast for x < (a + 1) / (a + b + 2); use symmetry otherwise.
  if (x < (a + 1) / (a + b + 2)) return (Math.exp(logFront) * betaContinuedFraction(x, a, b)) / a;
  return 1 - (Math.exp(logFront) * betaContinuedFraction(1 - x, b, a)) / b;
}

function betaContinuedFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 300; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-15) break;
  }
  return h;
}
