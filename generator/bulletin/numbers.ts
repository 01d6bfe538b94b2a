/**
 * Rounding of numbers printed in bulletin sentences: "numbers rounded to what the data support".
 *
 * The rule (stated on the methods page):
 * - A rate of change shown with its likely range is rounded, together with the two ends of the
 *   range, to the decimal place of the first significant digit of the range's width. The width of
 *   the range says how many digits mean something; digits below it are noise. A width of 8 gives
 *   whole numbers ("about 6; likely between 2 and 10"), a width of 0.3 gives one decimal.
 *   Reporting an estimate to the place of its uncertainty's leading digit is common practice.
 * - A bound of the range is never rounded to zero or across zero: when the range spans zero (it may
 *   be a fall or a rise), or when the width rule would round a bound to 0 or flip its sign, each
 *   bound is printed on its own to two significant figures ("from 2.4 fewer to 9.5 more", never
 *   "no change to 10 more"). A bound that is exactly 0 stays "no change".
 * - Any other number (a median, a season value, arrivals per km) is rounded to two significant
 *   figures (43.53 → 44, 0.4712 → 0.47, 1234 → 1200).
 *
 * All functions are pure; `formatNumber` never prints "−0", writes negative numbers with the minus
 * sign (U+2212) and uses "," between thousands.
 */

/** The power of ten of the leading digit: 43.5 → 1, 0.47 → −1, 8 → 0. Null for 0 or non-finite. */
export function leadingDigitPlace(value: number): number | null {
  if (!Number.isFinite(value) || value === 0) return null;
  return Math.floor(Math.log10(Math.abs(value)) + 1e-12);
}

/** Number of decimals (≥ 0) that rounding to `significant` figures of `value` needs. */
export function decimalsForSignificant(value: number, significant = 2): number {
  const place = leadingDigitPlace(value);
  if (place === null) return 0;
  return Math.max(0, significant - 1 - place);
}

/** Round to a number of decimals, or (negative decimals) to tens, hundreds… */
export function roundToDecimals(value: number, decimals: number): number {
  if (decimals >= 0) {
    const factor = 10 ** decimals;
    const rounded = Math.round(Math.abs(value) * factor + 1e-9) / factor;
    return value < 0 ? -rounded : rounded;
  }
  const factor = 10 ** -decimals;
  const rounded = Math.round(Math.abs(value) / factor + 1e-9) * factor;
  return value < 0 ? -rounded : rounded;
}

/** Round to `significant` significant figures (two by default). */
export function roundSignificant(value: number, significant = 2): number {
  const place = leadingDigitPlace(value);
  if (place === null) return value === 0 ? 0 : value;
  return roundToDecimals(value, significant - 1 - place);
}

/** Print a number with exactly `decimals` decimals (≥ 0) and thousands separators. */
const formats = new Map<number, Intl.NumberFormat>();

/** One formatter per number of decimals (making one is far slower than using it). */
function numberFormat(decimals: number): Intl.NumberFormat {
  let format = formats.get(decimals);
  if (!format) {
    format = new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals, useGrouping: true });
    formats.set(decimals, format);
  }
  return format;
}

export function formatNumber(value: number, decimals = 0): string {
  const safeDecimals = Math.max(0, decimals);
  const text = numberFormat(safeDecimals).format(Math.abs(value));
  const isZero = Number(text.replace(/,/g, '')) === 0;
  return value < 0 && !isZero ? `\u2212${text}` : text;
}

/** Two significant figures, printed. 43.53 → "44"; 0.4712 → "0.47"; 1234 → "1,200". */
export function formatSignificant(value: number, significant = 2): string {
  const rounded = roundSignificant(value, significant);
  return formatNumber(rounded, decimalsForSignificant(rounded, significant));
}

export interface RoundedRate {
  slope: number;
  lower: number | null;
  upper: number | null;
  /** decimals of the slope (and of both bounds unless they are printed on their own) */
  decimals: number;
  /** decimals of each bound; differ from `decimals` when the bounds are printed to two significant figures */
  lowerDecimals: number;
  upperDecimals: number;
  text: { slope: string; lower: string | null; upper: string | null };
}

/** Round a rate and its range to a fixed number of decimals (negative: tens, hundreds…). */
export function roundRateAt(slope: number, lower: number | null, upper: number | null, decimals: number): RoundedRate {
  const shown = Math.max(0, decimals);
  const r = (x: number): number => roundToDecimals(x, decimals);
  const roundedSlope = r(slope);
  const roundedLower = lower === null ? null : r(lower);
  const roundedUpper = upper === null ? null : r(upper);
  return {
    slope: roundedSlope,
    lower: roundedLower,
    upper: roundedUpper,
    decimals: shown,
    lowerDecimals: shown,
    upperDecimals: shown,
    text: {
      slope: formatNumber(roundedSlope, shown),
      lower: roundedLower === null ? null : formatNumber(roundedLower, shown),
      upper: roundedUpper === null ? null : formatNumber(roundedUpper, shown),
    },
  };
}

/**
 * Round a rate and its likely range by the width rule above. Without a range (or a zero-width
 * range) the rate is rounded to two significant figures.
 */
export function roundRate(slope: number, lower: number | null, upper: number | null): RoundedRate {
  const width = lower !== null && upper !== null ? upper - lower : null;
  const widthPlace = width !== null ? leadingDigitPlace(width) : null;
  const decimals = widthPlace !== null ? -widthPlace : decimalsForSignificant(slope, 2);
  return keepBoundsApartFromZero(roundRateAt(slope, lower, upper, decimals), slope, lower, upper);
}

/** Whether a rounded bound hides what the raw bound says: rounded to 0, or to the other sign. */
function boundLost(raw: number | null, rounded: number | null): boolean {
  if (raw === null || rounded === null || raw === 0) return false;
  return rounded === 0 || Math.sign(rounded) !== Math.sign(raw);
}

/**
 * The rule of the header: a range that spans zero, or a bound the width rule would round to 0 or
 * across 0, gets both bounds to two significant figures each (an exact 0 stays 0), and the rate
 * with them, so the sentence does not print "no change" beside a range of real amounts.
 */
export function keepBoundsApartFromZero(rate: RoundedRate, slope: number, lower: number | null, upper: number | null): RoundedRate {
  if (lower === null || upper === null) return rate;
  const spans = lower < 0 && upper > 0;
  if (!spans && !boundLost(lower, rate.lower) && !boundLost(upper, rate.upper)) return rate;
  const own = (x: number): { value: number; decimals: number } => {
    // below 10^-18 nothing printable is left (and 10^decimals would overflow)
    if (x === 0 || Math.abs(x) < 1e-18) return { value: 0, decimals: Math.max(0, rate.decimals) };
    const value = roundSignificant(x, 2);
    // two significant figures without a trailing zero after the point (0.30 → "0.3")
    const fixed = Math.abs(value).toFixed(Math.min(decimalsForSignificant(value, 2), 20));
    const decimals = fixed.includes('.') ? (fixed.replace(/0+$/u, '').split('.')[1] ?? '').length : 0;
    return { value, decimals };
  };
  const lo = own(lower);
  const hi = own(upper);
  // the rate to two significant figures, but never finer than the finer bound
  const finest = Math.max(lo.decimals, hi.decimals);
  const rough = own(slope);
  const mid = rough.decimals <= finest ? rough : { value: roundToDecimals(slope, finest), decimals: finest };
  if (mid.value === 0) mid.decimals = Math.max(lo.decimals, hi.decimals);
  return {
    slope: mid.value,
    lower: lo.value,
    upper: hi.value,
    decimals: mid.decimals,
    lowerDecimals: lo.decimals,
    upperDecimals: hi.decimals,
    text: { slope: formatNumber(mid.value, mid.decimals), lower: formatNumber(lo.value, lo.decimals), upper: formatNumber(hi.value, hi.decimals) },
  };
}

/**
 * Two significant figures for a sentence, without trailing zeros after the decimal point: the same
 * rounded number as formatSignificant, written the way people say it (0.080 → "0.08",
 * 3.0 → "3", 0.10 → "0.1"; 44 and 1,200 are unchanged).
 */
export function formatPlain(value: number, significant = 2): string {
  const text = formatSignificant(value, significant);
  return text.includes('.') ? text.replace(/\.?0+$/u, '') : text;
}
