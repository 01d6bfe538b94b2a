/**
 * Sine, cosine and arcsine from additions, multiplications, divisions and square roots only, in
 * a fixed order, so that any IEEE 754 double-precision implementation of the same steps gives the
 * same bits. Math.sin and its kin are not specified to the last bit and differ between engines and
 * libraries (V8's port of fdlibm, glibc, numpy's vector code); the drift job in Python
 * (generator/drift/scaleout/drift_job/portable_math.py, the same steps) and this reader must take
 * the same nearest-segment decisions even when two distances differ by a nanometre.
 *
 * - sin, cos: reduction by multiples of π/2 in two parts (Cody and Waite 1980, "Software Manual
 *   for the Elementary Functions", ch. 8; the split of π/2 is fdlibm's pio2_1/pio2_1t), then the
 *   Taylor series to the 17th/18th power on |r| ≤ π/4 (truncation below 10⁻¹⁷).
 * - asin: the Taylor series Σ (2n)!/(4ⁿ(n!)²(2n+1)) x^(2n+1) for |x| ≤ 1/2 (to n = 30, truncation
 *   below 10⁻¹⁸), and asin x = π/2 − 2 asin √((1 − x)/2) above (Abramowitz and Stegun 1964,
 *   4.4.40 and 4.4.32 in its half-angle form).
 * Accuracy is about 1 unit in the last place for the small angles used here (common practice).
 */

const pio2Hi = 1.5707963267341256; // fdlibm pio2_1: the first 33 bits of π/2
const pio2Lo = 6.077100506506192e-11; // fdlibm pio2_1t: π/2 − pio2_1
const twoOverPi = 2 / Math.PI;
const halfPi = Math.PI / 2;

/** 1/n! for n = 0…18 (factorials are exact in a double up to 18!). */
const inverseFactorial: number[] = [];
{
  let f = 1;
  for (let n = 0; n <= 18; n++) {
    if (n > 0) f *= n;
    inverseFactorial.push(1 / f);
  }
}
const fact = (n: number): number => inverseFactorial[n] ?? 0;

/** Coefficients of the arcsine series: a_n = (2n)!/(4ⁿ(n!)²)/(2n+1), n = 1…30. */
const asinCoefficients: number[] = [];
{
  let b = 1;
  for (let n = 1; n <= 30; n++) {
    b = (b * (2 * n - 1)) / (2 * n);
    asinCoefficients.push(b / (2 * n + 1));
  }
}

function sinSeries(r: number): number {
  const z = r * r;
  let p = fact(17);
  p = -fact(15) + z * p;
  p = fact(13) + z * p;
  p = -fact(11) + z * p;
  p = fact(9) + z * p;
  p = -fact(7) + z * p;
  p = fact(5) + z * p;
  p = -fact(3) + z * p;
  return r + r * (z * p);
}

function cosSeries(r: number): number {
  const z = r * r;
  let p = -fact(18);
  p = fact(16) + z * p;
  p = -fact(14) + z * p;
  p = fact(12) + z * p;
  p = -fact(10) + z * p;
  p = fact(8) + z * p;
  p = -fact(6) + z * p;
  p = fact(4) + z * p;
  p = -fact(2) + z * p;
  return 1 + z * p;
}

function reduce(x: number): { r: number; quadrant: number } {
  const k = Math.floor(x * twoOverPi + 0.5);
  const r = x - k * pio2Hi - k * pio2Lo;
  return { r, quadrant: ((k % 4) + 4) % 4 };
}

export function portableSin(x: number): number {
  const { r, quadrant } = reduce(x);
  if (quadrant === 0) return sinSeries(r);
  if (quadrant === 1) return cosSeries(r);
  if (quadrant === 2) return -sinSeries(r);
  return -cosSeries(r);
}

export function portableCos(x: number): number {
  const { r, quadrant } = reduce(x);
  if (quadrant === 0) return cosSeries(r);
  if (quadrant === 1) return -sinSeries(r);
  if (quadrant === 2) return -cosSeries(r);
  return sinSeries(r);
}

function asinSeries(t: number): number {
  const z = t * t;
  let p = asinCoefficients[29] ?? 0;
  for (let n = 28; n >= 0; n--) p = (asinCoefficients[n] ?? 0) + z * p;
  return t + t * (z * p);
}

/** Arcsine of x in [−1, 1] (NaN outside). */
export function portableAsin(x: number): number {
  const t = Math.abs(x);
  if (!(t <= 1)) return Number.NaN;
  const value = t <= 0.5 ? asinSeries(t) : halfPi - 2 * asinSeries(Math.sqrt((1 - t) / 2));
  return x < 0 ? -value : value;
}
