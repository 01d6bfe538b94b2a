/**
 * Kendall's score S = Σ_{i<j} sgn(t_j − t_i)·sgn(y_j − y_i) counted in O(n log n) by Knight's
 * merge-sort method (Knight 1966, "A computer method for calculating Kendall's tau with ungrouped
 * data", J. Am. Stat. Assoc. 61(314):436–439), with ties in time and in value:
 *
 *   S = n0 − n1 − n2 + n3 − 2·swaps
 *
 * n0 = n(n−1)/2 pairs, n1 pairs tied in time, n2 pairs tied in value, n3 pairs tied in both, and
 * `swaps` the strict inversions of the values once the points are sorted by (time, value) (Knight
 * 1966, §2; the same counts as Kendall 1975, Rank Correlation Methods, 4th ed., ch. 3).
 *
 * Values below a detection limit (censored, "<a"): a pair whose order is ambiguous counts as a
 * tie, with no substitution (Helsel 2012, Statistics for Censored Environmental Data Using Minitab
 * and R, 2nd ed., Wiley, ch. 11 on Kendall's tau with censored data). "<a" is below an uncensored
 * b ≥ a; two censored values and "<a" against b < a are ambiguous. The score of that rule is
 * obtained from three Knight counts: S = (S_A + S_B − S_C)/2, where S_A ranks "<a" just below a,
 * S_B ranks every censored value below all uncensored ones, and S_C is the score of the censored
 * values alone ranked by their limits (each pair kind sums to the rule's sign; worked out for this
 * module).
 *
 * Time O(n log n), memory O(n).
 */

/** Strict inversions of `values` (pairs i < j with values[i] > values[j]) by bottom-up merge sort. */
export function countInversions(values: Float64Array): number {
  const n = values.length;
  let source = Float64Array.from(values);
  let target = new Float64Array(n);
  let inversions = 0;
  for (let width = 1; width < n; width *= 2) {
    for (let start = 0; start < n; start += 2 * width) {
      const middle = Math.min(start + width, n);
      const end = Math.min(start + 2 * width, n);
      let i = start;
      let j = middle;
      let k = start;
      while (i < middle && j < end) {
        const right = source[j] as number;
        const left = source[i] as number;
        if (right < left) {
          target[k++] = right;
          j++;
          inversions += middle - i;
        } else {
          target[k++] = left;
          i++;
        }
      }
      while (i < middle) target[k++] = source[i++] as number;
      while (j < end) target[k++] = source[j++] as number;
    }
    const swap = source;
    source = target;
    target = swap;
  }
  return inversions;
}

/** Sizes (> 1) of runs of equal numbers in a sorted array. */
export function tieGroupSizes(sorted: ArrayLike<number>): number[] {
  const sizes: number[] = [];
  let run = 1;
  for (let i = 1; i <= sorted.length; i++) {
    if (i < sorted.length && sorted[i] === sorted[i - 1]) run++;
    else {
      if (run > 1) sizes.push(run);
      run = 1;
    }
  }
  return sizes;
}

function pairsIn(sizes: readonly number[]): number {
  let sum = 0;
  for (const size of sizes) sum += (size * (size - 1)) / 2;
  return sum;
}

/**
 * Knight's S for times `t` sorted ascending and numeric codes `code` (larger code = larger value;
 * equal codes are ties). Returns S and the tie groups of time and of code.
 */
export function knightScore(t: Float64Array, code: Float64Array): { S: number; timeTies: number[]; valueTies: number[] } {
  const n = t.length;
  for (let i = 1; i < n; i++) {
    if ((t[i] as number) < (t[i - 1] as number)) throw new Error('knightScore requires times sorted ascending');
  }
  // Sort the codes inside each group of equal time, so inversions only come from pairs with t_i < t_j.
  const ordered = Float64Array.from(code);
  const timeTies: number[] = [];
  let bothTiedPairs = 0;
  let groupStart = 0;
  for (let i = 1; i <= n; i++) {
    if (i < n && t[i] === t[groupStart]) continue;
    const size = i - groupStart;
    if (size > 1) {
      timeTies.push(size);
      const group = ordered.subarray(groupStart, i);
      group.sort();
      for (const run of tieGroupSizes(group)) bothTiedPairs += (run * (run - 1)) / 2;
    }
    groupStart = i;
  }
  const sortedCodes = Float64Array.from(code).sort();
  const valueTies = tieGroupSizes(sortedCodes);
  const allPairs = (n * (n - 1)) / 2;
  const swaps = countInversions(ordered);
  const S = allPairs - pairsIn(timeTies) - pairsIn(valueTies) + bothTiedPairs - 2 * swaps;
  return { S, timeTies, valueTies };
}

/** Dense rank (0, 1, 2, …) of each number among the distinct numbers of `values`. */
function denseRanks(values: ArrayLike<number>): Float64Array {
  const sorted = Float64Array.from(values).sort();
  const distinct: number[] = [];
  for (let i = 0; i < sorted.length; i++) {
    if (i === 0 || sorted[i] !== sorted[i - 1]) distinct.push(sorted[i] as number);
  }
  const ranks = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const value = values[i] as number;
    let lo = 0;
    let hi = distinct.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((distinct[mid] as number) < value) lo = mid + 1;
      else hi = mid;
    }
    ranks[i] = lo;
  }
  return ranks;
}

export interface KendallScore {
  S: number;
  /** sizes of groups of equal time */
  timeTies: number[];
  /** sizes of groups of equal value; censored values form one group per detection limit */
  valueTies: number[];
}

/**
 * Kendall's score of a series sorted by time, with ties and values below detection limits.
 * @param t times, ascending
 * @param y values (for a censored value, its detection limit)
 * @param censored 1 where the value was reported as "<y"; omit when nothing is censored
 */
export function kendallScore(t: Float64Array, y: Float64Array, censored?: Uint8Array): KendallScore {
  const n = t.length;
  let anyCensored = false;
  if (censored)
    for (let i = 0; i < n; i++)
      if (censored[i]) {
        anyCensored = true;
        break;
      }
  if (!anyCensored) return knightScore(t, y);
  const cens = censored as Uint8Array;
  const ranks = denseRanks(y);
  // S_A: "<a" just below a (code 2r), an uncensored a at code 2r + 1.
  const codeA = new Float64Array(n);
  // S_B: every censored value tied below all uncensored values.
  const codeB = new Float64Array(n);
  const censoredTimes: number[] = [];
  const censoredCodes: number[] = [];
  for (let i = 0; i < n; i++) {
    const r = ranks[i] as number;
    if (cens[i]) {
      codeA[i] = 2 * r;
      codeB[i] = -1;
      censoredTimes.push(t[i] as number);
      censoredCodes.push(r);
    } else {
      codeA[i] = 2 * r + 1;
      codeB[i] = r;
    }
  }
  const a = knightScore(t, codeA);
  const b = knightScore(t, codeB);
  const c = knightScore(Float64Array.from(censoredTimes), Float64Array.from(censoredCodes));
  const S = (a.S + b.S - c.S) / 2;
  return { S, timeTies: a.timeTies, valueTies: a.valueTies };
}
