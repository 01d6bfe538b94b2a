/**
 * Selection of the k-th smallest of the N′ pairwise slopes (y_j − y_i)/(t_j − t_i), t_i ≠ t_j,
 * without building the list of slopes: randomized interval shrinking for slope selection
 * (Matoušek 1991, "Randomized optimal algorithm for slope selection", Inf. Process. Lett.
 * 39(4):183–187; Dillencourt, Mount & Netanyahu 1992, "A randomized algorithm for slope
 * selection", Int. J. Comput. Geom. Appl. 2(1):1–27).
 *
 * Idea (Dillencourt et al. 1992, §2): with points ordered by time, a pair's slope is below s
 * exactly when the pair is inverted in the order of the keys y − s·t, so the number of slopes
 * below s is an inversion count, O(n log n) by merge sort (started from the cached order at a
 * nearby threshold, which is almost sorted, with galloping merges). The slopes inside an interval
 * [lo, hi) are the pairs whose order differs between the key orders at lo and at hi; a merge sort
 * of that permutation meets them as contiguous runs, so they can be sampled (Bernoulli, by
 * geometric skips) or, once few, listed in O(n log n + output). Each round samples K ≈ n slopes
 * of the current interval, keeps the sample window around each wanted rank (±2.5 binomial
 * standard deviations), and shrinks the interval to it; two rounds bring a million points down
 * to a few million candidate slopes, from which the wanted ranks are selected (quickselect).
 * Expected time O(n log n), memory O(n + K).
 *
 * Floating point: interval ends are never actual slopes; they are moved off a sampled slope by a
 * margin far above the rounding error of the keys (centred data), so each pair's side of an end
 * is decided exactly unless a slope lies within ~1e-12 relative of that margin. The counts are
 * cross-checked (the listed slopes must match the counted ones) and a mismatch throws.
 *
 * Scope: slopes closer to each other than ~1e-12 of (value range)/(smallest time gap) may be taken
 * as one value (the one returned is an actual slope of the data); measured data are far coarser.
 *
 * Repeated slopes (ties in value give many zero slopes): when the sample window holds a
 * repeated value v, the ranks v occupies are counted exactly and the interval is split at v,
 * so a huge block of equal slopes is never listed.
 *
 * Randomness comes from a seeded generator, so results and running time are reproducible; the
 * selected values do not depend on the seed.
 */
import { createSeededRandom } from '../random/seeded-random.ts';

export interface SlopeSelectionOptions {
  /** seed of the sampling; defaults to 1 */
  seed?: number;
  /** list all slopes directly while N′ is at most this; defaults to 50,000 (selection is faster above, measured) */
  directLimit?: number;
  /** list the candidate slopes once an interval holds at most this many; defaults to max(6n, 100,000) (small values exercise more rounds in tests) */
  listLimit?: number;
  /** slopes sampled per round; defaults to min(n, 1,000,000), at least 2,000 */
  sampleSize?: number;
}

/** N′: the number of pairs with different times, for t sorted ascending. */
export function countSlopePairs(t: ArrayLike<number>): number {
  const n = t.length;
  let tied = 0;
  let run = 1;
  for (let i = 1; i <= n; i++) {
    if (i < n && t[i] === t[i - 1]) run++;
    else {
      tied += (run * (run - 1)) / 2;
      run = 1;
    }
  }
  return (n * (n - 1)) / 2 - tied;
}

/** All N′ slopes, unsorted (only for small series and for tests). */
export function listAllSlopes(t: ArrayLike<number>, y: ArrayLike<number>): Float64Array {
  const n = t.length;
  const slopes: number[] = [];
  for (let i = 0; i < n; i++) {
    const ti = t[i] as number;
    const yi = y[i] as number;
    for (let j = i + 1; j < n; j++) {
      const dt = (t[j] as number) - ti;
      if (dt !== 0) slopes.push(((y[j] as number) - yi) / dt);
    }
  }
  return Float64Array.from(slopes);
}

/**
 * Stable sort of (key, index) pairs by key, counting strict inversions (pairs earlier in the input
 * with a larger key). `initial` is the starting order of the indices (identity when omitted): the
 * inversions counted are those of the keys read in that order. Bottom-up merge sort with insertion
 * sort on runs of 16, and galloping merges (binary search for the stretch where the two runs
 * overlap, bulk copies for the rest), so an almost sorted start costs little above the lowest levels.
 */
export function sortCountingInversions(keys: Float64Array, initial?: Uint32Array): { order: Uint32Array; inversions: number } {
  const n = keys.length;
  let srcKey = new Float64Array(n);
  let srcIdx = new Uint32Array(n);
  if (initial) {
    for (let i = 0; i < n; i++) {
      const index = initial[i] as number;
      srcIdx[i] = index;
      srcKey[i] = keys[index] as number;
    }
  } else {
    for (let i = 0; i < n; i++) {
      srcIdx[i] = i;
      srcKey[i] = keys[i] as number;
    }
  }
  let inversions = 0;
  const run = 16;
  for (let start = 0; start < n; start += run) {
    const end = Math.min(start + run, n);
    for (let i = start + 1; i < end; i++) {
      const key = srcKey[i] as number;
      const idx = srcIdx[i] as number;
      let j = i - 1;
      while (j >= start && (srcKey[j] as number) > key) {
        srcKey[j + 1] = srcKey[j] as number;
        srcIdx[j + 1] = srcIdx[j] as number;
        j--;
      }
      inversions += i - 1 - j;
      srcKey[j + 1] = key;
      srcIdx[j + 1] = idx;
    }
  }
  let dstKey = new Float64Array(n);
  let dstIdx = new Uint32Array(n);
  const copyRange = (from: number, to: number, at: number) => {
    if (to - from < 64) {
      for (let m = from; m < to; m++, at++) {
        dstKey[at] = srcKey[m] as number;
        dstIdx[at] = srcIdx[m] as number;
      }
      return;
    }
    dstKey.set(srcKey.subarray(from, to), at);
    dstIdx.set(srcIdx.subarray(from, to), at);
  };
  for (let width = run; width < n; width *= 2) {
    for (let start = 0; start < n; start += 2 * width) {
      const middle = Math.min(start + width, n);
      const end = Math.min(start + 2 * width, n);
      if (middle >= end || (srcKey[middle - 1] as number) <= (srcKey[middle] as number)) {
        copyRange(start, end, start);
        continue;
      }
      // left elements ≤ the first right element go first, untouched
      const firstRight = srcKey[middle] as number;
      let low = start;
      let high = middle;
      while (low < high) {
        const mid = (low + high) >> 1;
        if ((srcKey[mid] as number) <= firstRight) low = mid + 1;
        else high = mid;
      }
      const leftStart = low;
      // right elements ≥ the last left element go last, untouched
      const lastLeft = srcKey[middle - 1] as number;
      low = middle;
      high = end;
      while (low < high) {
        const mid = (low + high) >> 1;
        if ((srcKey[mid] as number) < lastLeft) low = mid + 1;
        else high = mid;
      }
      const rightEnd = low;
      if (leftStart > start) copyRange(start, leftStart, start);
      let i = leftStart;
      let j = middle;
      let k = leftStart;
      while (i < middle && j < rightEnd) {
        const right = srcKey[j] as number;
        const left = srcKey[i] as number;
        if (right < left) {
          dstKey[k] = right;
          dstIdx[k++] = srcIdx[j++] as number;
          inversions += middle - i;
        } else {
          dstKey[k] = left;
          dstIdx[k++] = srcIdx[i++] as number;
        }
      }
      if (i < middle) {
        copyRange(i, middle, k);
        k += middle - i;
      }
      if (j < end) copyRange(j, end, k);
    }
    [srcKey, dstKey] = [dstKey, srcKey];
    [srcIdx, dstIdx] = [dstIdx, srcIdx];
  }
  return { order: srcIdx, inversions };
}

interface Prepared {
  n: number;
  t: Float64Array; // ordered by (t, y)
  y: Float64Array;
  tc: Float64Array; // centred, scaled copies for the keys
  yc: Float64Array;
  scaleY: number;
  scaleT: number;
  minGap: number; // smallest positive time gap, original units
  keys: Float64Array; // scratch
  orders: Map<number, { order: Uint32Array; inversions: number }>; // cache by threshold
}

function prepare(t: ArrayLike<number>, y: ArrayLike<number>): Prepared {
  const n = t.length;
  // order by (t, y): t is ascending already; sort y inside groups of equal t
  const ts = Float64Array.from(t);
  const ys = Float64Array.from(y);
  let groupStart = 0;
  for (let i = 1; i <= n; i++) {
    if (i < n && ts[i] === ts[groupStart]) continue;
    if (i - groupStart > 1) ys.subarray(groupStart, i).sort();
    groupStart = i;
  }
  const tMid = n > 0 ? ((ts[0] as number) + (ts[n - 1] as number)) / 2 : 0;
  let yMin = Infinity;
  let yMax = -Infinity;
  for (let i = 0; i < n; i++) {
    yMin = Math.min(yMin, ys[i] as number);
    yMax = Math.max(yMax, ys[i] as number);
  }
  const yMid = n > 0 ? (yMin + yMax) / 2 : 0;
  // Keys are computed on centred, scaled copies (u = (t − t_mid)/scaleT, v = (y − y_mid)/scaleY, both
  // within [−1, 1]) so that tiny or huge units do not underflow or overflow; a slope s becomes
  // s·scaleT/scaleY there.
  let scaleT = 0;
  let scaleY = 0;
  let minGap = Infinity;
  for (let i = 0; i < n; i++) {
    scaleT = Math.max(scaleT, Math.abs((ts[i] as number) - tMid));
    scaleY = Math.max(scaleY, Math.abs((ys[i] as number) - yMid));
    if (i > 0) {
      const gap = (ts[i] as number) - (ts[i - 1] as number);
      if (gap > 0) minGap = Math.min(minGap, gap);
    }
  }
  if (!(scaleT > 0)) scaleT = 1;
  if (!(scaleY > 0)) scaleY = 1;
  const tc = new Float64Array(n);
  const yc = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    tc[i] = ((ts[i] as number) - tMid) / scaleT;
    yc[i] = ((ys[i] as number) - yMid) / scaleY;
  }
  return { n, t: ts, y: ys, tc, yc, scaleT, scaleY, minGap, keys: new Float64Array(n), orders: new Map() };
}

/** A slope in the scaled coordinates of the keys. */
function scaledSlope(p: Prepared, s: number): number {
  return (s * p.scaleT) / p.scaleY;
}

/**
 * Margin that moves an interval end off a slope value, far above key rounding error: keys are
 * within [−1, 1] + |s′|, so their rounding is ~1e-16·(1 + |s′|); across the smallest scaled gap g′
 * a slope difference of 1e-13·(1 + |s′|)/g′ is always resolved.
 */
function margin(p: Prepared, s: number): number {
  const gap = p.minGap / p.scaleT;
  const scaled = (1e-13 * (1 + Math.abs(scaledSlope(p, s)))) / gap;
  const m = (scaled * p.scaleY) / p.scaleT;
  return m > 0 && Number.isFinite(m) ? m : Number.MIN_VALUE;
}

function fillKeys(p: Prepared, s: number): Float64Array {
  const { keys, tc, yc, n } = p;
  if (s === -Infinity) for (let i = 0; i < n; i++) keys[i] = tc[i] as number;
  else if (s === Infinity) for (let i = 0; i < n; i++) keys[i] = -(tc[i] as number);
  else {
    const scaled = scaledSlope(p, s);
    for (let i = 0; i < n; i++) keys[i] = (yc[i] as number) - scaled * (tc[i] as number);
  }
  return keys;
}

/** Key order at s and the number of slopes strictly below s (cached: each end is used again). */
function orderAt(p: Prepared, s: number): { order: Uint32Array; inversions: number } {
  let entry = p.orders.get(s);
  if (!entry) {
    // Start from the cached order at the nearest threshold s′ < s: every pair inverted at s′ is
    // inverted at s too, so count(s) = count(s′) + the inversions of the keys at s read in the
    // order at s′, and that order is already nearly sorted.
    let base: { order: Uint32Array; inversions: number } | null = null;
    let baseAt = -Infinity;
    for (const [at, cached] of p.orders) {
      if (at < s && at > baseAt) {
        baseAt = at;
        base = cached;
      }
    }
    const keys = fillKeys(p, s);
    if (base) {
      const sorted = sortCountingInversions(keys, base.order);
      entry = { order: sorted.order, inversions: base.inversions + sorted.inversions };
    } else entry = sortCountingInversions(keys);
    if (p.orders.size > 8) p.orders.delete(p.orders.keys().next().value as number);
    p.orders.set(s, entry);
  }
  return entry;
}

/** Number of slopes strictly below s. */
function countBelow(p: Prepared, s: number, total: number): number {
  if (s === -Infinity) return 0;
  if (s === Infinity) return total;
  return orderAt(p, s).inversions;
}

/** For the interval [lo, hi): the points in key order at lo, and each one's position at hi. */
function intervalSequence(p: Prepared, lo: number, hi: number): { loOrder: Uint32Array; seq: Uint32Array } {
  const loOrder = orderAt(p, lo).order;
  const hiOrder = orderAt(p, hi).order;
  const hiRank = new Uint32Array(p.n);
  for (let r = 0; r < p.n; r++) hiRank[hiOrder[r] as number] = r;
  const seq = new Uint32Array(p.n);
  for (let r = 0; r < p.n; r++) seq[r] = hiRank[loOrder[r] as number] as number;
  return { loOrder, seq };
}

function slopeOf(p: Prepared, a: number, b: number): number {
  return ((p.y[b] as number) - (p.y[a] as number)) / ((p.t[b] as number) - (p.t[a] as number));
}

/**
 * Walk the inversions of the interval sequence by merge sort: inside each merge, a right element
 * taken first is inverted with the whole remaining left run, so the slopes in [lo, hi) come as
 * contiguous runs. With `rate` = 1 every slope is written; below 1 each is kept independently
 * with that probability, skipping ahead by geometric gaps (a Bernoulli sample in O(n log n + K)).
 */
function walkInterval(p: Prepared, lo: number, hi: number, rate: number, capacity: number, uniform: () => number): Float64Array {
  const { loOrder, seq } = intervalSequence(p, lo, hi);
  const n = p.n;
  const out = new Float64Array(capacity);
  let count = 0;
  const logKeep = rate < 1 ? Math.log(1 - rate) : 0;
  const gap = () => (rate >= 1 ? 0 : Math.floor(Math.log(1 - uniform()) / logKeep));
  let skip = gap();
  // Each element carries its time and value, so listing a run reads memory in order.
  let srcVal = Uint32Array.from(seq);
  let srcT = new Float64Array(n);
  let srcY = new Float64Array(n);
  for (let r = 0; r < n; r++) {
    const index = loOrder[r] as number;
    srcT[r] = p.t[index] as number;
    srcY[r] = p.y[index] as number;
  }
  let dstVal = new Uint32Array(n);
  let dstT = new Float64Array(n);
  let dstY = new Float64Array(n);
  const copy = (from: number, to: number, at: number) => {
    if (to - from < 64) {
      for (let m = from; m < to; m++, at++) {
        dstVal[at] = srcVal[m] as number;
        dstT[at] = srcT[m] as number;
        dstY[at] = srcY[m] as number;
      }
      return;
    }
    dstVal.set(srcVal.subarray(from, to), at);
    dstT.set(srcT.subarray(from, to), at);
    dstY.set(srcY.subarray(from, to), at);
  };
  for (let width = 1; width < n; width *= 2) {
    for (let start = 0; start < n; start += 2 * width) {
      const middle = Math.min(start + width, n);
      const end = Math.min(start + 2 * width, n);
      if (middle >= end || (srcVal[middle - 1] as number) < (srcVal[middle] as number)) {
        copy(start, end, start); // already in order: no inversion across the two runs
        continue;
      }
      // galloping: left elements below the first right one, and right elements above the last
      // left one, are in place and form no inversion (values are distinct ranks)
      let leftStart = start;
      let rightEnd = end;
      if (width >= 64) {
        const firstRight = srcVal[middle] as number;
        let low = start;
        let high = middle;
        while (low < high) {
          const mid = (low + high) >> 1;
          if ((srcVal[mid] as number) < firstRight) low = mid + 1;
          else high = mid;
        }
        leftStart = low;
        const lastLeft = srcVal[middle - 1] as number;
        low = middle;
        high = end;
        while (low < high) {
          const mid = (low + high) >> 1;
          if ((srcVal[mid] as number) < lastLeft) low = mid + 1;
          else high = mid;
        }
        rightEnd = low;
      }
      if (leftStart > start) copy(start, leftStart, start);
      let i = leftStart;
      let j = middle;
      let k = leftStart;
      while (i < middle && j < rightEnd) {
        if ((srcVal[j] as number) < (srcVal[i] as number)) {
          const tb = srcT[j] as number;
          const yb = srcY[j] as number;
          const runLength = middle - i;
          while (skip < runLength) {
            if (count >= capacity) {
              if (rate >= 1) throw new Error('slope selection lost count of the interval (rounding); please report');
              skip = Infinity; // a sample far above its expected size: keep what was drawn
              break;
            }
            out[count++] = (yb - (srcY[i + skip] as number)) / (tb - (srcT[i + skip] as number));
            skip += 1 + gap();
          }
          skip -= runLength;
          dstVal[k] = srcVal[j] as number;
          dstT[k] = tb;
          dstY[k++] = yb;
          j++;
        } else {
          dstVal[k] = srcVal[i] as number;
          dstT[k] = srcT[i] as number;
          dstY[k++] = srcY[i++] as number;
        }
      }
      if (i < middle) {
        copy(i, middle, k);
        k += middle - i;
      }
      if (j < end) copy(j, end, k);
    }
    [srcVal, dstVal] = [dstVal, srcVal];
    [srcT, dstT] = [dstT, srcT];
    [srcY, dstY] = [dstY, srcY];
  }
  if (rate >= 1 && count !== capacity) throw new Error('slope selection lost count of the interval (rounding); please report');
  return out.subarray(0, count);
}

/** Rearrange `values[from..to)` so that values[k] is the one it would hold if sorted (Hoare's quickselect). */
export function quickselect(values: Float64Array, k: number, from: number, to: number): number {
  let left = from;
  let right = to - 1;
  while (right > left) {
    const pivot = values[(left + right) >> 1] as number;
    let i = left;
    let j = right;
    while (i <= j) {
      while ((values[i] as number) < pivot) i++;
      while ((values[j] as number) > pivot) j--;
      if (i <= j) {
        const swap = values[i] as number;
        values[i] = values[j] as number;
        values[j] = swap;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return values[k] as number;
}

/** Values at 0-based positions `positions` (ascending) of `values` if it were sorted. */
function selectPositions(values: Float64Array, positions: readonly number[]): number[] {
  if (values.length <= 200_000) {
    values.sort();
    return positions.map((q) => values[q] as number);
  }
  const result: number[] = [];
  let from = 0;
  for (const q of positions) {
    result.push(quickselect(values, q, from, values.length));
    from = q; // everything left of q is ≤ values[q]
  }
  return result;
}

/**
 * The k-th smallest pairwise slopes for each rank k in `ranks` (1-based, 1..N′), in the order given.
 * @param t times, ascending
 * @param y values
 * @throws when a rank is outside 1..N′
 */
export function selectPairwiseSlopes(t: ArrayLike<number>, y: ArrayLike<number>, ranks: readonly number[], options: SlopeSelectionOptions = {}): number[] {
  for (let i = 1; i < t.length; i++) {
    if (!((t[i] as number) >= (t[i - 1] as number))) throw new Error(`selectPairwiseSlopes requires times sorted ascending; index ${i} has ${t[i]} after ${t[i - 1]}`);
  }
  const total = countSlopePairs(t);
  for (const k of ranks) {
    if (!Number.isInteger(k) || k < 1 || k > total) throw new Error(`selectPairwiseSlopes requires ranks in 1..${total}; got ${k}`);
  }
  const directLimit = options.directLimit ?? 50_000;
  if (total <= directLimit) {
    const all = listAllSlopes(t, y).sort();
    return ranks.map((k) => all[k - 1] as number);
  }
  const p = prepare(t, y);
  const random = createSeededRandom(options.seed ?? 1);
  const uniform = random.uniform;
  const found = new Map<number, number>();
  const wanted = [...new Set(ranks)].sort((a, b) => a - b);
  const listLimit = options.listLimit ?? Math.max(6 * p.n, 100_000);
  const sampleSize = options.sampleSize ?? Math.max(2000, Math.min(p.n, 1_000_000));
  // (the sample window keeps ±2.5 binomial standard deviations around each wanted rank)

  const solve = (lo: number, hi: number, below: number, inside: number, want: number[], depth: number): void => {
    if (want.length === 0) return;
    if (depth > 80) throw new Error('slope selection went too deep; please report');
    if (inside <= Math.max(listLimit, sampleSize)) {
      const slopes = walkInterval(p, lo, hi, 1, inside, uniform);
      const values = selectPositions(
        slopes,
        want.map((k) => k - below - 1),
      );
      want.forEach((k, i) => found.set(k, values[i] as number));
      return;
    }
    let sample: Float64Array;
    if (lo === -Infinity && hi === Infinity) {
      sample = new Float64Array(sampleSize);
      for (let k = 0; k < sampleSize; ) {
        const a = Math.floor(uniform() * p.n);
        const b = Math.floor(uniform() * p.n);
        if (p.t[a] === p.t[b]) continue;
        sample[k++] = slopeOf(p, Math.min(a, b), Math.max(a, b));
      }
    } else {
      sample =
        sampleSize >= inside
          ? walkInterval(p, lo, hi, 1, inside, uniform)
          : walkInterval(p, lo, hi, sampleSize / inside, Math.ceil(sampleSize + 8 * Math.sqrt(sampleSize) + 64), uniform);
    }
    sample.sort();
    const K = sample.length;
    if (K < 2) throw new Error('slope selection drew too small a sample; please report');
    const position = (k: number) => ((k - below) / inside) * K; // 1-based position in the sample
    const spread = (k: number) => {
      const q = (k - below) / inside;
      return Math.min(K / 4, 2.5 * Math.sqrt(K * q * (1 - q)) + 2);
    };
    // A repeated value at a wanted position: count its ranks exactly and split the interval there.
    for (const k of want) {
      const at = Math.min(K - 1, Math.max(0, Math.round(position(k)) - 1));
      const v = sample[at] as number;
      const w = Math.ceil(spread(k));
      const left = sample[Math.max(0, at - w)] as number;
      const right = sample[Math.min(K - 1, at + w)] as number;
      if (left === v || right === v || (at > 0 && sample[at - 1] === v) || (at + 1 < K && sample[at + 1] === v)) {
        const vLo = v - margin(p, v);
        const vHi = v + margin(p, v);
        const cLo = countBelow(p, vLo, total);
        const cHi = countBelow(p, vHi, total);
        const lower: number[] = [];
        const upper: number[] = [];
        for (const r of want) {
          if (r > cLo && r <= cHi) found.set(r, v);
          else if (r <= cLo) lower.push(r);
          else upper.push(r);
        }
        solve(lo, vLo, below, cLo - below, lower, depth + 1);
        solve(vHi, hi, cHi, below + inside - cHi, upper, depth + 1);
        return;
      }
    }
    // Group the wanted ranks whose sample windows overlap.
    const clusters: number[][] = [];
    for (const k of want) {
      const last = clusters[clusters.length - 1];
      const previous = last?.[last.length - 1];
      if (last && previous !== undefined && position(previous) + spread(previous) >= position(k) - spread(k)) last.push(k);
      else clusters.push([k]);
    }
    for (const cluster of clusters) {
      const first = cluster[0] as number;
      const lastRank = cluster[cluster.length - 1] as number;
      const iLow = Math.floor(position(first) - spread(first));
      const iHigh = Math.ceil(position(lastRank) + spread(lastRank));
      const newLo = iLow < 1 ? lo : (sample[iLow - 1] as number) - margin(p, sample[iLow - 1] as number);
      const newHi = iHigh > K ? hi : (sample[iHigh - 1] as number) + margin(p, sample[iHigh - 1] as number);
      const cLo = newLo === lo ? below : countBelow(p, newLo, total);
      const cHi = newHi === hi ? below + inside : countBelow(p, newHi, total);
      const inRange = cluster.filter((r) => r > cLo && r <= cHi);
      const lower = cluster.filter((r) => r <= cLo);
      const upper = cluster.filter((r) => r > cHi);
      if (inRange.length === cluster.length && cHi - cLo >= inside) {
        // The window spans the whole interval: chase the ranks one by one (each window is at
        // most half the sample), or list a modest interval.
        if (cluster.length > 1) {
          for (const rank of cluster) solve(lo, hi, below, inside, [rank], depth + 1);
          continue;
        }
        if (inside <= 64 * listLimit) {
          const slopes = walkInterval(p, lo, hi, 1, inside, uniform);
          const values = selectPositions(
            slopes,
            cluster.map((k) => k - below - 1),
          );
          cluster.forEach((k, i) => found.set(k, values[i] as number));
          continue;
        }
        throw new Error('slope selection made no progress; please report');
      }
      solve(newLo, newHi, cLo, cHi - cLo, inRange, depth + 1);
      solve(lo, newLo, below, cLo - below, lower, depth + 1);
      solve(newHi, hi, cHi, below + inside - cHi, upper, depth + 1);
    }
  };
  solve(-Infinity, Infinity, 0, total, wanted, 0);
  return ranks.map((k) => {
    const value = found.get(k);
    if (value === undefined) throw new Error('slope selection did not converge; please report');
    return value;
  });
}
