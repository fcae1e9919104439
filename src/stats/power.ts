/**
 * Exact power and sample size of the sign test.
 *
 * Method: with n values (ties left out) the count S above the hypothesised
 * median is Bin(n, pAbove). The test rejects at alpha when its exact p-value
 * is <= alpha, with the p-value convention of signTest.ts: one-sided
 * P(Bin(n, 1/2) >= count in the direction of the alternative), two-sided
 * min(1, 2 x the smaller one-sided tail). Because that p-value falls as the
 * count moves away from n/2, the rejection region is a set of counts at or
 * beyond a critical value, found by searching the null tail; the power is the
 * Bin(n, pAbove) probability of that region (binomial.ts, exact to ~1e-12).
 * This is the classical exact binomial power calculation (e.g. Conover,
 * "Practical Nonparametric Statistics", 3rd ed. 1999, sect. 3.4, from memory).
 *
 * Exact power is saw-toothed in n: adding one value can lower it, when the
 * critical count moves up by one. So a sample size is reported twice: the
 * smallest n reaching the target, and the smallest n from which the power
 * stays at or above the target.
 *
 * Sample size: the scan starts at the first n where the Neyman-Pearson bound
 * (the most powerful randomised test, Lehmann & Romano, "Testing Statistical
 * Hypotheses", 3rd ed. 2005, ch. 3) could reach the target, so no smaller n
 * is skipped that might.
 *
 * Cost: power O(log n) binomial tails. Sample size O(log N) tails for the
 * bound plus O(1) tails per n scanned, from the bound to stableN plus the
 * stability window (a few hundred to a few thousand n).
 */
import { binomialLowerTail, binomialPmf, binomialUpperTail, BINOMIAL_MAX_N } from "./binomial";
import { normalQuantile } from "./normal";
import { unavailable, type Alternative, type Unavailable } from "./types";

/** Exact power of the sign test for one sample size. Counts refer to values ABOVE the hypothesised median. */
export interface SignTestPower {
  /** Number of values (ties left out). */
  n: number;
  /** Probability that a value lies above the hypothesised median under the alternative. */
  pAbove: number;
  alpha: number;
  alternative: Alternative;
  /** Probability of rejecting at alpha when each value lies above with probability pAbove. */
  power: number;
  /** Probability of rejecting when pAbove = 1/2: the size the test really has, at most alpha. */
  attainedAlpha: number;
  /** Reject when at least this many values lie above (null: no such count rejects). */
  rejectAtOrAbove: number | null;
  /** Reject when at most this many values lie above (null: no such count rejects). */
  rejectAtOrBelow: number | null;
}

export interface SignTestPowerOptions {
  /** Significance level in (0, 1); default 0.05. */
  alpha?: number;
  /** Default "two-sided". */
  alternative?: Alternative;
}

function checkFraction(x: number, name: string, caller: string): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`${caller}: ${name} must lie strictly between 0 and 1, got ${x}`);
}

function checkAlternative(alternative: Alternative, caller: string): void {
  if (alternative !== "two-sided" && alternative !== "greater" && alternative !== "less") {
    throw new RangeError(`${caller}: unknown alternative ${String(alternative)}`);
  }
}

/**
 * Smallest s in [low, high] with test(s) true for a test that is false below
 * some point and true from it on; high + 1 when it is never true. Starts at
 * guess and widens its steps, so a good guess costs O(1) evaluations.
 */
function firstTrue(low: number, high: number, guess: number, test: (s: number) => boolean): number {
  let below = low - 1; // test(below) is false (or below the range)
  let above = high + 1; // test(above) is true (or above the range)
  const start = Math.min(high, Math.max(low, guess));
  if (test(start)) {
    above = start;
    for (let step = 1; above - step >= low; step *= 2) {
      if (!test(above - step)) {
        below = above - step;
        break;
      }
      above -= step;
    }
  } else {
    below = start;
    for (let step = 1; below + step <= high; step *= 2) {
      if (test(below + step)) {
        above = below + step;
        break;
      }
      below += step;
    }
  }
  while (above - below > 1) {
    const middle = Math.floor((below + above) / 2);
    if (test(middle)) above = middle;
    else below = middle;
  }
  return above;
}

/**
 * Smallest count s (0..n) whose null p-value is <= alpha, i.e. with
 * P(Bin(n, 1/2) >= s) <= alpha / sides; n + 1 when no count rejects.
 * Multiplying the tail by 2 instead of halving alpha keeps the comparison
 * identical to the p-value signTest.ts reports.
 */
function criticalCount(n: number, alpha: number, sides: 1 | 2, guess: number): number {
  return firstTrue(0, n, guess, (s) => sides * binomialUpperTail(s, n, 0.5) <= alpha);
}

/** Normal-approximation start for the critical count. */
function criticalGuess(n: number, alpha: number, sides: 1 | 2): number {
  return Math.ceil(n / 2 - (normalQuantile(alpha / sides) * Math.sqrt(n)) / 2);
}

function powerAt(n: number, pAbove: number, alpha: number, alternative: Alternative, critical: number): SignTestPower {
  const sides = alternative === "two-sided" ? 2 : 1;
  const rejects = critical <= n;
  const nullTail = rejects ? binomialUpperTail(critical, n, 0.5) : 0;
  const high = rejects && alternative !== "less" ? critical : null;
  const low = rejects && alternative !== "greater" ? n - critical : null;
  const power = (high === null ? 0 : binomialUpperTail(high, n, pAbove)) + (low === null ? 0 : binomialLowerTail(low, n, pAbove));
  return {
    n,
    pAbove,
    alpha,
    alternative,
    power: Math.min(1, power),
    attainedAlpha: sides * nullTail,
    rejectAtOrAbove: high,
    rejectAtOrBelow: low,
  };
}

/**
 * Exact power of the sign test with n values (ties left out) when each lies
 * above the hypothesised median with probability pAbove, rejecting when the
 * exact p-value is <= alpha (two-sided: min(1, 2 x smaller tail)).
 *
 * @throws RangeError for n not an integer in 0..1e9, pAbove outside [0, 1],
 *   alpha outside (0, 1) or an unknown alternative.
 * @example
 * signTestPower(20, 0.8); // two-sided, alpha 0.05: reject at >= 15 or <= 5 above;
 * //   power = P(Bin(20, 0.8) >= 15) + P(Bin(20, 0.8) <= 5) = 0.8042..., attainedAlpha 0.0414
 */
export function signTestPower(n: number, pAbove: number, options: SignTestPowerOptions = {}): SignTestPower {
  const alpha = options.alpha ?? 0.05;
  const alternative = options.alternative ?? "two-sided";
  if (!Number.isInteger(n) || n < 0 || n > BINOMIAL_MAX_N) {
    throw new RangeError(`signTestPower: n must be an integer from 0 to ${BINOMIAL_MAX_N}, got ${n}`);
  }
  if (!(pAbove >= 0 && pAbove <= 1)) throw new RangeError(`signTestPower: pAbove must be in [0, 1], got ${pAbove}`);
  checkFraction(alpha, "alpha", "signTestPower");
  checkAlternative(alternative, "signTestPower");
  const sides = alternative === "two-sided" ? 2 : 1;
  const critical = criticalCount(n, alpha, sides, n === 0 ? 0 : criticalGuess(n, alpha, sides));
  return powerAt(n, pAbove, alpha, alternative, critical);
}

/** Largest first-reaching n the sample-size search examines. */
export const SAMPLE_SIZE_LIMIT = 200000;

/**
 * How far past the stable candidate the scan looks for another dip. A dip is
 * about half a point probability deep and the smooth power climbs by about
 * (2 pAbove - 1)/4 point probabilities per added value, so dips below the
 * target end within about 2 / |2 pAbove - 1| values of where the power first
 * reaches it; the window is four times that, and at least 200.
 */
function stabilityWindow(pAbove: number): number {
  return Math.max(200, Math.ceil(8 / Math.abs(2 * pAbove - 1)));
}

/**
 * Power of the most powerful randomised level-`level` test of p = 1/2
 * against p = pAbove > 1/2 (Neyman-Pearson): reject above the critical count,
 * and at it with the probability that brings the size to exactly `level`.
 * Non-decreasing in n (a test may ignore a value), and no level-`level` test
 * based on n values has more power, so it bounds ours from above.
 */
function randomisedPower(n: number, pAbove: number, level: number): number {
  const critical = criticalCount(n, level, 1, criticalGuess(n, level, 1));
  const full = critical <= n ? binomialUpperTail(critical, n, 0.5) : 0;
  const edge = binomialPmf(critical - 1, n, 0.5);
  const share = edge > 0 ? Math.min(1, (level - full) / edge) : 0;
  const fullPower = critical <= n ? binomialUpperTail(critical, n, pAbove) : 0;
  return fullPower + share * binomialPmf(critical - 1, n, pAbove);
}

/**
 * Smallest n at which the power could first reach the target: where the
 * Neyman-Pearson bound does (for two-sided, the one-sided bound at alpha/2
 * plus alpha/2 for the far tail, which holds at most the null probability of
 * its region). Found by bisection, the bound being monotone in n.
 */
function firstPossibleN(pAbove: number, alpha: number, alternative: Alternative, targetPower: number): number {
  const towards = pAbove > 0.5 ? pAbove : 1 - pAbove;
  const bound =
    alternative === "two-sided"
      ? (n: number) => randomisedPower(n, towards, alpha / 2) + alpha / 2 >= targetPower
      : (n: number) => randomisedPower(n, towards, alpha) >= targetPower;
  const effect = Math.abs(2 * towards - 1);
  const zSum = -normalQuantile(alpha / (alternative === "two-sided" ? 2 : 1)) + normalQuantile(targetPower);
  const guess = Math.ceil(((zSum / effect) * (zSum / effect)) / 1.1);
  return firstTrue(1, SAMPLE_SIZE_LIMIT + 1, guess, bound);
}

/** Result of a sign-test sample size search. */
export interface SignTestSampleSize {
  available: true;
  pAbove: number;
  alpha: number;
  alternative: Alternative;
  /** Power asked for. */
  targetPower: number;
  /** Smallest n whose exact power reaches targetPower. */
  n: number;
  /** Exact power at n. */
  power: number;
  /** Attained size at n (at most alpha). */
  attainedAlpha: number;
  rejectAtOrAbove: number | null;
  rejectAtOrBelow: number | null;
  /** Smallest n from which the power stays >= targetPower for every larger n examined (through checkedThrough). */
  stableN: number;
  /** Exact power at stableN. */
  stablePower: number;
  /** Last n examined: stableN + max(200, 8 / |2 pAbove - 1|), four times the stretch in which dips can still occur. */
  checkedThrough: number;
}

export interface SignTestSampleSizeOptions extends SignTestPowerOptions {
  /** Power wanted, in (0, 1); default 0.8. */
  power?: number;
}

/**
 * Sample size for the sign test: the smallest number of values (ties left
 * out) whose exact power reaches the target, and `stableN`, the smallest n
 * from which the power never falls below the target again. Exact power is
 * saw-toothed in n (one more value can move the critical count and lower the
 * power), so n <= stableN; planning on stableN is the safe choice. "Never
 * again" is checked over a window: every n through
 * stableN + max(200, 8 / |2 pAbove - 1|) (`checkedThrough`); dips below the
 * target are about half a point probability deep while the power rises by
 * about |2 pAbove - 1| / 4 point probabilities per value, so they cannot
 * recur more than about 2 / |2 pAbove - 1| values on.
 *
 * Unavailable ("unreachable") when pAbove lies on the null side of 1/2 for
 * the alternative (or equals 1/2): the power then never exceeds alpha. Also
 * unavailable when no n up to SAMPLE_SIZE_LIMIT (200 000) reaches the target.
 *
 * @throws RangeError for pAbove outside [0, 1], power or alpha outside (0, 1),
 *   or an unknown alternative.
 * @example
 * signTestSampleSize(0.8); // two-sided, alpha 0.05, power 0.8: n = 20 (power 0.804), stableN = 23 (power 0.840)
 */
export function signTestSampleSize(pAbove: number, options: SignTestSampleSizeOptions = {}): SignTestSampleSize | Unavailable {
  const alpha = options.alpha ?? 0.05;
  const alternative = options.alternative ?? "two-sided";
  const targetPower = options.power ?? 0.8;
  if (!(pAbove >= 0 && pAbove <= 1)) throw new RangeError(`signTestSampleSize: pAbove must be in [0, 1], got ${pAbove}`);
  checkFraction(alpha, "alpha", "signTestSampleSize");
  checkFraction(targetPower, "power", "signTestSampleSize");
  checkAlternative(alternative, "signTestSampleSize");
  const hopeless = pAbove === 0.5 || (alternative === "greater" && pAbove < 0.5) || (alternative === "less" && pAbove > 0.5);
  if (hopeless) {
    const side = alternative === "greater" ? "above 0.5" : alternative === "less" ? "below 0.5" : "different from 0.5";
    return unavailable(
      "unreachable",
      `With p_above = ${pAbove} the sign test rejects no more often than alpha = ${alpha}, so no sample size gives power ${targetPower}; for this alternative p_above must be ${side}.`,
    );
  }
  const sides = alternative === "two-sided" ? 2 : 1;
  let critical = 0; // critical count of the previous n: the next one is the same or one more
  const powerFor = (m: number): SignTestPower => {
    critical = criticalCount(m, alpha, sides, critical);
    return powerAt(m, pAbove, alpha, alternative, critical);
  };
  const start = firstPossibleN(pAbove, alpha, alternative, targetPower);
  let first: SignTestPower | undefined;
  critical = criticalGuess(start, alpha, sides);
  for (let m = start; m <= SAMPLE_SIZE_LIMIT && first === undefined; m++) {
    const result = powerFor(m);
    if (result.power >= targetPower) first = result;
  }
  if (first === undefined) {
    return unavailable(
      "unreachable",
      `No sample size up to ${SAMPLE_SIZE_LIMIT} gives power ${targetPower} at alpha = ${alpha} for p_above = ${pAbove}; it lies too close to 0.5 for the sign test to detect.`,
    );
  }
  // Keep scanning: after every dip below the target the next n becomes the candidate for stableN, and the
  // scan goes on until the window after the current candidate has been examined without a dip.
  const window = stabilityWindow(pAbove);
  let stable = first;
  let lastBelow = first.n - 1;
  for (let m = first.n + 1; m <= lastBelow + 1 + window; m++) {
    const result = powerFor(m);
    if (result.power < targetPower) lastBelow = m;
    else if (m === lastBelow + 1) stable = result;
  }
  return {
    available: true,
    pAbove,
    alpha,
    alternative,
    targetPower,
    n: first.n,
    power: first.power,
    attainedAlpha: first.attainedAlpha,
    rejectAtOrAbove: first.rejectAtOrAbove,
    rejectAtOrBelow: first.rejectAtOrBelow,
    stableN: stable.n,
    stablePower: stable.power,
    checkedThrough: stable.n + window,
  };
}
